"""Element values of doubly terminated lowpass LC ladders, synthesised in
mpmath at 60 digits from the families' own characteristic functions.

Independent of the TypeScript synthesis in where the reflection polynomial F
comes from: here F is written down from the characteristic function
K = F/N of each family (Butterworth s^n, Chebyshev I eps T_n(s/j),
Chebyshev II s^n, elliptic eps R_n with the Cauer rational function
R_n(w) = C w prod (w^2 - sn^2(2iK/n, k)) / (1 - k^2 sn^2(2iK/n, k) w^2),
k from the degree equation by nomes, q(k) = q(k1)^(1/n)), or for Bessel by
spectral factorisation of |E|^2 - |N|^2 with the exact integer coefficients
of the reverse Bessel polynomial. E is the Hurwitz factor of |F|^2 + |N|^2.
The ladder is then extracted from Z = (E + F) / (E - F) (series-first) by
continued fractions, with zero shifting (partial removal of the pole at
infinity, then full removal of the resonant arm) for finite transmission
zeros, trying the zero orders in the same sequence as src/ladder (lowest zero
in the middle, ascending, descending, then all permutations) until every
element is positive. References: S. Darlington (1939), V. Belevitch,
"Classical Network Theory" (1968), G. C. Temes and S. K. Mitra (eds.),
"Modern Filter Theory and Design" (1973); R. W. Daniels, "Approximation
Methods for Electronic Filter Design" (1974), ch. 5 (the elliptic rational
function).
Writes test/fixtures/ladder-synthesis-mpmath.json.
"""
import itertools
import json
import os
from math import factorial

import mpmath as mp

mp.mp.dps = 60


def pmul(a, b):
    out = [mp.mpf(0)] * (len(a) + len(b) - 1)
    for i, x in enumerate(a):
        for j, y in enumerate(b):
            out[i + j] += x * y
    return out


def padd(a, b):
    n = max(len(a), len(b))
    a = [mp.mpf(0)] * (n - len(a)) + list(a)
    b = [mp.mpf(0)] * (n - len(b)) + list(b)
    return [x + y for x, y in zip(a, b)]


def pscale(a, k):
    return [x * k for x in a]


def peval(p, z):
    acc = mp.mpc(0)
    for c in p:
        acc = acc * z + c
    return acc


def trim(p):
    i = 0
    while i < len(p) - 1 and abs(p[i]) < mp.mpf(10) ** -45 * max(abs(c) for c in p):
        i += 1
    return p[i:]


def from_x_roots_left(xroots):
    """Monic product of (s - sigma), sigma the left-half-plane root of s^2 = -x."""
    p = [mp.mpf(1)]
    for x in xroots:
        sigma = mp.sqrt(-x)
        if mp.re(sigma) > 0:
            sigma = -sigma
        p = pmul(p, [mp.mpc(1), -sigma])
    return [mp.re(c) for c in p]


def mirror_x(p):
    """p(s) p(-s) written in x = -s^2, descending."""
    n = len(p) - 1
    pm = [c * (-1) ** (n - i) for i, c in enumerate(p)]
    q = pmul(p, pm)
    return [q[2 * n - 2 * k] * (-1) ** k for k in range(n, -1, -1)]


def hurwitz(f, n_poly):
    q = padd(mirror_x(f), mirror_x(n_poly))
    roots = mp.polyroots(q, maxsteps=500, extraprec=400)
    return from_x_roots_left(roots)


def div_quadratic(a, c):
    r = list(a)
    q = []
    for i in range(len(r) - 2):
        q.append(r[i])
        r[i + 2] -= r[i] * c
    return q, r[-2:]


def extract(a, b, zeros, arms):
    num, den = trim(a), trim(b)
    out = []
    z = 0
    while len(out) < arms:
        if z < len(zeros) and len(out) + 2 <= arms:
            wz = zeros[z]
            w = peval(num, mp.mpc(0, wz)) / peval(den, mp.mpc(0, wz))
            k = mp.im(w) / wz
            shifted = padd(num, pscale(den + [mp.mpf(0)], -k))
            q, _ = div_quadratic(trim(shifted), wz * wz)
            two_k = mp.re(peval(den, mp.mpc(0, wz)) / peval(q + [mp.mpf(0)], mp.mpc(0, wz)))
            rest = padd(den, pscale(q + [mp.mpf(0)], -two_k))
            q2, _ = div_quadratic(trim(rest), wz * wz)
            tank = two_k / (wz * wz)
            comp = 1 / two_k
            if not (k > 0 and tank > 0 and comp > 0):
                return None
            out.append((k, None))
            out.append((tank, comp))
            num, den = q, trim(q2)
            z += 1
            continue
        value = num[0] / den[0]
        if not value > 0:
            return None
        rest = padd(num, pscale(den + [mp.mpf(0)], -value))[1:]
        out.append((value, None))
        if len(out) == arms:
            t = rest[-1] / den[-1]
            return out, t
        num, den = den, rest[1:]
    return None


