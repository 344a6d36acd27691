import { describe, expect, it } from "vitest";
import { topologies } from "../../src/topologies/index.ts";
import { topologyCore } from "../../src/topologies/define.ts";
import { indexedFigures } from "../../src/topologies/spec.ts";
import { mulberry32 } from "../../src/math/index.ts";
import { sampleTarget } from "./arbitraries.ts";

describe("topologyCore", () => {
  const rand = mulberry32(20261201);
  for (const t of topologies) {
    it(`${t.id}: the unchecked kernels give the bits of the public figures on random values`, () => {
      const core = topologyCore(t)!;
      expect(core).toBeDefined();
      for (let trial = 0; trial < 50; trial++) {
        const values = Object.fromEntries(t.componentNames.map((n) => [n, (n.startsWith("C") ? 1e-9 : 1e3) * 10 ** (2 * rand())]));
        const x = Float64Array.from(t.componentNames, (n) => values[n]!);
        const fig = t.figures(values);
        expect(core.figuresAt(x)).toEqual(fig);
        expect(core.figures(values)).toEqual(fig);
        if (core.f0At !== undefined) expect(Object.is(core.f0At(x), fig.f0Hz)).toBe(true);
      }
    });
  }
});

describe("indexedFigures", () => {
  it("packs named values in component order for the kernel and refuses a part the stage lacks", () => {
    const parts = [
      { kind: "R", name: "R1", a: "in", b: "a" },
      { kind: "C", name: "C1", a: "a", b: "0" },
    ] as const;
    const f = indexedFigures(parts, (at) => {
      const r = at("R1");
      const c = at("C1");
      return { figures: (x) => ({ f0Hz: 1 / (2 * Math.PI * x[r]! * x[c]!), gain: 1 }) };
    });
    expect(f.figures({ R1: 1e3, C1: 1e-6 }).f0Hz).toBe(159.15494309189535);
    expect(f.f0At).toBeUndefined();
    expect(() =>
      indexedFigures(parts, (at) => {
        const r = at("R9");
        return { figures: (x) => ({ f0Hz: x[r]!, gain: 1 }) };
      }),
    ).toThrow(/R9/);
  });
});

describe("polynomialsInto with arrays shorter than the degree", () => {
  const ideal = { kind: "ideal" } as const;
  const finite = { kind: "single-pole", a0: 1e5, gbwHz: 1e6 } as const;
  for (const t of topologies.filter((tp) => tp.polynomialsInto !== undefined)) {
    it(`${t.id}: fits the ideal op-amp's lower degree in polynomialDegree - opampCount + 1 entries and declines the single-pole model there`, () => {
      const v = t.design(sampleTarget(t), {});
      const x = Float64Array.from(t.componentNames, (n) => v[n]!);
      const scale = 2 * Math.PI * t.figures(v).f0Hz;
      const full = t.polynomialDegree! + 1;
      const short = full - t.opampCount;
      const wide = { num: new Float64Array(full), den: new Float64Array(full) };
      const narrow = { num: new Float64Array(short), den: new Float64Array(short) };
      expect(t.polynomialsInto!(x, ideal, scale, wide.num, wide.den)).toBe(scale);
      expect(t.polynomialsInto!(x, ideal, scale, narrow.num, narrow.den)).toBe(scale);
      expect(Array.from(narrow.num)).toEqual(Array.from(wide.num.subarray(t.opampCount)));
      expect(Array.from(narrow.den)).toEqual(Array.from(wide.den.subarray(t.opampCount)));
      expect(Array.from(wide.den.subarray(0, t.opampCount)).every((c) => c === 0)).toBe(true);
      expect(t.polynomialsInto!(x, finite, scale, narrow.num, narrow.den)).toBe(0);
    });
  }
});
