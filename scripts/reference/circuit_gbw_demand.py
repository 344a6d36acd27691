"""Reference GBW demands for three topologies, from characteristic polynomials
derived by hand and rooted with numpy.roots (independent of the nodal
analysis and Muller iteration used in src/topologies/as-built.ts and src/math/muller.ts).

Op-amp: single pole, A(s) = a0 / (1 + s/wp), wp = 2 pi GBW / a0, a0 = 1e12 (as in src/topologies/as-built.ts).
Criterion: smallest GBW with the dominant pole's f0 and Q within 1 % of the
ideal design (second order); for first order, |H(j w0)/H_ideal(j w0) - 1| no
larger than a 1 % shift of f0 would cause.

Designs reproduce the topologies' defaults (10 kOhm level resistor):
- sallen-key-lowpass-unity: R1 = R2 = R, C1/C2 = 4 Q^2.
- mfb-lowpass: C1/C2 = 4 Q^2 (1 + K), R2 = R3, R1 = R2 / K.
- first-order-lowpass-inverting: R1 = 10 kOhm, R2 = K R1, C1 = 1/(w0 R2).

Run: python3 scripts/reference/circuit_gbw_demand.py
"""
import json
import math
import os

import numpy as np

A0 = 1e12
OUT = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures", "circuit-gbw-demand.json")


def pole_ok(coeffs_fn, w0, q):
    def ok(gbw):
        r = np.roots(coeffs_fn(2 * math.pi * gbw / A0))
        ideal = complex(-w0 / (2 * q), w0 * math.sqrt(max(0.0, 1 - 1 / (4 * q * q))))
        p = min(r, key=lambda z: abs(z - ideal))
        f = abs(p)
        qq = abs(p) / (-2 * p.real)
        return abs(f / w0 - 1) <= 0.01 and abs(qq / q - 1) <= 0.01
    return ok


def sk_unity(f0, q):
    w0 = 2 * math.pi * f0
    r = 1e4
    # R1 = R2 = R: w0 = 1/(R sqrt(C1 C2)), C1 = 4 Q^2 C2 -> C2 = 1/(2 Q w0 R)
    c2 = 1 / (2 * q * w0 * r)
    c1 = 4 * q * q * c2
    b = r * c2 + r * c2
    c = r * r * c1 * c2

    def coeffs(wp):
        # (1 + s/wp + a0)(1 + s b + s^2 c) + s R1 C1 (1 + s/wp)
        p1 = np.poly1d([1 / wp, 1 + A0])
        p2 = np.poly1d([c, b, 1])
        p3 = np.poly1d([r * c1 / wp, r * c1, 0])
        return (p1 * p2 + p3).coeffs

    return pole_ok(coeffs, w0, q)


def mfb_low(f0, q, k):
    w0 = 2 * math.pi * f0
    c2 = 1.0
    c1 = 4 * q * q * (1 + k)
    r2 = (c1 * w0 / q) / (2 * w0 * w0 * c1)
    r3 = 1 / (w0 * w0 * r2 * c1 * c2)
    r1 = r2 / k
    scale = 1e4 / r1
    r1, r2, r3, c1, c2 = r1 * scale, r2 * scale, r3 * scale, c1 / scale, c2 / scale
    g1, g2, g3 = 1 / r1, 1 / r2, 1 / r3

    def coeffs(wp):
        ya = np.poly1d([c1, g1 + g2 + g3])
        t = np.poly1d([1 / wp, 1])
        inner = np.poly1d([c2, g3]) * ya - g3 * g3
        return (t * inner + A0 * (np.poly1d([c2, 0]) * ya + g2 * g3)).coeffs

    return pole_ok(coeffs, w0, q)


def inv_low(f0, k):
    w0 = 2 * math.pi * f0
    r1 = 1e4
    r2 = k * r1
    c1 = 1 / (w0 * r2)
    c = 1 / 1.01
    dev = math.hypot((1 + c) / (1 + c * c) - 1, (1 - c) / (1 + c * c))

    def ok(gbw):
        s = 1j * w0
        a = A0 / (1 + s * A0 / (2 * math.pi * gbw))
        y1 = 1 / r1
        y2 = 1 / r2 + s * c1
        h = -y1 / (y2 + (y1 + y2) / a)
        h0 = -y1 / y2
        return abs(h / h0 - 1) <= dev

    return ok


def demand(ok, f0):
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
    for f0, q in [(1000.0, 0.7071067811865476), (250.0, 2.0), (20000.0, 5.0)]:
        t = {"order": 2, "kind": "lowpass", "f0Hz": f0, "q": q, "gain": 1}
        cases.append({"id": "sallen-key-lowpass-unity", "target": t, "gbwHz": demand(sk_unity(f0, q), f0)})
    for f0, q, k in [(1000.0, 0.7071067811865476, 1.0), (50.0, 1.5, 4.0), (30000.0, 3.0, 2.0)]:
        t = {"order": 2, "kind": "lowpass", "f0Hz": f0, "q": q, "gain": -k}
        cases.append({"id": "mfb-lowpass", "target": t, "gbwHz": demand(mfb_low(f0, q, k), f0)})
    for f0, k in [(1000.0, 1.0), (10.0, 10.0)]:
        t = {"order": 1, "kind": "lowpass", "f0Hz": f0, "gain": -k}
        cases.append({"id": "first-order-lowpass-inverting", "target": t, "gbwHz": demand(inv_low(f0, k), f0)})
    with open(OUT, "w") as fh:
        json.dump({"source": f"numpy {np.__version__} numpy.roots of hand-derived characteristic polynomials "
                   "(scripts/reference/circuit_gbw_demand.py)", "cases": cases}, fh, indent=1)


if __name__ == "__main__":
    main()
