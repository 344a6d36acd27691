import { describe, expect, it } from "vitest";
import { designFilter } from "../../src/design/index.ts";
import { builtStages } from "../../src/design/response.ts";
import { checkMask, maskPlan, spanRadS } from "../../src/design/verify.ts";
import { BATCH, mergeBoardRuns, runBoards, type BoardRun, type BoardStage } from "../../src/evaluate/boards.ts";
import { expectSameBits } from "../helpers/same-bits.ts";
import { compileStage } from "../../src/evaluate/stage-polynomials.ts";

const TWO_PI = 2 * Math.PI;

// An anti-alias lowpass for a slow data logger (our own scenario), with a real op-amp.
const design = designFilter({
  response: "lowpass",
  passband: { edgeHz: 2000, maxLossDb: 0.5 },
  stopband: { edgeHz: 6000, minAttenuationDb: 50 },
  family: "chebyshev1",
  opamp: { a0: 2e5, gbwHz: "3M" },
});
const spec = design.spec;
const plan = maskPlan(spec);
const built = builtStages(design);

function boardStages(rt: number, ct: number): BoardStage[] {
  return built.map((s) => {
    const compiled = compileStage(s.topology, s.values, spec.opamp, spanRadS(plan.bands));
    return {
      compiled,
      nominal: Float64Array.from(compiled.componentNames, (n) => s.values[n]!),
      tolerance: Float64Array.from(compiled.componentNames, (n) => (n.startsWith("C") ? ct : rt)),
      radius: TWO_PI * s.topology.figures(s.values).f0Hz,
    };
  });
}

describe("runBoards", () => {
  it("with zero tolerance every board has the design's own margin (5e-6 dB: one parabolic step away from the verdict band; 2.2e-6 dB measured on an interior ripple peak of this design)", () => {
    const run = runBoards(boardStages(0, 0), plan, { boards: 10, seed: 1, distribution: "uniform" });
    for (const m of run.marginDb) expect(Math.abs(m - design.verification.marginDb)).toBeLessThan(5e-6);
    expect(run.passed).toBe(design.verification.meetsSpec ? 10 : 0);
  });

  it("gives each board the verdict the design's verification gives its parts, and its margin to 1e-6 dB", () => {
    const stages = boardStages(0.01, 0.05);
    const run = runBoards(stages, plan, { boards: 40, seed: 11, distribution: "uniform" });
    // the worst board, rebuilt from its values and checked by the design layer's mask check
    const worst = built.map((s, k) => {
      const names = stages[k]!.compiled.componentNames;
      const values = Object.fromEntries(names.map((n, j) => [n, run.worstValues[k]![j]!]));
      return { topology: s.topology, values };
    });
    const m = checkMask(spec, worst, spec.opamp);
    expect(Math.abs(m.marginDb - run.marginDb[run.worstBoard]!)).toBeLessThan(1e-6);
    expect(m.marginDb >= 0).toBe(run.marginDb[run.worstBoard]! >= 0);
    expect(Math.min(...run.marginDb)).toBe(run.marginDb[run.worstBoard]);
  });

  it("draws board k the same whatever the number of boards after it", () => {
    const stages = boardStages(0.01, 0.05);
    const short = runBoards(stages, plan, { boards: BATCH + 17, seed: 5, distribution: "uniform" });
    const long = runBoards(stages, plan, { boards: 2 * BATCH + 3, seed: 5, distribution: "uniform" });
    expect(Array.from(long.marginDb.subarray(0, BATCH + 17))).toEqual(Array.from(short.marginDb));
    const other = runBoards(stages, plan, { boards: 50, seed: 6, distribution: "uniform" });
    expect(Array.from(other.marginDb)).not.toEqual(Array.from(short.marginDb.subarray(0, 50)));
  });

  it("keeps every part within its tolerance, for both distributions", () => {
    for (const distribution of ["uniform", "normal"] as const) {
      const stages = boardStages(0.02, 0.1);
      const run = runBoards(stages, plan, { boards: 300, seed: 2, distribution });
      stages.forEach((s, k) => {
        s.nominal.forEach((v, j) => {
          const x = run.worstValues[k]![j]! / v - 1;
          expect(Math.abs(x)).toBeLessThanOrEqual(s.tolerance[j]! * (1 + 1e-12));
        });
      });
    }
  });

  it("spreads normal draws less than uniform ones (sigma = tolerance / 3 against tolerance / sqrt 3)", () => {
    const stages = boardStages(0.01, 0.05);
    const u = runBoards(stages, plan, { boards: 600, seed: 9, distribution: "uniform" });
    const n = runBoards(stages, plan, { boards: 600, seed: 9, distribution: "normal" });
    const sd = (x: Float64Array) => {
      const m = x.reduce((a, b) => a + b, 0) / x.length;
      return Math.sqrt(x.reduce((a, b) => a + (b - m) ** 2, 0) / (x.length - 1));
    };
    // the passband level follows the parts roughly linearly: its spread scales with the part spread (ratio sqrt(3)/3 = 0.58)
    const ratio = sd(n.gainDb) / sd(u.gainDb);
    expect(ratio).toBeGreaterThan(0.45);
    expect(ratio).toBeLessThan(0.72);
  });
});

