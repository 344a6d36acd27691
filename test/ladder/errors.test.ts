import { describe, expect, it } from "vitest";
import { InvalidArgumentError, UnrealisableError } from "../../src/errors.ts";
import { ladderPrototype, LADDER_SYNTHESIS_MAX_ORDER, type LadderPrototypeSpec } from "../../src/ladder/index.ts";
import { firstNonFinite } from "../helpers/finite.ts";
import { thrownBy } from "../helpers/throws.ts";

const call = (spec: unknown) => () => ladderPrototype(spec as LadderPrototypeSpec);

describe("ladderPrototype: bad input is refused with the field's path", () => {
  const cases: [string, unknown, string][] = [
    ["no spec", undefined, "family"],
    ["not an object", 3, ""],
    ["unknown family", { family: "gaussian", order: 3 }, "family"],
    ["order not an integer", { family: "butterworth", order: 2.5 }, "order"],
    ["order 0", { family: "bessel", order: 0 }, "order"],
    ["missing ripple", { family: "chebyshev1", order: 3 }, "rippleDb"],
    ["missing attenuation", { family: "chebyshev2", order: 3 }, "attenuationDb"],
    ["attenuation below ripple", { family: "elliptic", order: 3, rippleDb: 3, attenuationDb: 2 }, "attenuationDb"],
    ["NaN ripple", { family: "elliptic", order: 3, rippleDb: Number.NaN, attenuationDb: 40 }, "rippleDb"],
    ["unknown form", { family: "butterworth", order: 3, form: "pi" }, "form"],
    ["negative source", { family: "butterworth", order: 3, sourceOhms: -50 }, "sourceOhms"],
    ["zero load", { family: "butterworth", order: 3, loadOhms: 0 }, "loadOhms"],
    ["infinite load", { family: "butterworth", order: 3, loadOhms: Number.POSITIVE_INFINITY }, "loadOhms"],
    ["load as text", { family: "butterworth", order: 3, loadOhms: "50" }, "loadOhms"],
    ["terminations 1e7 apart", { family: "butterworth", order: 3, sourceOhms: 1e-3, loadOhms: 1e5 }, "loadOhms"],
    ["unknown method", { family: "butterworth", order: 3, method: "fast" }, "method"],
    ["closed form of a family without one", { family: "elliptic", order: 3, rippleDb: 1, attenuationDb: 40, method: "closed-form" }, "method"],
    ["synthesis beyond its order limit", { family: "bessel", order: LADDER_SYNTHESIS_MAX_ORDER + 1 }, "order"],
    ["closed form beyond the family limit", { family: "butterworth", order: 65 }, "order"],
  ];
  for (const [name, spec, path] of cases) {
    it(name, () => {
      const e = thrownBy(call(spec), InvalidArgumentError);
      expect(e.fn).toBe("ladderPrototype");
      expect(e.path).toBe(path);
    });
  }
});

describe("ladderPrototype: what no ladder of the form realises is refused with what to change", () => {
  it("an even order with the load on the wrong side of the source", () => {
    const e = thrownBy(call({ family: "butterworth", order: 4, loadOhms: 0.5 }), UnrealisableError);
    expect(e.path).toBe("loadOhms");
    expect(e.message).toContain('form "shunt-first"');
    const f = thrownBy(call({ family: "legendre", order: 6, form: "shunt-first", sourceOhms: 50, loadOhms: 75 }), UnrealisableError);
    expect(f.message).toContain('form "series-first"');
  });

  it("an even-order Chebyshev I load short of the ripple's ratio", () => {
    const e = thrownBy(call({ family: "chebyshev1", order: 4, rippleDb: 1, loadOhms: 1 }), UnrealisableError);
    expect(e.path).toBe("loadOhms");
    expect(e.message).toMatch(/at least 2\.659/);
    thrownBy(call({ family: "chebyshev1", order: 4, rippleDb: 1, loadOhms: 1, method: "synthesis" }), UnrealisableError);
  });

  it("Chebyshev II zeros too close to the passband for an odd ladder of positive elements", () => {
    const e = thrownBy(call({ family: "chebyshev2", order: 9, attenuationDb: 30 }), UnrealisableError);
    expect(e.path).toBe("order");
    expect(e.message).toContain("raise attenuationDb or lower the order");
  });

  it("an order and selectivity beyond the synthesis's precision", () => {
    const e = thrownBy(call({ family: "elliptic", order: 16, rippleDb: 0.1, attenuationDb: 40 }), UnrealisableError);
    expect(e.message).toMatch(/lower the order/);
  });
});

describe("ladderPrototype: extreme but valid input gives finite, positive values", () => {
  it("tiny ripple, huge attenuation, terminations 1e6 apart", () => {
    for (const spec of [
      { family: "chebyshev1", order: 9, rippleDb: 1e-6 },
      { family: "chebyshev1", order: 10, rippleDb: 40 },
      { family: "butterworth", order: 7, sourceOhms: 1e-3, loadOhms: 1e3 },
      { family: "elliptic", order: 5, rippleDb: 0.01, attenuationDb: 150, sourceOhms: 1e9 },
      { family: "bessel", order: 12, normalization: "delay", sourceOhms: 1e-6 },
    ] as const) {
      const l = ladderPrototype(spec);
      expect(firstNonFinite(l)).toBeNull();
      for (const e of l.elements) expect(e.value).toBeGreaterThan(0);
    }
  });
});
