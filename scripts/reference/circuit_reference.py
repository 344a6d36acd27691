"""Reference data for the circuit layer (src/math/linear.ts, src/circuit/mna.ts).

1. circuit-linear-solve.json: random dense complex systems A x = b solved by
   numpy.linalg.solve (LAPACK zgesv), for the LU solver.
2. circuit-ladder.json: the voltage transfer of a doubly terminated RLC ladder
   (series R source, alternating shunt C / series L, load R, plus a bridged-T
   style series RC branch) computed by chaining ABCD (transmission) matrices
   with numpy -- a method independent of nodal analysis.

Run: python3 scripts/reference/circuit_reference.py
"""
import json
import os

import numpy as np

OUT = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures")
rng = np.random.default_rng(20261201)


def linear_cases():
    cases = []
    for n in (1, 2, 3, 5, 8, 13):
        for _ in range(2):
            a = rng.normal(size=(n, n)) + 1j * rng.normal(size=(n, n))
            # scale rows wildly, as MNA rows are
            a = a * (10.0 ** rng.uniform(-6, 3, size=(n, 1)))
            b = rng.normal(size=n) + 1j * rng.normal(size=n)
            x = np.linalg.solve(a, b)
            cases.append({
                "n": n,
                "aRe": a.real.ravel().tolist(), "aIm": a.imag.ravel().tolist(),
                "bRe": b.real.tolist(), "bIm": b.imag.tolist(),
                "xRe": x.real.tolist(), "xIm": x.imag.tolist(),
                "cond": float(np.linalg.cond(a)),
            })
    return cases


def abcd_series(z):
    return np.array([[1, z], [0, 1]], dtype=complex)


def abcd_shunt(y):
    return np.array([[1, 0], [y, 1]], dtype=complex)


def ladder():
    # A 5th-order LC lowpass ladder around 10 kHz, 600-ohm terminations
    # (values chosen here, not from a table), with a small series loss in the inductors.
    rs, rl = 600.0, 600.0
    c1, l2, c3, l4, c5 = 26.5e-9, 15.5e-3, 85.8e-9, 15.5e-3, 26.5e-9
    rl2, rl4 = 3.3, 4.7  # inductor winding resistances
    freqs = np.logspace(2, 5.5, 61)
    h = []
    for f in freqs:
        s = 2j * np.pi * f
        m = abcd_series(rs)
        m = m @ abcd_shunt(s * c1)
        m = m @ abcd_series(s * l2 + rl2)
        m = m @ abcd_shunt(s * c3)
        m = m @ abcd_series(s * l4 + rl4)
        m = m @ abcd_shunt(s * c5)
        m = m @ abcd_shunt(1 / rl)
        # V_in = A V_out + B I_out with I_out = 0 after the load is absorbed
        h.append(1 / m[0, 0])
    elements = [
        {"kind": "V", "name": "Vs", "a": "src", "b": "0", "ac": 1},
        {"kind": "R", "name": "Rs", "a": "src", "b": "n1", "value": rs},
        {"kind": "C", "name": "C1", "a": "n1", "b": "0", "value": c1},
        {"kind": "L", "name": "L2", "a": "n1", "b": "m2", "value": l2},
        {"kind": "R", "name": "RL2", "a": "m2", "b": "n3", "value": rl2},
        {"kind": "C", "name": "C3", "a": "n3", "b": "0", "value": c3},
        {"kind": "L", "name": "L4", "a": "n3", "b": "m4", "value": l4},
        {"kind": "R", "name": "RL4", "a": "m4", "b": "out", "value": rl4},
        {"kind": "C", "name": "C5", "a": "out", "b": "0", "value": c5},
        {"kind": "R", "name": "Rl", "a": "out", "b": "0", "value": rl},
    ]
    return {
        "circuit": {"title": "RLC ladder reference", "elements": elements},
        "freqHz": freqs.tolist(),
        "re": [float(v.real) for v in h],
        "im": [float(v.imag) for v in h],
    }


def main():
    src = f"numpy {np.__version__} (numpy.linalg.solve, LAPACK zgesv)"
    with open(os.path.join(OUT, "circuit-linear-solve.json"), "w") as fh:
        json.dump({"source": src, "cases": linear_cases()}, fh)
    with open(os.path.join(OUT, "circuit-ladder.json"), "w") as fh:
        json.dump({"source": f"numpy {np.__version__}: chained ABCD matrices of the ladder "
                   "(scripts/reference/circuit_reference.py)", **ladder()}, fh)


if __name__ == "__main__":
    main()
