// Approximation layer: prototype generation and minimum-order selection, one
// call each, beside the scipy.signal equivalent timed in the same run.
import { bessel, elliptic, legendre, minimumOrder, sectionTable } from "../dist/approx/index.js";

export const benchmarks = [
  {
    name: "elliptic(8, 0.5 dB, 60 dB) prototype",
    fn: () => elliptic(8, { rippleDb: 0.5, attenuationDb: 60 }),
    referenceName: "scipy.signal.ellipap",
    python: `
from scipy import signal
def run():
    return signal.ellipap(8, 0.5, 60)
`,
  },
  {
    name: "bessel(10) prototype, phase normalisation (roots cached after the first call)",
    fn: () => bessel(10),
    referenceName: "scipy.signal.besselap",
    python: `
from scipy import signal
def run():
    return signal.besselap(10)
`,
  },
  {
    name: "bessel(10) prototype, magnitude (-3 dB) normalisation",
    fn: () => bessel(10, { normalization: "magnitude" }),
    referenceName: "scipy.signal.besselap norm='mag'",
    python: `
from scipy import signal
def run():
    return signal.besselap(10, norm='mag')
`,
  },
  {
    name: "legendre(12) prototype (poles cached after the first call)",
    fn: () => legendre(12),
    note: "no scipy equivalent",
  },
  {
    name: "minimumOrder elliptic lowpass (1 kHz / 1.5 kHz, 0.5 dB / 60 dB)",
    fn: () =>
      minimumOrder({
        family: "elliptic",
        response: "lowpass",
        passbandW: 2 * Math.PI * 1000,
        stopbandW: 2 * Math.PI * 1500,
        passbandLossDb: 0.5,
        stopbandAttenuationDb: 60,
      }),
    referenceName: "scipy.signal.ellipord analog",
    python: `
import math
from scipy import signal
def run():
    return signal.ellipord(2*math.pi*1000, 2*math.pi*1500, 0.5, 60, analog=True)
`,
  },
  {
    name: "minimumOrder Butterworth bandstop (geometric-symmetry reduction)",
    fn: () =>
      minimumOrder({
        family: "butterworth",
        response: "bandstop",
        passbandW: [2 * Math.PI * 40, 2 * Math.PI * 80],
        stopbandW: [2 * Math.PI * 48, 2 * Math.PI * 63],
        passbandLossDb: 1,
        stopbandAttenuationDb: 30,
      }),
    referenceName: "scipy.signal.buttord analog (fminbound)",
    python: `
import math
from scipy import signal
def run():
    return signal.buttord([2*math.pi*40, 2*math.pi*80], [2*math.pi*48, 2*math.pi*63], 1, 30, analog=True)
`,
  },
  {
    name: "minimumOrder Bessel lowpass (order search, 3 dB / 40 dB, ratio 5)",
    fn: () =>
      minimumOrder({ family: "bessel", response: "lowpass", passbandW: 1, stopbandW: 5, passbandLossDb: 3, stopbandAttenuationDb: 40 }),
    note: "no scipy equivalent (scipy has no besselord)",
  },
  {
    name: "sectionTable of elliptic(8) prototype",
    fn: (() => {
      const h = elliptic(8, { rippleDb: 0.5, attenuationDb: 60 });
      return () => sectionTable(h);
    })(),
    referenceName: "scipy.signal.zpk2sos analog",
    python: `
from scipy import signal
z, p, k = signal.ellipap(8, 0.5, 60)
def run():
    return signal.zpk2sos(z, p, k, analog=True)
`,
  },
];
