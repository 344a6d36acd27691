import { afterAll, describe, expect, it } from "vitest";
import { designFilter, designResponse, type DesignResult, type FilterSpec } from "../../src/design/index.ts";
import { toSpiceNetlist } from "../../src/report/index.ts";
import { isInSeries } from "../../src/parts/index.ts";
import { SpecError } from "../../src/errors.ts";
import { loadFixture } from "../helpers/fixtures.ts";
import { requireNgspice, runAc } from "../helpers/ngspice.ts";

interface SpecEntry {
  readonly id: string;
  readonly scenario: string;
  readonly spec: FilterSpec;
  readonly scipyOrder?: number;
}

const fixture = loadFixture<{ specs: SpecEntry[] }>("design-specs.json");
const haveSpice = requireNgspice();

function allPartsInSeries(r: DesignResult): void {
  const seen = new Set<string>();
  for (const st of r.stages) {
    for (const [d, v] of Object.entries(st.components)) {
      expect(seen.has(d), `designator ${d} used twice`).toBe(false);
      seen.add(d);
      const series = d.startsWith("C") ? r.spec.capacitorSeries : r.spec.resistorSeries;
      expect(isInSeries(v, series), `${d} = ${v} is not an ${series} value`).toBe(true);
    }
    for (const u of st.opamps) {
      expect(seen.has(u)).toBe(false);
      seen.add(u);
    }
  }
}

/** Largest |dB difference| between ngspice and our as-built response where ours is above -80 dB. */
function spiceAgreementDb(r: DesignResult, real = false): { worst: number; points: number } {
  const sim = runAc(toSpiceNetlist(r, { pointsPerDecade: 40 }), ["out"]);
  const out = sim.vectors["out"] as { re: Float64Array; im: Float64Array };
  const ours = designResponse(r, sim.freqHz, real ? {} : { opamp: { kind: "ideal" } });
  let worst = 0;
  let points = 0;
  for (let i = 0; i < sim.freqHz.length; i++) {
    const a = 20 * Math.log10(Math.hypot(ours.re[i] as number, ours.im[i] as number));
    if (!(a > -80)) continue;
    const b = 20 * Math.log10(Math.hypot(out.re[i] as number, out.im[i] as number));
    worst = Math.max(worst, Math.abs(a - b));
    points++;
  }
  return { worst, points };
}

const agreement = { worstDb: 0, specs: 0, points: 0 };

/** Each spec designed once: the mask test and the ngspice test of an entry share the result. */
const designed = new Map<FilterSpec, DesignResult>();
function designOnce(spec: FilterSpec): DesignResult {
  let r = designed.get(spec);
  if (r === undefined) {
    r = designFilter(spec);
    designed.set(spec, r);
  }
  return r;
}

describe("designFilter end to end (our own scenarios)", () => {
  afterAll(() => {
    if (agreement.specs > 0) {
      console.log(`ngspice agreement: worst ${agreement.worstDb.toExponential(2)} dB over ${agreement.specs} specs, ${agreement.points} points above -80 dB`);
    }
  });

  it("covers every response and every family", () => {
    const responses = new Set(fixture.specs.map((s) => s.spec.response));
    expect([...responses].sort()).toEqual(["bandpass", "bandstop", "highpass", "lowpass"]);
    const families = new Set(fixture.specs.map((s) => designFilter(s.spec).family));
    expect(families.size).toBe(6);
    expect(fixture.specs.length).toBeGreaterThanOrEqual(30);
  });

  for (const entry of fixture.specs) {
    it(`${entry.id} (${entry.scenario}): meets the mask as built`, () => {
      const r = designOnce(entry.spec);
      const v = r.verification;
      const why = `${entry.id}: ${r.family} order ${r.order}; margins pass ${v.passbandMarginDb.toFixed(4)} stop ${v.stopbandMarginDb.toFixed(4)} gain ${v.gainMarginDb.toFixed(4)}; ${JSON.stringify(r.actions.map((a) => a.code))}`;
      expect(v.meetsSpec, why).toBe(true);
      expect(v.marginDb).toBeGreaterThanOrEqual(0);
      if (entry.scipyOrder !== undefined && entry.spec.order === undefined) {
        if (entry.spec.response === "bandstop" || entry.spec.response === "bandpass") {
          // Both sides choose the band centre differently (scipy moves bandstop passband
          // edges; we search the centre with the given edges), so allow one order apart.
          expect(Math.abs(r.minimumOrder - entry.scipyOrder)).toBeLessThanOrEqual(1);
        } else expect(r.minimumOrder, "minimum order vs scipy").toBe(entry.scipyOrder);
      }
      if (entry.spec.order !== undefined) expect(r.order).toBe(entry.spec.order);
      allPartsInSeries(r);
    });

    it.skipIf(!haveSpice)(`${entry.id} (${entry.scenario}): ngspice agrees with the as-built response to 0.01 dB`, () => {
      const agree = spiceAgreementDb(designOnce(entry.spec));
      expect(agree.points).toBeGreaterThan(20);
      expect(agree.worst, `${entry.id}: ngspice vs as-built`).toBeLessThanOrEqual(0.01);
      agreement.worstDb = Math.max(agreement.worstDb, agree.worst);
      agreement.specs++;
      agreement.points += agree.points;
    });
  }
});

