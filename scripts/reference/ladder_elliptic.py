#!/usr/bin/env python3
"""Elliptic LC ladders for the tests of src/ladder/active (filterwright).

Writes
  test/fixtures/ladder-elliptic.json   normalised doubly terminated elliptic
                                       lowpass ladders (odd orders 3 and 5,
                                       1-ohm terminations), series inductors
                                       first, each transmission zero made by a
                                       series resonator in a shunt arm, with
                                       the transfer V(load) / V(source emf)

Method, in 60-digit mpmath arithmetic:
1. The elliptic prototype by Jacobi elliptic functions, with the formulas of
   scipy.signal.ellipap (degree equation by the nome series, zeros
   j / (sqrt(m) sn(i K / n, m)), poles from v0 = K F(atan(1/eps) | 1 - m1) /
   (n K1)); checked against scipy.signal.ellipap to 1e-12. Those formulas
   follow M. D. Lutovac, D. V. Tosic, B. L. Evans, "Filter Design for Signal
   Processing Using MATLAB and Mathematica", Prentice Hall 2001.
2. Darlington synthesis: S21 = H_elliptic (so V_L / V_S = H / 2), the
   reflection polynomial F from E(s) E(-s) - k^2 N(s) N(-s) = F(s) F(-s)
   (its roots j sn(i K / n, m), i = 0, 2, ..., n - 1, the zeros of the
   elliptic rational function; the identity is checked), the input
   impedance Z = (E + F) / (E - F), and for each transmission zero w_z in
   turn, from the highest down, the partial removal of a series inductor L = Z(j w_z) / (j w_z)
   (zero shifting), then the removal of the shunt series resonator from the
   admittance's pole at j w_z, and finally a series inductor and the load
   (G. C. Temes & S. K. Mitra (eds.), "Modern Filter Theory and Design",
   Wiley 1973, ch. 3; H. J. Orchard & G. C. Temes, "Filter design using
   transformed variables", IEEE Trans. Circuit Theory 15(4), 1968).
3. The ladder's response by chained ABCD matrices is checked against H / 2
   to 1e-30 at 40 frequencies.
Run: python3 scripts/reference/ladder_elliptic.py
"""
import json
import os

import mpmath as mp
import numpy as np
import scipy
from scipy import signal

mp.mp.dps = 60
OUT = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures")


def ellipdeg(n, m1):
    """Solve the degree equation n K'(m1)/K(m1) = K'(m)/K(m) for m by the nome series."""
    k1 = mp.ellipk(m1)
    k1p = mp.ellipk(1 - m1)
    q1 = mp.exp(-mp.pi * k1p / k1)
    q = q1 ** (mp.mpf(1) / n)
    num = mp.nsum(lambda i: q ** (i * (i + 1)), [0, mp.inf])
    den = 1 + 2 * mp.nsum(lambda i: q ** (i * i), [1, mp.inf])
    return 16 * q * (num / den) ** 4


def elliptic(n, rp, rs):
    eps = mp.sqrt(mp.power(10, mp.mpf(rp) / 10) - 1)
    ck1 = eps / mp.sqrt(mp.power(10, mp.mpf(rs) / 10) - 1)
    m1 = ck1 ** 2
    m = ellipdeg(n, m1)
    capk = mp.ellipk(m)
    js = list(range(1 - n % 2, n, 2))
    sn = [mp.ellipfun("sn", j * capk / n, m=m) for j in js]
    cn = [mp.ellipfun("cn", j * capk / n, m=m) for j in js]
    dn = [mp.ellipfun("dn", j * capk / n, m=m) for j in js]
    zeros = []
    for s in sn:
        if abs(s) > mp.mpf(10) ** -40:
            w = 1 / (mp.sqrt(m) * s)
            zeros += [mp.mpc(0, w), mp.mpc(0, -w)]
    r = mp.ellipf(mp.atan(1 / eps), 1 - m1)
    v0 = capk * r / (n * mp.ellipk(m1))
    sv = mp.ellipfun("sn", v0, m=1 - m)
    cv = mp.ellipfun("cn", v0, m=1 - m)
    dv = mp.ellipfun("dn", v0, m=1 - m)
    poles = []
    for s, c, d in zip(sn, cn, dn):
        p = -(c * d * sv * cv + 1j * s * dv) / (1 - (d * sv) ** 2)
        poles.append(p)
        if abs(p.imag) > mp.mpf(10) ** -40:
            poles.append(mp.conj(p))
    k = mp.re(mp.fprod([-p for p in poles]) / mp.fprod([-z for z in zeros]))
    reflection = []
    for s in sn:
        reflection += [mp.mpc(0, s)] if abs(s) < mp.mpf(10) ** -40 else [mp.mpc(0, s), mp.mpc(0, -s)]
    return zeros, poles, k, reflection


