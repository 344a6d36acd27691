"""Reference matrix exponentials from scipy.linalg.expm (and mpmath.expm for the stiff case).

Writes test/fixtures/math-expm.json.
"""
import json
import os

import mpmath as mp
import numpy as np
import scipy
from scipy.linalg import expm

mp.mp.dps = 40
rng = np.random.default_rng(7)
cases = []
mats = [
    np.array([[0.0, 1.0], [0.0, 0.0]]),
    np.array([[-1.0, 2.0], [-2.0, -1.0]]),
    rng.normal(size=(5, 5)),
    rng.normal(size=(8, 8)) * 3.0,
    # cascade-like block lower-triangular matrix with widely spread rates
    np.array([[-1e3, 0, 0, 0], [1e3, 0, 50, 0], [0, -50, -20, 0], [0, 1, 0, -0.1]]),
]
for m in mats:
    ref = mp.expm(mp.matrix(m.tolist()))
    cases.append({
        "n": m.shape[0],
        "data": m.flatten().tolist(),
        "expm": [float(ref[i, j]) for i in range(m.shape[0]) for j in range(m.shape[0])],
        "scipy": expm(m).flatten().tolist(),
    })
out = {
    "source": f"mpmath {mp.__version__} mpmath.expm (dps=40) as reference; scipy {scipy.__version__} scipy.linalg.expm alongside",
    "cases": cases,
}
path = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures", "math-expm.json")
with open(path, "w") as f:
    json.dump(out, f, indent=1)
print("wrote", path)
