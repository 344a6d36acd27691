/**
 * Bill of materials as CSV (RFC 4180: comma-separated, CRLF line ends,
 * fields quoted when they contain a comma, quote or line break).
 *
 * One row per distinct part (kind, value, series), with every reference
 * designator that uses it and the quantity: that is what a buyer orders from
 * and what a pick-and-place line loads. Op-amps get one row with their count
 * and the gain-bandwidth the design needs.
 *
 * @module
 */
import { formatRkm, formatValue } from "../units/index.ts";
import type { DesignResult, LcLadderDesign } from "../design/index.ts";
import { InvalidArgumentError } from "../errors.ts";
import { requireDesignResult } from "../design/check.ts";
import { realisationOption, type RealisationChoice } from "./realisation.ts";
import type { RealisationCandidate } from "../analysis/index.ts";
import type { ActiveLadder } from "../ladder/active/types.ts";

/** Options of {@link bomLines} and {@link toBomCsv}. */
export interface BomOptions {
  /**
   * A realisation from `compareRealisations(result)`: the BOM of its board
   * (an active ladder's parts, each at the tolerance its boards were measured
   * at, and its op-amps) instead of the design's cascade.
   * @defaultValue the realisation the design chose (`result.realisation`, from a spec's
   *   `realisation: "auto"` or `"active-ladder"`), else the design's own cascade
   */
  readonly realisation?: RealisationChoice;
}

/** One line of the bill of materials. */
export interface BomLine {
  /** Reference designators, in cascade order. */
  readonly designators: readonly string[];
  /** `resistor`, `capacitor` or `op-amp`. */
  readonly part: "resistor" | "capacitor" | "op-amp";
  /** Value in SI units (NaN-free; 0 for op-amps). */
  readonly value: number;
  /** Value in engineering notation with unit, e.g. `"4.7 kΩ"`. */
  readonly valueText: string;
  /** RKM code (IEC 60062), e.g. `"4k7"`; empty for op-amps. */
  readonly rkm: string;
  /** Preferred-value series, e.g. `"E96"`; empty for op-amps. */
  readonly series: string;
  /** Tolerance as text, e.g. `"1%"`: each part's own, as the design allocated it; empty for op-amps. */
  readonly tolerance: string;
  /**
   * Capacitor dielectric class: `"C0G/NP0"` ceramic up to 100 nF, `"film (PP/PPS)"`
   * above (stable, low-loss dielectrics with no voltage coefficient, as a
   * filter needs; common practice, no source); empty for resistors and op-amps.
   */
  readonly dielectric: string;
  /** Number of parts. */
  readonly quantity: number;
}

/**
 * The bill of materials as data, one line per distinct part.
 *
 * @param result - a design
 * @param options - the realisation to list (default: the design's cascade)
 * @returns lines: resistors by ascending value, then capacitors, then op-amps
 * @throws {@link InvalidArgumentError} when `result` is not a design result (the path names the first bad field)
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const first = bomLines(designFilter(spec))[0];
 * [first.part, first.series, first.tolerance]; //=> ["resistor", "E96", "1%"]
 * ```
 */
export function bomLines(result: DesignResult, options: BomOptions = {}): BomLine[] {
  requireDesignResult("bomLines", result);
  const realisation = realisationOption("bomLines", options, result);
  if (realisation?.ladder !== undefined) return ladderBomLines(result, realisation);
  const parts: PartEntry[] = [];
  for (const stage of result.stages) {
    for (const [d, v] of Object.entries(stage.components)) {
      const part = d.startsWith("C") ? "capacitor" : "resistor";
      parts.push({ designator: d, part, value: v, tolerance: stage.tolerances[d] ?? (part === "resistor" ? result.spec.resistorTolerance : result.spec.capacitorTolerance) });
    }
  }
  const lines = partLines(result, parts);
  const opamps = result.stages.flatMap((s) => s.opamps);
  if (opamps.length > 0) lines.push(opampLine(result, opamps, Math.max(...result.stages.map((s) => s.gbwDemandHz))));
  return lines;
}

/** One resistor or capacitor of a board, before grouping. */
export interface PartEntry {
  readonly designator: string;
  readonly part: "resistor" | "capacitor";
  readonly value: number;
  readonly tolerance: number;
}