def poly(roots):
    """Monic polynomial, ascending real coefficients."""
    c = [mp.mpc(1)]
    for r in roots:
        nxt = [mp.mpc(0)] * (len(c) + 1)
        for i, a in enumerate(c):
            nxt[i] -= r * a
            nxt[i + 1] += a
        c = nxt
    return [mp.re(x) for x in c]


def padd(a, b, sb=1):
    n = max(len(a), len(b))
    return [(a[i] if i < len(a) else 0) + sb * (b[i] if i < len(b) else 0) for i in range(n)]


def pmul(a, b):
    out = [mp.mpf(0)] * (len(a) + len(b) - 1)
    for i, x in enumerate(a):
        for j, y in enumerate(b):
            out[i + j] += x * y
    return out


def mirror(a):
    return [x * (-1) ** i for i, x in enumerate(a)]


def peval(a, s):
    return mp.fsum(x * s ** i for i, x in enumerate(a))


def trim(a):
    big = max(abs(x) for x in a)
    while len(a) > 1 and abs(a[-1]) < big * mp.mpf(10) ** -45:
        a = a[:-1]
    return a


def pdiv(a, b):
    """Quotient of a by b, asserting a zero remainder."""
    a = list(a)
    q = [mp.mpf(0)] * (len(a) - len(b) + 1)
    for i in range(len(q) - 1, -1, -1):
        q[i] = a[i + len(b) - 1] / b[-1]
        for j, y in enumerate(b):
            a[i + j] -= q[i] * y
    rem = max(abs(x) for x in a[: len(b) - 1]) if len(b) > 1 else 0
    assert rem < mp.mpf(10) ** -25 * max(1, max(abs(x) for x in q)), f"remainder {rem}"
    return q


def synthesise(zeros, poles, k, reflection, order_of_zeros):
    e = poly(poles)
    f = poly(reflection)
    nn = poly(zeros)
    # E E* - k^2 N N* = F F*
    lhs = padd(pmul(e, mirror(e)), [k * k * x for x in pmul(nn, mirror(nn))], -1)
    rhs = pmul(f, mirror(f))
    assert max(abs(x) for x in padd(lhs, rhs, -1)) < mp.mpf(10) ** -45, "Feldtkeller identity"
    num, den = trim(padd(e, f)), trim(padd(e, f, -1))
    elements = []
    for wz in order_of_zeros:
        s = mp.mpc(0, wz)
        big = peval(num, s) / peval(den, s)
        assert abs(mp.re(big)) < mp.mpf(10) ** -25, f"input impedance not reactive at the zero: {big}"
        ell = mp.re(big / s)
        quad = [wz * wz, 0, 1]
        # Z - s L vanishes at +-j wz: its numerator is (s^2 + wz^2) P
        p = pdiv(padd(num, pmul([0, ell], den), -1), quad)
        # Y = den / ((s^2 + wz^2) P) has a pole at j wz; the arm's admittance is 2 K s / (s^2 + wz^2)
        kk = mp.re(peval(den, s) / (peval(p, s) * 2 * s))
        lsh = 1 / (2 * kk)
        csh = 1 / (lsh * wz * wz)
        # Y - 2K s / (s^2 + wz^2) = (den - 2K s P) / ((s^2 + wz^2) P); that numerator vanishes at +-j wz
        rest = pdiv(padd(den, pmul([0, 2 * kk], p), -1), quad)
        num, den = p, rest  # Z = P / rest
        elements.append(dict(kind="series-L", value=ell))
        elements.append(dict(kind="shunt-C", value=csh, seriesL=lsh))
    # what is left: Z = s L + R_L
    num, den = trim(num), trim(den)
    assert len(den) == 1 and len(num) == 2, "remainder is not s L + R"
    elements.append(dict(kind="series-L", value=num[1] / den[0]))
    load = num[0] / den[0]
    return elements, load


