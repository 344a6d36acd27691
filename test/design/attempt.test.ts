import { describe, expect, it } from "vitest";
import { validateSpec, type DesignSpec, type FilterSpec } from "../../src/design/spec.ts";
import { choosePrototype } from "../../src/design/family.ts";
import { prototypeInterval } from "../../src/design/placement.ts";
import { boardStages, buildAttempt, meetsSpec, type Attempt } from "../../src/design/attempt.ts";
import { checkMask } from "../../src/design/verify.ts";
import { designFilter } from "../../src/design/pipeline.ts";

function attemptFor(input: FilterSpec, order: number, position = 0.5): { spec: DesignSpec; a: Attempt } {
  const spec = validateSpec(input);
  const proto = choosePrototype(spec, spec.family === "auto" ? "butterworth" : spec.family, order);
  return { spec, a: buildAttempt(spec, { proto, interval: prototypeInterval(spec, proto.zpk) }, { position, wide: false }) };
}

/** The gain each stage delivers with the spec's op-amp at its reference frequency (bandpass: the exact design's f0). */
function deliveredGains(spec: DesignSpec, a: Attempt): number[] {
  return a.plans.map((p, i) => {
    const f0 = a.exactPlans[i]!.target.f0Hz;
    const h = p.topology.response(a.chosen[i]!.values, Float64Array.of(f0), spec.opamp);
    return Math.hypot(h.re[0]!, h.im[0]!);
  });
}

const mfbLowpass: FilterSpec = {
  response: "lowpass",
  passband: { edgeHz: 1000, maxLossDb: 3 },
  stopband: { edgeHz: 3000, minAttenuationDb: 50 },
  family: "butterworth",
  order: 6,
  topology: "mfb-lowpass",
  gain: { vPerV: -3 },
  parts: { capacitorSeries: "E24", resistorSeries: "E24" },
};

describe("buildAttempt", () => {
  it("places the design at the asked position and checks the built stages against the mask", () => {
    const { spec, a } = attemptFor({ ...mfbLowpass, gain: { vPerV: -1 } }, 6, 0.25);
    expect(a.position).toBe(0.25);
    expect(a.value).toBeCloseTo(a.interval.low * (a.interval.high / a.interval.low) ** 0.25, 6);
    expect(a.plans.map((p) => p.topology.id)).toEqual(["mfb-lowpass", "mfb-lowpass", "mfb-lowpass"]);
    expect(a.mask).toEqual(checkMask(spec, boardStages(a.plans, a.chosen), spec.opamp));
    expect(meetsSpec(spec, a)).toBe(a.mask.marginDb >= 0);
  });

  it("corrects each stage's gain for the error of the stages before it, once (ideal op-amp)", () => {
    const { a } = attemptFor(mfbLowpass, 6);
    let carried = 1;
    a.plans.forEach((p, i) => {
      const exact = a.exactPlans[i]!.target.gain;
      expect(p.target.gain * carried).toBeCloseTo(exact, 12);
      carried *= a.chosen[i]!.figures.gain / exact;
    });
  });

  it("takes the deliberate gain pre-distortion of a bandpass stage back out of the carried error (real op-amp)", () => {
    const spec: FilterSpec = {
      response: "bandpass",
      passband: { edgeHz: [10000, 20000], maxLossDb: 1 },
      stopband: { edgeHz: [3000, 60000], minAttenuationDb: 40 },
      family: "butterworth",
      opamp: { a0: 1e5, gbwHz: 1e6 },
    };
    const { spec: s, a } = attemptFor(spec, 3);
    expect(a.predistortion.every((pd) => pd?.ok === true && pd.gainFactor > 1.0005)).toBe(true);
    const delivered = deliveredGains(s, a);
    let carried = 1;
    a.plans.forEach((p, i) => {
      const exact = Math.abs(a.exactPlans[i]!.target.gain);
      // What the stages before it really deliver with the op-amp, against their own uncorrected targets.
      expect(Math.abs(p.target.gain) * carried / exact).toBeCloseTo(1, 3);
      carried *= delivered[i]! / exact;
    });
  });
});

describe("designFilter gain correction", () => {
  it("lands a 6th-order MFB lowpass of gain -3 V/V on E24 on the spec's gain: the last stage's target completes it", () => {
    const r = designFilter(mfbLowpass);
    const earlier = r.stages.slice(0, -1).reduce((g, st) => g * st.asBuilt.gain, 1);
    expect(earlier * r.stages.at(-1)!.target.gain).toBeCloseTo(-3, 9);
  });
});
