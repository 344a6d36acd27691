import { describe, expect, it } from "vitest";
import { SCENARIOS } from "../../src/cli/scenarios.ts";
import { designFilter, type FilterSpec } from "../../src/design/index.ts";
import { maskPlan } from "../../src/design/verify.ts";
import { runBoards, type BoardStage } from "../../src/evaluate/boards.ts";
import { cascadeMagnitudeSquared } from "../../src/evaluate/cascade.ts";
import { maskFigures, rationalSource, type MaskPlan } from "../../src/evaluate/mask.ts";
import {
  boardTolerances,
  constraintSpreads,
  linearLevels,
  linearModel,
  PASS_POINT,
  pointFigures,
  predictYield,
  sigmaPerTolerance,
  STOP_RELEVANCE_DB,
  unitDeviations,
  type LinearModel,
} from "../../src/evaluate/spread.ts";
import { boardPolynomialsInto, genericStagePolynomialsInto } from "../../src/evaluate/stage-polynomials.ts";
import type { ScaledRational } from "../../src/evaluate/types.ts";
import { boardStagesOf } from "../helpers/boards.ts";

// Our own scenarios: an anti-alias lowpass for a slow data logger with a real op-amp, a rumble highpass for a
// turntable preamp, and the demo's hydrophone bandpass and hum notch (state-variable notches: the generic path),
// their topologies pinned to the multi-amplifier stages the model was first checked on (the automatic choice now
// builds the hydrophone as a band split and the hum notch with a one-op-amp notch section), and the rumble
// highpass's family to the Butterworth the model was first checked on (the automatic choice now builds an
// elliptic highpass with a one-op-amp highpass-notch section).
const SPECS: Record<string, FilterSpec> = {
  "logger lowpass": {
    response: "lowpass",
    passband: { edgeHz: 2000, maxLossDb: 0.5 },
    stopband: { edgeHz: 6000, minAttenuationDb: 50 },
    family: "chebyshev1",
    opamp: { a0: 2e5, gbwHz: "3M" },
  },
  "rumble highpass": { response: "highpass", passband: { edgeHz: 300, maxLossDb: 1 }, stopband: { edgeHz: 100, minAttenuationDb: 40 }, family: "butterworth" },
  "hydrophone bandpass": { ...SCENARIOS["hydrophone"]!.spec, topology: ["mfb-bandpass", "mfb-bandpass", "mfb-bandpass-attenuated", "tow-thomas-bandpass"] },
  "hum notch": { ...SCENARIOS["hum-notch"]!.spec, topology: "state-variable-notch" },
  // the same specs as the automatic choice builds them: a band split, a one-op-amp notch section
  "hydrophone band split": SCENARIOS["hydrophone"]!.spec,
  "hum notch, one-op-amp section": SCENARIOS["hum-notch"]!.spec,
  "rumble highpass, one-op-amp section": { response: "highpass", passband: { edgeHz: 300, maxLossDb: 1 }, stopband: { edgeHz: 100, minAttenuationDb: 40 } },
};
// the model's own properties are checked on the first four; the automatic designs only board by board (a deep
// one-op-amp notch puts a level near a zero, where the dB change is far from linear at 0.1 % steps)
const MODEL_SPECS = ["logger lowpass", "rumble highpass", "hydrophone bandpass", "hum notch"];

interface Case {
  readonly plan: MaskPlan;
  readonly stages: BoardStage[];
  readonly model: LinearModel;
  readonly marginDb: number;
}

const cases = new Map<string, Case>();
function caseOf(name: string): Case {
  let c = cases.get(name);
  if (c === undefined) {
    const design = designFilter(SPECS[name]!);
    const plan = maskPlan(design.spec);
    const stages = boardStagesOf(design, 0.01, 0.02);
    c = { plan, stages, model: linearModel(stages, plan), marginDb: design.verification.marginDb };
    cases.set(name, c);
  }
  return c;
}

