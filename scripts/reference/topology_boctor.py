"""Reference data for the single-amplifier notch sections (src/topologies/boctor.ts).

1. A sympy check of the header's transfer function: the nodal equations of
   both circuits (op-amp a VCVS of gain A) solved symbolically, and
   H = N / (D + Dp/A) with the header's N, D and Dp confirmed term by term.
2. test/fixtures/boctor-nodal.json: for a few targets, the part values from
   the header's design equations (written again here, independently of the
   TypeScript) and H(j 2 pi f) from a numpy nodal analysis (4 x 4 complex
   system per frequency: nodes a, n, p, out, the op-amp output an ideal
   source of A(s) (v_p - v_n), A(s) = a0 / (1 + s a0 / (2 pi GBW))).

Run: python3 scripts/reference/topology_boctor.py
"""
import json
import math
import os

import numpy as np
import sympy as sp

OUT = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures")


def parts(low):
    # (kind, name, node a, node b)
    return [
        ("R", "R1", "in", "a"), ("R", "R2", "a", "0"), ("R", "R3", "n", "out"),
        ("R", "R4", "in", "p"), ("R", "R5", "p", "0"), ("R", "R6", "n", "0" if low else "in"),
        ("C", "C1", "a", "n"), ("C", "C2", "a", "out"),
    ]


def symbolic_check():
    s, A = sp.symbols("s A")
    G = {k: sp.Symbol("G" + k[1:], positive=True) for k in ("R1", "R2", "R3", "R4", "R5", "R6")}
    C = {k: sp.Symbol(k, positive=True) for k in ("C1", "C2")}
    for low in (True, False):
        va, vn, vp, vo = sp.symbols("va vn vp vo")
        V = {"in": 1, "0": 0, "a": va, "n": vn, "p": vp, "out": vo}
        kcl = {"a": 0, "n": 0, "p": 0}
        for kind, name, x, y in parts(low):
            adm = G[name] if kind == "R" else s * C[name]
            for u, w in ((x, y), (y, x)):
                if u in kcl:
                    kcl[u] += adm * (V[u] - V[w])
        sol = sp.solve([kcl["a"], kcl["n"], kcl["p"], vo - A * (vp - vn)], [va, vn, vp, vo], dict=True)[0]
        h = sol[vo]
        g1, g2, g3, g4, g5, g6 = (G[k] for k in ("R1", "R2", "R3", "R4", "R5", "R6"))
        c1, c2 = C["C1"], C["C2"]
        gamma, beta, gt = g4 / (g4 + g5), g5 / (g4 + g5), g1 + g2
        if low:
            n1 = gamma * (c1 * (g2 + g3 + g6) + c2 * (g3 + g6)) - beta * c1 * g1
            n0 = gamma * gt * (g3 + g6)
        else:
            n1 = gamma * (c1 * (g2 + g3) + c2 * g3) - beta * (c1 * g1 + (c1 + c2) * g6)
            n0 = gt * (gamma * g3 - beta * g6)
        n = gamma * c1 * c2 * s**2 + n1 * s + n0
        d = c1 * c2 * s**2 + g3 * (c1 + c2) * s + g3 * gt
        dp = c1 * c2 * s**2 + (c1 * (gt + g3 + g6) + c2 * (g3 + g6)) * s + gt * (g3 + g6)
        assert sp.simplify(h - n / (d + dp / A)) == 0, "header transfer function"
    return "sympy: H = N / (D + Dp/A) confirmed for both forms"


def design(low, f0, q, fz, gain, m):
    w0 = 2 * math.pi * f0
    r2 = (fz / f0) ** 2
    gamma = gain / r2 if low else gain
    g3 = w0 * m / (q * (1 + m))
    gt = w0 * q * (1 + m)
    g1 = gamma * (gt + (1 + m) * g3 * r2 / m)
    g2 = gt - g1
    g6 = g3 * (r2 - 1) if low else g3 * (1 - r2) * gamma / (1 - gamma)
    v = {"C1": m, "C2": 1.0, "R1": 1 / g1, "R2": 1 / g2, "R3": 1 / g3, "R4": 1 / (gamma * gt), "R5": 1 / ((1 - gamma) * gt), "R6": 1 / g6}
    k = 10_000 / v["R1"]  # level: R1 = 10 kOhm
    return {n: (x * k if n.startswith("R") else x / k) for n, x in v.items()}


def nodal(low, v, freqs, a0, gbw):
    idx = {"a": 0, "n": 1, "p": 2, "out": 3}
    out = []
    for f in freqs:
        s = 2j * math.pi * f
        A = a0 / (1 + s * a0 / (2 * math.pi * gbw)) if a0 is not None else None
        M = np.zeros((4, 4), dtype=complex)
        b = np.zeros(4, dtype=complex)
        for kind, name, x, y in parts(low):
            adm = 1 / v[name] if kind == "R" else s * v[name]
            for u, w in ((x, y), (y, x)):
                if u in ("a", "n", "p"):
                    M[idx[u], idx[u]] += adm
                    if w == "in":
                        b[idx[u]] += adm
                    elif w != "0":
                        M[idx[u], idx[w]] -= adm
        # output row: v_out = A (v_p - v_n), or v_p = v_n for the ideal op-amp
        if A is None:
            M[3, 2], M[3, 1] = 1, -1
        else:
            M[3, 3], M[3, 2], M[3, 1] = 1 / A, -1, 1
        x = np.linalg.solve(M, b)
        out.append(x[3])
    return out


def main():
    check = symbolic_check()
    cases = []
    targets = [
        (True, 1000.0, 2.0, 2000.0, 1.0, 1.0),
        (True, 12_000.0, 4.0, 15_000.0, 1.1, 1.0),
        (True, 350.0, 0.7, 1900.0, 1.5, 3.0),
        (False, 1000.0, 2.0, 500.0, 0.8, 1.0),
        (False, 12_000.0, 4.0, 9000.0, 0.9, 1.0),
        (False, 80.0, 9.0, 20.0, 0.95, 6.0),
    ]
    for low, f0, q, fz, gain, m in targets:
        v = design(low, f0, q, fz, gain, m)
        freqs = np.logspace(math.log10(f0) - 2, math.log10(f0) + 2.5, 46)
        for a0, gbw in ((None, None), (2e5, 1e6)):
            h = nodal(low, v, freqs, a0, gbw)
            cases.append({
                "topology": "boctor-lowpass-notch" if low else "boctor-highpass-notch",
                "target": {"order": 2, "kind": "lowpass-notch" if low else "highpass-notch", "f0Hz": f0, "q": q, "fzHz": fz, "gain": gain},
                "choices": {"capacitorRatio": m},
                "values": v,
                "opamp": {"kind": "ideal"} if a0 is None else {"kind": "single-pole", "a0": a0, "gbwHz": gbw},
                "freqHz": freqs.tolist(),
                "re": [z.real for z in h],
                "im": [z.imag for z in h],
            })
    data = {
        "source": {
            "method": "numpy nodal analysis (numpy.linalg.solve) of the circuits in src/topologies/boctor.ts; design equations written again from its header",
            "symbolic": check,
            "versions": f"numpy {np.__version__}, sympy {sp.__version__}",
        },
        "generatedBy": "scripts/reference/topology_boctor.py; do not edit",
        "cases": cases,
    }
    with open(os.path.join(OUT, "boctor-nodal.json"), "w") as fh:
        json.dump(data, fh, indent=1)
    print(check, "; wrote", len(cases), "cases")


if __name__ == "__main__":
    main()
