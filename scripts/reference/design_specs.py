"""Reference minimum orders for the end-to-end design specs.

Writes test/fixtures/design-specs.json: our own design scenarios (lowpass,
highpass, bandpass, bandstop across every family) and, for the families that
scipy can size (Butterworth, Chebyshev I/II, elliptic), the minimum analog
order scipy.signal.{buttord,cheb1ord,cheb2ord,ellipord} gives for the same
mask. Bandstop orders are recorded but scipy moves the bandstop passband
edges to lower the order (band_stop_obj), so the tests only require ours to
be within one of scipy's there.

Run: python3 scripts/reference/design_specs.py
"""
import json
import math
import os

import scipy
from scipy import signal

# (id, scenario, spec) -- every scenario is our own invention.
SPECS = [
    ("lp-bw-seismic", "geophone channel ahead of a slow ADC", {"response": "lowpass", "passband": {"edgeHz": 40, "maxLossDb": 1}, "stopband": {"edgeHz": 180, "minAttenuationDb": 45}, "family": "butterworth"}),
    ("lp-c1-audio-adc", "line-level audio anti-alias", {"response": "lowpass", "passband": {"edgeHz": 20000, "maxLossDb": 0.5}, "stopband": {"edgeHz": 44000, "minAttenuationDb": 50}, "family": "chebyshev1"}),
    ("lp-c2-thermo", "thermocouple amplifier hum rejection", {"response": "lowpass", "passband": {"edgeHz": 8, "maxLossDb": 1}, "stopband": {"edgeHz": 45, "minAttenuationDb": 50}, "family": "chebyshev2"}),
    ("lp-el-vib", "vibration anti-alias with gain", {"response": "lowpass", "passband": {"edgeHz": 2000, "maxLossDb": 0.2}, "stopband": {"edgeHz": 6100, "minAttenuationDb": 70}, "family": "elliptic", "gain": {"db": 6}}),
    ("lp-bs-pulse", "pulse-shape preserving lowpass for a photodiode", {"response": "lowpass", "passband": {"edgeHz": 1000, "maxLossDb": 3}, "stopband": {"edgeHz": 9000, "minAttenuationDb": 40}, "family": "bessel"}),
    ("lp-lg-loadcell", "load-cell smoothing", {"response": "lowpass", "passband": {"edgeHz": 15, "maxLossDb": 1}, "stopband": {"edgeHz": 60, "minAttenuationDb": 40}, "family": "legendre"}),
    ("lp-bw-ecg-inv", "ECG band limit, inverting allowed", {"response": "lowpass", "passband": {"edgeHz": 150, "maxLossDb": 0.5}, "stopband": {"edgeHz": 600, "minAttenuationDb": 40}, "family": "butterworth", "gain": {"vPerV": -2}}),
    ("lp-c1-gain20", "current-shunt amplifier band limit", {"response": "lowpass", "passband": {"edgeHz": 5000, "maxLossDb": 1}, "stopband": {"edgeHz": 15000, "minAttenuationDb": 45}, "family": "chebyshev1", "gain": {"db": 20}}),
    ("lp-el-steep", "steep lowpass ahead of a 16 kS/s codec", {"response": "lowpass", "passband": {"edgeHz": 3400, "maxLossDb": 0.5}, "stopband": {"edgeHz": 4600, "minAttenuationDb": 60}, "family": "elliptic"}),
    ("lp-auto-strain", "strain-gauge channel, automatic family", {"response": "lowpass", "passband": {"edgeHz": 100, "maxLossDb": 0.5}, "stopband": {"edgeHz": 400, "minAttenuationDb": 60}}),
    ("hp-bw-rumble", "turntable rumble filter", {"response": "highpass", "passband": {"edgeHz": 40, "maxLossDb": 1}, "stopband": {"edgeHz": 12, "minAttenuationDb": 30}, "family": "butterworth"}),
    ("hp-c1-ultra", "ultrasonic receiver, remove audible band", {"response": "highpass", "passband": {"edgeHz": 38000, "maxLossDb": 0.5}, "stopband": {"edgeHz": 15000, "minAttenuationDb": 50}, "family": "chebyshev1"}),
    ("hp-c2-dcblock", "DC and drift removal for a pressure sensor", {"response": "highpass", "passband": {"edgeHz": 2, "maxLossDb": 1}, "stopband": {"edgeHz": 0.4, "minAttenuationDb": 35}, "family": "chebyshev2"}),
    ("hp-el-tone", "pilot-tone highpass", {"response": "highpass", "passband": {"edgeHz": 1200, "maxLossDb": 0.3}, "stopband": {"edgeHz": 700, "minAttenuationDb": 55}, "family": "elliptic"}),
    ("hp-bs-eeg", "EEG baseline removal with little ringing", {"response": "highpass", "passband": {"edgeHz": 1, "maxLossDb": 3}, "stopband": {"edgeHz": 0.1, "minAttenuationDb": 30}, "family": "bessel"}),
    ("hp-lg-wind", "wind-noise highpass for an outdoor microphone", {"response": "highpass", "passband": {"edgeHz": 150, "maxLossDb": 1}, "stopband": {"edgeHz": 45, "minAttenuationDb": 36}, "family": "legendre"}),
    ("hp-bw-gain", "hydrophone preamp low cut with gain", {"response": "highpass", "passband": {"edgeHz": 500, "maxLossDb": 0.5}, "stopband": {"edgeHz": 120, "minAttenuationDb": 40}, "family": "butterworth", "gain": {"db": 12}}),
    ("hp-auto-mono", "bearing-noise highpass, monotonic", {"response": "highpass", "passband": {"edgeHz": 3000, "maxLossDb": 0.5}, "stopband": {"edgeHz": 900, "minAttenuationDb": 50}, "priority": "monotonic"}),
    ("bp-bw-hydro", "hydrophone ping band", {"response": "bandpass", "passband": {"edgeHz": [10000, 40000], "maxLossDb": 0.5}, "stopband": {"edgeHz": [2500, 160000], "minAttenuationDb": 40}, "family": "butterworth", "gain": {"db": 20}}),
    ("bp-c1-oxi", "pulse-oximeter cardiac band", {"response": "bandpass", "passband": {"edgeHz": [0.7, 4], "maxLossDb": 1}, "stopband": {"edgeHz": [0.15, 20], "minAttenuationDb": 30}, "family": "chebyshev1"}),
    ("bp-c2-bird", "bird-call band for an acoustic logger", {"response": "bandpass", "passband": {"edgeHz": [2000, 6000], "maxLossDb": 1}, "stopband": {"edgeHz": [700, 16000], "minAttenuationDb": 40}, "family": "chebyshev2"}),
    ("bp-el-rfid", "low-frequency tag reader band", {"response": "bandpass", "passband": {"edgeHz": [120000, 140000], "maxLossDb": 0.5}, "stopband": {"edgeHz": [95000, 175000], "minAttenuationDb": 40}, "family": "elliptic"}),
    ("bp-bs-tacho", "tachometer pulse band with flat delay", {"response": "bandpass", "passband": {"edgeHz": [50, 400], "maxLossDb": 3}, "stopband": {"edgeHz": [5, 4000], "minAttenuationDb": 25}, "family": "bessel"}),
    ("bp-lg-lock", "lock-in reference band", {"response": "bandpass", "passband": {"edgeHz": [900, 1100], "maxLossDb": 1}, "stopband": {"edgeHz": [500, 2000], "minAttenuationDb": 30}, "family": "legendre"}),
    ("bp-auto-sonar", "echo-sounder receive band, automatic", {"response": "bandpass", "passband": {"edgeHz": [45000, 55000], "maxLossDb": 1}, "stopband": {"edgeHz": [30000, 80000], "minAttenuationDb": 35}}),
    ("bs-bw-hum", "50 Hz hum notch for a strain gauge", {"response": "bandstop", "passband": {"edgeHz": [30, 80], "maxLossDb": 1}, "stopband": {"edgeHz": [47, 53], "minAttenuationDb": 25}, "family": "butterworth"}),
    ("bs-c1-hum60", "60 Hz hum notch, Chebyshev", {"response": "bandstop", "passband": {"edgeHz": [35, 100], "maxLossDb": 1}, "stopband": {"edgeHz": [57, 63], "minAttenuationDb": 30}, "family": "chebyshev1"}),
    ("bs-c2-pilot", "19 kHz pilot-tone removal", {"response": "bandstop", "passband": {"edgeHz": [15000, 24000], "maxLossDb": 0.5}, "stopband": {"edgeHz": [18500, 19500], "minAttenuationDb": 40}, "family": "chebyshev2"}),
    ("bs-el-carrier", "PWM carrier rejection", {"response": "bandstop", "passband": {"edgeHz": [12000, 30000], "maxLossDb": 0.5}, "stopband": {"edgeHz": [18000, 22000], "minAttenuationDb": 45}, "family": "elliptic"}),
    ("bs-bs-click", "metronome-click notch with low ringing", {"response": "bandstop", "passband": {"edgeHz": [400, 5000], "maxLossDb": 3}, "stopband": {"edgeHz": [1300, 1600], "minAttenuationDb": 15}, "family": "bessel"}),
    ("bs-lg-whine", "motor-whine notch", {"response": "bandstop", "passband": {"edgeHz": [1000, 4000], "maxLossDb": 1}, "stopband": {"edgeHz": [1800, 2200], "minAttenuationDb": 20}, "family": "legendre"}),
    ("bs-auto-sub", "subcarrier removal, automatic family", {"response": "bandstop", "passband": {"edgeHz": [3000, 12000], "maxLossDb": 1}, "stopband": {"edgeHz": [5500, 6500], "minAttenuationDb": 30}}),
    ("lp-bw-e24", "battery-monitor smoothing with E24 resistors", {"response": "lowpass", "passband": {"edgeHz": 10, "maxLossDb": 1}, "stopband": {"edgeHz": 50, "minAttenuationDb": 40}, "family": "butterworth", "parts": {"resistorSeries": "E24", "capacitorSeries": "E6"}}),
    ("lp-c1-order-fixed", "fixed-order lowpass for a scope front end", {"response": "lowpass", "passband": {"edgeHz": 100000, "maxLossDb": 1}, "stopband": {"edgeHz": 400000, "minAttenuationDb": 40}, "family": "chebyshev1", "order": 5}),
]

