#!/usr/bin/env python3
"""Reference prototypes for src/approx (filterwright).

Writes
  test/fixtures/approx-prototypes-scipy.json   scipy.signal buttap, cheb1ap, cheb2ap,
                                               ellipap, besselap (each norm)
  test/fixtures/approx-prototypes-mpmath.json  50-digit references: Bessel (each norm,
                                               orders 1-30) and Legendre "optimum L"
                                               (orders 1-20), rounded to double

Legendre reference construction (exact rational arithmetic, then mpmath roots):
odd n = 2k+1: L_n(w^2) = int_{-1}^{2w^2-1} [sum_{i=0}^{k} a_i P_i(x)]^2 dx,
a_i = (2i+1) / (sqrt(2) (k+1))  (A. Papoulis, "Optimum filters with monotonic
response", Proc. IRE 46(3), 1958, pp. 606-609);
even n = 2k+2: L_n(w^2) = int_{-1}^{2w^2-1} (x+1) [sum a_i P_i(x)]^2 dx with
a_i = (2i+1)/sqrt((k+1)(k+2)) on i = 0,2,4,.. (k even) or i = 1,3,5,.. (k odd)
(M. Fukada, "Optimum filters of even orders with monotonic response",
IRE Trans. Circuit Theory CT-6(3), 1959, pp. 277-281).
Run: python3 scripts/reference/approx_prototypes.py
"""
import json
import os
from fractions import Fraction

import mpmath as mp
import numpy as np
import scipy
from scipy import signal

OUT = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures")
SCIPY = f"scipy {scipy.__version__} scipy.signal"


def cl(values):
    return [[float(np.real(v)), float(np.imag(v))] for v in np.atleast_1d(values)]


def scipy_cases():
    cases = []
    for n in range(1, 65):
        z, p, k = signal.buttap(n)
        cases.append(dict(family="butterworth", order=n, zeros=cl(z), poles=cl(p), gain=float(k)))
    for rp in (0.5, 1.0, 3.0):
        for n in range(1, 65):
            z, p, k = signal.cheb1ap(n, rp)
            cases.append(dict(family="chebyshev1", order=n, rippleDb=rp, zeros=cl(z), poles=cl(p), gain=float(k)))
    for rs in (20.0, 50.0, 80.0):
        for n in range(1, 65):
            z, p, k = signal.cheb2ap(n, rs)
            cases.append(dict(family="chebyshev2", order=n, attenuationDb=rs, zeros=cl(z), poles=cl(p), gain=float(k)))
    for rp, rs in ((0.1, 40.0), (0.5, 60.0), (1.0, 80.0), (3.0, 30.0)):
        for n in range(1, 25):
            z, p, k = signal.ellipap(n, rp, rs)
            cases.append(dict(family="elliptic", order=n, rippleDb=rp, attenuationDb=rs, zeros=cl(z), poles=cl(p), gain=float(k)))
    for norm, ours in (("phase", "phase"), ("delay", "delay"), ("mag", "magnitude")):
        for n in range(1, 31):
            z, p, k = signal.besselap(n, norm=norm)
            cases.append(dict(family="bessel", order=n, normalization=ours, zeros=cl(z), poles=cl(p), gain=float(k)))
    return cases


# ---------------------------------------------------------------- mpmath references
mp.mp.dps = 50


def mpc(values):
    return [[float(mp.re(v)), float(mp.im(v))] for v in values]


def lhp_sorted(roots):
    return sorted([r for r in roots if mp.re(r) < 0], key=lambda r: (float(mp.re(r)), float(mp.im(r))))


