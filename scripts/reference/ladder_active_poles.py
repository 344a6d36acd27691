#!/usr/bin/env python3
"""Poles of active ladder circuits by numpy, for the tests of src/ladder/active (filterwright).

Reads  test/fixtures/ladder-active-circuits.json  (element lists written by
                                                   scripts/reference/ladder-active-circuits.mjs)
Writes test/fixtures/ladder-active-poles.json     their natural frequencies

Method: the modified nodal equations (G + s C) x = 0 of each circuit, built
here from the element list on its own (C.-W. Ho, A. E. Ruehli, P. A.
Brennan, "The modified nodal approach to network analysis", IEEE Trans.
Circuits Syst. 22(6), 1975; a single-pole op-amp as the row
(1/a0 + s / (2 pi GBW)) v_out = v+ - v-), and the finite generalised
eigenvalues of the pencil (G, -C) by scipy.linalg.eigvals (LAPACK QZ);
eigenvalues beyond 1e12 rad/s (the pencil's infinite ones in rounding)
are dropped.
Run: python3 scripts/reference/ladder_active_poles.py
"""
import json
import os

import numpy as np
import scipy
import scipy.linalg as sl

HERE = os.path.dirname(__file__)
FIX = os.path.join(HERE, "..", "..", "test", "fixtures")


def mna(elements):
    nodes = []
    for e in elements:
        names = [e["inP"], e["inN"], e["out"]] if e["kind"] == "OA" else [e["a"], e["b"]]
        for n in names:
            if n != "0" and n not in nodes:
                nodes.append(n)
    branches = [e for e in elements if e["kind"] in ("V", "L", "OA")]
    size = len(nodes) + len(branches)
    g = np.zeros((size, size))
    c = np.zeros((size, size))
    idx = {n: i for i, n in enumerate(nodes)}

    def at(n):
        return -1 if n == "0" else idx[n]

    def stamp(m, a, b, y):
        for i, j, sg in ((a, a, 1), (b, b, 1), (a, b, -1), (b, a, -1)):
            if i >= 0 and j >= 0:
                m[i, j] += sg * y

    k = len(nodes)
    for e in elements:
        if e["kind"] == "R":
            stamp(g, at(e["a"]), at(e["b"]), 1 / e["value"])
        elif e["kind"] == "C":
            stamp(c, at(e["a"]), at(e["b"]), e["value"])
        elif e["kind"] in ("V", "L"):
            a, b = at(e["a"]), at(e["b"])
            for i, sg in ((a, 1), (b, -1)):
                if i >= 0:
                    g[i, k] += sg
                    g[k, i] += sg
            if e["kind"] == "L":
                c[k, k] -= e["value"]
            k += 1
        elif e["kind"] == "OA":
            o, p, n = at(e["out"]), at(e["inP"]), at(e["inN"])
            g[o, k] += 1
            m = e["model"]
            assert m["kind"] == "single-pole"
            # (1/a0 + s tau) v_out - (v+ - v-) = 0
            g[k, o] += 1 / m["a0"]
            c[k, o] += 1 / (2 * np.pi * m["gbwHz"])
            if p >= 0:
                g[k, p] -= 1
            if n >= 0:
                g[k, n] += 1
            k += 1
    return g, c


def main():
    with open(os.path.join(FIX, "ladder-active-circuits.json")) as fh:
        src = json.load(fh)
    out = []
    for cir in src["circuits"]:
        g, c = mna(cir["elements"])
        w = sl.eigvals(g, -c)
        w = w[np.isfinite(w) & (np.abs(w) < 1e12)]
        w = w[np.argsort(np.abs(w))]
        out.append(dict(name=cir["name"], poles=[[float(x.real), float(x.imag)] for x in w], maxRealPart=float(np.max(w.real))))
        print(cir["name"], len(w), "poles, largest real part", float(np.max(w.real)))
    data = dict(
        source=f"numpy {np.__version__}, scipy {scipy.__version__} scipy.linalg.eigvals of the nodal pencil (G, -C) "
        "(scripts/reference/ladder_active_poles.py), circuits of test/fixtures/ladder-active-circuits.json",
        circuits=out,
    )
    with open(os.path.join(FIX, "ladder-active-poles.json"), "w") as fh:
        json.dump(data, fh, indent=1)
        fh.write("\n")


if __name__ == "__main__":
    main()
