import { describe, expect, it } from "vitest";
import { validateSpec, type FilterSpec } from "../../src/design/spec.ts";
import { chooseFamily, choosePrototype } from "../../src/design/family.ts";
import { prototypeInterval } from "../../src/design/placement.ts";
import { buildAttempt, sturdierStagesOf, type PlacedPrototype } from "../../src/design/attempt.ts";
import { RECOVERY_STEPS, orderRange, retuneToMask, searchDesign } from "../../src/design/recovery.ts";
import { designFilter } from "../../src/design/pipeline.ts";

/** A bandstop whose minimum order misses the mask once rounded: the whole ladder, then one order more. */
const bandstop: FilterSpec = {
  response: "bandstop",
  passband: { edgeHz: [2040, 38700], maxLossDb: 0.1 },
  stopband: { edgeHz: [6420, 12300], minAttenuationDb: 21 },
  family: "chebyshev1",
  parts: { resistorSeries: "E24", capacitorSeries: "E24" },
};

/** An elliptic highpass that needs re-tuning and a move inside the slack. */
const highpass: FilterSpec = {
  response: "highpass",
  passband: { edgeHz: 1200, maxLossDb: 0.3 },
  stopband: { edgeHz: 700, minAttenuationDb: 55 },
  family: "elliptic",
};

function placedAt(input: FilterSpec, order?: number): { spec: ReturnType<typeof validateSpec>; placed: PlacedPrototype } {
  const spec = validateSpec(input);
  const fam = chooseFamily(spec);
  const proto = choosePrototype(spec, fam.family, order ?? (fam.order as number));
  return { spec, placed: { proto, interval: prototypeInterval(spec, proto.zpk) } };
}

describe("RECOVERY_STEPS", () => {
  it("re-tunes, then moves inside the slack, then tightens the prototype, then builds sturdier stages", () => {
    expect(RECOVERY_STEPS.map((s) => s.code)).toEqual(["re-tuned-to-mask", "moved-placement", "tightened-prototype", "sturdier-stages"]);
  });

  it("the sturdier step rebuilds one-op-amp finite-zero, bandpass and high-Q stages with multi-amplifier stages, or does not apply", () => {
    const { spec, placed } = placedAt(bandstop);
    const first = buildAttempt(spec, placed, { position: 0.5, wide: false });
    const avoid = sturdierStagesOf(first);
    const step = RECOVERY_STEPS[3]!;
    const out = step.run(spec, placed, first);
    if (avoid.size === 0) expect(out).toBeNull();
    else {
      expect(out!.actions.map((a) => a.code)).toEqual(["sturdier-stages"]);
      const rebuilt = buildAttempt(spec, placed, { position: 0.5, wide: true, avoid });
      for (const p of rebuilt.plans) if (p.automatic) expect(avoid.has(p.topology.id), p.topology.id).toBe(false);
    }
    // a design of Sallen-Key lowpass stages at low Q has nothing to trade
    const low = placedAt({ response: "lowpass", passband: { edgeHz: 1000, maxLossDb: 3 }, stopband: { edgeHz: 8000, minAttenuationDb: 30 }, family: "butterworth" });
    const lowFirst = buildAttempt(low.spec, low.placed, { position: 0.5, wide: false });
    expect(sturdierStagesOf(lowFirst).size).toBe(0);
    expect(step.run(low.spec, low.placed, lowFirst)).toBeNull();
  });

  it("each step records its own action and the tightening applies to equiripple families only", () => {
    const { spec, placed } = placedAt(bandstop);
    const first = buildAttempt(spec, placed, { position: 0.5, wide: false });
    const retuned = RECOVERY_STEPS[0]!.run(spec, placed, first)!;
    expect(retuned.actions.map((a) => a.code)).toEqual(["re-tuned-to-mask"]);
    expect(retuned.attempt.mask.marginDb).toBeGreaterThanOrEqual(first.mask.marginDb);
    const moved = RECOVERY_STEPS[1]!.run(spec, placed, retuned.attempt)!;
    expect(moved.actions.map((a) => a.code)).toEqual(["moved-placement"]);
    expect([0.25, 0.75]).toContain(moved.attempt.position);
    const tightened = RECOVERY_STEPS[2]!.run(spec, placed, moved.attempt)!;
    expect(tightened.actions.length).toBeGreaterThan(0);
    expect(tightened.actions.every((a) => a.code === "tightened-prototype")).toBe(true);
    expect(tightened.attempt.mask.marginDb).toBeGreaterThanOrEqual(moved.attempt.mask.marginDb);
    const mono = placedAt({ ...bandstop, family: "butterworth" });
    const monoFirst = buildAttempt(mono.spec, mono.placed, { position: 0.5, wide: false });
    expect(RECOVERY_STEPS[2]!.run(mono.spec, mono.placed, monoFirst)).toBeNull();
  });
});