describe("mergeBoardRuns", () => {
  it("joins runs of consecutive whole batches into the one run over them all, bit for bit", () => {
    const stages = boardStages(0.01, 0.05);
    const boards = 3 * BATCH + 41;
    const whole = runBoards(stages, plan, { boards, seed: 21, distribution: "normal" });
    const piece = (from: number, to: number): BoardRun =>
      runBoards(stages, plan, { boards: to - from, seed: 21, distribution: "normal", firstBoard: from });
    expectSameBits(mergeBoardRuns([piece(0, BATCH), piece(BATCH, boards)]), whole);
    expectSameBits(mergeBoardRuns([piece(0, BATCH), piece(BATCH, 3 * BATCH), piece(3 * BATCH, boards)]), whole);
    expectSameBits(mergeBoardRuns([whole]), whole);
  });

  /** A made-up run of `margins.length` boards from `first` (NaN: an unstable board), with the worst board as runBoards picks it. */
  function made(first: number, margins: readonly number[]): BoardRun {
    let worst = 0;
    let worstMargin = Infinity;
    margins.forEach((m, k) => {
      const x = Number.isNaN(m) ? -Infinity : m;
      if (x < worstMargin) {
        worstMargin = x;
        worst = first + k;
      }
    });
    const none = worstMargin === Infinity;
    return {
      boards: margins.length,
      passed: margins.filter((m) => m >= 0).length,
      unstable: margins.filter((m) => Number.isNaN(m)).length,
      marginDb: Float64Array.from(margins),
      passbandLossDb: Float64Array.from(margins, (m) => -m),
      stopbandAttenuationDb: Float64Array.from(margins, (m) => 2 * m),
      gainDb: Float64Array.from(margins, (m) => 3 * m),
      worstBoard: none ? 0 : worst,
      worstMarginDb: worstMargin,
      worstValues: [Float64Array.of(none ? 0 : worst)],
    };
  }

  it.each([
    ["a tie across runs goes to the earlier board", [[0.5, -1, 2], [-1, 3]], 1],
    ["a smaller margin in a later run wins", [[0.5, -1, 2], [3, -1.5]], 4],
    ["the first unstable board wins over any margin", [[-3, 1], [NaN, -9], [NaN]], 2],
    ["an unstable board in the first run stays worst", [[NaN], [-9, NaN]], 0],
    ["a run without a worst board (+Infinity) gives way to one with a margin", [[], [1, -2]], 1],
  ] as [string, number[][], number][])("%s", (_what, parts, expected) => {
    let first = 0;
    const runs = parts.map((m) => {
      const r = made(first, m);
      first += m.length;
      return r;
    });
    const merged = mergeBoardRuns(runs);
    const single = made(0, parts.flat());
    expect(merged.worstBoard).toBe(expected);
    expectSameBits(merged, single);
  });
});