/** The stages with resistors at `rt` and capacitors at `ct`. */
function withTolerances(stages: readonly BoardStage[], rt: number, ct: number): BoardStage[] {
  return stages.map((s) => ({ ...s, tolerance: Float64Array.from(s.compiled.componentNames, (n) => (n.startsWith("C") ? ct : rt)) }));
}

/** The board's polynomials with each part moved by `rel[j]` (board order), formed as runBoards forms them. */
function boardPolys(stages: readonly BoardStage[], rel: Float64Array): ScaledRational[] {
  let at = 0;
  return stages.map((s) => {
    const v = s.nominal.map((x, j) => x * (1 + rel[at + j]!));
    at += s.nominal.length;
    const num = new Float64Array(s.compiled.points);
    const den = new Float64Array(s.compiled.points);
    if (s.compiled.closedForm === null) genericStagePolynomialsInto(s.compiled, s.nominal, s.radius, num, den);
    return { num, den, scale: boardPolynomialsInto(s.compiled, v, s.radius, num, den) };
  });
}

/** Exact and linearised level changes at the model's points for parts moved by `eps * d`. */
function levelChanges(c: Case, d: Float64Array, eps: number): { exact: Float64Array; linear: Float64Array } {
  const { model } = c;
  const rel = d.map((x) => eps * x);
  const w = model.freqHz.map((f) => 2 * Math.PI * f);
  const exact = cascadeMagnitudeSquared(boardPolys(c.stages, rel), w).map((x, i) => 10 * Math.log10(x) - model.levelDb[i]!);
  const ones = new Float64Array(model.parts.length).fill(eps);
  const linear = linearLevels(model, ones, d, 1).map((x, i) => x - model.levelDb[i]!);
  return { exact, linear };
}

const maxAbs = (a: Float64Array): number => a.reduce((m, x) => Math.max(m, Math.abs(x)), 0);

describe("linearModel", () => {
  it.each(MODEL_SPECS)("%s: its points give the design's own nominal margin (1e-9 dB)", (name) => {
    const c = caseOf(name);
    expect(Math.abs(c.model.nominal.marginDb - c.marginDb)).toBeLessThan(1e-9);
    expect(c.model.parts.length).toBe(c.stages.reduce((k, s) => k + s.nominal.length, 0));
    expect(c.model.gradient.length).toBe(c.model.parts.length * c.model.levelDb.length);
    // both edges of every passband are points; a stopband point stands at most STOP_RELEVANCE_DB below the highest one
    for (const g of c.plan.pass) {
      for (const hz of g.hz) expect(c.model.freqHz.some((f) => Math.abs(f / hz - 1) < 1e-12)).toBe(true);
    }
    const stop = c.model.levelDb.filter((_, i) => c.model.band[i] !== PASS_POINT);
    expect(stop.length).toBeGreaterThan(0);
    expect(Math.max(...stop) - Math.min(...stop)).toBeLessThanOrEqual(STOP_RELEVANCE_DB);
    expect(Math.max(...stop)).toBe(c.model.levelDb[c.model.extremes.stop]);
  });

  it.each(MODEL_SPECS)("%s: predicts the level changes to second order in the deviations", (name) => {
    const c = caseOf(name);
    const d = unitDeviations(c.model.parts.length, 1, "uniform", 7);
    const big = levelChanges(c, d, 1e-3);
    const small = levelChanges(c, d, 1e-4);
    const err = (x: { exact: Float64Array; linear: Float64Array }) => maxAbs(x.exact.map((e, i) => e - x.linear[i]!));
    // the change itself is first order: ten times smaller for a ten times smaller step
    expect(maxAbs(small.exact)).toBeGreaterThan(0.05 * maxAbs(big.exact));
    // the model's error is second order: about a hundred times smaller (rounding floor 1e-9 dB)
    expect(err(big)).toBeLessThan(0.02 * maxAbs(big.exact));
    expect(err(small)).toBeLessThan(err(big) / 30 + 1e-9);
  });

  it.each(MODEL_SPECS)("%s: gives the first-order change of the band extremes (envelope theorem)", (name) => {
    const c = caseOf(name);
    const p = c.model.parts.length;
    for (const seed of [1, 2, 3]) {
      const d = unitDeviations(p, 1, "uniform", seed);
      const eps = 1e-4;
      const exact = maskFigures(rationalSource(boardPolys(c.stages, d.map((x) => eps * x))), c.plan, "golden");
      const lin = pointFigures(linearLevels(c.model, new Float64Array(p).fill(eps), d, 1), 0, c.model.band, c.plan.limits);
      const n = c.model.nominal;
      for (const [e, l, nominal] of [
        [exact.passbandLossDb, lin.passbandLossDb, n.passbandLossDb],
        [exact.stopbandAttenuationDb, lin.stopbandAttenuationDb, n.stopbandAttenuationDb],
        [exact.gainDb, lin.gainDb, n.gainDb],
      ] as const) {
        expect(Math.abs(e - l)).toBeLessThan(0.03 * Math.abs(e - nominal) + 1e-8);
      }
    }
  });
});

