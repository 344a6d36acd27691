/**
 * designLcLadder on scenarios of our own: a passive anti-alias lowpass ahead
 * of a fast ADC (50 ohm, 30 MHz passband) and a wideband 10.7 MHz IF
 * bandpass. The nominal mask figures against an independent nodal analysis
 * (acAnalysis), the lossless level, the boards' yield with tight and loose
 * parts, the dissipation loss of finite-Q inductors, and the typed errors.
 */
import { describe, expect, it } from "vitest";
import { acAnalysis, LADDER_SOURCE } from "../../src/circuit/index.ts";
import { designLcLadder, lcLadderNetlist, type LcLadderDesign } from "../../src/design/lc-ladder.ts";
import { InvalidArgumentError, SpecError, UnrealisableError } from "../../src/errors.ts";
import { logGrid } from "../../src/tf/index.ts";
import { ADC_SPEC, IF_SPEC, TIGHT } from "./lc-ladder-scenarios.ts";

const LOOSE = { ...TIGHT, inductorTolerance: 0.1, capacitorTolerance: 0.05 } as const;

/** |V(out)| in dB by the nodal analysis of the design's circuit. */
function mnaDb(d: LcLadderDesign, freqHz: ArrayLike<number>): Float64Array {
  const f = Float64Array.from(freqHz);
  const r = acAnalysis(d.circuit, { source: LADDER_SOURCE, outputs: [d.asBuilt.outputNode], freqHz: f });
  const v = r.outputs[d.asBuilt.outputNode] as { re: Float64Array; im: Float64Array };
  return f.map((_, i) => 10 * Math.log10((v.re[i] as number) ** 2 + (v.im[i] as number) ** 2));
}

/** The loss and attenuation from the lossless level on dense grids of the mask's bands, by the nodal analysis. */
function denseFigures(d: LcLadderDesign, pass: [number, number][], stop: [number, number][]): { loss: number; attenuation: number } {
  let low = Infinity;
  let high = -Infinity;
  for (const [a, b] of pass) for (const x of mnaDb(d, logGrid(a, b, 20000))) low = Math.min(low, x);
  for (const [a, b] of stop) for (const x of mnaDb(d, logGrid(a, b, 20000))) high = Math.max(high, x);
  return { loss: d.levelDb - low, attenuation: d.levelDb - high };
}

describe("designLcLadder: a 30 MHz anti-alias lowpass", () => {
  const tight = designLcLadder(ADC_SPEC, TIGHT);
  const loose = designLcLadder(ADC_SPEC, LOOSE);

  it("chooses a ladder that meets the mask as built, with its parts list and 50 ohm terminations", () => {
    expect(tight.verification.meetsSpec).toBe(true);
    expect(tight.order).toBeGreaterThanOrEqual(3);
    expect(tight.asBuilt.sourceOhms).toBe(50);
    expect(tight.asBuilt.loadOhms).toBeCloseTo(50, 9);
    expect(tight.parts.reduce((n, p) => n + p.quantity, 0)).toBe(tight.asBuilt.components.length);
    expect(tight.placement.chosenHz).toBeGreaterThanOrEqual(tight.placement.lowHz * (1 - 1e-12));
    expect(tight.placement.chosenHz).toBeLessThanOrEqual(tight.placement.highHz * (1 + 1e-12));
  });

  it("measures from the lossless level RL / (RS + RL)", () => {
    expect(tight.levelDb).toBeCloseTo(20 * Math.log10(0.5), 12);
  });

  it("reports the loss and attenuation the nodal analysis gives at the worst frequencies, to 1e-6 dB", () => {
    const v = tight.verification;
    const [pass, stop] = mnaDb(tight, [v.passbandWorstHz, v.stopbandWorstHz]) as unknown as [number, number];
    expect(Math.abs(tight.levelDb - pass - v.passbandLossDb)).toBeLessThan(1e-6);
    expect(Math.abs(tight.levelDb - stop - v.stopbandAttenuationDb)).toBeLessThan(1e-6);
    expect(Math.abs(v.passbandMarginDb - (1 - (tight.levelDb - pass)))).toBeLessThan(1e-6);
    expect(Math.abs(v.stopbandMarginDb - (tight.levelDb - stop - 45))).toBeLessThan(1e-6);
  });

  it("finds the band extremes a 20,000-point nodal sweep finds", () => {
    const dense = denseFigures(tight, [[30e3, 30e6]], [[60e6, 60e9]]);
    const v = tight.verification;
    expect(v.passbandLossDb).toBeGreaterThanOrEqual(dense.loss - 1e-9);
    expect(v.passbandLossDb - dense.loss).toBeLessThan(1e-3);
    expect(v.stopbandAttenuationDb).toBeLessThanOrEqual(dense.attenuation + 1e-9);
    expect(dense.attenuation - v.stopbandAttenuationDb).toBeLessThan(1e-3);
  });

  it("yields more boards with tight parts (1 % C, 2 % L) than with loose ones (5 %, 10 %), seeded", () => {
    const t = tight.verification.yield;
    const l = loose.verification.yield;
    expect(t.boards).toBe(512);
    expect(t.fraction).toBeGreaterThan(l.fraction);
    expect(t.lower95).toBeGreaterThan(l.upper95);
    expect(t.lower95).toBeLessThanOrEqual(t.fraction);
    expect(t.upper95).toBeGreaterThanOrEqual(t.fraction);
    expect(designLcLadder(ADC_SPEC, LOOSE).verification.yield).toEqual(l);
    expect(designLcLadder(ADC_SPEC, { ...LOOSE, seed: 12 }).verification.yield.passed).not.toBe(l.passed);
  });

  it("shows the inductors' dissipation loss in the passband", () => {
    const fixed = { ...ADC_SPEC, family: "elliptic", order: 5 } as const;
    const lossless = designLcLadder(fixed, { ...TIGHT, inductorQ: 1e6, boards: 1 });
    const lossy = designLcLadder(fixed, { ...TIGHT, inductorQ: 25, boards: 1 });
    expect(lossy.verification.passbandLossDb).toBeGreaterThan(lossless.verification.passbandLossDb + 0.3);
    // deep in the passband (1 MHz) the Q = 25 ladder already sits below its lossless level
    const [deep] = mnaDb(lossy, [1e6]) as unknown as [number];
    expect(lossy.levelDb - deep).toBeGreaterThan(0.01);
    const [deep0] = mnaDb(lossless, [1e6]) as unknown as [number];
    expect(Math.abs(lossless.levelDb - deep0)).toBeLessThan(0.01);
  });

  it("exports a SPICE netlist that prints vdb(out) over the spec's span", () => {
    const net = lcLadderNetlist(tight);
    expect(net).toContain(".print ac vdb(out)");
    expect(net).toMatch(/^\.ac dec 100 3e6 6e8$/m);
  });
});