def zero_orders(zs):
    asc = sorted(zs)
    middle = []
    for i, z in enumerate(asc):
        if i % 2 == 0:
            middle.append(z)
        else:
            middle.insert(0, z)
    seen, out = set(), []
    for o in [middle, asc, asc[::-1]] + [list(p) for p in itertools.permutations(asc)]:
        key = tuple(o)
        if key not in seen:
            seen.add(key)
            out.append(o)
    return out


def ladder(e, f, n_poly, zeros, order):
    a = padd(e, f)
    b = padd(e, pscale(f, -1))[1:]
    for order_z in zero_orders(zeros):
        res = extract(a, b, order_z, order)
        if res is not None:
            arms, t = res
            return arms, t, order_z
    raise RuntimeError("no positive ladder")


def eps_of(db):
    return mp.sqrt(mp.power(10, mp.mpf(db) / 10) - 1)


def butterworth_case(n):
    x = [-(mp.expjpi(mp.mpf(2 * k + n - 1) / (2 * n))) ** 2 for k in range(1, n + 1)]
    e = from_x_roots_left(x)
    f = [mp.mpf(1)] + [mp.mpf(0)] * n
    return e, f, [mp.mpf(1)], []


def chebyshev1_case(n, ripple):
    eps = eps_of(ripple)
    # T_n(w) with w = s / j: eps T_n gives F(s) = eps 2^(n-1) prod (s - j cos theta_k), monic after scaling
    f = [mp.mpf(1)]
    for k in range(1, n + 1):
        c = mp.cos((2 * k - 1) * mp.pi / (2 * n))
        f = pmul(f, [mp.mpc(1), mp.mpc(0, -c)])
    f = [mp.re(c) for c in f]
    lead = eps * 2 ** (n - 1)
    n_poly = [1 / lead]  # |S21|^2 = 1 / (1 + eps^2 T^2), F and N both divided by eps 2^(n-1)
    e = hurwitz(f, n_poly)
    return e, f, n_poly, []