describe("predictYield", () => {
  it("with every tolerance zero passes every board of a design that meets the mask", () => {
    const c = caseOf("logger lowpass");
    const y = predictYield(c.model, c.plan, new Float64Array(c.model.parts.length), "uniform", { samples: 50 });
    expect(c.marginDb).toBeGreaterThan(0);
    expect(y.fraction).toBe(1);
    for (const m of y.marginDb) expect(m).toBeCloseTo(c.model.nominal.marginDb, 12);
  });

  // [design, resistor tolerance, capacitor tolerance, distribution, largest yield difference, smallest share of boards with the same verdict]
  const SMALL: [string, number, number, "uniform" | "normal", number, number][] = [
    ["logger lowpass", 0.01, 0.01, "uniform", 0.02, 0.98],
    ["logger lowpass", 0.001, 0.01, "normal", 0.02, 0.98],
    // the rumble design at the frequency-following default window (higher impedance): 96.9 % same verdicts measured
    ["rumble highpass", 0.01, 0.02, "uniform", 0.02, 0.96],
    ["hydrophone bandpass", 0.001, 0.01, "uniform", 0.03, 0.97],
    ["hydrophone bandpass", 0.01, 0.01, "normal", 0.03, 0.97],
    ["hum notch", 0.001, 0.01, "uniform", 0.02, 0.98],
    ["hum notch", 0.01, 0.01, "normal", 0.03, 0.97],
    // at 5 % capacitors the first-order model is a screen, not a verdict: measured 3.8 % apart in yield and
    // 92-93 % of verdicts shared for the band split and the one-op-amp notch (the design's yield always comes from boards)
    ["hydrophone band split", 0.01, 0.05, "uniform", 0.05, 0.9],
    ["hum notch, one-op-amp section", 0.01, 0.05, "uniform", 0.05, 0.9],
    ["hum notch, one-op-amp section", 0.001, 0.01, "normal", 0.03, 0.97],
    // the automatic rumble highpass (a one-op-amp highpass-notch section near its gain ceiling): measured 6.4 %
    // apart in yield and 93.6 % of verdicts shared at 1 % R, 2.2 % and 97.8 % at the 0.5 % R its design takes
    ["rumble highpass, one-op-amp section", 0.01, 0.02, "uniform", 0.07, 0.93],
    ["rumble highpass, one-op-amp section", 0.005, 0.02, "uniform", 0.03, 0.97],
  ];
  it.each(SMALL)("%s at %s R / %s C (%s): agrees with runBoards board by board", (name, rt, ct, distribution, diff, same) => {
    const c = caseOf(name);
    const stages = withTolerances(c.stages, rt, ct);
    const boards = 1000;
    const lin = predictYield(c.model, c.plan, boardTolerances(stages), distribution, { samples: boards, seed: 4 });
    const run = runBoards(stages, c.plan, { boards, seed: 4, distribution });
    let agree = 0;
    for (let k = 0; k < boards; k++) if (lin.marginDb[k]! >= 0 === run.marginDb[k]! >= 0) agree++;
    expect(Math.abs(lin.fraction - run.passed / boards)).toBeLessThanOrEqual(diff);
    expect(agree / boards).toBeGreaterThanOrEqual(same);
  });

  it("drifts from runBoards at 5 % R / 10 % C but still within 10 % of boards", () => {
    const c = caseOf("hydrophone bandpass");
    const stages = withTolerances(c.stages, 0.05, 0.1);
    const lin = predictYield(c.model, c.plan, boardTolerances(stages), "normal", { samples: 1000, seed: 4 });
    const run = runBoards(stages, c.plan, { boards: 1000, seed: 4, distribution: "normal" });
    expect(Math.abs(lin.fraction - run.passed / 1000)).toBeLessThan(0.1);
  });
});

