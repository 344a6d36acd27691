"""Reference data for the Deliyannis-Friend bandpass (src/topologies/deliyannis-friend.ts),
computed independently of the TypeScript code:

- designs: the component values from the design equations in that file's header,
  re-implemented here (equal capacitors, rho = R3/(R1 || R2), Q0 = sqrt(rho)/2,
  alpha = R5/R4 = (1 - Q0/Q)/(2 Q0^2), R4 = R3/sqrt(rho) at the level);
- response: numpy.linalg.solve of the stage's nodal equations (unknowns a, n, out, p;
  op-amp as a single-pole VCVS A(s) = a0/(1 + s a0/(2 pi GBW)), a0 = 2e5, GBW = 1 MHz);
- gbwHz: the smallest GBW (a0 = 1e12, as in src/topologies/as-built.ts) with the
  pole nearest the ideal one within 1 % in f0 and Q, the poles found as the finite
  generalized eigenvalues (scipy.linalg.eig) of the nodal pencil G + s C with the
  op-amp's pole as a state (no determinant, no Muller iteration).

Run: python3 scripts/reference/topology_deliyannis_friend.py
"""
import json
import math
import os

import numpy as np
import scipy
import scipy.linalg

OUT = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures", "topology-deliyannis-friend.json")
A0_RESPONSE = 2e5
GBW_RESPONSE = 1e6
A0_DEMAND = 1e12


def design(f0, q, gain, ratio=None, capacitor=None):
    rho = ratio if ratio is not None else 4 * q
    w0 = 2 * math.pi * f0
    sr = math.sqrt(rho)
    q0 = sr / 2
    alpha = (1 - q0 / q) / (2 * q0 * q0)
    # C = 1 normalised
    ga = w0 * sr
    g1 = abs(gain) * w0 / (q * (1 + alpha))
    v = {"R1": 1 / g1, "R2": 1 / (ga - g1), "C1": 1.0, "C2": 1.0, "R3": sr / w0, "R4": 1 / w0, "R5": alpha / w0}
    k = (v["C1"] / capacitor) if capacitor is not None else 1e4 / v["R4"]
    return {n: (x * k if n[0] == "R" else x / k) for n, x in v.items()}


def matrices(v, a0, gbw):
    """G and C of the pencil (G + s C) x = b, x = [a, n, out, p]; rows: KCL a, KCL n, KCL p, op-amp."""
    g1, g2, g3, g4, g5 = (1 / v[n] for n in ("R1", "R2", "R3", "R4", "R5"))
    c1, c2 = v["C1"], v["C2"]
    # op-amp row divided by a0: vn - vp + out (1/a0 + s/(2 pi GBW)) = 0; rows scaled to conductance (g3)
    G = np.array([[g1 + g2, 0, 0, 0], [0, g3, -g3, 0], [0, 0, -g4, g4 + g5], [0, g3, g3 / a0, -g3]], dtype=float)
    C = np.array([[c1 + c2, -c1, -c2, 0], [-c1, c1, 0, 0], [0, 0, 0, 0], [0, 0, g3 / (2 * math.pi * gbw), 0]], dtype=float)
    b = np.array([g1, 0, 0, 0], dtype=complex)
    return G, C, b


def response(v, freqs):
    G, C, b = matrices(v, A0_RESPONSE, GBW_RESPONSE)
    out = []
    for f in freqs:
        x = np.linalg.solve(G + 2j * math.pi * f * C, b)
        out.append([x[2].real, x[2].imag])
    return out


def pole_near(v, gbw, w0, q):
    G, C, _ = matrices(v, A0_DEMAND, gbw)
    lam = scipy.linalg.eig(G, -C, right=False)
    lam = lam[np.isfinite(lam)]
    ideal = complex(-w0 / (2 * q), w0 * math.sqrt(1 - 1 / (4 * q * q)))
    return min(lam, key=lambda z: abs(z - ideal))


def demand(v, f0, q):
    w0 = 2 * math.pi * f0

    def ok(gbw):
        p = pole_near(v, gbw, w0, q)
        return abs(abs(p) / w0 - 1) <= 0.01 and abs(abs(p) / (-2 * p.real) / q - 1) <= 0.01

    lo, hi = f0, f0 * 4
    while not ok(hi):
        lo, hi = hi, hi * 4
    while hi / lo > 1 + 1e-7:
        mid = math.sqrt(lo * hi)
        if ok(mid):
            hi = mid
        else:
            lo = mid
    return hi


def main():
    cases = []
    for target, choices in [
        ({"order": 2, "kind": "bandpass", "f0Hz": 1000.0, "q": 10.0, "gain": -5.0}, {}),
        ({"order": 2, "kind": "bandpass", "f0Hz": 10000.0, "q": 15.0, "gain": -10.0}, {"resistorRatio": 100.0}),
        ({"order": 2, "kind": "bandpass", "f0Hz": 200.0, "q": 40.0, "gain": -2.0}, {"capacitor": 1e-8}),
        ({"order": 2, "kind": "bandpass", "f0Hz": 3000.0, "q": 5.0, "gain": -1.0}, {}),
    ]:
        v = design(target["f0Hz"], target["q"], target["gain"], choices.get("resistorRatio"), choices.get("capacitor"))
        f0 = target["f0Hz"]
        freqs = [f0 * 10 ** (x / 10) for x in range(-15, 16)] + [f0 * (1 + d) for d in (-0.02, -0.01, -0.003, 0.003, 0.01, 0.02)]
        freqs.sort()
        cases.append({
            "target": target,
            "choices": choices,
            "values": v,
            "opamp": {"kind": "single-pole", "a0": A0_RESPONSE, "gbwHz": GBW_RESPONSE},
            "freqHz": freqs,
            "response": response(v, freqs),
            "gbwHz": demand(v, f0, target["q"]),
        })
    with open(OUT, "w") as fh:
        json.dump({
            "source": f"numpy {np.__version__} numpy.linalg.solve of the stage's nodal equations; scipy {scipy.__version__} "
                      "scipy.linalg.eig of the nodal pencil for the GBW demand; design equations re-implemented "
                      "(scripts/reference/topology_deliyannis_friend.py)",
            "cases": cases,
        }, fh, indent=1)


if __name__ == "__main__":
    main()
