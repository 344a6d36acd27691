import { describe, expect, it } from "vitest";
import { validateSpec, type FilterSpec } from "../../src/design/spec.ts";
import { chooseFamily } from "../../src/design/family.ts";
import { orderRange, searchDesign } from "../../src/design/recovery.ts";
import { designFilter } from "../../src/design/pipeline.ts";
import { CAPACITOR_LIMITS, RESISTOR_LIMITS, characteristicFrequencyHz, defaultResistorWindow, partLimits } from "../../src/design/impedance-level.ts";
import { SK_MIN_GAIN_STEP } from "../../src/topologies/sallen-key.ts";
import { getTopology } from "../../src/topologies/index.ts";
import { SCENARIOS } from "../../src/cli/scenarios.ts";

/** The nominal design of a spec (family choice, order search, fallback ladder) as stage id + values. */
function nominal(input: FilterSpec) {
  const spec = validateSpec(input);
  const { family, order, choice } = chooseFamily(spec);
  const { attempt } = searchDesign(spec, family, orderRange(spec, order));
  const stages = attempt.plans.map((p, i) => ({ id: p.topology.id, gain: p.target.gain, opamps: p.topology.opampCount, values: attempt.chosen[i]!.values }));
  return { spec, family, order, choice, attempt, stages };
}

const resistors = (stages: { values: Readonly<Record<string, number>> }[]): number[] =>
  stages.flatMap((s) => Object.entries(s.values).filter(([k]) => k.startsWith("R")).map(([, v]) => v));
const capacitors = (stages: { values: Readonly<Record<string, number>> }[]): number[] =>
  stages.flatMap((s) => Object.entries(s.values).filter(([k]) => k.startsWith("C")).map(([, v]) => v));

describe("defaultResistorWindow", () => {
  it("is a decade either side of 10 kΩ·sqrt(1.59 kHz / f), held between 2 kΩ and 316 kΩ", () => {
    const ref = 1 / (2 * Math.PI * 1e4 * 1e-8);
    const w = defaultResistorWindow(1000);
    expect(w.min).toBeCloseTo(1e3 * Math.sqrt(ref / 1000), 6);
    expect(w.max).toBeCloseTo(1e5 * Math.sqrt(ref / 1000), 3);
    expect(defaultResistorWindow(ref).min).toBeCloseTo(1000, 9);
    expect(defaultResistorWindow(1)).toEqual({ min: 31600, max: 3160000 });
    expect(defaultResistorWindow(200_000)).toEqual({ min: 200, max: 20000 });
  });

  it("rises as the frequency falls and stays inside the library's limits", () => {
    let prev = Infinity;
    for (const f of [0.01, 1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e8]) {
      const w = defaultResistorWindow(f);
      expect(w.min).toBeGreaterThanOrEqual(RESISTOR_LIMITS.min);
      expect(w.max).toBeLessThanOrEqual(RESISTOR_LIMITS.max);
      expect(w.min).toBeLessThanOrEqual(prev);
      prev = w.min;
    }
  });

  it("characteristicFrequencyHz is the geometric mean of the edges", () => {
    expect(characteristicFrequencyHz([1000, 4000])).toBeCloseTo(2000, 9);
    expect(characteristicFrequencyHz([])).toBeNaN();
  });
});

describe("validateSpec windows", () => {
  it("takes the default resistor window from the band edges and 10 pF-10 µF for capacitors", () => {
    const s = validateSpec({ response: "lowpass", passband: { edgeHz: 1, maxLossDb: 1 }, stopband: { edgeHz: 4, minAttenuationDb: 40 } });
    expect(s.resistorRange).toEqual(defaultResistorWindow(2));
    expect(s.capacitorRange).toEqual(CAPACITOR_LIMITS);
  });

  it("keeps a window the user gives, and a single bound with the default other bound", () => {
    const s = validateSpec({
      response: "lowpass",
      passband: { edgeHz: 1, maxLossDb: 1 },
      stopband: { edgeHz: 4, minAttenuationDb: 40 },
      parts: { resistorMinOhm: "1k", resistorMaxOhm: "100k", capacitorMinF: "1n", capacitorMaxF: "4.7u" },
    });
    expect(s.resistorRange).toEqual({ min: 1000, max: 100000 });
    expect(s.capacitorRange).toEqual({ min: 1e-9, max: 4.7e-6 });
    // only a maximum below the default minimum: the minimum goes to the library's limit
    const t = validateSpec({ response: "lowpass", passband: { edgeHz: 1, maxLossDb: 1 }, stopband: { edgeHz: 4, minAttenuationDb: 40 }, parts: { resistorMaxOhm: "20k" } });
    expect(t.resistorRange).toEqual({ min: 100, max: 20000 });
  });

  it("partLimits widens the library's limits to the spec's windows, never narrows them", () => {
    expect(partLimits({ resistorRange: { min: 1e3, max: 1e5 }, capacitorRange: { min: 1e-9, max: 1e-6 } })).toEqual({ resistor: RESISTOR_LIMITS, capacitor: CAPACITOR_LIMITS });
    expect(partLimits({ resistorRange: { min: 10, max: 1e8 }, capacitorRange: { min: 1e-12, max: 1e-4 } })).toEqual({
      resistor: { min: 10, max: 1e8 },
      capacitor: { min: 1e-12, max: 1e-4 },
    });
  });
});

