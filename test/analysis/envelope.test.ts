import { describe, expect, it } from "vitest";
import { designFilter, designResponse, type DesignResult } from "../../src/design/index.ts";
import { monteCarlo } from "../../src/analysis/index.ts";
import { monteCarloEnvelope } from "../../src/analysis/envelope.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { thrownBy } from "../helpers/throws.ts";

const design = designFilter({
  response: "lowpass",
  passband: { edgeHz: "3.3k", maxLossDb: 0.5 },
  stopband: { edgeHz: "12k", minAttenuationDb: 45 },
  opamp: { a0: 1e5, gbwHz: "5M" },
});

/** The same design with some part values replaced (by designator). */
function withValues(r: DesignResult, values: Readonly<Record<string, number>>): DesignResult {
  return { ...r, stages: r.stages.map((s) => ({ ...s, components: Object.fromEntries(Object.entries(s.components).map(([k, v]) => [k, values[k] ?? v])) })) };
}

/** |H| in dB of a design on a grid, by its public response. */
function db(r: DesignResult, f: Float64Array): Float64Array {
  const h = designResponse(r, f);
  return Float64Array.from(f, (_, i) => 20 * Math.log10(Math.hypot(h.re[i] as number, h.im[i] as number)));
}

describe("monteCarloEnvelope", () => {
  it("builds the boards monteCarlo builds: one board's curve is the response of monteCarlo's board with the same seed", () => {
    const e = monteCarloEnvelope(design, { runs: 1, seed: 7, points: 60 });
    const board = withValues(design, monteCarlo(design, { runs: 1, seed: 7 }).worstBoard);
    const expected = db(board, e.freqHz);
    for (let i = 0; i < e.freqHz.length; i++) {
      expect(e.minDb[i]).toBeCloseTo(expected[i] as number, 3);
      expect(e.maxDb[i]).toBe(e.minDb[i]);
    }
    // and the nominal curve is the design's own
    const nominal = db(design, e.freqHz);
    for (let i = 0; i < e.freqHz.length; i++) expect(e.nominalDb[i]).toBeCloseTo(nominal[i] as number, 9);
  });

  it("takes quantiles by linear interpolation between order statistics (Hyndman & Fan definition 7)", () => {
    const e = monteCarloEnvelope(design, { runs: 2, points: 40, coverage: 0.8 });
    for (let i = 0; i < e.freqHz.length; i++) {
      const lo = e.minDb[i] as number;
      const span = (e.maxDb[i] as number) - lo;
      // two boards: the 10th percentile is 10 % of the way from the lower to the upper
      expect(e.lowerDb[i]).toBeCloseTo(lo + 0.1 * span, 4);
      expect(e.medianDb[i]).toBeCloseTo(lo + 0.5 * span, 4);
      expect(e.upperDb[i]).toBeCloseTo(lo + 0.9 * span, 4);
    }
  });

  it("orders its curves and keeps the nominal inside the spread of 300 boards in the passband", () => {
    const e = monteCarloEnvelope(design, { runs: 300 });
    expect(e.freqHz.length).toBe(400);
    expect(e.leftOut).toBe(0);
    for (let i = 0; i < e.freqHz.length; i++) {
      expect(e.minDb[i]).toBeLessThanOrEqual(e.lowerDb[i] as number);
      expect(e.lowerDb[i]).toBeLessThanOrEqual(e.medianDb[i] as number);
      expect(e.medianDb[i]).toBeLessThanOrEqual(e.upperDb[i] as number);
      expect(e.upperDb[i]).toBeLessThanOrEqual(e.maxDb[i] as number);
      if ((e.freqHz[i] as number) < 3000) {
        expect(e.nominalDb[i]).toBeGreaterThan((e.minDb[i] as number) - 1e-3);
        expect(e.nominalDb[i]).toBeLessThan((e.maxDb[i] as number) + 1e-3);
      }
    }
    // the same seed gives the same curves
    expect(monteCarloEnvelope(design, { runs: 300 }).upperDb).toEqual(e.upperDb);
  });

  it("collapses onto the nominal curve with exact parts", () => {
    const e = monteCarloEnvelope(design, { runs: 20, points: 30, resistorTolerance: 0, capacitorTolerance: 0 });
    for (let i = 0; i < 30; i++) {
      expect(e.minDb[i]).toBeCloseTo(e.nominalDb[i] as number, 3);
      expect(e.maxDb[i]).toBeCloseTo(e.nominalDb[i] as number, 3);
    }
  });

  it("names the option that is out of range", () => {
    const path = (o: unknown): string | undefined => thrownBy(() => monteCarloEnvelope(design, o as never), InvalidArgumentError).path;
    expect(path({ runs: 30000 })).toBe("options.runs");
    expect(path({ runs: 20000, points: 4000 })).toBe("options.runs");
    expect(path({ points: 3 })).toBe("options.points");
    expect(path({ coverage: 1 })).toBe("options.coverage");
    expect(path({ coverage: 0 })).toBe("options.coverage");
    expect(path({ bandHz: [10, 5] })).toBe("options.bandHz");
    expect(path({ resistorTolerance: 2 })).toBe("options.resistorTolerance");
  });
});
