"""Roots of the reverse Bessel polynomials theta_n, n = 1..30, to 50 digits.

theta_n(s) = sum_k a_k s^k, a_k = (2n-k)! / (2^(n-k) k! (n-k)!), with exact
integer coefficients, solved by mpmath.polyroots at mp.dps = 50 with extra
working precision (the roots are ill conditioned: condition ~5e15 at n = 30).
Writes test/fixtures/math-bessel-roots.json.
"""
import json
import os
from math import factorial

import mpmath as mp

mp.mp.dps = 50
out = {
    "source": f"mpmath {mp.__version__} mpmath.polyroots (mp.dps=50, extraprec=800) on exact integer coefficients",
    "description": "roots of reverse Bessel polynomials theta_n(s), descending-power coefficients a_k = (2n-k)!/(2^(n-k) k! (n-k)!); roots as [re, im] strings with 30 significant digits",
    "orders": [],
}
for n in range(1, 31):
    coeffs = [mp.mpf(factorial(2 * n - k) // (2 ** (n - k) * factorial(k) * factorial(n - k))) for k in range(n, -1, -1)]
    roots, err = mp.polyroots(coeffs, maxsteps=2000, extraprec=800, error=True)
    assert err < mp.mpf(10) ** -30, (n, err)
    roots = sorted(roots, key=lambda z: (float(z.real), float(z.imag)))
    out["orders"].append({
        "order": n,
        "coefficients": [str(int(c)) for c in coeffs],
        "roots": [[mp.nstr(z.real, 30), mp.nstr(z.imag, 30)] for z in roots],
        "errorEstimate": mp.nstr(err, 3),
    })
path = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures", "math-bessel-roots.json")
with open(path, "w") as f:
    json.dump(out, f, indent=1)
print("wrote", path)
