/**
 * Section tables: the per-section pole frequency, Q, zero frequency and kind
 * of a prototype, as a designer reads them from a handbook, and a compact
 * fixed-width text rendering. The factorisation and zero pairing are those of
 * `toSections` in the tf layer (highest-Q pole pair takes the nearest zero pair).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import type { NotchType, SectionKind, Zpk } from "../tf/types.ts";
import { requireZpk } from "../tf/check.ts";
import { type SectionOrdering, toSectionsUnchecked } from "../tf/sections.ts";
import { requireInteger, requireOneOf, requireOptions } from "../validate.ts";

/** One row of a section table. Frequencies are angular (rad/s), on the prototype's scale. */
export interface SectionRow {
  /** Position in the cascade, counting from 1. */
  readonly index: number;
  /** Section order. */
  readonly order: 1 | 2;
  /** Pole frequency (rad/s): |p| of the pole pair, or of the real pole. */
  readonly w0: number;
  /** Pole Q of a second-order section (absent for first order). */
  readonly q?: number;
  /** Frequency (rad/s) of the jw-axis zero pair of a notch section. */
  readonly wz?: number;
  /** What the section does on its own. */
  readonly kind: SectionKind;
  /** For a notch section, where the zero lies relative to the pole frequency. */
  readonly notchType?: NotchType;
}

/** Options of {@link sectionTable}. */
export interface SectionTableOptions {
  /**
   * Row order: `"ascending-q"` (first-order rows first, then increasing Q, as
   * handbook tables list them), `"descending-q"`, or `"as-given"` (order of the poles).
   * @defaultValue "ascending-q"
   */
  readonly order?: SectionOrdering;
}

const ORDERINGS: readonly SectionOrdering[] = ["ascending-q", "descending-q", "as-given"];

/**
 * The section table of a prototype (or any stable zpk): one row per first- or
 * second-order section with its pole frequency, Q, notch-zero frequency and kind.
 *
 * @param zpk - stable zeros/poles/gain, no more zeros than poles
 * @param options - row order
 * @returns the rows, numbered from 1 in cascade order
 * @throws {@link InvalidArgumentError} when the zpk is malformed, unstable or improper, or the order is unknown
 * @example
 * ```ts
 * sectionTable(butterworth(3));
 * //=> [{ index: 1, order: 1, w0: 1, kind: "lowpass" },
 * //    { index: 2, order: 2, w0: 1, q: 1.0000000000000002, kind: "lowpass" }]
 * ```
 */
export function sectionTable(zpk: Zpk, options?: SectionTableOptions): readonly SectionRow[] {
  const fn = "sectionTable";
  const h = requireZpk(fn, "zpk", zpk);
  const opts = requireOptions(fn, "options", options);
  const ordering = opts["order"] === undefined ? "ascending-q" : requireOneOf(fn, "options.order", opts["order"], ORDERINGS);
  if (h.zeros.length > h.poles.length) {
    throw new InvalidArgumentError({
      fn,
      path: "zpk.zeros",
      received: h.zeros.length,
      message: `a system with more zeros (${h.zeros.length}) than poles (${h.poles.length}) has no section table`,
    });
  }
  h.poles.forEach((p, i) => {
    if (!(p.re < 0)) {
      throw new InvalidArgumentError({ fn, path: `zpk.poles.${i}`, received: p, message: "poles must lie in the open left half-plane" });
    }
  });
  const cascade = toSectionsUnchecked(h, ordering);
  return Object.freeze(
    cascade.sections.map((s, i): SectionRow => {
      if (s.order === 1) return Object.freeze({ index: i + 1, order: 1, w0: s.w0, kind: s.kind });
      const row: SectionRow = {
        index: i + 1,
        order: 2,
        w0: s.w0,
        q: s.q,
        kind: s.kind,
        ...(s.wz === undefined ? {} : { wz: s.wz }),
        ...(s.notchType === undefined ? {} : { notchType: s.notchType }),
      };
      return Object.freeze(row);
    }),
  );
}

/** Options of {@link formatSectionTable}. */
export interface FormatSectionTableOptions {
  /**
   * Significant digits for w0, Q and wz (1-15).
   * @defaultValue 4
   */
  readonly digits?: number;
}

/**
 * Render section rows as a compact fixed-width text table (one header line,
 * one line per section, columns separated by two spaces, `-` where a value
 * does not apply). Lines end with `\n`.
 *
 * @param rows - rows from {@link sectionTable}
 * @param options - significant digits
 * @returns the table as text
 * @throws {@link InvalidArgumentError} when `rows` is not an array or `digits` is out of range
 * @example
 * ```ts
 * formatSectionTable(sectionTable(butterworth(3)));
 * //=> "#  order  w0 (rad/s)  Q      wz (rad/s)  kind\n" +
 * //   "1  1      1.000       -      -           lowpass\n" +
 * //   "2  2      1.000       1.000  -           lowpass\n"
 * ```
 */
export function formatSectionTable(rows: readonly SectionRow[], options?: FormatSectionTableOptions): string {
  const fn = "formatSectionTable";
  if (!Array.isArray(rows)) {
    throw new InvalidArgumentError({ fn, path: "rows", received: rows, message: "expected an array of section rows" });
  }
  const opts = requireOptions(fn, "options", options);
  const digits = opts["digits"] === undefined ? 4 : requireInteger(fn, "options.digits", opts["digits"], { min: 1, max: 15 });
  const num = (x: number | undefined): string => (x === undefined ? "-" : x.toPrecision(digits));
  const table: string[][] = [["#", "order", "w0 (rad/s)", "Q", "wz (rad/s)", "kind"]];
  (rows as readonly unknown[]).forEach((r, i) => {
    const row = r as Partial<SectionRow> | null;
    if (typeof row !== "object" || row === null || (row.order !== 1 && row.order !== 2) || typeof row.kind !== "string" || !(typeof row.w0 === "number" && row.w0 > 0)) {
      throw new InvalidArgumentError({ fn, path: `rows[${i}]`, received: r, message: "expected a section row from sectionTable ({ index, order, w0, kind, ... })" });
    }
  });
  for (const r of rows as readonly SectionRow[]) {
    const kind = r.notchType === undefined ? r.kind : `${r.kind} (${r.notchType})`;
    table.push([String(r.index), String(r.order), num(r.w0), num(r.q), num(r.wz), kind]);
  }
  const widths = (table[0] as string[]).map((_, c) => Math.max(...table.map((line) => (line[c] as string).length)));
  return table
    .map((line) => `${line.map((cell, c) => (c === line.length - 1 ? cell : cell.padEnd(widths[c] as number))).join("  ")}\n`)
    .join("");
}