def chebyshev2_case(n, atten):
    d = 1 / eps_of(atten)
    # |S21|^2 = d^2 T_n(1/w)^2 / (1 + d^2 T_n(1/w)^2); with u = 1/w: K = F/N = 1 / (d T_n(1/w)),
    # N(s) ~ s^n T_n(1/w) scaled, F ~ s^n
    zeros = [1 / mp.cos((2 * k - 1) * mp.pi / (2 * n)) for k in range(1, n // 2 + 1)]
    # w^n T_n(1/w) = 2^(n-1) prod (1 - w^2 cos^2) over pairs, times (for odd n) the root at w = 0 of T_n(1/w) w^n ... constant
    n_poly = [mp.mpf(1)]
    for z in zeros:
        n_poly = pmul(n_poly, [mp.mpf(1), mp.mpf(0), z * z])
    # |N(jw)|^2 = d^2 (w^n T_n(1/w))^2; w^n T_n(1/w) = 2^(n-1) prod_k (1 - w^2 c_k^2) (odd n: times c for the middle factor) ...
    # evaluate the scale at w = 1, where T_n(1) = 1: |N(j)|^2 = d^2
    scale = d / abs(peval(n_poly, mp.mpc(0, 1)))
    n_poly = pscale(n_poly, scale)
    f = [mp.mpf(1)] + [mp.mpf(0)] * n
    e = hurwitz(f, n_poly)
    return e, f, n_poly, zeros


def elliptic_case(n, ripple, atten):
    assert n % 2 == 1
    eps = eps_of(ripple)
    k1 = eps / eps_of(atten)
    q1 = mp.qfrom(m=k1 * k1)
    m = mp.mfrom(q=q1 ** (mp.mpf(1) / n))
    k = mp.sqrt(m)
    kk = mp.ellipk(m)
    wr = [mp.ellipfun("sn", 2 * i * kk / n, m=m) for i in range(1, (n - 1) // 2 + 1)]
    num = [mp.mpf(1), mp.mpf(0)]  # w
    den = [mp.mpf(1)]
    for w in wr:
        num = pmul(num, [mp.mpf(1), mp.mpf(0), -w * w])
        den = pmul(den, [-k * k * w * w, mp.mpf(0), mp.mpf(1)])
    c = peval(den, 1) / peval(num, 1)
    # check the degree equation: R_n(1/k) = 1/k1
    rk = c * peval(num, 1 / k) / peval(den, 1 / k)
    assert abs(rk * k1 - 1) < mp.mpf(10) ** -40, rk * k1
    # in s = j w: F(s) ~ eps c s prod (s^2 + w_i^2); N(s) ~ prod (1 + k^2 w_i^2 s^2)
    f = [mp.mpf(1), mp.mpf(0)]
    for w in wr:
        f = pmul(f, [mp.mpf(1), mp.mpf(0), w * w])
    lead_f = eps * c
    n_poly = [mp.mpf(1)]
    for w in wr:
        n_poly = pmul(n_poly, [k * k * w * w, mp.mpf(0), mp.mpf(1)])
    n_poly = pscale(n_poly, 1 / lead_f)
    zeros = [1 / (k * w) for w in wr]
    e = hurwitz(f, n_poly)
    return e, f, n_poly, zeros


def bessel_case(n):
    coeffs = [mp.mpf(factorial(2 * n - j) // (2 ** (n - j) * factorial(j) * factorial(n - j))) for j in range(n, -1, -1)]
    e = coeffs  # monic, theta_n(0) = coeffs[-1]
    n_poly = [coeffs[-1]]
    p = padd(mirror_x(e), pscale(mirror_x(n_poly), -1))
    assert p[-1] == 0
    roots = mp.polyroots(p[:-1], maxsteps=500, extraprec=400)
    f = pmul(from_x_roots_left(roots), [mp.mpf(1), mp.mpf(0)])
    return e, f, n_poly, []


cases = []
for n in range(2, 13):
    cases.append(({"family": "butterworth", "order": n}, butterworth_case(n)))
for n in (3, 6, 9, 12):
    cases.append(({"family": "chebyshev1", "order": n, "rippleDb": 0.5}, chebyshev1_case(n, 0.5)))
for n in (3, 5, 7, 9, 11):
    cases.append(({"family": "chebyshev2", "order": n, "attenuationDb": 120}, chebyshev2_case(n, 120)))
for n in (3, 5, 7, 9, 11):
    cases.append(({"family": "elliptic", "order": n, "rippleDb": 0.5, "attenuationDb": 60}, elliptic_case(n, 0.5, 60)))
for n in range(2, 13):
    cases.append(({"family": "bessel", "order": n, "normalization": "delay"}, bessel_case(n)))

out = {
    "source": f"mpmath {mp.__version__} at mp.dps = 60: characteristic functions of the families, Hurwitz factor by mpmath.polyroots, continued-fraction extraction with zero shifting (scripts/reference/ladder_synthesis.py)",
    "description": "series-first ladders between equal terminations (Chebyshev I even orders: the load its ripple needs), source 1 ohm; each element [value, companion or null] as 25-digit strings; loadRatio = R_load / R_source; zeroOrder = the finite transmission zeros (rad/s) along the ladder",
    "cases": [],
}
for spec, (e, f, n_poly, zeros) in cases:
    order = spec["order"]
    arms, t, zorder = ladder(e, f, n_poly, zeros, order)
    last_series = (order - 1) % 2 == 0
    load = t if last_series else 1 / t
    out["cases"].append({
        "spec": spec,
        "elements": [[mp.nstr(v, 25), None if c is None else mp.nstr(c, 25)] for v, c in arms],
        "loadRatio": mp.nstr(load, 25),
        "zeroOrder": [mp.nstr(z, 25) for z in zorder],
    })
path = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures", "ladder-synthesis-mpmath.json")
with open(path, "w") as fh:
    json.dump(out, fh, indent=1)
print("wrote", path)
