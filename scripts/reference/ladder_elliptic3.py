#!/usr/bin/env python3
"""Reference element values of a third-order elliptic LC ladder (filterwright).

Writes
  test/fixtures/ladder-elliptic3.json   shunt-C-first doubly terminated ladder
                                        (1 ohm both ends) realising the elliptic
                                        prototype of order 3, rounded to double

The prototype is computed at 60 digits with mpmath: ripple factor
eps = sqrt(10^(Rp/10) - 1), k1 = eps / sqrt(10^(As/10) - 1), the selectivity
modulus k from the degree equation by nomes, q(k) = q(k1)^(1/n); zeros at
+-j / (k sn(2K/3, k)); poles j cd((u - j v0) K, k) for u = 1/3 and the real pole
-sc(v0 K, k'), with v0 = F(atan(1/eps), k1') / (n K(k1)) (the Jacobi-function
solution of the elliptic approximation, e.g. R. W. Daniels, "Approximation
Methods for Electronic Filter Design", McGraw-Hill, 1974, chapter 5, from
memory). Cross-checked against scipy.signal.ellipap (the difference is
recorded in the fixture).

The ladder is found by Darlington's method: with R_S = R_L = 1 the reflection
coefficient rho = -P/D has P(s)P(-s) = D(s)D(-s) - k^2 N(s)N(-s), so
P(s) = s (s^2 + W^2) for order 3 (reflection zeros on the jw axis), and
Y_in = (D + P) / (D - P). The shunt capacitor C1 = Y_in(j wz) / (j wz) is
removed partially (zero shifting) so the remainder has a pole pair at the
transmission zero wz, which is removed as the series tank L2 || C2; the rest
is C3 in parallel with the 1-ohm load (S. Darlington, "Synthesis of
reactance 4-poles which produce prescribed insertion loss characteristics",
J. Math. Phys. 18, 1939; G. C. Temes and S. K. Mitra (eds.), "Modern Filter
Theory and Design", Wiley, 1973, on zero-shifting extraction). The script
checks the ladder's own response (ABCD chain, 60 digits) against the
prototype transfer H / 2 and records the largest relative difference.

Run: python3 scripts/reference/ladder_elliptic3.py
"""
import json
import os

import mpmath as mp
import numpy as np
import scipy
from scipy import signal

mp.mp.dps = 60
OUT = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures")
N = 3
RP = mp.mpf("0.5")
AS = mp.mpf(40)


def elliptic3():
    eps = mp.sqrt(mp.power(10, RP / 10) - 1)
    k1 = eps / mp.sqrt(mp.power(10, AS / 10) - 1)
    q = mp.power(mp.qfrom(k=k1), mp.mpf(1) / N)
    k = mp.kfrom(q=q)
    m = k * k
    big_k = mp.ellipk(m)
    k1p2 = 1 - k1 * k1
    v0 = mp.ellipf(mp.atan(1 / eps), k1p2) / (N * mp.ellipk(k1 * k1))
    wz = 1 / (k * mp.ellipfun("sn", 2 * big_k / N, m=m))
    zeros = [mp.mpc(0, wz), mp.mpc(0, -wz)]
    p = 1j * mp.ellipfun("cd", (mp.mpf(1) / N - 1j * v0) * big_k, m=m)
    p = mp.mpc(-abs(mp.re(p)), abs(mp.im(p)))
    p0 = -mp.ellipfun("sc", v0 * big_k, m=1 - m)
    poles = [p, mp.conj(p), mp.mpc(p0, 0)]
    gain = mp.re(mp.fprod([-x for x in poles]) / mp.fprod([-x for x in zeros]))
    return zeros, poles, gain, wz, 1 / k


def poly_from_roots(roots):
    c = [mp.mpc(1)]
    for r in roots:
        c = [a - r * b for a, b in zip(c + [0], [0] + c)]
    return [mp.re(x) for x in c]  # descending powers; conjugate-closed roots give real coefficients


def pval(c, s):
    acc = mp.mpc(0)
    for a in c:
        acc = acc * s + a
    return acc


def padd(a, b):
    n = max(len(a), len(b))
    a = [0] * (n - len(a)) + list(a)
    b = [0] * (n - len(b)) + list(b)
    return [x + y for x, y in zip(a, b)]


def pscale(a, f):
    return [x * f for x in a]


def pdiv(num, den):
    num = list(num)
    out = []
    while len(num) >= len(den):
        f = num[0] / den[0]
        out.append(f)
        for i in range(len(den)):
            num[i] -= f * den[i]
        num.pop(0)
    return out, num


