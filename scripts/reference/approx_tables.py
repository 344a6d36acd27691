#!/usr/bin/env python3
"""Handbook section tables, typed in from memory, cross-checked against scipy.

Source (from memory): U. Tietze and Ch. Schenk, "Electronic Circuits - Handbook
for Design and Application", 2nd ed., Springer, 2008, chapter on active filters,
tables of filter coefficients (Butterworth, Bessel, Chebyshev 0.5 dB and 1 dB):
per section the coefficients a_i, b_i of 1 / (1 + a_i S + b_i S^2) (b_i = 0 for
the first-order section) printed to 4 decimals, and the pole Q_i printed to 2
decimals. S is normalised to the corner frequency: the -3 dB point for
Butterworth and Bessel; for Chebyshev the frequency where the gain is 3 dB
below its DC value (for even orders that is 3 dB below -ripple). The
section's pole frequency is f0_i = 1 / sqrt(b_i), its Q_i = sqrt(b_i) / a_i.

Each remembered row is checked against scipy.signal (buttap, besselap 'mag',
cheb1ap renormalised as above) to the printed precision before it is written;
rows that disagree are dropped and listed in the fixture's notes.
Writes test/fixtures/approx-handbook-tables.json.
Run: python3 scripts/reference/approx_tables.py
"""
import json
import math
import os

import numpy as np
import scipy
from scipy import signal
from scipy.optimize import brentq

OUT = os.path.join(os.path.dirname(__file__), "..", "..", "test", "fixtures", "approx-handbook-tables.json")

# (a, b, Q) per section in ascending-Q order; b = 0 marks the first-order section (Q None).
BUTTERWORTH = {
    2: [(1.4142, 1.0, 0.71)],
    3: [(1.0, 0.0, None), (1.0, 1.0, 1.00)],
    4: [(1.8478, 1.0, 0.54), (0.7654, 1.0, 1.31)],
    5: [(1.0, 0.0, None), (1.6180, 1.0, 0.62), (0.6180, 1.0, 1.62)],
    6: [(1.9319, 1.0, 0.52), (1.4142, 1.0, 0.71), (0.5176, 1.0, 1.93)],
    7: [(1.0, 0.0, None), (1.8019, 1.0, 0.55), (1.2470, 1.0, 0.80), (0.4450, 1.0, 2.25)],
    8: [(1.9616, 1.0, 0.51), (1.6629, 1.0, 0.60), (1.1111, 1.0, 0.90), (0.3902, 1.0, 2.56)],
    9: [(1.0, 0.0, None), (1.8794, 1.0, 0.53), (1.5321, 1.0, 0.65), (1.0, 1.0, 1.00), (0.3473, 1.0, 2.88)],
    10: [(1.9754, 1.0, 0.51), (1.7820, 1.0, 0.56), (1.4142, 1.0, 0.71), (0.9080, 1.0, 1.10), (0.3129, 1.0, 3.20)],
}
BESSEL = {
    2: [(1.3617, 0.6180, 0.58)],
    3: [(0.7560, 0.0, None), (0.9996, 0.4772, 0.69)],
    4: [(1.3397, 0.4889, 0.52), (0.7743, 0.3890, 0.81)],
    5: [(0.6656, 0.0, None), (1.1402, 0.4128, 0.56), (0.6216, 0.3245, 0.92)],
    6: [(1.2217, 0.3887, 0.51), (0.9686, 0.3505, 0.61), (0.5131, 0.2756, 1.02)],
    7: [(0.5937, 0.0, None), (1.0944, 0.3395, 0.53), (0.8304, 0.3011, 0.66), (0.4332, 0.2381, 1.13)],
    8: [(1.1112, 0.3162, 0.51), (0.9754, 0.2979, 0.56), (0.7202, 0.2621, 0.71), (0.3728, 0.2087, 1.23)],
    9: [(0.5386, 0.0, None), (1.0244, 0.2834, 0.52), (0.8710, 0.2636, 0.59), (0.6320, 0.2311, 0.76), (0.3257, 0.1854, 1.32)],
    10: [(1.0215, 0.2650, 0.50), (0.9393, 0.2549, 0.54), (0.7815, 0.2351, 0.62), (0.5604, 0.2059, 0.81), (0.2883, 0.1665, 1.42)],
}
CHEBY_05 = {
    2: [(1.3614, 1.3827, 0.86)],
    3: [(1.8636, 0.0, None), (0.6402, 1.1931, 1.71)],
    4: [(2.6282, 3.4341, 0.71), (0.3648, 1.1509, 2.94)],
    5: [(2.9235, 0.0, None), (1.3025, 2.3534, 1.18), (0.2290, 1.0833, 4.54)],
    6: [(3.8645, 6.9797, 0.68), (0.7528, 1.8573, 1.81), (0.1589, 1.0711, 6.51)],
    7: [(4.0211, 0.0, None), (1.8729, 4.1795, 1.09), (0.4861, 1.5676, 2.58), (0.1156, 1.0443, 8.84)],
    8: [(5.1117, 11.9607, 0.68), (1.0639, 2.9365, 1.61), (0.3439, 1.4206, 3.47), (0.0885, 1.0407, 11.53)],
    9: [(5.1318, 0.0, None), (2.4283, 6.6307, 1.06), (0.6839, 2.2908, 2.21), (0.2559, 1.3133, 4.48), (0.0695, 1.0272, 14.58)],
    10: [(6.3648, 18.3695, 0.67), (1.3582, 4.3453, 1.53), (0.4822, 1.9440, 2.89), (0.1994, 1.2520, 5.61), (0.0563, 1.0263, 17.99)],
}
CHEBY_1 = {
    2: [(1.3022, 1.5515, 0.96)],
    3: [(2.2156, 0.0, None), (0.5442, 1.2057, 2.02)],
    4: [(2.5904, 4.1301, 0.78), (0.3039, 1.1697, 3.56)],
    5: [(3.5711, 0.0, None), (1.1280, 2.4896, 1.40), (0.1872, 1.0814, 5.56)],
    6: [(3.8437, 8.5529, 0.76), (0.6292, 1.9124, 2.20), (0.1296, 1.0766, 8.00)],
    7: [(4.9520, 0.0, None), (1.6338, 4.4899, 1.30), (0.3987, 1.5834, 3.16), (0.0937, 1.0432, 10.90)],
    8: [(5.1019, 14.7608, 0.75), (0.8916, 3.0426, 1.96), (0.2806, 1.4334, 4.27), (0.0717, 1.0432, 14.24)],
    9: [(6.3415, 0.0, None), (2.1252, 7.1711, 1.26), (0.5624, 2.3278, 2.71), (0.2076, 1.3166, 5.53), (0.0562, 1.0258, 18.03)],
    10: [(6.3634, 22.7468, 0.75), (1.1399, 4.5167, 1.86), (0.3939, 1.9665, 3.56), (0.1616, 1.2569, 6.94), (0.0455, 1.0277, 22.26)],
}


