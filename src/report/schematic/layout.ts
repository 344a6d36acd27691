/**
 * The schematic of a stage: its topology's template where there is one and
 * it passes the connectivity check (src/report/schematic/connectivity.ts),
 * else the generic layout; and the stages of a cascade side by side, each
 * output wired to the next input.
 *
 * @module
 */
import type { Element } from "../../circuit/types.ts";
import { textWidth } from "../plot/text.ts";
import { sheetMismatch } from "./connectivity.ts";
import { genericSheet } from "./generic.ts";
import { sheetLabelBoxes } from "./render.ts";
import { GRID, opampPins, type Point, type Sheet } from "./sheet.ts";
import { multipleFeedbackSheet } from "./templates/multiple-feedback.ts";
import { sallenKeySheet } from "./templates/sallen-key.ts";
import { sallenKeyThirdSheet } from "./templates/sallen-key-third.ts";
import { stateVariableSheet } from "./templates/state-variable.ts";
import { towThomasSheet } from "./templates/tow-thomas.ts";

/** A template: the topology ids it draws and the drawing (null when the elements are not of its shape). */
export interface SchematicTemplate {
  /** Topology ids. */
  readonly ids: readonly string[];
  /** The layout. */
  readonly sheet: (elements: readonly Element[]) => Sheet | null;
}

/** The per-topology templates. */
export const SCHEMATIC_TEMPLATES: readonly SchematicTemplate[] = [
  {
    ids: ["sallen-key-lowpass-unity", "sallen-key-lowpass-equal", "sallen-key-lowpass-gain", "sallen-key-highpass-unity", "sallen-key-highpass-equal", "sallen-key-highpass-gain"],
    sheet: sallenKeySheet,
  },
  { ids: ["sallen-key-lowpass-third-order", "sallen-key-highpass-third-order"], sheet: sallenKeyThirdSheet },
  { ids: ["mfb-lowpass", "mfb-highpass", "mfb-bandpass", "mfb-bandpass-attenuated"], sheet: multipleFeedbackSheet },
  { ids: ["state-variable-lowpass", "state-variable-highpass", "state-variable-bandpass"], sheet: stateVariableSheet },
  { ids: ["tow-thomas-lowpass", "tow-thomas-bandpass"], sheet: towThomasSheet },
];

/** How a stage was laid out. */
export interface StageSheet {
  /** The sheet. */
  readonly sheet: Sheet;
  /** Whether a template drew it (else the generic layout). */
  readonly template: boolean;
}

/**
 * The sheet of one stage (see the module header).
 *
 * @param topologyId - the stage's topology
 * @param elements - its elements, nodes as in the topology
 * @returns the sheet and whether a template drew it
 * @throws Error when even the generic layout does not match the elements (a bug)
 */
export function stageSheet(topologyId: string, elements: readonly Element[]): StageSheet {
  const t = SCHEMATIC_TEMPLATES.find((x) => x.ids.includes(topologyId));
  const drawn = t?.sheet(elements) ?? null;
  if (drawn !== null && sheetMismatch(drawn, elements) === null) return { sheet: drawn, template: true };
  const sheet = genericSheet(elements);
  const bad = sheetMismatch(sheet, elements);
  if (bad !== null) throw new Error(`schematic of ${topologyId}: ${bad}`);
  return { sheet, template: false };
}

/** The sheet moved by (dx, dy) grid units. */
function shifted(s: Sheet, dx: number, dy: number): Sheet {
  const m = (p: Point): Point => [p[0] + dx, p[1] + dy];
  return {
    parts: s.parts.map((p) => ({ ...p, a: m(p.a), b: m(p.b) })),
    opamps: s.opamps.map((o) => ({ ...o, at: m(o.at) })),
    wires: s.wires.map((w) => w.map(m)),
    grounds: s.grounds.map(m),
    terminals: s.terminals.map((t) => ({ ...t, at: m(t.at) })),
    nodeLabels: s.nodeLabels.map((n) => ({ ...n, at: m(n.at) })),
  };
}

/** The grid x extent of a sheet, labels included. */
function xExtent(s: Sheet): [number, number] {
  const xs = [...s.parts.flatMap((p) => [p.a[0], p.b[0]]), ...s.wires.flat().map((p) => p[0]), ...s.opamps.flatMap((o) => [o.at[0] - 1, opampPins(o).out[0]]), ...s.terminals.map((t) => t.at[0])];
  let lo = Math.min(...xs);
  let hi = Math.max(...xs);
  for (const b of sheetLabelBoxes(s)) {
    lo = Math.min(lo, Math.floor(b.box.x0 / GRID));
    hi = Math.max(hi, Math.ceil(b.box.x1 / GRID));
  }
  for (const n of s.nodeLabels) hi = Math.max(hi, n.at[0] + Math.ceil(textWidth(n.text, 12) / GRID));
  return [lo, hi];
}

/**
 * Stages side by side: each stage's output terminal and the next stage's
 * input terminal replaced by a wire between them, a caption over each stage.
 *
 * @param stages - the stages' sheets and captions, in cascade order
 * @returns one sheet
 */
export function joinedSheets(stages: readonly { readonly sheet: Sheet; readonly caption: string }[]): Sheet {
  const parts: Sheet["parts"][number][] = [];
  const opamps: Sheet["opamps"][number][] = [];
  const wires: (readonly Point[])[] = [];
  const grounds: Point[] = [];
  const terminals: Sheet["terminals"][number][] = [];
  const nodeLabels: Sheet["nodeLabels"][number][] = [];
  let cursor = 0;
  let lastOut: Point | null = null;
  stages.forEach(({ sheet, caption }, k) => {
    const input = sheet.terminals.find((t) => t.node === "in")?.at ?? [0, 0];
    const [lo] = xExtent(sheet);
    const dy = lastOut === null ? 0 : lastOut[1] - input[1];
    const dx = (k === 0 ? 0 : cursor + 4) - lo;
    const s = shifted(sheet, dx, dy);
    const [, hi] = xExtent(s);
    parts.push(...s.parts);
    opamps.push(...s.opamps);
    wires.push(...s.wires);
    grounds.push(...s.grounds);
    nodeLabels.push(...s.nodeLabels);
    const top = Math.min(...s.wires.flat().map((p) => p[1]), ...s.parts.flatMap((p) => [p.a[1], p.b[1]]), ...s.opamps.map((o) => o.at[1] - 4));
    nodeLabels.push({ text: caption, at: [lo + dx, top - 3] });
    for (const t of s.terminals) {
      if (t.node === "in" && lastOut !== null) wires.push([lastOut, t.at]);
      else if (t.node === "in" || k === stages.length - 1) terminals.push(t);
      if (t.node === "out") lastOut = t.at;
    }
    cursor = hi;
  });
  return { parts, opamps, wires, grounds, terminals, nodeLabels };
}
