import { describe, expect, it } from "vitest";
import { topologies } from "../../src/topologies/index.ts";
import { stageSheet, SCHEMATIC_TEMPLATES } from "../../src/report/schematic/layout.ts";
import { sheetMismatch } from "../../src/report/schematic/connectivity.ts";
import { genericSheet } from "../../src/report/schematic/generic.ts";
import { sheetLabelBoxes } from "../../src/report/schematic/render.ts";
import { toSvgSchematic } from "../../src/report/schematic.ts";
import { toMarkdown } from "../../src/report/markdown.ts";
import { designFilter } from "../../src/design/index.ts";
import { formatValue } from "../../src/units/index.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import type { Element } from "../../src/circuit/types.ts";
import { thrownBy } from "../helpers/throws.ts";
import { textBoxes, viewBox } from "../helpers/svg-bounds.ts";
import { plotDesign } from "../helpers/plot-designs.ts";

/** A topology's elements with made-up values of every size. */
function elementsOf(id: string): readonly Element[] {
  const t = topologies.find((x) => x.id === id)!;
  const v: Record<string, number> = {};
  t.componentNames.forEach((n, i) => (v[n] = n.startsWith("C") ? 1.5e-9 * 3.3 ** (i % 4) : 1210 * 2.2 ** (i % 5)));
  return t.elements(v, { input: "in", output: "out", nodePrefix: "", opamp: { kind: "ideal" } });
}

const overlaps = (a: { x0: number; x1: number; y0: number; y1: number }, b: typeof a): boolean => a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;

describe("stage schematics", () => {
  for (const t of topologies) {
    it(`${t.id}: the drawing's nets are the element list's nodes, and no two labels overlap`, () => {
      const els = elementsOf(t.id);
      const { sheet, template } = stageSheet(t.id, els);
      expect(sheetMismatch(sheet, els)).toBeNull();
      expect(template).toBe(SCHEMATIC_TEMPLATES.some((x) => x.ids.includes(t.id)));
      expect(sheetMismatch(genericSheet(els), els)).toBeNull();
      const boxes = sheetLabelBoxes(sheet);
      for (let i = 0; i < boxes.length; i++) {
        for (let j = i + 1; j < boxes.length; j++) {
          expect(overlaps((boxes[i] as (typeof boxes)[number]).box, (boxes[j] as (typeof boxes)[number]).box), `${boxes[i]?.text} / ${boxes[j]?.text}`).toBe(false);
        }
      }
    });
  }

  it("notices a drawing that is not the circuit: a part on the wrong net, two parts swapped, a missing part", () => {
    const els = elementsOf("sallen-key-lowpass-unity");
    const { sheet } = stageSheet("sallen-key-lowpass-unity", els);
    // the shunt capacitor moved from node b to node a
    const moved = { ...sheet, parts: sheet.parts.map((p) => (p.a[0] === 20 && p.a[1] === 10 && p.b[1] === 16 ? { ...p, a: [10, 10] as const, b: [10, 16] as const } : p)) };
    expect(sheetMismatch(moved, els)).not.toBeNull();
    // the two capacitors' designators swapped
    const names = sheet.parts.filter((p) => p.kind === "C").map((p) => p.name);
    const swapped = { ...sheet, parts: sheet.parts.map((p) => (p.kind === "C" ? { ...p, name: p.name === names[0] ? (names[1] as string) : (names[0] as string) } : p)) };
    expect(sheetMismatch(swapped, els)).not.toBeNull();
    expect(sheetMismatch({ ...sheet, parts: sheet.parts.slice(1) }, els)).not.toBeNull();
    // the op-amp's inputs the other way up
    expect(sheetMismatch({ ...sheet, opamps: sheet.opamps.map((o) => ({ ...o, plusOnTop: !o.plusOnTop })) }, els)).not.toBeNull();
    // a crossing is not a connection: a wire laid across the + input line joins nothing
    expect(sheetMismatch({ ...sheet, wires: [...sheet.wires, [[22, 6], [22, 20]]] }, els)).toBeNull();
  });
});

describe("toSvgSchematic", () => {
  const designs = [plotDesign("lowpass"), plotDesign("bandstop"), plotDesign("bandpass")];

  it("writes every designator of the BOM and every value, and keeps all text inside the drawing", () => {
    for (const r of designs) {
      const svgs = [toSvgSchematic(r), ...r.stages.map((st) => toSvgSchematic(r, { stage: st.index }))];
      for (const svg of svgs) {
        const vb = viewBox(svg);
        for (const b of textBoxes(svg)) {
          expect(b.x0, b.text).toBeGreaterThanOrEqual(0);
          expect(b.y0, b.text).toBeGreaterThanOrEqual(0);
          expect(b.x1, b.text).toBeLessThanOrEqual(vb.width);
          expect(b.y1, b.text).toBeLessThanOrEqual(vb.height);
        }
        expect(svg).not.toMatch(/NaN|undefined|<script/);
      }
      const all = svgs[0] as string;
      for (const st of r.stages) {
        for (const [d, v] of Object.entries(st.components)) {
          expect(all).toMatch(new RegExp(`>${d}( |<)`));
          expect(all).toContain(formatValue(v, { digits: 3, unit: d.startsWith("C") ? "F" : "\u03a9" }));
        }
        for (const u of st.opamps) expect(all).toContain(`>${u}<`);
      }
    }
  });

  it("draws Sallen-Key and multiple-feedback stages from their templates", () => {
    const r = designFilter({ response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 0.5 }, stopband: { edgeHz: "5k", minAttenuationDb: 50 }, family: "butterworth", topology: "mfb-lowpass" });
    const st = r.stages.find((s) => s.topology === "mfb-lowpass")!;
    const svg = toSvgSchematic(r, { stage: st.index });
    expect(svg).toContain(`Stage ${st.index}: multiple-feedback lowpass`);
    // the template writes a horizontal part's designator and value on one line
    const [first] = Object.entries(st.components);
    expect(svg).toMatch(new RegExp(`>${first?.[0]} [^<]*\u03a9<|>${first?.[0]} [^<]*F<`));
  });

  it("names a bad stage number", () => {
    const r = designs[0]!;
    expect(thrownBy(() => toSvgSchematic(r, { stage: 0 }), InvalidArgumentError).path).toBe("options.stage");
    expect(thrownBy(() => toSvgSchematic(r, { stage: r.stages.length + 1 }), InvalidArgumentError).path).toBe("options.stage");
    expect(thrownBy(() => toSvgSchematic({} as never), InvalidArgumentError).fn).toBe("toSvgSchematic");
  });
});

describe("toMarkdown with schematics", () => {
  const r = plotDesign("lowpass");
  it("writes them in, links them as files, or leaves them out", () => {
    expect(toMarkdown(r)).not.toContain("## Schematics");
    expect(toMarkdown(r)).toBe(toMarkdown(r, { schematics: "none" }));
    const inline = toMarkdown(r, { schematics: "inline" });
    expect((inline.match(/<svg /g) ?? []).length).toBe(r.stages.length);
    const linked = toMarkdown(r, { schematics: "img/stage-{stage}.svg" });
    for (const st of r.stages) expect(linked).toContain(`![Stage ${st.index}: ${st.topologyName}](img/stage-${st.index}.svg)`);
  });
  it("names a bad schematics option", () => {
    expect(thrownBy(() => toMarkdown(r, { schematics: "stage.svg" }), InvalidArgumentError).path).toBe("options.schematics");
  });
});