/** Parts grouped by kind, value and tolerance: resistors by ascending value, then capacitors. */
export function partLines(result: DesignResult, parts: readonly PartEntry[]): BomLine[] {
  const groups = new Map<string, { part: "resistor" | "capacitor"; value: number; tolerance: number; designators: string[] }>();
  for (const p of parts) {
    const key = `${p.part}:${p.value}:${p.tolerance}`;
    const g = groups.get(key) ?? { part: p.part, value: p.value, tolerance: p.tolerance, designators: [] };
    g.designators.push(p.designator);
    groups.set(key, g);
  }
  const rank = (p: string): number => (p === "resistor" ? 0 : 1);
  return [...groups.values()]
    .sort((a, b) => rank(a.part) - rank(b.part) || a.value - b.value || a.tolerance - b.tolerance)
    .map((g) => {
      const series = g.part === "resistor" ? result.spec.resistorSeries : result.spec.capacitorSeries;
      const tol = g.tolerance * 100;
      return {
        designators: g.designators,
        part: g.part,
        value: g.value,
        valueText: formatValue(g.value, { digits: 3, unit: g.part === "resistor" ? "Ω" : "F" }),
        rkm: formatRkm(g.value, { digits: 3, kind: g.part }),
        series,
        tolerance: `${Number(tol.toPrecision(3))}%`,
        dielectric: g.part === "capacitor" ? (g.value <= 100e-9 * (1 + 1e-9) ? "C0G/NP0" : "film (PP/PPS)") : "",
        quantity: g.designators.length,
      };
    });
}

/** The op-amps' line: the spec's model, or with an ideal model the gain-bandwidth the board needs. */
export function opampLine(result: DesignResult, designators: readonly string[], needHz: number): BomLine {
  const m = result.spec.opamp;
  const valueText =
    m.kind === "ideal"
      ? needHz > 0
        ? `GBW >= ${formatValue(needHz, { digits: 3, unit: "Hz" })}`
        : "ideal in the design: choose the op-amp by the realisation's GBW needs"
      : `A0 ${formatValue(m.a0, { digits: 3 })}, GBW ${formatValue(m.gbwHz, { digits: 3, unit: "Hz" })}`;
  return { designators: [...designators], part: "op-amp", value: 0, valueText, rkm: "", series: "", tolerance: "", dielectric: "", quantity: designators.length };
}

/**
 * The BOM of an active ladder: its resistors and capacitors at the
 * tolerances its boards were measured at, in the spec's series, and its
 * op-amps.
 *
 * @param result - the design the ladder realises
 * @param c - the candidate (with its ladder)
 * @returns the lines
 */
export function ladderBomLines(result: DesignResult, c: RealisationCandidate): BomLine[] {
  const l = c.ladder as ActiveLadder;
  const lines = partLines(
    result,
    l.parts.map((p) => ({ designator: p.name, part: p.kind, value: p.value, tolerance: p.kind === "resistor" ? c.tolerances.resistor : c.tolerances.capacitor })),
  );
  const opamps = l.circuit.elements.filter((e) => e.kind === "OA").map((e) => e.name);
  if (opamps.length > 0) lines.push(opampLine(result, opamps, 0));
  return lines;
}

function csvField(x: string): string {
  return /[",\r\n]/.test(x) ? `"${x.replace(/"/g, '""')}"` : x;
}

/**
 * The bill of materials as CSV text with a header row:
 * `designators,part,value,rkm,series,tolerance,quantity`.
 *
 * @param result - a design
 * @param options - the realisation to list (default: the design's cascade)
 * @returns CSV text (CRLF line ends, UTF-8; values use Ω and µ)
 * @throws {@link InvalidArgumentError} when `result` is not a design result (the path names the first bad field)
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * toBomCsv(designFilter(spec)).split("\r\n")[0];
 * //=> "designators,part,value,rkm,series,tolerance,dielectric,quantity"
 * ```
 */
export function toBomCsv(result: DesignResult, options: BomOptions = {}): string {
  requireDesignResult("toBomCsv", result);
  const rows = [["designators", "part", "value", "rkm", "series", "tolerance", "dielectric", "quantity"]];
  for (const l of bomLines(result, options)) {
    rows.push([l.designators.join(", "), l.part, l.valueText, l.rkm, l.series, l.tolerance, l.dielectric, String(l.quantity)]);
  }
  return `${rows.map((r) => r.map(csvField).join(",")).join("\r\n")}\r\n`;
}

/**
 * The bill of materials of a passive LC ladder design as CSV text: one row
 * per distinct part with its designators, value, RKM code, series,
 * tolerance, what it must do (an inductor's Q at a frequency) and quantity.
 *
 * @param design - a design from `designLcLadder`
 * @returns CSV text (CRLF line ends, UTF-8)
 * @throws {@link InvalidArgumentError} when `design` is not a ladder design
 * @example
 * ```ts
 * toLcLadderBomCsv(designLcLadder(spec)).split("\r\n")[0];
 * //=> "designators,part,value,rkm,series,tolerance,requirement,quantity"
 * ```
 */
export function toLcLadderBomCsv(design: LcLadderDesign): string {
  const parts = (design as { parts?: unknown } | null)?.parts;
  if (!Array.isArray(parts)) {
    throw new InvalidArgumentError({ fn: "toLcLadderBomCsv", path: "design", received: design, message: "expected a design from designLcLadder" });
  }
  const rows = [["designators", "part", "value", "rkm", "series", "tolerance", "requirement", "quantity"]];
  for (const l of design.parts) rows.push([l.designators.join(", "), l.part, l.valueText, l.rkm, l.series, l.toleranceText, l.requirement, String(l.quantity)]);
  return `${rows.map((r) => r.map(csvField).join(",")).join("\r\n")}\r\n`;
}