def abcd_response(elements, load, w):
    s = mp.mpc(0, w)
    a, b, c, d = mp.mpc(1), mp.mpc(0), mp.mpc(0), mp.mpc(1)
    for el in elements:
        if el["kind"] == "series-L":
            z = s * el["value"]
            a, b, c, d = a, a * z + b, c, c * z + d
        else:
            y = 1 / (1 / (s * el["value"]) + s * el["seriesL"])
            a, b, c, d = a + b * y, b, c + d * y, d
    return 1 / (a + b / load + (c + d / load))


def hval(zeros, poles, k, w):
    s = mp.mpc(0, w)
    return k * mp.fprod([s - z for z in zeros]) / mp.fprod([s - p for p in poles])


def case(n, rp, rs):
    zeros, poles, k, reflection = elliptic(n, rp, rs)
    zs, ps, ks = signal.ellipap(n, rp, rs)
    assert np.allclose(sorted(np.abs(zs)), sorted(float(abs(z)) for z in zeros), rtol=1e-12)
    assert np.allclose(sorted(np.abs(ps)), sorted(float(abs(p)) for p in poles), rtol=1e-12)
    assert abs(ks - float(k)) < 1e-12 * abs(ks)
    wz = sorted((mp.im(z) for z in zeros if mp.im(z) > 0), key=float)
    # the order of extraction (the one that keeps every element positive here)
    order = wz[::-1]
    elements, load = synthesise(zeros, poles, k, reflection, order)
    assert abs(load - 1) < mp.mpf(10) ** -25, f"load {load}"
    for el in elements:
        assert el["value"] > 0 and el.get("seriesL", 1) > 0, f"negative element {el}"
    worst = max(abs(abcd_response(elements, load, w) / (hval(zeros, poles, k, w) / 2) - 1) for w in mp.linspace(mp.mpf("0.01"), 10, 40))
    assert worst < mp.mpf(10) ** -30, f"ladder response off by {worst}"
    dump = [
        {key: (float(v) if not isinstance(v, str) else v) for key, v in el.items()}
        for el in elements
    ]
    return dict(
        order=n, rippleDb=rp, attenuationDb=rs, form="series-first", sourceOhms=1.0, loadOhms=1.0,
        elements=dump,
        transfer=dict(
            zeros=[[float(mp.re(z)), float(mp.im(z))] for z in zeros],
            poles=[[float(mp.re(p)), float(mp.im(p)) if abs(mp.im(p)) > mp.mpf(10) ** -40 else 0.0] for p in poles],
            gain=float(k / 2),
        ),
        check=f"ladder response equals H/2 to {mp.nstr(worst, 3)} relative (40 points, 0.01-10 rad/s)",
    )


def main():
    cases = [case(3, 0.5, 30.0), case(5, 0.1, 50.0)]
    data = dict(
        source=(
            f"mpmath {mp.__version__} (60 digits): elliptic prototype by Jacobi elliptic functions, "
            f"checked against scipy {scipy.__version__} scipy.signal.ellipap; Darlington synthesis with "
            "zero shifting (scripts/reference/ladder_elliptic.py)"
        ),
        ladders=cases,
    )
    path = os.path.join(OUT, "ladder-elliptic.json")
    with open(path, "w") as fh:
        json.dump(data, fh, indent=1)
        fh.write("\n")
    print("wrote", path)


if __name__ == "__main__":
    main()
