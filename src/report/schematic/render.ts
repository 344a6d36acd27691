/**
 * A sheet drawn as SVG 1.1: resistors as IEC 60617 rectangles, capacitors as
 * two plates, inductors as four arcs, op-amps as triangles with their - and
 * + inputs marked, ground symbols, open-circle terminals, filled dots where
 * three or more wires meet (a wire that only crosses another has none), and
 * every part's designator and value beside it. The drawing's size is the
 * bounding box of everything in it, text by the conservative width estimate
 * of src/report/plot/text.ts, plus a margin, so nothing is cut off.
 *
 * @module
 */
import { formatValue } from "../../units/index.ts";
import { esc, px, textWidth } from "../plot/text.ts";
import { GRID, opampPins, type PlacedOpamp, type PlacedPart, type Point, type Sheet } from "./sheet.ts";

const FONT = 12;
const STROKE = "#1a1a1a";

/** A text run and its box. */
interface Label {
  readonly text: string;
  readonly x: number;
  readonly y: number;
  readonly anchor: "start" | "middle" | "end";
  readonly fill?: string;
}

/** A box, pixels. */
interface Box {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

const P = (v: number): number => v * GRID;

/** The value of a part as written on it. */
function valueText(p: PlacedPart): string {
  return formatValue(p.value, { digits: 3, unit: p.kind === "R" ? "\u03a9" : p.kind === "C" ? "F" : "H" });
}

/** A part's symbol and leads, and its two labels. */
function partSvg(p: PlacedPart): { svg: string[]; labels: Label[] } {
  const [ax, ay] = [P(p.a[0]), P(p.a[1])];
  const [bx, by] = [P(p.b[0]), P(p.b[1])];
  const horizontal = ay === by;
  const cx = (ax + bx) / 2;
  const cy = (ay + by) / 2;
  const len = horizontal ? Math.abs(bx - ax) : Math.abs(by - ay);
  const half = p.kind === "R" ? 18 : p.kind === "C" ? 4 : 20;
  const body = Math.min(half, len / 2 - 2);
  // in the part's own frame: u along it, v across; to pixels
  const at = (u: number, v: number): string => (horizontal ? `${px(cx + u)},${px(cy + v)}` : `${px(cx + v)},${px(cy + u)}`);
  const lo = -len / 2;
  const svg: string[] = [`<path d="M${at(lo, 0)}L${at(-body, 0)}M${at(body, 0)}L${at(-lo, 0)}" stroke="${STROKE}" stroke-width="1.5" fill="none"/>`];
  if (p.kind === "R") svg.push(`<path d="M${at(-body, -6)}L${at(body, -6)}L${at(body, 6)}L${at(-body, 6)}Z" stroke="${STROKE}" stroke-width="1.5" fill="#ffffff"/>`);
  else if (p.kind === "C") svg.push(`<path d="M${at(-body, -11)}L${at(-body, 11)}M${at(body, -11)}L${at(body, 11)}" stroke="${STROKE}" stroke-width="2.2" fill="none"/>`);
  else {
    const arcs: string[] = [`M${at(-body, 0)}`];
    for (let k = 0; k < 4; k++) arcs.push(`A${px(body / 4)},${px(body / 4)} 0 0 1 ${at(-body + ((k + 1) * body) / 2, 0)}`);
    svg.push(`<path d="${arcs.join("")}" stroke="${STROKE}" stroke-width="1.5" fill="none"/>`);
  }
  const v = valueText(p);
  const off = p.kind === "C" ? 15 : 11;
  const labels: Label[] =
    p.label === "above"
      ? [{ text: `${p.name} ${v}`, x: cx, y: cy - off - 4, anchor: "middle" }]
      : p.label === "below"
        ? [{ text: `${p.name} ${v}`, x: cx, y: cy + off + FONT, anchor: "middle" }]
        : p.label === "right"
          ? [
              { text: p.name, x: cx + off, y: cy - 2, anchor: "start" },
              { text: v, x: cx + off, y: cy + FONT + 1, anchor: "start" },
            ]
          : [
              { text: p.name, x: cx - off, y: cy - 2, anchor: "end" },
              { text: v, x: cx - off, y: cy + FONT + 1, anchor: "end" },
            ];
  return { svg, labels };
}

/** An op-amp's triangle, input marks, pin stubs and designator. */
function opampSvg(o: PlacedOpamp): { svg: string[]; labels: Label[] } {
  const [x, y] = [P(o.at[0]), P(o.at[1])];
  const pins = opampPins(o);
  const top = o.plusOnTop ? "+" : "\u2212";
  const bottom = o.plusOnTop ? "\u2212" : "+";
  const svg = [
    `<path d="M${px(x)},${px(y - 35)}L${px(x + 60)},${px(y)}L${px(x)},${px(y + 35)}Z" stroke="${STROKE}" stroke-width="1.5" fill="#ffffff"/>`,
    `<path d="M${px(P(pins.plus[0]))},${px(P(pins.plus[1]))}H${px(x)}M${px(P(pins.minus[0]))},${px(P(pins.minus[1]))}H${px(x)}M${px(x + 60)},${px(y)}H${px(P(pins.out[0]))}" stroke="${STROKE}" stroke-width="1.5" fill="none"/>`,
  ];
  const labels: Label[] = [
    { text: top, x: x + 7, y: y - 20 + 4.5, anchor: "start" },
    { text: bottom, x: x + 7, y: y + 20 + 4.5, anchor: "start" },
    { text: o.name, x: x + 30, y: y - 24, anchor: "start" },
  ];
  return { svg, labels };
}

/** A ground symbol hanging from a point. */
function groundSvg(g: Point): string {
  const [x, y] = [P(g[0]), P(g[1])];
  return `<path d="M${px(x)},${px(y)}V${px(y + 8)}M${px(x - 9)},${px(y + 8)}H${px(x + 9)}M${px(x - 6)},${px(y + 12)}H${px(x + 6)}M${px(x - 3)},${px(y + 16)}H${px(x + 3)}" stroke="${STROKE}" stroke-width="1.5" fill="none"/>`;
}

/** The points where three or more wire ends or pins meet, or a wire end or pin lands inside another wire. */
function junctions(sheet: Sheet): Point[] {
  const count = new Map<string, { p: Point; n: number }>();
  const add = (p: Point, n: number): void => {
    const k = `${p[0]},${p[1]}`;
    const c = count.get(k) ?? { p, n: 0 };
    c.n += n;
    count.set(k, c);
  };
  const segments: [Point, Point][] = [];
  for (const w of sheet.wires) for (let i = 1; i < w.length; i++) segments.push([w[i - 1] as Point, w[i] as Point]);
  for (const [a, b] of segments) {
    add(a, 1);
    add(b, 1);
  }
  for (const p of sheet.parts) {
    add(p.a, 1);
    add(p.b, 1);
  }
  for (const o of sheet.opamps) for (const p of Object.values(opampPins(o))) add(p, 1);
  for (const t of sheet.terminals) add(t.at, 1);
  for (const g of sheet.grounds) add(g, 1);
  // a point inside a segment counts that segment twice (it continues both ways)
  for (const c of count.values()) {
    for (const [a, b] of segments) {
      const inside =
        (a[0] === b[0] && c.p[0] === a[0] && c.p[1] > Math.min(a[1], b[1]) && c.p[1] < Math.max(a[1], b[1])) ||
        (a[1] === b[1] && c.p[1] === a[1] && c.p[0] > Math.min(a[0], b[0]) && c.p[0] < Math.max(a[0], b[0]));
      if (inside) c.n += 2;
    }
  }
  return [...count.values()].filter((c) => c.n >= 3).map((c) => c.p);
}

/** A label's box, pixels. */
function labelBox(l: Label): Box {
  const w = textWidth(l.text, FONT);
  const x0 = l.anchor === "start" ? l.x : l.anchor === "middle" ? l.x - w / 2 : l.x - w;
  return { x0, y0: l.y - 0.93 * FONT, x1: x0 + w, y1: l.y + 0.24 * FONT };
}

/**
 * Draw a sheet.
 *
 * @param sheet - the sheet
 * @param title - the drawing's title (its first line, and the `title` element)
 * @returns SVG text
 */
export function renderSheet(sheet: Sheet, title: string): string {
  const body: string[] = [];
  const labels: Label[] = [];
  for (const w of sheet.wires) body.push(`<path d="M${w.map((p) => `${px(P(p[0]))},${px(P(p[1]))}`).join("L")}" stroke="${STROKE}" stroke-width="1.5" fill="none"/>`);
  for (const p of sheet.parts) {
    const d = partSvg(p);
    body.push(...d.svg);
    labels.push(...d.labels);
  }
  for (const o of sheet.opamps) {
    const d = opampSvg(o);
    body.push(...d.svg);
    labels.push(...d.labels);
  }
  for (const g of sheet.grounds) body.push(groundSvg(g));
  for (const j of junctions(sheet)) body.push(`<circle cx="${px(P(j[0]))}" cy="${px(P(j[1]))}" r="3" fill="${STROKE}"/>`);
  for (const t of sheet.terminals) {
    const [x, y] = [P(t.at[0]), P(t.at[1])];
    body.push(`<circle cx="${px(x)}" cy="${px(y)}" r="4" stroke="${STROKE}" stroke-width="1.5" fill="#ffffff"/>`);
    labels.push({ text: t.node, x: t.side === "left" ? x - 8 : x + 8, y: y + 4.5, anchor: t.side === "left" ? "end" : "start" });
  }
  // a node's name sits just above its line, right of the point given
  for (const n of sheet.nodeLabels) labels.push({ text: n.text, x: P(n.at[0]) + 4, y: P(n.at[1]) - 4, anchor: "start", fill: "#666666" });
  // the bounding box of everything drawn
  const box: Box = { x0: Infinity, y0: Infinity, x1: -Infinity, y1: -Infinity };
  const grow = (b: Box): void => {
    box.x0 = Math.min(box.x0, b.x0);
    box.y0 = Math.min(box.y0, b.y0);
    box.x1 = Math.max(box.x1, b.x1);
    box.y1 = Math.max(box.y1, b.y1);
  };
  const pointBox = (p: Point, r: number): Box => ({ x0: P(p[0]) - r, y0: P(p[1]) - r, x1: P(p[0]) + r, y1: P(p[1]) + r });
  for (const w of sheet.wires) for (const p of w) grow(pointBox(p, 2));
  for (const p of sheet.parts) [p.a, p.b].forEach((q) => grow(pointBox(q, 12)));
  for (const o of sheet.opamps) grow({ x0: P(o.at[0]) - 12, y0: P(o.at[1]) - 36, x1: P(o.at[0]) + 72, y1: P(o.at[1]) + 36 });
  for (const g of sheet.grounds) grow({ x0: P(g[0]) - 10, y0: P(g[1]), x1: P(g[0]) + 10, y1: P(g[1]) + 18 });
  for (const l of labels) grow(labelBox(l));
  const margin = 12;
  const titleHeight = 24;
  const width = Math.ceil(Math.max(box.x1 - box.x0 + 2 * margin, textWidth(title, 13) + 2 * margin));
  const height = Math.ceil(box.y1 - box.y0 + 2 * margin + titleHeight);
  const dx = margin - box.x0;
  const dy = margin + titleHeight - box.y0;
  const out = [
    `<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="DejaVu Sans, Verdana, Arial, Helvetica, sans-serif" font-size="${FONT}">`,
    `<title>${esc(title)}</title>`,
    `<rect x="0" y="0" width="${width}" height="${height}" fill="#ffffff"/>`,
    `<text x="${margin}" y="${margin + 13}" font-size="13" fill="#111111">${esc(title)}</text>`,
    `<g transform="translate(${px(dx)} ${px(dy)})">`,
    ...body,
    ...labels.map((l) => `<text x="${px(l.x)}" y="${px(l.y)}"${l.anchor === "start" ? "" : ` text-anchor="${l.anchor}"`}${l.fill === undefined ? "" : ` fill="${l.fill}"`}>${esc(l.text)}</text>`),
    "</g>",
    "</svg>",
    "",
  ];
  return out.join("\n");
}

/**
 * The label boxes of a sheet as drawn (before the translation to the
 * drawing's margin), for the layouts' overlap checks.
 *
 * @param sheet - the sheet
 * @returns the boxes, pixels
 */
export function sheetLabelBoxes(sheet: Sheet): { readonly text: string; readonly box: Box }[] {
  const labels: Label[] = [...sheet.parts.flatMap((p) => partSvg(p).labels), ...sheet.opamps.flatMap((o) => opampSvg(o).labels)];
  return labels.map((l) => ({ text: l.text, box: labelBox(l) }));
}