describe("impedance level of a design", () => {
  it("a 1 Hz lowpass gets a high impedance level (resistors' geometric mean at least 100 kΩ, all inside 10 kΩ-10 MΩ: a one-op-amp notch section's spread reaches past the window's decade) and capacitors of at most 1 µF", () => {
    const d = nominal({ response: "lowpass", passband: { edgeHz: 1, maxLossDb: 0.5 }, stopband: { edgeHz: 3, minAttenuationDb: 50 } });
    const r = resistors(d.stages);
    const c = capacitors(d.stages);
    expect(r.length).toBeGreaterThan(0);
    for (const x of r) expect(x).toBeGreaterThanOrEqual(10e3), expect(x).toBeLessThanOrEqual(10e6);
    expect(Math.exp(r.reduce((s, x) => s + Math.log(x), 0) / r.length)).toBeGreaterThanOrEqual(100e3);
    for (const x of c) expect(x).toBeLessThanOrEqual(1e-6);
  });

  it("a 200 kHz lowpass gets a lower level than a 1 kHz one, with no capacitor below 10 pF", () => {
    const at = (f: number) => nominal({ response: "lowpass", passband: { edgeHz: f, maxLossDb: 0.5 }, stopband: { edgeHz: 3 * f, minAttenuationDb: 50 } });
    const high = at(200e3);
    const mid = at(1e3);
    const geo = (xs: number[]) => Math.exp(xs.reduce((s, x) => s + Math.log(x), 0) / xs.length);
    expect(geo(resistors(high.stages))).toBeLessThan(geo(resistors(mid.stages)) / 2);
    for (const x of resistors(high.stages)) expect(x).toBeLessThanOrEqual(20e3), expect(x).toBeGreaterThanOrEqual(100);
    for (const x of capacitors(high.stages)) expect(x).toBeGreaterThanOrEqual(10e-12);
  });

  it("a user window is used as given: every resistor inside 2 kΩ-20 kΩ for a 1 kHz all-pole lowpass", () => {
    const d = nominal({
      response: "lowpass",
      passband: { edgeHz: 1000, maxLossDb: 0.5 },
      stopband: { edgeHz: 3000, minAttenuationDb: 50 },
      family: "chebyshev1",
      parts: { resistorMinOhm: "2k", resistorMaxOhm: "20k" },
    });
    expect(d.spec.resistorRange).toEqual({ min: 2000, max: 20000 });
    for (const x of resistors(d.stages)) expect(x).toBeGreaterThanOrEqual(2000), expect(x).toBeLessThanOrEqual(20000);
  });

  it("where no topology keeps a finite-zero stage inside a one-decade user window, the design says so and keeps the fewest parts outside", () => {
    const spec = { response: "lowpass", passband: { edgeHz: 1000, maxLossDb: 0.5 }, stopband: { edgeHz: 3000, minAttenuationDb: 50 }, family: "elliptic", parts: { resistorMinOhm: "2k", resistorMaxOhm: "20k" } } as const;
    const r = designFilter(spec);
    const outside = (s: typeof r.stages) => s.flatMap((st) => Object.entries(st.components)).filter(([k, v]) => k.startsWith("R") && (v < 2000 * (1 - 1e-9) || v > 20000 * (1 + 1e-9))).length;
    const n = outside(r.stages);
    if (n > 0) expect(r.warnings.some((w) => w.code === "resistor-out-of-range")).toBe(true);
    // each multi-amplifier alternative named for the notch stages leaves at least as many parts outside
    for (const t of ["state-variable-notch", "tow-thomas-lowpass-notch"]) {
      const alt = designFilter({ ...spec, topology: ["auto", t, t] });
      expect(outside(alt.stages), t).toBeGreaterThanOrEqual(n);
    }
  });
});

