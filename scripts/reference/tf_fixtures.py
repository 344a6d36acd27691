"""Reference responses and transforms for src/tf from scipy.signal (and mpmath).

Writes test/fixtures/tf-filters.json. For a set of filters of our own choosing
(prototype from scipy.signal.buttap / cheb1ap / cheb2ap / ellipap / besselap,
then one of lp2lp_zpk / lp2hp_zpk / lp2bp_zpk / lp2bs_zpk with fixed scalings):
  - the prototype and transformed zpk (scipy.signal.lp2*_zpk),
  - freqs_zpk on a stored log grid: complex H, |H| in dB, np.unwrap(np.angle(H)),
  - group delay: mpmath.diff of arg H(jw) at 40 digits (independent of our formula),
  - step and impulse responses on a uniform time grid: exact residue sums in
    mpmath (simple poles) and, for cross-checking, scipy.signal.step / impulse.
Plus systems with repeated poles whose step response is known in closed form.
"""
import json
import os

import mpmath as mp
import numpy as np
import scipy
from scipy import signal

from _residues import residues

mp.mp.dps = 40
SCIPY = f"scipy {scipy.__version__}"


def cl(values):
    return [[float(np.real(v)), float(np.imag(v))] for v in values]


def h_mp(z, p, k, s):
    v = mp.mpf(k)
    for zi in z:
        v *= s - mp.mpc(zi)
    for pi in p:
        v /= s - mp.mpc(pi)
    return v


def group_delay_mp(z, p, k, w):
    # -d/dw arg H(jw), by mpmath numerical differentiation of the log's imaginary part
    f = lambda x: mp.im(mp.log(h_mp(z, p, k, mp.mpc(0, x))))
    return float(-mp.diff(f, mp.mpf(w)))


def time_mp(z, p, k, t):
    """Exact step and impulse (regular part) responses by residues; simple poles only."""
    z, p, k, res = residues(z, p, k)
    h0 = h_mp(z, p, k, mp.mpf(0))
    step, imp = [], []
    for tv in t:
        tv = mp.mpf(tv)
        y = h0 + sum(r / pi * mp.exp(pi * tv) for r, pi in zip(res, p))
        g = sum(r * mp.exp(pi * tv) for r, pi in zip(res, p))
        step.append(float(mp.re(y)))
        imp.append(float(mp.re(g)))
    return step, imp


PROTOS = {
    "butter5": (lambda: signal.buttap(5), "scipy.signal.buttap(5)"),
    "cheb1_4": (lambda: signal.cheb1ap(4, 0.5), "scipy.signal.cheb1ap(4, rp=0.5)"),
    "cheb2_3": (lambda: signal.cheb2ap(3, 40), "scipy.signal.cheb2ap(3, rs=40)"),
    "ellip6": (lambda: signal.ellipap(6, 0.5, 60), "scipy.signal.ellipap(6, rp=0.5, rs=60)"),
    "ellip5": (lambda: signal.ellipap(5, 1.0, 50), "scipy.signal.ellipap(5, rp=1, rs=50)"),
    "bessel8": (lambda: signal.besselap(8, norm="phase"), "scipy.signal.besselap(8, norm='phase')"),
}

CASES = [
    # name, prototype, transform, params
    ("butter5-lp", "butter5", "lp2lp", {"w0": 3.7e3}),
    ("cheb1_4-hp", "cheb1_4", "lp2hp", {"w0": 1.3e4}),
    ("ellip6-bp", "ellip6", "lp2bp", {"w0": 2.2e3, "bandwidth": 800.0}),
    ("ellip5-bp", "ellip5", "lp2bp", {"w0": 1.0e3, "bandwidth": 300.0}),
    ("bessel8-lp", "bessel8", "lp2lp", {"w0": 1.1e5}),
    ("bessel8-bs", "bessel8", "lp2bs", {"w0": 5.0e2, "bandwidth": 150.0}),
    ("cheb2_3-lp", "cheb2_3", "lp2lp", {"w0": 0.35}),
    ("ellip6-bs", "ellip6", "lp2bs", {"w0": 6.0e4, "bandwidth": 2.5e4}),
    ("cheb1_4-lp", "cheb1_4", "lp2lp", {"w0": 2.0}),
]