def reference_sections(family, n, rp=None):
    """(a, b, Q) of scipy's prototype in the table's normalisation, ascending Q."""
    if family == "butterworth":
        z, p, k = signal.buttap(n)
        c = 1.0
    elif family == "bessel":
        z, p, k = signal.besselap(n, norm="mag")
        c = 1.0
    else:
        z, p, k = signal.cheb1ap(n, rp)
        mag = lambda w: abs(signal.freqs_zpk(z, p, k, [w])[1][0])
        h0 = mag(0.0)
        c = brentq(lambda w: 20 * math.log10(mag(w) / h0) + 10 * math.log10(2), 0.5, 5.0, xtol=1e-15)
    # In S = s / c the poles are p / c.
    p = p / c
    rows = []
    for q in p:
        if q.imag < -1e-12:
            continue
        if abs(q.imag) <= 1e-12:
            rows.append((1.0 / -q.real, 0.0, None))
        else:
            m2 = abs(q) ** 2
            rows.append((2 * -q.real / m2, 1.0 / m2, abs(q) / (2 * -q.real)))
    rows.sort(key=lambda r: -1 if r[2] is None else r[2])
    return rows


def main():
    tables = []
    dropped = []
    for family, rp, table, label in (
        ("butterworth", None, BUTTERWORTH, "Butterworth"),
        ("bessel", None, BESSEL, "Bessel"),
        ("chebyshev1", 0.5, CHEBY_05, "Chebyshev 0.5 dB"),
        ("chebyshev1", 1.0, CHEBY_1, "Chebyshev 1 dB"),
    ):
        kept = []
        for n, rows in table.items():
            ref = reference_sections(family, n, rp)
            ok = len(ref) == len(rows)
            for (a, b, q), (ra, rb, rq) in zip(rows, ref):
                if abs(a - ra) > 0.5e-4 + 1e-9 or abs(b - rb) > 0.5e-4 + 1e-9:
                    ok = False
                if (q is None) != (rq is None) or (q is not None and abs(q - rq) > 0.005 + 1e-9):
                    ok = False
            if ok:
                kept.append(dict(order=n, sections=[dict(a=a, b=b, q=q) for a, b, q in rows]))
            else:
                dropped.append(f"{label} order {n}: remembered {rows}, scipy gives {[(round(float(x), 4), round(float(y), 4), None if z is None else round(float(z), 2)) for x, y, z in ref]}; dropped")
        tables.append(dict(family=family, rippleDb=rp, title=label, rows=kept))
    data = {
        "source": {
            "book": "U. Tietze and Ch. Schenk, Electronic Circuits - Handbook for Design and Application, 2nd ed., Springer, 2008",
            "table": "filter coefficient tables of the active-filter chapter (Butterworth, Bessel, Chebyshev 0.5 dB and 1 dB)",
            "entry": "from memory",
            "checkedWith": f"scipy {scipy.__version__} scipy.signal buttap, besselap(norm='mag'), cheb1ap",
        },
        "generatedBy": "scripts/reference/approx_tables.py; do not edit",
        "normalisation": "S normalised to the -3 dB frequency (Chebyshev: 3 dB below the DC gain); "
                         "section 1 / (1 + a S + b S^2), b = 0 for the first-order section; f0 = 1/sqrt(b), Q = sqrt(b)/a",
        "precision": {"a": 4, "b": 4, "q": 2},
        "notes": dropped if dropped else ["every remembered row agreed with scipy to the printed precision"],
        "tables": tables,
    }
    with open(OUT, "w") as fh:
        json.dump(data, fh, indent=1)
    print("dropped:", len(dropped))
    for d in dropped:
        print(" ", d)


if __name__ == "__main__":
    main()
