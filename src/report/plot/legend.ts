/**
 * A plot's legend: one swatch and label per entry, in rows below the plot
 * that wrap at its width, so it never covers the data. A label too wide for
 * a row on its own is broken at spaces onto further lines under its first.
 *
 * @module
 */
import { esc, px, textWidth, wrapText } from "./text.ts";

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
  /** Text only, no swatch (a note such as how many entries did not fit). */
  readonly plain?: boolean;
}

/** One piece of a legend row: an entry's swatch with the first line of its label, or a further line of it. */
export interface LegendItem {
  /** The entry. */
  readonly entry: LegendEntry;
  /** The text of this line. */
  readonly text: string;
  /** Whether the swatch is drawn (the first line of the label). */
  readonly swatch: boolean;
}

const SWATCH = 22;
const GAP = 6;
const SPACING = 18;

/** An item's width, pixels. */
const itemWidth = (i: LegendItem, fontSize: number): number => SWATCH + GAP + textWidth(i.text, fontSize);

/**
 * The rows of the entries within `width` pixels and at most `maxRows` rows:
 * when they do not all fit, the first entries that do and a note of how
 * many were left out.
 *
 * @param entries - the entries
 * @param fontSize - font size, pixels
 * @param width - the width available, pixels
 * @param maxRows - most rows (at least 1)
 * @returns the items of each row
 */
export function fittedLegendRows(entries: readonly LegendEntry[], fontSize: number, width: number, maxRows: number): LegendItem[][] {
  const all = legendRows(entries, fontSize, width);
  if (all.length <= maxRows) return all;
  for (let k = entries.length - 1; k >= 0; k--) {
    const left = entries.length - k;
    const rows = legendRows([...entries.slice(0, k), { label: `and ${left} more not listed`, plain: true }], fontSize, width);
    if (rows.length <= maxRows) return rows;
  }
  return legendRows([{ label: `${entries.length} traces`, plain: true }], fontSize, width).slice(0, maxRows);
}

/**
 * The rows the entries take within `width` pixels.
 *
 * @param entries - the entries
 * @param fontSize - font size, pixels
 * @param width - the width available, pixels
 * @returns the items of each row
 */
export function legendRows(entries: readonly LegendEntry[], fontSize: number, width: number): LegendItem[][] {
  const rows: LegendItem[][] = [];
  let row: LegendItem[] = [];
  let used = 0;
  const place = (item: LegendItem, alone: boolean): void => {
    const w = itemWidth(item, fontSize);
    if (row.length > 0 && (alone || used + SPACING + w > width)) {
      rows.push(row);
      row = [];
      used = 0;
    }
    used += (row.length > 0 ? SPACING : 0) + w;
    row.push(item);
  };
  for (const e of entries) {
    if (SWATCH + GAP + textWidth(e.label, fontSize) <= width) {
      place({ entry: e, text: e.label, swatch: true }, false);
      continue;
    }
    const lines = wrapText(e.label, fontSize, width - SWATCH - GAP);
    lines.forEach((text, k) => place({ entry: e, text, swatch: k === 0 }, true));
    // nothing follows a wrapped label on its last line
    rows.push(row);
    row = [];
    used = 0;
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
export function legendSvg(rows: readonly (readonly LegendItem[])[], left: number, top: number, fontSize: number, lineHeight: number): string[] {
  const out: string[] = [];
  rows.forEach((row, r) => {
    const y = top + r * lineHeight + lineHeight / 2;
    let x = left;
    for (const item of row) {
      if (item.swatch && item.entry.plain !== true) out.push(swatch(item.entry, x, y));
      out.push(`<text x="${px(x + SWATCH + GAP)}" y="${px(y + fontSize * 0.35)}">${esc(item.text)}</text>`);
      x += itemWidth(item, fontSize) + SPACING;
    }
  });
  return out;
}