describe("designLcLadder: a wideband 10.7 MHz IF bandpass", () => {
  const d = designLcLadder(IF_SPEC, { ...TIGHT, inductorQ: 100 });

  it("meets the mask as built, its figures those of the nodal analysis to 1e-6 dB", () => {
    const v = d.verification;
    expect(v.meetsSpec).toBe(true);
    const [pass, stop] = mnaDb(d, [v.passbandWorstHz, v.stopbandWorstHz]) as unknown as [number, number];
    expect(Math.abs(d.levelDb - pass - v.passbandLossDb)).toBeLessThan(1e-6);
    expect(Math.abs(d.levelDb - stop - v.stopbandAttenuationDb)).toBeLessThan(1e-6);
    const dense = denseFigures(d, [[9.8e6, 11.7e6]], [[7.5e3, 7.5e6], [15e6, 15e9]]);
    expect(v.passbandLossDb - dense.loss).toBeLessThan(1e-3);
    expect(v.passbandLossDb).toBeGreaterThanOrEqual(dense.loss - 1e-9);
    expect(dense.attenuation - v.stopbandAttenuationDb).toBeLessThan(1e-3);
  });
});

describe("designLcLadder: errors", () => {
  const bad: [string, Record<string, unknown>][] = [
    ["options.sourceOhms", { sourceOhms: -50 }],
    ["options.loadOhms", { loadOhms: 0 }],
    ["options.form", { form: "pi" }],
    ["options.inductorSeries", { inductorSeries: "E6" }],
    ["options.inductorTolerance", { inductorTolerance: 0.7 }],
    ["options.inductorQ", { inductorQ: 0.5 }],
    ["options.capacitorTolerance", { capacitorTolerance: -0.01 }],
    ["options.terminationTolerance", { terminationTolerance: Number.NaN }],
    ["options.boards", { boards: 2.5 }],
    ["options.seed", { seed: -1 }],
    ["options.colour", { colour: "red" }],
  ];
  it.each(bad)("names %s", (path, options) => {
    expect(() => designLcLadder(ADC_SPEC, options)).toThrow(InvalidArgumentError);
    try {
      designLcLadder(ADC_SPEC, options);
    } catch (e) {
      expect((e as InvalidArgumentError).path).toBe(path);
      expect((e as InvalidArgumentError).fn).toBe("designLcLadder");
    }
  });

  it("refuses an even-order Chebyshev I ladder between equal terminations, naming options.loadOhms", () => {
    const spec = { ...ADC_SPEC, family: "chebyshev1", order: 6 } as const;
    expect(() => designLcLadder(spec, { loadOhms: 50 })).toThrow(UnrealisableError);
    try {
      designLcLadder(spec, { loadOhms: 50 });
    } catch (e) {
      expect((e as UnrealisableError).path).toBe("options.loadOhms");
    }
    // its default load is the one its ripple needs, and the level is that of its ripple peaks: full power transfer
    const d = designLcLadder(spec, { boards: 1 });
    const ratio = d.asBuilt.loadOhms / d.asBuilt.sourceOhms;
    expect(d.levelDb).toBeCloseTo(20 * Math.log10(Math.sqrt(ratio) / 2), 9);
  });

  it("refuses an order above 12 and a bad spec", () => {
    expect(() => designLcLadder({ ...ADC_SPEC, order: 13 })).toThrow(InvalidArgumentError);
    expect(() => designLcLadder({ ...ADC_SPEC, passband: { edgeHz: -1, maxLossDb: 1 } })).toThrow(SpecError);
  });

  it("lcLadderNetlist refuses what is not a designed ladder", () => {
    expect(() => lcLadderNetlist({} as LcLadderDesign)).toThrow(InvalidArgumentError);
    expect(() => lcLadderNetlist(designLcLadder(ADC_SPEC, { boards: 1 }), { pointsPerDecade: 0 })).toThrow(InvalidArgumentError);
  });
});