describe("designFilter with a real op-amp", () => {
  const opamp = { a0: 2e5, gbwHz: "10 MHz" } as const;
  const specs: FilterSpec[] = [
    { response: "lowpass", passband: { edgeHz: "5k", maxLossDb: 0.5 }, stopband: { edgeHz: "20k", minAttenuationDb: 50 }, family: "chebyshev1", opamp },
    { response: "highpass", passband: { edgeHz: 300, maxLossDb: 1, topHz: "20k" }, stopband: { edgeHz: 80, minAttenuationDb: 40 }, family: "butterworth", opamp },
    { response: "bandstop", passband: { edgeHz: [600, 1800], maxLossDb: 1, topHz: "30k" }, stopband: { edgeHz: [950, 1100], minAttenuationDb: 30 }, family: "elliptic", opamp },
  ];
  for (const spec of specs) {
    it(`${spec.response} ${spec.family}: meets the mask with the single-pole model`, () => {
      const r = designOnce(spec);
      expect(r.verification.opamp.kind).toBe("single-pole");
      expect(r.verification.meetsSpec, JSON.stringify(r.verification.marginDb)).toBe(true);
    });

    it.skipIf(!haveSpice)(`${spec.response} ${spec.family}: ngspice (single-pole op-amp macro) agrees to 0.01 dB`, () => {
      const agree = spiceAgreementDb(designOnce(spec), true);
      expect(agree.points).toBeGreaterThan(20);
      expect(agree.worst).toBeLessThanOrEqual(0.01);
    });
  }
});