def synthesise(zeros, poles, gain, wz):
    d = poly_from_roots(poles)
    n = pscale(poly_from_roots(zeros), gain)
    # F(s) = D(s)D(-s) - N(s)N(-s), even; F / (-s^2) = (s^2 + W^2)^2
    neg = lambda c: [x * (-1) ** (len(c) - 1 - i) for i, x in enumerate(c)]
    mul = lambda a, b: [sum(a[i] * b[j - i] for i in range(len(a)) if 0 <= j - i < len(b)) for j in range(len(a) + len(b) - 1)]
    f = padd(mul(d, neg(d)), pscale(mul(n, neg(n)), -1))
    quot, rem = pdiv(f, [-1, 0, 0])
    w2 = quot[2] / 2  # (s^2 + W^2)^2 = s^4 + 2 W^2 s^2 + W^4
    residue = max(abs(x) for x in rem + [quot[1], quot[3], quot[4] - w2 * w2, quot[0] - 1])
    pp = [mp.mpf(1), 0, w2, 0]
    a = padd(d, pp)  # Y_in numerator
    b = padd(d, pscale(pp, -1))[1:]  # denominator, degree 2
    jz = mp.mpc(0, wz)
    c1 = mp.re(pval(a, jz) / pval(b, jz) / jz)
    num1 = padd(a, pscale(b + [0], -c1))  # A - s C1 B, its leading term cancelled when C1 is all of Y_in's capacitance
    while abs(num1[0]) < mp.mpf(10) ** -40:
        num1 = num1[1:]
    q1, r1 = pdiv(num1, [mp.mpf(1), 0, wz * wz])
    two_k = mp.re(pval(b, jz) / (jz * pval(q1, jz)))
    c2 = 1 / two_k
    l2 = two_k / (wz * wz)
    r_num, r_rem = pdiv(padd(b, pscale(q1 + [0], -two_k)), [mp.mpf(1), 0, wz * wz])
    r0 = r_num[-1]
    c3 = q1[0] / r0
    g_load = q1[1] / r0
    checks = dict(
        reflectionResidue=float(residue),
        zeroShiftRemainder=float(max(abs(x) for x in r1)),
        tankRemainder=float(max(abs(x) for x in r_rem)),
        loadConductanceMinusOne=float(g_load - 1),
    )
    return [c1, l2, c2, c3], checks


def ladder_response(c1, l2, c2, c3, w):
    s = mp.mpc(0, w)
    # ABCD: series Rs = 1, shunt C1, series tank, shunt C3, load 1
    def chain(*ms):
        a = [[1, 0], [0, 1]]
        for m in ms:
            a = [[a[0][0] * m[0][0] + a[0][1] * m[1][0], a[0][0] * m[0][1] + a[0][1] * m[1][1]],
                 [a[1][0] * m[0][0] + a[1][1] * m[1][0], a[1][0] * m[0][1] + a[1][1] * m[1][1]]]
        return a
    z_tank = 1 / (1 / (s * l2) + s * c2)
    t = chain([[1, 1], [0, 1]], [[1, 0], [s * c1, 1]], [[1, z_tank], [0, 1]], [[1, 0], [s * c3, 1]])
    return 1 / (t[0][0] + t[0][1] / 1)


def main():
    zeros, poles, gain, wz, ws = elliptic3()
    elements, checks = synthesise(zeros, poles, gain, wz)
    c1, l2, c2, c3 = elements
    worst = mp.mpf(0)
    for w in [mp.mpf(10) ** (x / mp.mpf(50)) for x in range(-100, 101)]:
        h = gain * mp.fprod([mp.mpc(0, w) - z for z in zeros]) / mp.fprod([mp.mpc(0, w) - p for p in poles]) / 2
        worst = max(worst, abs(ladder_response(c1, l2, c2, c3, w) / h - 1))
    z, p, k = signal.ellipap(N, float(RP), float(AS))
    mine = sorted([complex(x) for x in poles], key=lambda x: (x.real, x.imag))
    theirs = sorted(list(p), key=lambda x: (x.real, x.imag))
    scipy_diff = max(abs(a - b) / abs(b) for a, b in zip(mine, theirs))
    scipy_zero_diff = abs(float(wz) - float(max(np.imag(z)))) / float(wz)
    data = dict(
        source=dict(
            generator="scripts/reference/ladder_elliptic3.py",
            method="mpmath %s at 60 digits: Jacobi elliptic prototype, Darlington synthesis with zero shifting" % mp.__version__,
            crossCheck="%s ellipap(3, 0.5, 40): largest relative pole difference %.3e, zero difference %.3e"
            % ("scipy " + scipy.__version__, scipy_diff, scipy_zero_diff),
            ladderVersusTransfer="largest relative difference of the ladder's ABCD response from H/2 over 1e-2..1e2 rad/s: %.3e" % float(worst),
            checks=checks,
        ),
        order=N,
        rippleDb=float(RP),
        attenuationDb=float(AS),
        form="shunt-first",
        sourceOhms=1.0,
        loadOhms=1.0,
        elements=[
            dict(kind="shunt-C", value=float(c1)),
            dict(kind="series-L", value=float(l2), parallelC=float(c2)),
            dict(kind="shunt-C", value=float(c3)),
        ],
        transmissionZero=float(wz),
        stopbandEdge=float(ws),
    )
    with open(os.path.join(OUT, "ladder-elliptic3.json"), "w") as fh:
        json.dump(data, fh, indent=2)
        fh.write("\n")
    print(json.dumps(data, indent=2))


if __name__ == "__main__":
    main()
