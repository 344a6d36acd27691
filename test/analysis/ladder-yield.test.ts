import { describe, expect, it } from "vitest";
import { designFilter, type FilterSpec } from "../../src/index.ts";
import { activeLadderMonteCarlo, monteCarlo } from "../../src/analysis/index.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { fdnrLowpassLadder, gicHighpassLadder, leapfrogLowpassLadder } from "../../src/ladder/active/index.ts";
import { chebyshev1Ladder } from "../helpers/ladder-prototypes.ts";
import { thrownBy } from "../helpers/throws.ts";

// Our own scenario: the anti-alias lowpass ahead of a converter sampling at 52 kHz, flat to 18 kHz
// within 0.25 dB and 33 dB down from its Nyquist frequency, 26 kHz: a 7th-order Chebyshev I, 1 % resistors (E96) and
// 2 % capacitors (E12), the same parts and tolerances for the cascade and the ladders.
const spec: FilterSpec = {
  response: "lowpass",
  passband: { edgeHz: 18_000, maxLossDb: 0.25 },
  stopband: { edgeHz: 26_000, minAttenuationDb: 33 },
  family: "chebyshev1",
  order: 7,
  parts: { resistorSeries: "E96", capacitorSeries: "E12", resistorTolerance: 0.01, capacitorTolerance: 0.02 },
};
const BOARDS = 1000;
const SEED = 20_260_314;

describe("activeLadderMonteCarlo", () => {
  const design = designFilter(spec);
  // the ladder realises the very prototype the design placed: its ripple, at its natural frequency
  const ladder = chebyshev1Ladder(7, design.placement.designRippleDb as number, "series-first");
  const edgeHz = design.placement.chosenHz;

  it("gives a 7th-order Chebyshev I leapfrog and FDNR ladder far higher yield than the biquad cascade (same spec, parts, tolerances, boards)", () => {
    expect(design.verification.meetsSpec).toBe(true);
    const cascade = monteCarlo(design, { runs: BOARDS, seed: SEED });
    const leapfrog = activeLadderMonteCarlo(design, leapfrogLowpassLadder(ladder, { edgeHz }), { runs: BOARDS, seed: SEED });
    const fdnr = activeLadderMonteCarlo(design, fdnrLowpassLadder(ladder, { edgeHz }), { runs: BOARDS, seed: SEED });
    expect(cascade.tolerances).toEqual({ resistor: 0.01, capacitor: 0.02 });
    expect(leapfrog.tolerances).toEqual(cascade.tolerances);
    expect(fdnr.tolerances).toEqual(cascade.tolerances);
    expect(cascade.yield).toBeLessThan(0.15);
    for (const r of [leapfrog, fdnr]) {
      expect(r.yield).toBeGreaterThan(0.5);
      // far apart: beyond ten standard errors of the difference
      expect(r.yield - cascade.yield).toBeGreaterThan(10 * Math.hypot(r.yieldStandardError, cascade.yieldStandardError));
      expect(r.marginDb.median).toBeGreaterThan(cascade.marginDb.median);
    }
  });

  it("meets the mask with every part at its preferred value and no spread", () => {
    for (const f of [leapfrogLowpassLadder(ladder, { edgeHz }), fdnrLowpassLadder(ladder, { edgeHz })]) {
      const r = activeLadderMonteCarlo(design, f, { runs: 1, resistorTolerance: 0, capacitorTolerance: 0 });
      expect(r.yield).toBe(1);
      expect(r.marginDb.min).toBeGreaterThan(0.05);
      expect(Object.keys(r.worstBoard).length).toBe(f.parts.length);
    }
  });

  it("with 10 MHz single-pole op-amps, the pre-distorted ladders meet the mask about as often as with ideal ones; uncorrected, on no board", () => {
    const opamp = { kind: "single-pole", a0: 2e5, gbwHz: 10e6 } as const;
    const real = designFilter({ ...spec, opamp: { a0: 2e5, gbwHz: "10M" } });
    for (const make of [leapfrogLowpassLadder, fdnrLowpassLadder]) {
      const ideal = activeLadderMonteCarlo(design, make(ladder, { edgeHz }), { runs: BOARDS, seed: SEED });
      const plain = activeLadderMonteCarlo(real, make(ladder, { edgeHz, opamp, predistort: false }), { runs: BOARDS, seed: SEED });
      const fixed = activeLadderMonteCarlo(real, make(ladder, { edgeHz, opamp }), { runs: BOARDS, seed: SEED });
      // measured (1000 boards, the resistors re-tuned after rounding in each): leapfrog 79.5 % ideal, 0 % uncorrected,
      // 75.9 % pre-distorted; FDNR 75.4 %, 0 %, 76.6 %
      expect(plain.yield).toBeLessThan(0.02);
      expect(plain.marginDb.median).toBeLessThan(-0.2);
      expect(fixed.yield).toBeGreaterThan(ideal.yield - 0.05);
      expect(fixed.marginDb.median).toBeGreaterThan(0);
    }
  });

  it("repeats exactly for a seed", () => {
    const f = leapfrogLowpassLadder(ladder, { edgeHz });
    expect(activeLadderMonteCarlo(design, f, { runs: 300, seed: 5 })).toEqual(activeLadderMonteCarlo(design, f, { runs: 300, seed: 5 }));
  });

  it("refuses a ladder for another response, a ladder that is not one, and bad options", () => {
    const hp = gicHighpassLadder(ladder, { edgeHz });
    expect(thrownBy(() => activeLadderMonteCarlo(design, hp), InvalidArgumentError).path).toBe("ladder.response");
    expect(thrownBy(() => activeLadderMonteCarlo(design, null as never), InvalidArgumentError).path).toBe("ladder");
    const f = leapfrogLowpassLadder(ladder, { edgeHz });
    expect(thrownBy(() => activeLadderMonteCarlo(design, { ...f, output: "nowhere" }), InvalidArgumentError).path).toBe("ladder.output");
    expect(thrownBy(() => activeLadderMonteCarlo(design, f, { runs: 0 }), InvalidArgumentError).path).toBe("options.runs");
    expect(thrownBy(() => activeLadderMonteCarlo(design, f, { capacitorTolerance: 2 }), InvalidArgumentError).path).toBe("options.capacitorTolerance");
    expect(thrownBy(() => activeLadderMonteCarlo({} as never, f), InvalidArgumentError).fn).toBe("activeLadderMonteCarlo");
  });
});