def transform(kind, z, p, k, params):
    if kind == "lp2lp":
        return signal.lp2lp_zpk(z, p, k, wo=params["w0"])
    if kind == "lp2hp":
        return signal.lp2hp_zpk(z, p, k, wo=params["w0"])
    if kind == "lp2bp":
        return signal.lp2bp_zpk(z, p, k, wo=params["w0"], bw=params["bandwidth"])
    return signal.lp2bs_zpk(z, p, k, wo=params["w0"], bw=params["bandwidth"])


filters = []
for name, proto, kind, params in CASES:
    z0, p0, k0 = PROTOS[proto][0]()
    z, p, k = transform(kind, z0, p0, k0, params)
    wc = params["w0"]
    w = np.logspace(np.log10(wc) - 2, np.log10(wc) + 2, 241)
    _, h = signal.freqs_zpk(z, p, k, worN=w)
    gd_w = w[::8]
    gd = [group_delay_mp(z, p, k, x) for x in gd_w]
    slow = min(abs(np.real(p)))
    t = np.linspace(0, 14 / slow, 301)
    step_mp, imp_mp = time_mp(z, p, k, t)
    sys = signal.ZerosPolesGain(z, p, k)
    _, step_sp = signal.step(sys, T=t)
    _, imp_sp = signal.impulse(sys, T=t)
    filters.append({
        "name": name,
        "prototype": {"source": f"{SCIPY} {PROTOS[proto][1]}", "zeros": cl(z0), "poles": cl(p0), "gain": float(k0)},
        "transform": {"kind": kind, "params": params, "source": f"{SCIPY} scipy.signal.{kind}_zpk"},
        "zeros": cl(z), "poles": cl(p), "gain": float(k),
        "w": w.tolist(),
        "response": {"source": f"{SCIPY} scipy.signal.freqs_zpk", "re": np.real(h).tolist(), "im": np.imag(h).tolist(),
                     "magnitudeDb": (20 * np.log10(np.abs(h))).tolist(), "phaseUnwrapped": np.unwrap(np.angle(h)).tolist()},
        "groupDelay": {"source": f"mpmath {mp.__version__} mpmath.diff of arg H(jw) (dps=40)", "w": gd_w.tolist(), "tau": gd},
        "time": {"t": t.tolist(),
                 "exact": {"source": f"mpmath {mp.__version__} residue sum at simple poles (dps=40)", "step": step_mp, "impulse": imp_mp},
                 "scipy": {"source": f"{SCIPY} scipy.signal.step / scipy.signal.impulse", "step": step_sp.tolist(), "impulse": imp_sp.tolist()}},
    })

# Repeated poles: closed forms (t in seconds).
repeated = []
t = np.linspace(0, 12, 121)
# 1/(s+1)^3: y = 1 - e^-t (1 + t + t^2/2), h = t^2 e^-t / 2
repeated.append({
    "name": "triple-real", "zeros": [], "poles": [[-1.0, 0.0]] * 3, "gain": 1.0, "t": t.tolist(),
    "step": [float(1 - mp.exp(-x) * (1 + x + x * x / 2)) for x in map(mp.mpf, t)],
    "impulse": [float(x * x * mp.exp(-x) / 2) for x in map(mp.mpf, t)],
})
# 4/(s^2+2s+2)^2 = 4/((s+1)^2+1)^2, by inverse Laplace in mpmath (invertlaplace, talbot)
f = lambda s: 4 / ((s + 1) ** 2 + 1) ** 2
repeated.append({
    "name": "double-pair", "zeros": [], "poles": [[-1.0, 1.0], [-1.0, -1.0], [-1.0, 1.0], [-1.0, -1.0]], "gain": 4.0,
    "t": t[1:].tolist(),
    "step": [float(mp.invertlaplace(lambda s: f(s) / s, x, method="talbot")) for x in t[1:]],
    "impulse": [float(mp.invertlaplace(f, x, method="talbot")) for x in t[1:]],
})

out = {
    "source": f"{SCIPY} scipy.signal (buttap, cheb1ap, cheb2ap, ellipap, besselap, lp2lp_zpk, lp2hp_zpk, lp2bp_zpk, lp2bs_zpk, freqs_zpk, step, impulse); mpmath {mp.__version__} (group delay, exact time responses)",
    "filters": filters,
    "repeated": {"source": f"closed form evaluated with mpmath {mp.__version__}; double-pair by mpmath.invertlaplace (talbot)", "cases": repeated},
}
path = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures", "tf-filters.json")
with open(path, "w") as fh:
    json.dump(out, fh)
print("wrote", path, os.path.getsize(path), "bytes")