ORD = {
    "butterworth": lambda wp, ws, gp, gs: signal.buttord(wp, ws, gp, gs, analog=True)[0],
    "chebyshev1": lambda wp, ws, gp, gs: signal.cheb1ord(wp, ws, gp, gs, analog=True)[0],
    "chebyshev2": lambda wp, ws, gp, gs: signal.cheb2ord(wp, ws, gp, gs, analog=True)[0],
    "elliptic": lambda wp, ws, gp, gs: signal.ellipord(wp, ws, gp, gs, analog=True)[0],
}


def main():
    out = []
    for sid, scenario, spec in SPECS:
        entry = {"id": sid, "scenario": scenario, "spec": spec}
        fam = spec.get("family")
        if fam in ORD:
            pb = spec["passband"]["edgeHz"]
            sb = spec["stopband"]["edgeHz"]
            to_w = lambda e: [2 * math.pi * x for x in e] if isinstance(e, list) else 2 * math.pi * e
            entry["scipyOrder"] = int(ORD[fam](to_w(pb), to_w(sb), spec["passband"]["maxLossDb"], spec["stopband"]["minAttenuationDb"]))
        out.append(entry)
    data = {
        "source": f"scipy {scipy.__version__} scipy.signal.buttord/cheb1ord/cheb2ord/ellipord (analog=True); specs are our own scenarios",
        "specs": out,
    }
    here = os.path.dirname(os.path.abspath(__file__))
    path = os.path.join(here, "..", "..", "test", "fixtures", "design-specs.json")
    with open(path, "w") as f:
        json.dump(data, f, indent=1)
        f.write("\n")
    print(f"wrote {len(out)} specs to {os.path.normpath(path)}")


if __name__ == "__main__":
    main()