describe("constraintSpreads", () => {
  it("sums the parts' contributions in quadrature and gives beta = margin / sigma", () => {
    const c = caseOf("rumble highpass");
    const tol = boardTolerances(c.stages);
    const spreads = constraintSpreads(c.model, c.plan, tol, "uniform");
    expect(spreads.map((s) => s.constraint)).toEqual(["passband", "stopband", "gain"]);
    const margins = [c.plan.limits.maxLossDb - c.model.nominal.passbandLossDb, c.model.nominal.stopbandAttenuationDb - c.plan.limits.minAttenuationDb];
    expect(spreads[0]!.marginDb).toBeCloseTo(margins[0]!, 12);
    expect(spreads[1]!.marginDb).toBeCloseTo(margins[1]!, 12);
    for (const s of spreads) {
      const v = s.gradient.reduce((a, g, j) => a + (g * tol[j]! / Math.sqrt(3)) ** 2, 0);
      expect(s.sigmaDb).toBeCloseTo(Math.sqrt(v), 14);
      expect(s.beta).toBeCloseTo(s.marginDb / s.sigmaDb, 12);
    }
    const normal = constraintSpreads(c.model, c.plan, tol, "normal");
    expect(normal[0]!.sigmaDb / spreads[0]!.sigmaDb).toBeCloseTo(sigmaPerTolerance("normal") * Math.sqrt(3), 12);
  });

  it("matches the sampled spread of the linearised passband peak (a single-peak passband)", () => {
    const c = caseOf("rumble highpass");
    const tol = boardTolerances(c.stages);
    const g = constraintSpreads(c.model, c.plan, tol, "normal").find((s) => s.constraint === "gain")!;
    const n = 20000;
    const levels = linearLevels(c.model, tol, unitDeviations(c.model.parts.length, n, "normal", 5), n);
    const points = c.model.levelDb.length;
    const peak = c.model.extremes.peak;
    let s1 = 0;
    let s2 = 0;
    for (let k = 0; k < n; k++) {
      const x = levels[k * points + peak]!;
      s1 += x;
      s2 += x * x;
    }
    const sd = Math.sqrt(s2 / n - (s1 / n) ** 2);
    expect(c.model.band[peak]).toBe(PASS_POINT);
    expect(Math.abs(sd / g.sigmaDb - 1)).toBeLessThan(0.03);
  });
});

describe("sigmaPerTolerance", () => {
  it("is the spread of the draws runBoards makes", () => {
    for (const distribution of ["uniform", "normal"] as const) {
      const d = unitDeviations(1, 40000, distribution, 3);
      const sd = Math.sqrt(d.reduce((a, x) => a + x * x, 0) / d.length);
      expect(Math.abs(sd / sigmaPerTolerance(distribution) - 1)).toBeLessThan(0.01);
    }
    expect(sigmaPerTolerance("uniform")).toBeCloseTo(1 / Math.sqrt(3), 15);
    expect(sigmaPerTolerance("normal")).toBeCloseTo(0.986579 / 3, 6);
  });
});
