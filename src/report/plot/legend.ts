/**
 * A plot's legend: one swatch and label per entry, in rows below the plot
 * that wrap at its width, so it never covers the data.
 *
 * @module
 */
import { esc, px, textWidth } from "./text.ts";

/** How an entry is drawn: a line (with an optional dash pattern), a filled box, or a marker. */
export interface LegendEntry {
  /** The label. */
  readonly label: string;
  /** Line or outline colour. */
  readonly stroke?: string;
  /** Fill colour (a box swatch). */
  readonly fill?: string;
  /** Fill opacity of the box. */
  readonly fillOpacity?: number;
  /** SVG dash pattern of the line. */
  readonly dash?: string | undefined;
  /** Line width. */
  readonly strokeWidth?: number;
  /** A marker instead of a line: a cross (pole) or a ring (zero). */
  readonly marker?: "cross" | "ring";
}

const SWATCH = 22;
const GAP = 6;
const SPACING = 18;

/** An entry's width, pixels. */
const entryWidth = (e: LegendEntry, fontSize: number): number => SWATCH + GAP + textWidth(e.label, fontSize);

/**
 * The rows the entries take within `width` pixels.
 *
 * @param entries - the entries
 * @param fontSize - font size, pixels
 * @param width - the width available, pixels
 * @returns the entries of each row
 */
export function legendRows(entries: readonly LegendEntry[], fontSize: number, width: number): LegendEntry[][] {
  const rows: LegendEntry[][] = [];
  let row: LegendEntry[] = [];
  let used = 0;
  for (const e of entries) {
    const w = entryWidth(e, fontSize);
    if (row.length > 0 && used + SPACING + w > width) {
      rows.push(row);
      row = [];
      used = 0;
    }
    used += (row.length > 0 ? SPACING : 0) + w;
    row.push(e);
  }
  if (row.length > 0) rows.push(row);
  return rows;
}

/** The swatch of one entry, its left end at x, centred on y. */
function swatch(e: LegendEntry, x: number, y: number): string {
  if (e.marker === "cross") {
    const c = x + SWATCH / 2;
    return `<path d="M${px(c - 4)},${px(y - 4)}L${px(c + 4)},${px(y + 4)}M${px(c - 4)},${px(y + 4)}L${px(c + 4)},${px(y - 4)}" stroke="${e.stroke ?? "#000"}" stroke-width="1.6" fill="none"/>`;
  }
  if (e.marker === "ring") return `<circle cx="${px(x + SWATCH / 2)}" cy="${px(y)}" r="4" stroke="${e.stroke ?? "#000"}" stroke-width="1.4" fill="none"/>`;
  if (e.fill !== undefined) {
    return `<rect x="${px(x)}" y="${px(y - 5)}" width="${SWATCH}" height="10" fill="${e.fill}" fill-opacity="${e.fillOpacity ?? 1}"${e.stroke === undefined ? "" : ` stroke="${e.stroke}"`}/>`;
  }
  return `<line x1="${px(x)}" y1="${px(y)}" x2="${px(x + SWATCH)}" y2="${px(y)}" stroke="${e.stroke ?? "#000"}" stroke-width="${e.strokeWidth ?? 1.6}"${e.dash === undefined ? "" : ` stroke-dasharray="${e.dash}"`}/>`;
}

/**
 * The legend's SVG: rows from `top`, each starting at `left`.
 *
 * @param rows - from {@link legendRows}
 * @param left - left edge, pixels
 * @param top - top of the first row, pixels
 * @param fontSize - font size, pixels
 * @param lineHeight - height of a row, pixels
 * @returns the SVG elements
 */
export function legendSvg(rows: readonly (readonly LegendEntry[])[], left: number, top: number, fontSize: number, lineHeight: number): string[] {
  const out: string[] = [];
  rows.forEach((row, r) => {
    const y = top + r * lineHeight + lineHeight / 2;
    let x = left;
    for (const e of row) {
      out.push(swatch(e, x, y));
      out.push(`<text x="${px(x + SWATCH + GAP)}" y="${px(y + fontSize * 0.35)}">${esc(e.label)}</text>`);
      x += entryWidth(e, fontSize) + SPACING;
    }
  });
  return out;
}
