import { describe, expect, it } from "vitest";
import { getTopology, topologies } from "../../src/topologies/registry.ts";
import { GBW_DEMAND_A0, asBuiltPole, polynomialPole } from "../../src/topologies/as-built.ts";
import type { StageTarget } from "../../src/topologies/types.ts";
import { loadFixture } from "../helpers/fixtures.ts";
import fc from "fast-check";
import { realisableArb, sampleTarget } from "./arbitraries.ts";

const fixture = loadFixture<{ cases: { id: string; target: StageTarget; gbwHz: number }[] }>("circuit-gbw-demand.json");

/** (a.re + j a.im) / (b.re + j b.im) as [re, im]. */
function divide([ar, ai]: readonly [number, number], [br, bi]: readonly [number, number]): [number, number] {
  const d = br * br + bi * bi;
  return [(ar * br + ai * bi) / d, (ai * br - ar * bi) / d];
}

describe("Topology.gbwDemandHz", () => {
  it("matches numpy roots of hand-derived characteristic polynomials to 0.2 %", () => {
    for (const c of fixture.cases) {
      const d = getTopology(c.id).gbwDemandHz(c.target);
      expect(Math.abs(d / c.gbwHz - 1), `${c.id} ${JSON.stringify(c.target)}: ${d} vs ${c.gbwHz}`).toBeLessThan(0.002);
    }
  });

  // A first-order stage's criterion is its response at f0: within the change a 1 % shift of f0 makes there.
  const [limitRe, limitIm] = divide([1, 1], [1, 1 / 1.01]);
  const firstOrderLimit = Math.hypot(limitRe - 1, limitIm);
  for (const topo of topologies.filter((t) => t.order === 1)) {
    it(`${topo.id}: the demand keeps the response at f0 within a 1 % f0 shift and a GBW 2 % lower does not`, () => {
      const target = sampleTarget(topo);
      const d = topo.gbwDemandHz(target);
      expect(Number.isFinite(d) && d > target.f0Hz).toBe(true);
      const v = topo.design(target, {});
      const f = new Float64Array([topo.figures(v).f0Hz]);
      const ideal = topo.response(v, f, { kind: "ideal" });
      const at = (g: number) => {
        const h = topo.response(v, f, { kind: "single-pole", a0: GBW_DEMAND_A0, gbwHz: g });
        const [re, im] = divide([h.re[0] as number, h.im[0] as number], [ideal.re[0] as number, ideal.im[0] as number]);
        return Math.hypot(re - 1, im);
      };
      expect(at(d)).toBeLessThanOrEqual(firstOrderLimit * (1 + 1e-9));
      expect(at(d / 1.02)).toBeGreaterThan(firstOrderLimit);
    });
  }

  for (const topo of topologies.filter((t) => t.order === 2)) {
    it(`${topo.id}: the demand keeps the pole within 1 % and a GBW 2 % lower does not`, () => {
      const target = sampleTarget(topo);
      const d = topo.gbwDemandHz(target);
      expect(Number.isFinite(d) && d > target.f0Hz).toBe(true);
      const v = topo.design(target, {});
      const ideal = topo.figures(v);
      const at = (g: number) => {
        const m = { kind: "single-pole", a0: GBW_DEMAND_A0, gbwHz: g } as const;
        const p = asBuiltPole(topo, v, m);
        return Math.max(Math.abs(p.f0Hz / ideal.f0Hz - 1), Math.abs((p.q as number) / (ideal.q as number) - 1));
      };
      expect(at(d)).toBeLessThanOrEqual(0.01);
      expect(at(d / 1.02)).toBeGreaterThan(0.01);
    });
  }
});

describe("Topology.gbwDemandHz over the realisable range", () => {
  for (const topo of topologies) {
    it(`${topo.id}: finite and above f0 for random realisable targets (including Q < 1/2)`, () => {
      fc.assert(
        fc.property(realisableArb(topo), ({ target }) => {
          const d = topo.gbwDemandHz(target);
          expect(Number.isFinite(d)).toBe(true);
          expect(d).toBeGreaterThan(target.f0Hz);
        }),
        { numRuns: 12 },
      );
    });
  }
});

describe("polynomialPole (the GBW demand's pole from the closed-form polynomials)", () => {
  for (const topo of topologies.filter((t) => t.order === 2 && t.polynomialsInto !== undefined)) {
    it(`${topo.id}: the same pole as Muller on the nodal determinant, to 1e-9, for random targets and op-amps`, () => {
      fc.assert(
        fc.property(realisableArb(topo), fc.double({ min: 0.3, max: 4, noNaN: true }), ({ target }, gbwLog) => {
          const v = topo.design(target, {});
          const ideal = topo.figures(v);
          const opamp = { kind: "single-pole", a0: GBW_DEMAND_A0, gbwHz: target.f0Hz * 10 ** gbwLog * Math.max(1, target.q ?? 1) } as const;
          const x = Float64Array.from(topo.componentNames, (n) => v[n]!);
          const p = polynomialPole(topo.polynomialsInto!, topo.polynomialDegree!, x, opamp, 2, ideal);
          let m: ReturnType<typeof asBuiltPole> | null = null;
          try {
            m = asBuiltPole(topo, v, opamp);
          } catch {
            m = null; // the nodal determinant's iteration found no pole near the ideal one
          }
          fc.pre(m !== null);
          expect(p, `${topo.id} ${JSON.stringify(target)}`).not.toBeNull();
          expect(Math.abs(p!.f0Hz / m.f0Hz - 1)).toBeLessThan(1e-9);
          expect(Math.abs(p!.q! / m.q! - 1)).toBeLessThan(1e-9);
        }),
        { numRuns: 25 },
      );
    });
  }
});

describe("asBuiltPole", () => {
  it("returns the ideal figures with an ideal op-amp and a lower, sharper pole for a slow unity-gain Sallen-Key", () => {
    const t = getTopology("sallen-key-lowpass-unity");
    const v = t.design({ order: 2, kind: "lowpass", f0Hz: 1000, q: 2, gain: 1 }, {});
    const ideal = asBuiltPole(t, v, { kind: "ideal" });
    expect(Math.abs(ideal.f0Hz / 1000 - 1)).toBeLessThan(1e-12);
    expect(Math.abs(ideal.q! / 2 - 1)).toBeLessThan(1e-12);
    const slow = asBuiltPole(t, v, { kind: "single-pole", a0: 1e5, gbwHz: 1e5 });
    expect(slow.f0Hz).toBeLessThan(1000);
    expect(slow.q!).toBeGreaterThan(2);
  });

  it("rejects missing values", () => {
    expect(() => asBuiltPole(getTopology("mfb-lowpass"), { R1: 1 }, { kind: "ideal" })).toThrow(/values\.R2/);
  });
});
