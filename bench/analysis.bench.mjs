// Analyses of a finished design: output noise (adjoint nodal analysis at 200
// frequencies) and a Monte Carlo yield run. No python reference: scipy has no
// circuit-level equivalent; the noise figures are checked against ngspice
// `.noise` in test/analysis/noise.test.ts instead.
import { designFilter } from "../dist/design/index.js";
import { monteCarlo, noiseAnalysis } from "../dist/analysis/index.js";

const result = designFilter({
  response: "lowpass",
  passband: { edgeHz: 10000, maxLossDb: 0.5 },
  stopband: { edgeHz: 19000, minAttenuationDb: 70 },
  family: "chebyshev1",
  order: 8,
});

export const benchmarks = [
  {
    name: "noiseAnalysis: 8th-order Chebyshev I lowpass, 200 frequencies, resistors + op-amp en/in",
    fn: () => noiseAnalysis(result, { opampVoltageNoise: 8e-9, opampCurrentNoise: 1e-12 }),
    note: "no scipy equivalent (checked against ngspice .noise in the tests)",
  },
  {
    name: "monteCarlo: same design, 100 boards against the mask",
    fn: () => monteCarlo(result, { runs: 100 }),
    note: "no scipy equivalent",
  },
];
