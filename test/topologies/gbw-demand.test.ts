import { describe, expect, it } from "vitest";
import { getTopology, topologies } from "../../src/topologies/registry.ts";
import { stagePole, type DefinedTopology } from "../../src/topologies/common.ts";
import type { StageTarget } from "../../src/topologies/types.ts";
import { loadFixture } from "../helpers/fixtures.ts";

const fixture = loadFixture<{ cases: { id: string; target: StageTarget; gbwHz: number }[] }>("circuit-gbw-demand.json");

function sampleTarget(t: DefinedTopology): StageTarget {
  const kind = t.kinds[0]!;
  const base = { order: t.order, kind, f0Hz: 2000, q: 1.2 } as const;
  let gain = t.id.includes("unity") || t.id.includes("buffer") ? 1 : 2.5;
  if (t.id === "mfb-bandpass") gain = 3;
  if (t.fixedGain !== undefined) gain = t.fixedGain(base);
  return {
    ...base,
    gain: t.inverting ? -gain : gain,
    ...(kind === "lowpass-notch" ? { fzHz: 5000 } : {}),
    ...(kind === "highpass-notch" ? { fzHz: 900 } : {}),
  };
}

describe("Topology.gbwDemandHz", () => {
  it("matches numpy roots of hand-derived characteristic polynomials to 0.2 %", () => {
    for (const c of fixture.cases) {
      const d = getTopology(c.id).gbwDemandHz(c.target);
      expect(Math.abs(d / c.gbwHz - 1), `${c.id} ${JSON.stringify(c.target)}: ${d} vs ${c.gbwHz}`).toBeLessThan(0.002);
    }
  });

  for (const topo of topologies as readonly DefinedTopology[]) {
    it(`${topo.id}: the demand keeps the pole within 1 % and a GBW 2 % lower does not`, () => {
      const target = sampleTarget(topo);
      const d = topo.gbwDemandHz(target);
      expect(Number.isFinite(d) && d > target.f0Hz).toBe(true);
      if (topo.order === 1) return; // response criterion, covered by the fixture
      const v = topo.design(target, {});
      const ideal = topo.figures(v);
      const at = (g: number) => {
        const m = { kind: "single-pole", a0: 1e8, gbwHz: g } as const;
        const p = stagePoleOf(topo, v, m, ideal);
        return Math.max(Math.abs(p.f0Hz / ideal.f0Hz - 1), Math.abs((p.q as number) / (ideal.q as number) - 1));
      };
      expect(at(d)).toBeLessThanOrEqual(0.01);
      expect(at(d / 1.02)).toBeGreaterThan(0.01);
    });
  }
});

/** The stage's pole found from its own elements (same search as the library, through the public elements()). */
function stagePoleOf(
  topo: DefinedTopology,
  v: Record<string, number>,
  model: { kind: "single-pole"; a0: number; gbwHz: number },
  ideal: { f0Hz: number; q?: number },
): { f0Hz: number; q?: number } {
  const parts = topo.elements(v, { input: "in", output: "out", nodePrefix: "", opamp: model });
  const spec = {
    order: topo.order,
    parts: parts.map((e) =>
      e.kind === "OA"
        ? { kind: "OA" as const, name: e.name, inP: e.inP, inN: e.inN, out: e.out }
        : { kind: e.kind as "R" | "C", name: e.name, a: (e as { a: string }).a, b: (e as { b: string }).b },
    ),
    name: topo.name,
  };
  const p = stagePole(spec as never, v, model, ideal);
  if (p === null) throw new Error("pole not found");
  return p;
}
