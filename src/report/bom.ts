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
import type { DesignResult } from "../design/index.ts";
import { requireDesignResult } from "../design/check.ts";

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
 * @returns lines: resistors by ascending value, then capacitors, then op-amps
 * @throws {@link InvalidArgumentError} when `result` is not a design result (the path names the first bad field)
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const first = bomLines(designFilter(spec))[0];
 * [first.part, first.series, first.tolerance]; //=> ["resistor", "E96", "1%"]
 * ```
 */
export function bomLines(result: DesignResult): BomLine[] {
  requireDesignResult("bomLines", result);
  const groups = new Map<string, { part: "resistor" | "capacitor"; value: number; tolerance: number; designators: string[] }>();
  for (const stage of result.stages) {
    for (const [d, v] of Object.entries(stage.components)) {
      const part = d.startsWith("C") ? "capacitor" : "resistor";
      const tolerance = stage.tolerances[d] ?? (part === "resistor" ? result.spec.resistorTolerance : result.spec.capacitorTolerance);
      const key = `${part}:${v}:${tolerance}`;
      const g = groups.get(key) ?? { part, value: v, tolerance, designators: [] };
      g.designators.push(d);
      groups.set(key, g);
    }
  }
  const rank = (p: string): number => (p === "resistor" ? 0 : 1);
  const lines: BomLine[] = [...groups.values()]
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
  const opamps = result.stages.flatMap((s) => s.opamps);
  if (opamps.length > 0) {
    const need = Math.max(...result.stages.map((s) => s.gbwDemandHz));
    const m = result.spec.opamp;
    const valueText =
      m.kind === "ideal"
        ? `GBW >= ${formatValue(need, { digits: 3, unit: "Hz" })}`
        : `A0 ${formatValue(m.a0, { digits: 3 })}, GBW ${formatValue(m.gbwHz, { digits: 3, unit: "Hz" })}`;
    lines.push({ designators: opamps, part: "op-amp", value: 0, valueText, rkm: "", series: "", tolerance: "", dielectric: "", quantity: opamps.length });
  }
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
 * @returns CSV text (CRLF line ends, UTF-8; values use Ω and µ)
 * @throws {@link InvalidArgumentError} when `result` is not a design result (the path names the first bad field)
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * toBomCsv(designFilter(spec)).split("\r\n")[0];
 * //=> "designators,part,value,rkm,series,tolerance,dielectric,quantity"
 * ```
 */
export function toBomCsv(result: DesignResult): string {
  requireDesignResult("toBomCsv", result);
  const rows = [["designators", "part", "value", "rkm", "series", "tolerance", "dielectric", "quantity"]];
  for (const l of bomLines(result)) {
    rows.push([l.designators.join(", "), l.part, l.valueText, l.rkm, l.series, l.tolerance, l.dielectric, String(l.quantity)]);
  }
  return `${rows.map((r) => r.map(csvField).join(",")).join("\r\n")}\r\n`;
}
