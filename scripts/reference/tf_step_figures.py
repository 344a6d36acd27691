"""Step-response figures of reference lowpass filters, computed in mpmath.

For filters from scipy.signal (buttap, cheb1ap, besselap, ellipap via lp2lp_zpk /
lp2bs_zpk with our own scalings) the exact step response is the residue sum at
the (simple) poles, evaluated with mpmath at 40 digits. Crossings of 10 %, 90 %
and the settling band are located on a fine grid and solved with
mpmath.findroot (bisection on the bracket, anderson); the peak is the root of
the impulse response. Writes test/fixtures/tf-step-figures.json.
"""
import json
import os

import mpmath as mp
import numpy as np
import scipy
from scipy import signal

from _residues import residues

mp.mp.dps = 40


def build(z, p, k):
    z, p, k, res = residues(z, p, k)
    h0 = k
    for zj in z:
        h0 *= -zj
    for pj in p:
        h0 /= -pj
    h0 = mp.re(h0)
    step = lambda t: mp.re(h0 + sum(r / pi * mp.exp(pi * t) for r, pi in zip(res, p))) / h0
    imp = lambda t: mp.re(sum(r * mp.exp(pi * t) for r, pi in zip(res, p))) / h0
    return float(h0), step, imp


def root(f, a, b):
    return mp.findroot(f, (mp.mpf(a), mp.mpf(b)), solver="anderson")


cases = []
specs = [
    ("butter5-lp", signal.buttap(5), ("lp2lp", {"w0": 3.7e3})),
    ("cheb1_4-lp", signal.cheb1ap(4, 0.5), ("lp2lp", {"w0": 2.0})),
    ("bessel8-lp", signal.besselap(8, norm="phase"), ("lp2lp", {"w0": 1.1e5})),
    ("ellip5-lp", signal.ellipap(5, 1.0, 50), ("lp2lp", {"w0": 640.0})),
    ("cheb1_3-bs", signal.cheb1ap(3, 1.0), ("lp2bs", {"w0": 300.0, "bandwidth": 120.0})),
]
for name, (z0, p0, k0), (kind, params) in specs:
    if kind == "lp2lp":
        z, p, k = signal.lp2lp_zpk(z0, p0, k0, wo=params["w0"])
    else:
        z, p, k = signal.lp2bs_zpk(z0, p0, k0, wo=params["w0"], bw=params["bandwidth"])
    final, r, dr = build(z, p, k)
    slow = min(abs(np.real(p)))
    t = np.linspace(0, 40 / slow, 40001)
    y = np.array([float(r(mp.mpf(x))) for x in t])
    band = 0.02

    def first(level):
        if y[0] >= level:
            return 0.0
        i = int(np.argmax(y >= level))
        return float(root(lambda x: r(x) - level, t[i - 1], t[i]))

    t10, t90 = first(0.1), first(0.9)
    i = int(np.argmax(y))
    tp = float(root(dr, t[i - 1], t[i + 1]))
    peak = float(r(mp.mpf(tp)))
    out_band = np.nonzero(np.abs(y - 1) > band)[0]
    last = int(out_band[-1])
    level = 1 + band if y[last] > 1 else 1 - band
    ts = float(root(lambda x: r(x) - level, t[last], t[last + 1]))
    cases.append({
        "name": name, "zeros": [[float(v.real), float(v.imag)] for v in z], "poles": [[float(v.real), float(v.imag)] for v in p],
        "gain": float(k), "finalValue": final, "overshootPercent": (peak - 1) * 100, "peakTimeS": tp,
        "riseTimeS": t90 - t10, "settlingTimeS": ts, "bandPercent": 2,
    })
out = {
    "source": f"scipy {scipy.__version__} scipy.signal (buttap, cheb1ap, besselap, ellipap, lp2lp_zpk, lp2bs_zpk) for the filters; mpmath {mp.__version__} exact residue sums and mpmath.findroot (dps=40) for the figures",
    "cases": cases,
}
path = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures", "tf-step-figures.json")
with open(path, "w") as f:
    json.dump(out, f, indent=1)
print("wrote", path)
