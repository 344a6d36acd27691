// Analyses of a finished design: output noise (adjoint nodal analysis at 200
// frequencies) and Monte Carlo yield runs. The Monte Carlo rows are timed per
// board against ngspice's own control-language loop on the same netlist
// (alter every part, AC sweep over the mask's bands, `meas` of the extremes),
// measured in the same run; the noise figures are checked against ngspice
// `.noise` in test/analysis/noise.test.ts instead.
import { designFilter } from "../dist/design/index.js";
import { monteCarlo, noiseAnalysis } from "../dist/analysis/index.js";
import { toSpiceNetlist } from "../dist/report/index.js";
import { timeNgspiceMonteCarlo } from "./harness.mjs";

const spec = {
  response: "lowpass",
  passband: { edgeHz: 10000, maxLossDb: 0.5 },
  stopband: { edgeHz: 19000, minAttenuationDb: 70 },
  family: "chebyshev1",
  order: 8,
};
const result = designFilter(spec);
const withOpamp = designFilter({ ...spec, opamp: { a0: 2e5, gbwHz: "10M" } });
const BOARDS = 1000;
// the mask's bands as the design's verification checks them (three decades beyond each edge)
const bands = { pass: [[10, 10000]], stop: [[19000, 19e6]] };
const tolerance = { resistor: result.spec.resistorTolerance, capacitor: result.spec.capacitorTolerance };

export const benchmarks = [
  {
    name: "noiseAnalysis: 8th-order Chebyshev I lowpass, 200 frequencies, resistors + op-amp en/in",
    fn: () => noiseAnalysis(result, { opampVoltageNoise: 8e-9, opampCurrentNoise: 1e-12 }),
    note: "no scipy equivalent (checked against ngspice .noise in the tests)",
  },
  {
    name: `monteCarlo, per board: same design (ideal op-amps), full mask check (${BOARDS} boards per call)`,
    fn: () => monteCarlo(result, { runs: BOARDS }),
    perCall: BOARDS,
    referenceName: "ngspice control loop, per trial",
    reference: () => timeNgspiceMonteCarlo(toSpiceNetlist(result, { measure: false }), tolerance, bands),
  },
  {
    name: `monteCarlo, per board: same spec with a 10 MHz single-pole op-amp (${BOARDS} boards per call)`,
    fn: () => monteCarlo(withOpamp, { runs: BOARDS }),
    perCall: BOARDS,
    referenceName: "ngspice control loop, per trial",
    reference: () => timeNgspiceMonteCarlo(toSpiceNetlist(withOpamp, { measure: false }), tolerance, bands),
  },
];