describe("retuneToMask", () => {
  it("never returns a worse attempt than it was given", () => {
    const { spec, placed } = placedAt(highpass);
    const a = buildAttempt(spec, placed, { position: 0.5, wide: true });
    const r = retuneToMask(spec, a);
    expect(r.mask.marginDb).toBeGreaterThanOrEqual(a.mask.marginDb);
    expect(r.plans).toBe(a.plans);
  });
});

describe("orderRange", () => {
  it("tries the minimum order and up to two more within the limit, or only the spec's fixed order", () => {
    const auto = validateSpec(bandstop);
    expect(orderRange(auto, 2)).toEqual({ minimum: 2, first: 2, last: 4 });
    expect(orderRange(auto, 15)).toEqual({ minimum: 15, first: 15, last: 16 });
    expect(orderRange(auto, null)).toEqual({ minimum: 16, first: 16, last: 16 });
    expect(orderRange(validateSpec({ ...bandstop, family: "auto" }), 11)).toEqual({ minimum: 11, first: 11, last: 12 });
    expect(orderRange(validateSpec({ ...bandstop, order: 3 }), 2)).toEqual({ minimum: 2, first: 3, last: 3 });
  });
});

describe("searchDesign", () => {
  it("climbs the ladder in order at each order and raises the order only to one it then tries", () => {
    const spec = validateSpec(bandstop);
    const fam = chooseFamily(spec);
    const { attempt, actions } = searchDesign(spec, fam.family, orderRange(spec, fam.order));
    const codes = actions.map((a) => a.code);
    expect(codes[0]).toBe("placed-in-slack");
    expect(codes.slice(1, 4)).toEqual(["re-tuned-to-mask", "moved-placement", "tightened-prototype"]);
    const raised = actions.filter((a) => a.code === "raised-order");
    expect(raised.length).toBe(attempt.proto.order - (fam.order as number));
    expect(raised.at(-1)?.message).toContain(`raised the order to ${attempt.proto.order}.`);
  });

  it("records only the steps it took: a design that meets the mask after re-tuning and moving stops there", () => {
    const r = designFilter(highpass);
    expect(r.verification.meetsSpec).toBe(true);
    const codes = r.actions.map((a) => a.code);
    expect(codes.slice(0, 3)).toEqual(["placed-in-slack", "re-tuned-to-mask", "moved-placement"]);
    // what follows is the yield search's, each step saying it was taken for the boards' yield
    for (const a of r.actions.slice(3)) {
      expect(["raised-order", "centred-for-yield", "tightened-tolerances", "changed-family-for-yield", "confirmed-yield", "kept-best-attempt"]).toContain(a.code);
      expect(a.message).toMatch(/yield|boards/);
    }
  });

  it("does not record raising the order beyond the last order tried (a Bessel design that stays at 16)", () => {
    const r = designFilter({
      response: "lowpass",
      passband: { edgeHz: 1000, maxLossDb: 1 },
      stopband: { edgeHz: 1100, minAttenuationDb: 80 },
      family: "bessel",
    });
    expect(r.order).toBe(16);
    expect(r.verification.meetsSpec).toBe(false);
    expect(r.actions.filter((a) => a.code === "raised-order")).toEqual([]);
    for (const a of r.actions) expect(a.message).not.toMatch(/raised the order to 17/);
  });
});
