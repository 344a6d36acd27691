"""Reference Wilson score intervals from scipy.stats.binomtest(...).proportion_ci(method="wilson").

Writes test/fixtures/evaluate-wilson.json.
"""
import json
import os

import scipy
from scipy.stats import binomtest

cases = []
for n, k in [(1, 0), (1, 1), (10, 7), (20, 19), (256, 256), (256, 250), (512, 490), (1000, 950), (4096, 3900), (100000, 99990)]:
    ci = binomtest(k, n).proportion_ci(confidence_level=0.95, method="wilson")
    cases.append({"passed": k, "n": n, "lower": float(ci.low), "upper": float(ci.high)})

out = {"source": f"scipy {scipy.__version__} binomtest(k, n).proportion_ci(confidence_level=0.95, method='wilson')", "cases": cases}
path = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures", "evaluate-wilson.json")
with open(path, "w") as f:
    json.dump(out, f, indent=1)
    f.write("\n")
