"""Analog second-order sections from scipy.signal.zpk2sos(analog=True, pairing='minimal').

For filters of our own scaling, records the zpk and scipy's sections
([b0 b1 b2 a0 a1 a2] rows, ascending index = descending powers of s) so the
tests can check that toSections forms the same denominators and pairs the same
zeros with them. Writes test/fixtures/tf-sections.json.
"""
import json
import os

import numpy as np
import scipy
from scipy import signal


def cl(values):
    return [[float(np.real(v)), float(np.imag(v))] for v in values]


cases = []
specs = [
    ("ellip6-lp", signal.ellipap(6, 0.5, 60), ("lp2lp", {"w0": 2.0e3})),
    ("cheb2_5-lp", signal.cheb2ap(5, 40), ("lp2lp", {"w0": 7.5e2})),
    ("ellip7-lp", signal.ellipap(7, 0.1, 80), ("lp2lp", {"w0": 4.4e4})),
    ("cheb1_4-hp", signal.cheb1ap(4, 0.5), ("lp2hp", {"w0": 1.3e4})),
    ("butter6-bp", signal.buttap(3), ("lp2bp", {"w0": 9.0e2, "bandwidth": 2.0e2})),
]
for name, (z0, p0, k0), (kind, params) in specs:
    if kind == "lp2lp":
        z, p, k = signal.lp2lp_zpk(z0, p0, k0, wo=params["w0"])
    elif kind == "lp2hp":
        z, p, k = signal.lp2hp_zpk(z0, p0, k0, wo=params["w0"])
    else:
        z, p, k = signal.lp2bp_zpk(z0, p0, k0, wo=params["w0"], bw=params["bandwidth"])
    sos = signal.zpk2sos(z, p, k, analog=True, pairing="minimal")
    cases.append({"name": name, "zeros": cl(z), "poles": cl(p), "gain": float(k), "sos": sos.tolist()})

out = {
    "source": f"scipy {scipy.__version__} scipy.signal.zpk2sos(analog=True, pairing='minimal') on filters from buttap/cheb1ap/cheb2ap/ellipap and lp2lp_zpk/lp2hp_zpk/lp2bp_zpk",
    "cases": cases,
}
path = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures", "tf-sections.json")
with open(path, "w") as f:
    json.dump(out, f, indent=1)
print("wrote", path)
