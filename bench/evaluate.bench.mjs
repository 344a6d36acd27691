// As-built stage polynomials of one board: an 8th-order Butterworth lowpass at
// 10 kHz from four unity-gain Sallen-Key stages with single-pole op-amps (the
// board of circuit.bench.mjs), every stage's N(z)/D(z) written into scratch
// arrays as the Monte Carlo loop does. Two rows: the topologies' closed-form
// polynomials (the fast path stagePolynomialsInto takes) and the generic path
// (the stage's nodal equations sampled on circles, LU per point, inverse DFT).
// No python reference: scipy has no as-built circuit polynomials.
import { compileStage, genericStagePolynomialsInto, stagePolynomialsInto } from "../dist/evaluate/index.js";
import { sallenKeyLowpassUnity } from "../dist/topologies/index.js";

const opamp = { kind: "single-pole", a0: 2e5, gbwHz: 10e6 };
const qs = [0.5097955791041592, 0.6013448869350453, 0.8999762231364156, 2.5629154477415055];
const stages = qs.map((q) => {
  const v = sallenKeyLowpassUnity.design({ order: 2, kind: "lowpass", f0Hz: 10000, q, gain: 1 }, { capacitor: 4.7e-9 });
  const compiled = compileStage(sallenKeyLowpassUnity, v, opamp);
  return {
    compiled,
    values: Float64Array.from(compiled.componentNames, (n) => v[n]),
    radius: 2 * Math.PI * 10000,
    num: new Float64Array(compiled.points),
    den: new Float64Array(compiled.points),
  };
});

/** One board's polynomials through `into`; returns a checksum so the work is not dropped. */
function board(into) {
  let sum = 0;
  for (const s of stages) sum += into(s.compiled, s.values, s.radius, s.num, s.den) + s.den[s.den.length - 1];
  return sum;
}

export const benchmarks = [
  {
    name: "stage polynomials, closed form: 4-stage 8th-order Sallen-Key lowpass board, single-pole op-amps",
    fn: () => board(stagePolynomialsInto),
    note: "no python reference (scipy has no as-built circuit polynomials)",
  },
  {
    name: "stage polynomials, generic (nodal equations on sample circles): same board",
    fn: () => board(genericStagePolynomialsInto),
    note: "no python reference (scipy has no as-built circuit polynomials)",
  },
];

// The first-order tolerance model of the same board and the per-part
// tolerance allocation on it (the yield search's screen): linearModel at the
// critical points of a mask for the board's 10 kHz lowpass, then
// allocateTolerances for a 95 % target.
import { allocateTolerances, linearModel, planMask } from "../dist/evaluate/index.js";

const plan = planMask(
  { pass: [[10, 8000]], stop: [[30000, 3e7]], referenceHz: 10 },
  { maxLossDb: 1, minAttenuationDb: 35, gain: 1, gainToleranceDb: 0.5 },
);
const boardStages = stages.map((s) => ({ compiled: s.compiled, nominal: s.values, tolerance: new Float64Array(s.values.length).fill(0.01), radius: s.radius }));
const model = linearModel(boardStages, plan);

benchmarks.push(
  {
    name: "linearModel: first-order tolerance model of the 4-stage board (16 parts) at its mask's critical points",
    fn: () => linearModel(boardStages, plan).levelDb.length,
    note: "no reference (the board Monte Carlo it replaces as a screen is timed in analysis.bench.mjs)",
  },
  {
    name: "allocateTolerances: per-part classes for a 95 % target on the 16-part board (2000 linearised boards)",
    fn: () => allocateTolerances(model, plan, { target: 0.95 }).cost,
    note: "no reference",
  },
);
