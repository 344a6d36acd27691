/**
 * designLcLadder on scenarios of our own: a passive anti-alias lowpass ahead
 * of a fast ADC (50 ohm, 30 MHz passband) and a wideband 10.7 MHz IF
 * bandpass. The nominal mask figures against an independent nodal analysis
 * (acAnalysis), the lossless level, the boards' yield with tight and loose
 * parts, the dissipation loss of finite-Q inductors, and the typed errors.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { acAnalysis, LADDER_SOURCE } from "../../src/circuit/index.ts";
import { designLcLadder, lcLadderNetlist, type LcLadderDesign } from "../../src/design/lc-ladder.ts";
import type { FilterSpec } from "../../src/design/spec.ts";
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

  it("builds boards whose verdict is the nominal one when the parts hardly spread, and spreads more with the terminations drawn", () => {
    const exact = designLcLadder(ADC_SPEC, { ...TIGHT, inductorTolerance: 1e-9, capacitorTolerance: 1e-9, boards: 64 });
    expect(exact.verification.meetsSpec).toBe(true);
    expect(exact.verification.yield.fraction).toBe(1);
    const miss = designLcLadder({ ...ADC_SPEC, stopband: { edgeHz: 60e6, minAttenuationDb: 45 }, family: "elliptic", order: 3 }, { ...TIGHT, inductorTolerance: 1e-9, capacitorTolerance: 1e-9, boards: 64 });
    expect(miss.verification.meetsSpec).toBe(false);
    expect(miss.verification.yield.fraction).toBe(0);
    const drawn = designLcLadder(ADC_SPEC, { ...LOOSE, terminationTolerance: 0.1 });
    expect(drawn.verification.yield.terminationTolerance).toBe(0.1);
    expect(drawn.verification.yield.passed).toBeLessThan(loose.verification.yield.passed);
  });

  it("reports the worst board, whose margin the nodal analysis of its drawn parts confirms", () => {
    const w = loose.verification.yield.worstBoard;
    expect(w.marginDb).toBeLessThan(0);
    const inductors = loose.circuit.elements.filter((e) => e.kind === "L");
    for (const e of inductors) expect(Math.abs((w.values[e.name] as number) / e.value - 1)).toBeLessThanOrEqual(0.1 + 1e-12);
    expect(inductors.some((e) => w.values[e.name] !== e.value)).toBe(true);
    // the loss resistances and the terminations are held at their values
    for (const e of loose.circuit.elements) if (e.kind === "R") expect(w.values[e.name], e.name).toBe(e.value);
    const board = { ...loose, circuit: { ...loose.circuit, elements: loose.circuit.elements.map((e) => (e.kind === "V" ? e : { ...e, value: w.values[e.name] as number })) } };
    const dense = denseFigures(board as LcLadderDesign, [[30e3, 30e6]], [[60e6, 60e9]]);
    const margin = Math.min(1 - dense.loss, dense.attenuation - 45);
    expect(Math.abs(margin - w.marginDb)).toBeLessThan(2e-3);
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

describe("designLcLadder: highpass and bandstop", () => {
  it.each([
    ["a 2 MHz highpass", { response: "highpass", passband: { edgeHz: 2e6, maxLossDb: 1 }, stopband: { edgeHz: 1e6, minAttenuationDb: 40 } }, 1e-9],
    [
      "a notch for the 88-108 MHz band",
      { response: "bandstop", passband: { edgeHz: [80e6, 118e6], maxLossDb: 1 }, stopband: { edgeHz: [90e6, 106e6], minAttenuationDb: 30 } },
      1e-6,
    ],
  ] as const)("builds %s whose figures are the nodal analysis's", (_name, spec, tol) => {
    for (const form of ["shunt-first", "series-first"] as const) {
      const d = designLcLadder(spec as FilterSpec, { form, boards: 64, inductorQ: 100, sourceOhms: 75 });
      const v = d.verification;
      expect(v.meetsSpec).toBe(true);
      expect(d.asBuilt.loadOhms).toBeCloseTo(75, 9);
      const [pass, stop] = mnaDb(d, [v.passbandWorstHz, v.stopbandWorstHz]) as unknown as [number, number];
      expect(Math.abs(d.levelDb - pass - v.passbandLossDb)).toBeLessThan(tol);
      expect(Math.abs(d.levelDb - stop - v.stopbandAttenuationDb)).toBeLessThan(tol);
    }
  });
});

describe("designLcLadder: random lowpass and highpass masks", () => {
  it("returns finite figures, positive parts and a yield in [0, 1] (seeded)", () => {
    fc.assert(
      fc.property(
        fc.constantFrom("lowpass", "highpass"),
        fc.double({ min: 3, max: 8, noNaN: true }),
        fc.double({ min: 1.3, max: 4, noNaN: true }),
        fc.double({ min: 0.1, max: 3, noNaN: true }),
        fc.double({ min: 20, max: 60, noNaN: true }),
        fc.constantFrom("shunt-first", "series-first"),
        (response, logEdge, ratio, lossDb, attDb, form) => {
          const p = 10 ** logEdge;
          const s = response === "lowpass" ? p * ratio : p / ratio;
          const d = designLcLadder(
            { response, passband: { edgeHz: p, maxLossDb: lossDb }, stopband: { edgeHz: s, minAttenuationDb: attDb } },
            { form, boards: 8, seed: 1 },
          );
          const v = d.verification;
          for (const x of [v.passbandLossDb, v.stopbandAttenuationDb, v.marginDb, v.exactMarginDb, d.levelDb, v.passbandWorstHz, v.stopbandWorstHz]) {
            expect(Number.isFinite(x)).toBe(true);
          }
          for (const c of d.asBuilt.components) expect(c.value > 0 && Number.isFinite(c.value)).toBe(true);
          expect(v.yield.fraction).toBeGreaterThanOrEqual(0);
          expect(v.yield.fraction).toBeLessThanOrEqual(1);
          expect(v.meetsSpec).toBe(v.marginDb >= 0);
        },
      ),
      { numRuns: 24, seed: 20261203 },
    );
  });
});
