// The whole design pipeline for an 8th-order lowpass: family sizing, prototype,
// placement in the slack, sections, gain distribution, topology choice,
// preferred values with joint re-tuning, and the as-built check against the
// mask (dense mask grids plus the 256-point response curve stored in the result).
// The python snippet times only the math steps scipy can do for the same spec
// (order, prototype, second-order sections, response on 256 points): no parts,
// no circuit, no verification, so the ratio says how much the rest costs.
import { designFilter } from "../dist/design/index.js";

const spec = {
  response: "lowpass",
  passband: { edgeHz: 10000, maxLossDb: 0.5 },
  stopband: { edgeHz: 19000, minAttenuationDb: 70 },
  family: "chebyshev1",
  order: 8,
};

export const benchmarks = [
  {
    name: "designFilter: 8th-order Chebyshev I lowpass, full pipeline",
    fn: () => designFilter(spec),
    referenceName: "scipy math steps only",
    python: `
import numpy as np
from scipy import signal
w = 2*np.pi*np.logspace(3, 5.3, 256)
def run():
    n, wn = signal.cheb1ord(2*np.pi*10000, 2*np.pi*19000, 0.5, 70, analog=True)
    z, p, k = signal.cheby1(8, 0.5, wn, analog=True, output="zpk")
    sos = signal.zpk2sos(z, p, k, analog=True)
    signal.freqs_zpk(z, p, k, w)
`,
  },
];
