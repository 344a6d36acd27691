/**
 * compareRealisations: the design's cascade against the active ladders of
 * the same prototype, on the same boards, and the choice by yield and
 * op-amp count.
 */
import { describe, expect, it } from "vitest";
import { designFilter, InvalidArgumentError } from "../../src/index.ts";
import { compareRealisations } from "../../src/analysis/index.ts";
import { thrownBy } from "../helpers/throws.ts";
import { SHARP_LOWPASS } from "../helpers/sharp-lowpass.ts";

const sharp = SHARP_LOWPASS;

describe("compareRealisations", () => {
  const design = designFilter(sharp);
  const c = compareRealisations(design, { runs: 600, seed: 11 });

  it("builds the cascade, the leapfrog and the FDNR ladder of a lowpass on the same boards", () => {
    expect(c.candidates.map((k) => k.method)).toEqual(["biquad-cascade", "leapfrog", "fdnr"]);
    expect(c.candidates.every((k) => k.boards === 600)).toBe(true);
    expect(c.tolerances).toEqual({ resistor: 0.01, capacitor: 0.02 });
    const cascade = c.candidates[0];
    expect(cascade?.opamps).toBe(design.stages.reduce((k, st) => k + st.opamps.length, 0));
    for (const k of c.candidates) {
      expect(k.lower95).toBeLessThanOrEqual(k.yield);
      expect(k.upper95).toBeGreaterThanOrEqual(k.yield);
      expect(k.meetsTarget).toBe(k.lower95 >= 0.5);
    }
  });

  it("chooses a ladder, which meets the target the cascade misses, and says why", () => {
    const [cascade, ...ladders] = c.candidates;
    expect(cascade?.meetsTarget).toBe(false);
    expect(ladders.some((k) => k.meetsTarget)).toBe(true);
    const chosen = c.candidates[c.chosen];
    expect(chosen?.realisation).toBe("active-ladder");
    expect(chosen?.ladder?.method).toBe(chosen?.method);
    const meeting = c.candidates.filter((k) => k.meetsTarget);
    expect(chosen?.opamps).toBe(Math.min(...meeting.map((k) => k.opamps)));
    expect(c.reason).toMatch(/active ladder: .* 50 % yield target, at .* of boards/);
  });

  it("pre-distorts the ladders for the spec's op-amp and re-tunes them: with 10 MHz op-amps they still meet the target the cascade misses", () => {
    const real = compareRealisations(designFilter({ ...sharp, opamp: { a0: 2e5, gbwHz: "10M" } }), { runs: 600, seed: 11 });
    const [cascade, ...ladders] = real.candidates;
    expect(cascade?.meetsTarget).toBe(false);
    expect(ladders.map((k) => k.method)).toEqual(["leapfrog", "fdnr"]);
    for (const k of ladders) {
      expect(k.ladder?.predistortion).not.toBeNull();
      // and re-tuned after rounding: the largest pole error of the rounded circuit cut at least by half
      const r = k.ladder?.retune;
      expect(r?.errorAfterDb).toBeLessThan((r?.errorBeforeDb ?? 0) / 2);
      expect(k.meetsTarget).toBe(true);
      expect(k.medianMarginDb).toBeGreaterThan(0);
    }
  });

  it("uses GIC inductors for a highpass and says why a bandpass has no ladder yet", () => {
    const hp = compareRealisations(designFilter({ response: "highpass", passband: { edgeHz: 400, maxLossDb: 0.5 }, stopband: { edgeHz: 150, minAttenuationDb: 40 } }), { runs: 200 });
    expect(hp.candidates.map((k) => k.method)).toEqual(["biquad-cascade", "gic-inductor"]);
    const bp = compareRealisations(designFilter({ response: "bandpass", passband: { edgeHz: [300, 3400], maxLossDb: 1 }, stopband: { edgeHz: [100, "10k"], minAttenuationDb: 30 } }), { runs: 100 });
    expect(bp.candidates.map((k) => k.method)).toEqual(["biquad-cascade"]);
    expect(bp.skipped.map((k) => k.method)).toEqual(["leapfrog", "fdnr", "gic-inductor"]);
    expect(bp.chosen).toBe(0);
  });

  it("refuses what is not a design and bad options, naming the field", () => {
    expect(thrownBy(() => compareRealisations({} as never), InvalidArgumentError).fn).toBe("compareRealisations");
    expect(thrownBy(() => compareRealisations(design, { runs: 0 }), InvalidArgumentError).path).toBe("options.runs");
    expect(thrownBy(() => compareRealisations(design, { capacitorTolerance: 0.5 }), InvalidArgumentError).path).toBe("options.capacitorTolerance");
  });
});
