/**
 * Seeded, bounded fuzz of the plots and schematics: random designs of every
 * response and family (scripts/spec-corpus.mjs, our own generator), each
 * drawn as every plot kind at two sizes and as a schematic of the whole
 * cascade: nothing throws but a typed error, no drawing carries NaN,
 * Infinity or "undefined", and no text's estimated box leaves its drawing.
 * `FUZZ_PLOT_DESIGNS=N` (default 24) sets how many designs.
 */
import { describe, expect, it } from "vitest";
import { FilterwrightError } from "../src/errors.ts";
import { designFilter, type DesignResult, type FilterSpec } from "../src/index.ts";
import { toSvgPlot, PLOT_KINDS } from "../src/report/svg.ts";
import { toSvgSchematic } from "../src/report/schematic.ts";
import { textBoxes, viewBox } from "../test/helpers/svg-bounds.ts";
// @ts-expect-error plain JavaScript module without types
import { randomSpecs } from "../scripts/spec-corpus.mjs";

const SEED = 20261203;
const n = Number(process.env["FUZZ_PLOT_DESIGNS"] ?? 24);

/** Whether every text of the drawing lies inside its viewBox. */
function textOutside(svg: string): string | null {
  const vb = viewBox(svg);
  for (const b of textBoxes(svg)) if (b.x0 < 0 || b.y0 < 0 || b.x1 > vb.width || b.y1 > vb.height) return b.text;
  return null;
}

describe("plots and schematics of random designs", () => {
  it(`${n} designs: every kind at two sizes and the schematic draw cleanly`, () => {
    const specs = (randomSpecs(SEED, n) as { id: string; spec: FilterSpec }[]).map((e, i) => ({ ...e, spec: { ...e.spec, yieldCheck: { maxBoards: 256, seed: i + 1 } } as FilterSpec }));
    let drawn = 0;
    for (const { id, spec } of specs) {
      let r: DesignResult;
      try {
        r = designFilter(spec);
      } catch (e) {
        expect(e, id).toBeInstanceOf(FilterwrightError);
        continue;
      }
      for (const kind of PLOT_KINDS) {
        for (const size of [{}, { width: 360, height: 260 }]) {
          let svg: string;
          try {
            svg = toSvgPlot(r, { kind, ...size });
          } catch (e) {
            expect(e, `${id} ${kind}`).toBeInstanceOf(FilterwrightError);
            continue;
          }
          expect(svg, `${id} ${kind}`).not.toMatch(/NaN|Infinity|undefined/);
          expect(textOutside(svg), `${id} ${kind}`).toBeNull();
          drawn++;
        }
      }
      const sch = toSvgSchematic(r);
      expect(sch, `${id} schematic`).not.toMatch(/NaN|Infinity|undefined/);
      expect(textOutside(sch), `${id} schematic`).toBeNull();
    }
    expect(drawn).toBeGreaterThan(n * PLOT_KINDS.length);
  });
});