describe("gain placement", () => {
  it("the Sallen-Key gain forms refuse a gain within 2 % of 1; the unity form takes it", () => {
    const target = { order: 2 as const, kind: "lowpass" as const, f0Hz: 100, q: 0.8 };
    const gainForm = getTopology("sallen-key-lowpass-gain");
    expect(gainForm.check({ ...target, gain: 1 + SK_MIN_GAIN_STEP / 2 }, {})).toMatch(/unity-gain form/);
    expect(gainForm.check({ ...target, gain: 1 + SK_MIN_GAIN_STEP }, {})).toBeNull();
    const v = gainForm.design({ ...target, gain: 1 + SK_MIN_GAIN_STEP }, {});
    expect((v["R3"] as number) / (v["R4"] as number)).toBeCloseTo(SK_MIN_GAIN_STEP, 12);
    expect(getTopology("sallen-key-lowpass-unity").design({ ...target, gain: 1 }, {})["R3"]).toBeUndefined();
  });

  it("stages at unity gain have no gain resistors, and no resistor is below 100 Ω, over designs with gains near 1", () => {
    // gains of 0.1 dB to 0.5 dB: the equal-peak split leaves stages within a few per cent of unity
    for (const db of [0.05, 0.1, 0.2, 0.5]) {
      for (const response of ["lowpass", "highpass"] as const) {
        const d = nominal({
          response,
          passband: { edgeHz: response === "lowpass" ? 1000 : 4000, maxLossDb: 1 },
          stopband: { edgeHz: response === "lowpass" ? 4000 : 1000, minAttenuationDb: 60 },
          family: "butterworth",
          gain: { db },
        });
        for (const s of d.stages) {
          // a non-inverting stage within 2 % of unity is the unity form: no gain resistor pair
          if (s.gain > 0 && s.gain < 1 + SK_MIN_GAIN_STEP) expect(s.id, `${s.id} at gain ${s.gain}`).toMatch(/unity|buffer/);
          if (s.id.includes("sallen-key") && s.values["R3"] !== undefined) expect((s.values["R3"] as number) / (s.values["R4"] as number)).toBeGreaterThanOrEqual(SK_MIN_GAIN_STEP * 0.9);
        }
        for (const x of resistors(d.stages)) expect(x).toBeGreaterThanOrEqual(100);
      }
    }
  });

  it("40 dB over a cascade is shared: no stage carries more than 20 dB", () => {
    const d = nominal({
      response: "lowpass",
      passband: { edgeHz: 1000, maxLossDb: 0.5 },
      stopband: { edgeHz: 3000, minAttenuationDb: 60 },
      family: "butterworth",
      gain: { db: 40 },
    });
    expect(d.stages.length).toBeGreaterThan(1);
    for (const s of d.stages) expect(Math.abs(s.gain)).toBeLessThanOrEqual(10 * 1.05);
    const total = d.stages.reduce((p, s) => p * Math.abs(s.gain), 1);
    expect(20 * Math.log10(total)).toBeCloseTo(40, 0);
  });
});

describe("op-amp estimate", () => {
  // Scenarios naming a family are designed with the family left to the choice, so that the choice makes an estimate.
  it.each(Object.keys(SCENARIOS))("demo scenario %s: the family choice's estimate equals the built count", (name) => {
    const { family: _named, ...spec } = SCENARIOS[name]!.spec;
    void _named;
    const d = nominal(spec);
    const built = d.stages.reduce((n, s) => n + s.opamps, 0);
    const cand = d.choice.candidates.find((c) => c.family === d.family)!;
    expect(d.attempt.proto.order).toBe(cand.order);
    expect(cand.opamps).toBe(built);
  });

  it("the vibration demo's result reports the estimate it builds", () => {
    const r = designFilter(SCENARIOS["vibration"]!.spec);
    const built = r.stages.reduce((n, s) => n + s.opamps.length, 0);
    const cand = r.familyChoice.candidates.find((c) => c.family === r.family)!;
    if (cand.order === r.order) expect(cand.opamps).toBe(built);
    expect(r.familyChoice.reason).toContain(`about ${cand.opamps} op-amp`);
  });
});
