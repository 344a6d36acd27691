"""Reference values for src/math/polynomial.ts and src/math/roots.ts from numpy and mpmath.

Writes test/fixtures/math-polynomial.json: products, sums, derivatives and
values (numpy.polymul / polyadd / polyder / polyval), monic polynomials from
roots (numpy.poly), and roots of fixed test polynomials computed by
mpmath.polyroots at 40 digits on the same double coefficients.
"""
import json
import os

import mpmath as mp
import numpy as np

mp.mp.dps = 40
rng = np.random.default_rng(20261201)


def c(z):
    return [float(np.real(z)), float(np.imag(z))]


cases = []
for deg_a, deg_b in [(0, 0), (1, 2), (3, 4), (6, 5), (9, 2)]:
    a = rng.normal(size=deg_a + 1).round(6)
    b = rng.normal(size=deg_b + 1).round(6)
    z = complex(rng.normal(), rng.normal())
    x = float(rng.normal())
    cases.append({
        "a": a.tolist(), "b": b.tolist(),
        "mul": np.polymul(a, b).tolist(),
        "add": np.polyadd(a, b).tolist(),
        "derA": np.polyder(a).tolist() if deg_a > 0 else [0.0],
        "z": c(z), "evalA": c(np.polyval(a, z)),
        "x": x, "evalRealB": float(np.polyval(b, x)),
    })

from_roots = []
for roots in [
    [complex(-1, 1), complex(-1, -1), -2],
    [complex(-0.3, 2.5), complex(-0.3, -2.5), complex(-1.2, 0.4), complex(-1.2, -0.4), -0.7, 3.0],
    [0.5, 0.5, -4.0],
]:
    from_roots.append({"roots": [c(r) for r in roots], "coeffs": np.real(np.poly(roots)).tolist()})

root_cases = []
for coeffs in [
    [1.0, -6.0, 11.0, -6.0],
    [1.0, 0.0, 0.0, 0.0, 0.0, 1.0],
    [2.5, -1.0, 0.25, 3.0, -7.0, 1.0, 0.5],
    [1.0, 3.2, 7.1, 9.6, 8.3, 4.4, 1.3],
    [1e-3, 1.0, 1e3],
    [1.0, 0.0, 1e-6],
    rng.normal(size=16).round(8).tolist(),
    rng.normal(size=26).round(8).tolist(),
]:
    r = mp.polyroots([mp.mpf(v) for v in coeffs], maxsteps=2000, extraprec=400)
    root_cases.append({"coeffs": coeffs, "roots": [[float(z.real), float(z.imag)] for z in (mp.mpc(z) for z in r)]})

out = {
    "source": f"numpy {np.__version__} (numpy.polymul, polyadd, polyder, polyval, poly); mpmath {mp.__version__} mpmath.polyroots (dps=40) for roots",
    "arithmetic": cases,
    "fromRoots": from_roots,
    "roots": root_cases,
}
path = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures", "math-polynomial.json")
with open(path, "w") as f:
    json.dump(out, f, indent=1)
print("wrote", path)