describe("designFilter outcomes", () => {
  const lp: FilterSpec = {
    response: "lowpass",
    passband: { edgeHz: 1000, maxLossDb: 0.5 },
    stopband: { edgeHz: 2000, minAttenuationDb: 60 },
  };

  it("reports a forced order that is too low as not meeting the mask, with margins", () => {
    const r = designFilter({ ...lp, family: "butterworth", order: 3 });
    expect(r.order).toBe(3);
    expect(r.verification.meetsSpec).toBe(false);
    expect(r.verification.stopbandMarginDb).toBeLessThan(-10);
    // The passband is kept (up to rounding); the stopband takes the shortfall.
    expect(r.verification.passbandMarginDb).toBeGreaterThan(-0.1);
    expect(r.verification.marginDb).toBe(
      Math.min(r.verification.passbandMarginDb, r.verification.stopbandMarginDb, r.verification.gainMarginDb),
    );
    expect(r.warnings.some((w) => w.code === "spec-not-met")).toBe(true);
  });

  it("throws one SpecError listing every problem of a malformed spec", () => {
    let err: unknown;
    try {
      designFilter({ response: "lowpas", passband: { edgeHz: -5, maxLossDb: 0.5 }, stopband: {}, order: 0 } as unknown as FilterSpec);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(SpecError);
    const paths = (err as SpecError).issues.map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(["response", "stopband.edgeHz", "stopband.minAttenuationDb", "order"]));
  });

  it("refuses a per-stage topology list of the wrong length", () => {
    expect(() =>
      designFilter({ ...lp, family: "butterworth", order: 4, topology: ["sallen-key-lowpass-unity"] }),
    ).toThrow(SpecError);
  });

  it("uses one named topology wherever it fits and refuses one that fits nowhere", () => {
    const r = designFilter({ ...lp, stopband: { edgeHz: 4000, minAttenuationDb: 40 }, family: "butterworth", order: 5, topology: "mfb-lowpass" });
    expect(r.stages.slice(1).map((s) => s.topology)).toEqual(["mfb-lowpass", "mfb-lowpass"]);
    expect(r.stages[0]?.order).toBe(1);
    expect(() => designFilter({ ...lp, topology: "sallen-key-highpass-unity" })).toThrow(SpecError);
  });

  it("honours a per-stage topology list and the requested polarity", () => {
    const r = designFilter({
      ...lp,
      stopband: { edgeHz: 4000, minAttenuationDb: 40 },
      family: "butterworth",
      order: 6,
      topology: ["mfb-lowpass", "mfb-lowpass", "mfb-lowpass"],
      gain: { db: 0, polarity: "non-inverting" },
    });
    expect(r.stages.map((s) => s.topology)).toEqual(["mfb-lowpass", "mfb-lowpass", "mfb-lowpass"]);
    // Three inverting stages make an inverting filter: the requested polarity cannot be met and says so.
    expect(r.verification.polarity).toBe("inverting");
    expect(r.verification.polarityOk).toBe(false);
    expect(r.verification.meetsSpec).toBe(false);
    expect(r.warnings.some((w) => w.code === "polarity")).toBe(true);
    const auto = designFilter({ ...lp, stopband: { edgeHz: 4000, minAttenuationDb: 40 }, family: "butterworth", gain: { db: 0, polarity: "non-inverting" } });
    expect(auto.verification.polarity).toBe("non-inverting");
    expect(auto.verification.meetsSpec).toBe(true);
    const inv = designFilter({ ...lp, stopband: { edgeHz: 4000, minAttenuationDb: 40 }, family: "butterworth", gain: { vPerV: -1 } });
    expect(inv.verification.polarity).toBe("inverting");
    expect(inv.verification.polarityOk).toBe(true);
  });

  it("chooses the family automatically and says why", () => {
    const fewest = designFilter({ ...lp, priority: "fewest-stages" });
    expect(fewest.familyChoice.automatic).toBe(true);
    expect(fewest.familyChoice.candidates.length).toBe(6);
    const minStages = Math.min(...fewest.familyChoice.candidates.map((c) => c.stages ?? Infinity));
    // the family chosen is the one with the fewest stages (the yield target may then add an order)
    expect(fewest.familyChoice.candidates.find((c) => c.family === fewest.family)?.stages).toBe(minStages);
    expect(fewest.stages.length).toBeLessThanOrEqual(minStages + 1);
    expect(fewest.familyChoice.reason).toContain("fewest stages");
    // The default priority counts op-amps first: for this anti-alias spec an
    // elliptic design has the fewest stages but needs multi-amplifier notch stages.
    const aa: FilterSpec = {
      response: "lowpass",
      passband: { edgeHz: 2000, maxLossDb: 0.1 },
      stopband: { edgeHz: 24000, minAttenuationDb: 100 },
    };
    const byStages = designFilter({ ...aa, priority: "fewest-stages" });
    const byOpamps = designFilter(aa);
    expect(byOpamps.familyChoice.priority).toBe("fewest-op-amps");
    const opampsOf = (r: typeof byOpamps): number =>
      r.familyChoice.candidates.find((c) => c.family === r.family)?.opamps as number;
    const fewestOpamps = Math.min(...byOpamps.familyChoice.candidates.map((c) => c.opamps ?? Infinity));
    expect(opampsOf(byOpamps)).toBe(fewestOpamps);
    expect(opampsOf(byOpamps)).toBeLessThan(opampsOf(byStages));
    expect(byOpamps.familyChoice.reason).toContain("fewest op-amps");
    const mono = designFilter({ ...lp, priority: "monotonic" });
    expect(["butterworth", "legendre", "bessel", "chebyshev2"]).toContain(mono.family);
    const flat = designFilter({ ...lp, stopband: { edgeHz: 8000, minAttenuationDb: 30 }, priority: "flattest-delay" });
    const cands = flat.familyChoice.candidates.filter((c) => c.delayVariation !== undefined);
    const best = Math.min(...cands.map((c) => c.delayVariation as number));
    expect(flat.familyChoice.candidates.find((c) => c.family === flat.family)?.delayVariation).toBe(best);
  });

  it("distributes gain so that no stage output peaks above the filter output by more than rounding", () => {
    const r = designFilter({
      response: "lowpass",
      passband: { edgeHz: 1000, maxLossDb: 0.5 },
      stopband: { edgeHz: 1600, minAttenuationDb: 50 },
      family: "chebyshev1",
      gain: { db: 10 },
    });
    const out = r.stages[r.stages.length - 1]?.peakGain as number;
    for (const s of r.stages) expect(s.peakGain).toBeLessThanOrEqual(out * 1.02);
    expect(r.verification.meetsSpec).toBe(true);
  });

  it("moves a high-Q lowpass section to a multi-amplifier stage rather than spread its capacitors beyond a decade", () => {
    // 0.1 dB Chebyshev I: the highest section has Q near 3, where a single-op-amp
    // lowpass needs a capacitor ratio of 4Q^2 (x 2 for multiple feedback) or more.
    const r = designFilter({
      response: "lowpass",
      passband: { edgeHz: 2000, maxLossDb: 0.1 },
      stopband: { edgeHz: 24000, minAttenuationDb: 100 },
      family: "chebyshev1",
      gain: { db: 6, polarity: "non-inverting" },
    });
    expect(r.verification.meetsSpec).toBe(true);
    const highest = r.stages.reduce((a, b) => ((b.target.q ?? 0) > (a.target.q ?? 0) ? b : a));
    expect(r.warnings.filter((w) => w.code === "large-capacitor-ratio" && w.stage === highest.index)).toEqual([]);
    expect(highest.target.q).toBeGreaterThan(2.5);
    expect(["tow-thomas-lowpass", "state-variable-lowpass"]).toContain(highest.topology);
  });

  it("keeps all but the unavoidable resistor inside the window when a notch stage's spread exceeds it", () => {
    // Elliptic zeros far above the poles: a summing notch needs R8/R9 = (fz/f0)^2 > 100,
    // wider than the 1k-100k window, so one resistor per stage must fall outside.
    const r = designFilter({
      response: "lowpass",
      passband: { edgeHz: 2000, maxLossDb: 0.1 },
      stopband: { edgeHz: 24000, minAttenuationDb: 100 },
      family: "elliptic",
      parts: { resistorMinOhm: "1k", resistorMaxOhm: "100k" },
    });
    expect(r.verification.meetsSpec).toBe(true);
    for (const stage of r.stages) {
      const outside = Object.entries(stage.components).filter(
        ([k, v]) => k.startsWith("R") && (v < 1000 * (1 - 1e-9) || v > 100000 * (1 + 1e-9)),
      );
      expect(outside.length).toBeLessThanOrEqual(1);
    }
  });

  it("warns when the op-amp's gain-bandwidth is too small and checks with that op-amp", () => {
    const r = designFilter({ ...lp, family: "chebyshev1", opamp: { a0: 1e5, gbwHz: 20000 } });
    expect(r.warnings.some((w) => w.code === "insufficient-gbw")).toBe(true);
    expect(r.verification.opamp).toEqual({ kind: "single-pole", a0: 1e5, gbwHz: 20000 });
  });

  it("returns frozen plain data that survives JSON", () => {
    const r = designFilter(lp);
    expect(Object.isFrozen(r)).toBe(true);
    expect(Object.isFrozen(r.stages[0])).toBe(true);
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
    expect(r.verification.curve.freqHz.length).toBe(256);
  });
});
