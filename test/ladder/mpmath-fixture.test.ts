import { describe, expect, it } from "vitest";
import { ladderPrototype, type LadderPrototypeSpec } from "../../src/ladder/index.ts";
import { loadFixture } from "../helpers/fixtures.ts";

interface Case {
  readonly spec: LadderPrototypeSpec;
  readonly elements: readonly (readonly [string, string | null])[];
  readonly loadRatio: string;
  readonly zeroOrder: readonly string[];
}

const fx = loadFixture<{ cases: readonly Case[] }>("ladder-synthesis-mpmath.json");

/** Worst relative difference of the element values (and companions) from the 60-digit synthesis. */
function worstRelative(spec: LadderPrototypeSpec, c: Case): number {
  const l = ladderPrototype(spec);
  let worst = Math.abs(l.loadOhms / Number(c.loadRatio) - 1);
  c.elements.forEach(([v, comp], i) => {
    const e = l.elements[i];
    if (e === undefined) return expect.unreachable(`element ${i + 1} missing`);
    worst = Math.max(worst, Math.abs(e.value / Number(v) - 1));
    const mine = e.kind === "series-L" ? e.parallelC : e.seriesL;
    expect(mine === undefined, `element ${i + 1} companion`).toBe(comp === null);
    if (comp !== null && mine !== undefined) worst = Math.max(worst, Math.abs(mine / Number(comp) - 1));
  });
  return worst;
}

describe("ladderPrototype against a 60-digit mpmath synthesis from the families' characteristic functions", () => {
  for (const c of fx.cases) {
    const name = Object.entries(c.spec).map(([k, v]) => `${k} ${v}`).join(", ");
    it(`${name}: every element (series-first, 1 ohm) to 1e-13 relative${c.spec.family === "butterworth" || c.spec.family === "chebyshev1" ? ", closed form and synthesis" : ""}`, () => {
      const worst = worstRelative(c.spec, c);
      expect(worst).toBeLessThan(1e-13);
      if (c.spec.family === "butterworth" || c.spec.family === "chebyshev1") {
        expect(worstRelative({ ...c.spec, method: "synthesis" }, c)).toBeLessThan(1e-13);
      }
    });
  }
});