def bessel_reference(n, norm):
    # reverse Bessel polynomial theta_n(s) = sum a_k s^k, a_k = (2n-k)! / (2^(n-k) k! (n-k)!)
    a = [mp.factorial(2 * n - k) / (mp.mpf(2) ** (n - k) * mp.factorial(k) * mp.factorial(n - k)) for k in range(n + 1)]
    coeffs = list(reversed(a))  # descending for polyroots
    roots = mp.polyroots(coeffs, maxsteps=400, extraprec=400)
    a0 = a[0]
    if norm == "delay":
        return roots, a0
    if norm == "phase":
        f = a0 ** (mp.mpf(-1) / n)
        return [r * f for r in roots], mp.mpf(1)
    # magnitude: find w with |a0 / theta(jw)| = 1/sqrt(2)
    def mag(w):
        v = a0
        for r in roots:
            v /= abs(1j * w - r)
        return v - 1 / mp.sqrt(2)
    w3 = mp.findroot(mag, mp.mpf(1.5) if n > 1 else mp.mpf(1))
    return [r / w3 for r in roots], a0 / w3 ** n


def elliptic_reference(n, rp, rs):
    """Elliptic prototype at 50 digits (same construction, mpmath ellipk/ellipfun/ellipf/jtheta)."""
    eps = mp.sqrt(mp.mpf(10) ** (mp.mpf(rp) / 10) - 1)
    k1 = eps / mp.sqrt(mp.mpf(10) ** (mp.mpf(rs) / 10) - 1)
    K1 = mp.ellipk(k1 ** 2)
    K1p = mp.ellipk(1 - k1 ** 2)
    q = mp.exp(-mp.pi * K1p / (n * K1))
    k = (mp.jtheta(2, 0, q) / mp.jtheta(3, 0, q)) ** 2
    m = k ** 2
    K = mp.ellipk(m)
    # sn(j v K1, k1) = j / eps  <=>  sc(v K1, k1') = 1/eps  <=>  v K1 = F(atan(1/eps) | 1 - k1^2)
    v0 = mp.ellipf(mp.atan(1 / eps), 1 - k1 ** 2) / (K1 * n)
    zeros, poles = [], []
    for i in range(1, n // 2 + 1):
        u = mp.mpf(2 * i - 1) / n
        zeta = mp.ellipfun("cd", u * K, m=m)
        zeros += [1j / (k * zeta), -1j / (k * zeta)]
        p = 1j * mp.ellipfun("cd", (u - 1j * v0) * K, m=m)
        poles += [p, mp.conj(p)]
    if n % 2 == 1:
        poles.append(1j * mp.ellipfun("sn", 1j * v0 * K, m=m))
    gain = mp.re(mp.fprod([-p for p in poles]) / mp.fprod([-z for z in zeros]))
    if n % 2 == 0:
        gain /= mp.sqrt(1 + eps ** 2)
    return zeros, poles, gain


def legendre_poly(i):
    """P_i(x) ascending coefficients as Fractions (Bonnet recursion)."""
    p0, p1 = [Fraction(1)], [Fraction(0), Fraction(1)]
    if i == 0:
        return p0
    for m in range(1, i):
        # (m+1) P_{m+1} = (2m+1) x P_m - m P_{m-1}
        nxt = [Fraction(0)] * (m + 2)
        for j, c in enumerate(p1):
            nxt[j + 1] += Fraction(2 * m + 1, m + 1) * c
        for j, c in enumerate(p0):
            nxt[j] -= Fraction(m, m + 1) * c
        p0, p1 = p1, nxt
    return p1


def pmul(a, b):
    out = [Fraction(0)] * (len(a) + len(b) - 1)
    for i, x in enumerate(a):
        for j, y in enumerate(b):
            out[i + j] += x * y
    return out


def legendre_L(n):
    """Coefficients (ascending, Fractions) of L_n(u), u = w^2, L_n(0)=0, L_n(1)=1."""
    if n % 2 == 1:
        k = (n - 1) // 2
        idx = range(0, k + 1)
        scale2 = Fraction(1, 2 * (k + 1) ** 2)  # a0^2
        weight = [Fraction(1)]
    else:
        k = (n - 2) // 2
        idx = range(0 if k % 2 == 0 else 1, k + 1, 2)
        scale2 = Fraction(1, (k + 1) * (k + 2))
        weight = [Fraction(1), Fraction(1)]  # (x + 1)
    v = [Fraction(0)]
    for i in idx:
        pi = legendre_poly(i)
        term = [Fraction(2 * i + 1) * c for c in pi]
        v = [x + y for x, y in zip(v + [Fraction(0)] * (len(term) - len(v)), term + [Fraction(0)] * (len(v) - len(term)))]
    integrand = [scale2 * c for c in pmul(pmul(v, v), weight)]
    # antiderivative F(x) with F(-1) = 0
    F = [Fraction(0)] + [c / (j + 1) for j, c in enumerate(integrand)]
    F0 = sum(c * (-1) ** j for j, c in enumerate(F))
    F[0] -= F0
    # substitute x = 2u - 1
    out = [Fraction(0)]
    powx = [Fraction(1)]
    for j, c in enumerate(F):
        if j > 0:
            powx = pmul(powx, [Fraction(-1), Fraction(2)])
        out = [x + y for x, y in zip(out + [Fraction(0)] * (len(powx) - len(out)), [c * t for t in powx] + [Fraction(0)] * (len(out) - len(powx)))]
    while len(out) > 1 and out[-1] == 0:
        out.pop()
    return out


def legendre_reference(n):
    L = legendre_L(n)
    assert L[0] == 0 and sum(L) == 1, (n, L)
    # 1 + L_n(u) = 0 in u, then s = +-sqrt(-u), keep Re s < 0
    c = [mp.mpf(x.numerator) / x.denominator for x in L]
    c[0] += 1
    us = mp.polyroots(list(reversed(c)), maxsteps=400, extraprec=400)
    poles = []
    for u in us:
        s = mp.sqrt(-u)
        poles.append(-s if mp.re(s) > 0 else s)
    gain = mp.re(mp.fprod([-p for p in poles]))
    return poles, gain, L


def main():
    # memory check of the construction: Papoulis' first polynomials
    assert legendre_L(3) == [0, 1, -3, 3], legendre_L(3)
    assert legendre_L(4) == [0, 0, 3, -8, 6], legendre_L(4)
    assert legendre_L(5) == [0, 1, -8, 28, -40, 20], legendre_L(5)
    scipy_data = {
        "source": f"{SCIPY}.buttap, cheb1ap, cheb2ap, ellipap, besselap (norm 'phase', 'delay', 'mag' -> ours 'magnitude')",
        "generatedBy": "scripts/reference/approx_prototypes.py; do not edit",
        "cases": scipy_cases(),
    }
    with open(os.path.join(OUT, "approx-prototypes-scipy.json"), "w") as f:
        json.dump(scipy_data, f, separators=(",", ":"))
    ref = []
    for norm in ("delay", "phase", "magnitude"):
        for n in range(1, 31):
            poles, gain = bessel_reference(n, norm)
            ref.append(dict(family="bessel", order=n, normalization=norm, zeros=[], poles=mpc(poles), gain=float(gain)))
    for rp, rs in ((0.1, 40.0), (0.5, 60.0), (1.0, 80.0), (3.0, 30.0)):
        for n in range(1, 25):
            zeros, poles, gain = elliptic_reference(n, rp, rs)
            ref.append(dict(family="elliptic", order=n, rippleDb=rp, attenuationDb=rs,
                            zeros=mpc(zeros), poles=mpc(poles), gain=float(gain)))
    for n in range(1, 21):
        poles, gain, L = legendre_reference(n)
        ref.append(dict(
            family="legendre", order=n, zeros=[], poles=mpc(poles), gain=float(gain),
            lCoefficients=[str(x) for x in L],
        ))
    mp_data = {
        "source": f"mpmath {mp.__version__} at 50 digits: polyroots of the reverse Bessel polynomial "
                  "(norm as scipy.signal.besselap); elliptic prototypes by mpmath ellipk/ellipfun/jtheta "
                  "(same construction as scipy.signal.ellipap); Legendre optimum-L polynomials built in exact rational "
                  "arithmetic (Papoulis 1958 odd orders, Fukada 1959 even orders), roots by polyroots",
        "generatedBy": "scripts/reference/approx_prototypes.py; do not edit",
        "cases": ref,
    }
    with open(os.path.join(OUT, "approx-prototypes-mpmath.json"), "w") as f:
        json.dump(mp_data, f, separators=(",", ":"))


if __name__ == "__main__":
    main()
