/**
 * The exports of a design's other realisations: an active ladder chosen by
 * `compareRealisations` goes through the same netlist and BOM functions as
 * the cascade (`toSpiceNetlist(result, { realisation })`,
 * `toBomCsv(result, { realisation })`), and the comparison itself into the
 * Markdown report. The BOM of a ladder is in ./bom.ts.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import type { DesignResult } from "../design/index.ts";
import { chosenActiveLadder } from "../design/realisation.ts";
import type { RealisationCandidate, RealisationComparison } from "../analysis/index.ts";
import type { ActiveLadder } from "../ladder/active/types.ts";

/** A realisation to export: one candidate of `compareRealisations(result).candidates`. */
export type RealisationChoice = RealisationCandidate;

/** A candidate's realisation kind, checked. */
function requireCandidate(fn: string, value: unknown): RealisationCandidate {
  const path = "options.realisation";
  const v = value as Partial<RealisationCandidate> | null;
  if (v === null || typeof v !== "object" || (v.realisation !== "cascade" && v.realisation !== "active-ladder")) {
    throw new InvalidArgumentError({ fn, path, received: value, message: "expected one of compareRealisations(result).candidates" });
  }
  if (v.realisation === "active-ladder") {
    const l = v.ladder as Partial<ActiveLadder> | undefined;
    if (l === undefined || l === null || typeof l !== "object" || typeof l.output !== "string" || !Array.isArray(l.parts) || l.circuit === undefined) {
      throw new InvalidArgumentError({ fn, path: `${path}.ladder`, received: l, message: "expected the active ladder of the candidate, as compareRealisations returned it" });
    }
    const t = v.tolerances;
    if (t === undefined || !(t.resistor >= 0 && t.resistor <= 0.2) || !(t.capacitor >= 0 && t.capacitor <= 0.2)) {
      throw new InvalidArgumentError({ fn, path: `${path}.tolerances`, received: t, message: "expected the candidate's part tolerances (fractions from 0 to 0.2)" });
    }
  }
  return v as RealisationCandidate;
}

/**
 * The `realisation` option of a netlist or BOM call: undefined for the
 * cascade, else the checked candidate. Without the option, the realisation
 * the design chose (a spec's `realisation: "auto"` or `"active-ladder"`,
 * recorded in `result.realisation`) is exported.
 *
 * @param fn - the public function
 * @param options - its options
 * @param result - the design (its own choice is the default)
 * @returns the candidate, or undefined
 */
export function realisationOption(fn: string, options: unknown, result: DesignResult): RealisationCandidate | undefined {
  if (options === null || typeof options !== "object") {
    if (options !== undefined) throw new InvalidArgumentError({ fn, path: "options", received: options, message: "expected an options object (or nothing)" });
  }
  const r = options === undefined ? undefined : (options as { realisation?: unknown }).realisation;
  if (r === undefined) return chosenActiveLadder(result);
  const c = requireCandidate(fn, r);
  return c.realisation === "cascade" ? undefined : c;
}

/** The netlist header lines of an active ladder. */
export function ladderComments(result: DesignResult, c: RealisationCandidate): string[] {
  const l = c.ladder as ActiveLadder;
  return [
    `${result.family} ${result.spec.response}, ${result.filterOrder} poles, as an active ladder (${l.method}, ${l.opampCount} op-amps); designed by filterwright`,
    `boards: ${(c.yield * 100).toFixed(1)} % of ${c.boards} meet the mask at ${(c.tolerances.resistor * 100).toFixed(1)} % R / ${(c.tolerances.capacitor * 100).toFixed(1)} % C (95 % interval from ${(c.lower95 * 100).toFixed(1)} %)`,
    `input node: in (driven by Vin, AC 1 V); output node: ${l.output}`,
    `parts: ${l.parts.map((p) => `${p.name} (${p.role})`).join(", ")}`,
  ];
}

const pc = (x: number): string => `${Number((x * 100).toPrecision(3))} %`;

/**
 * The Markdown section of a comparison of realisations.
 *
 * @param c - the comparison
 * @returns the lines
 */
export function realisationLines(c: RealisationComparison): string[] {
  const L = [
    "## Realisations compared",
    "",
    `Every realisation on the same ${c.candidates[0]?.boards ?? 0} seeded boards (seed ${c.seed}) at ${pc(c.tolerances.resistor)} resistors and ${pc(c.tolerances.capacitor)} capacitors (the chosen one in bold):`,
    "",
    "| realisation | op-amps | resistors and capacitors | yield | 95 % interval | median margin | target |",
    "|---|---|---|---|---|---|---|",
  ];
  c.candidates.forEach((k, i) => {
    const b = (x: string): string => (i === c.chosen ? `**${x}**` : x);
    L.push(`| ${b(k.method)} | ${k.opamps} | ${k.parts} | ${b(pc(k.yield))} | [${pc(k.lower95)}, ${pc(k.upper95)}] | ${k.medianMarginDb.toFixed(3)} dB | ${k.meetsTarget ? "met" : "not met"} |`);
  });
  L.push("", `Choice: ${c.reason}`);
  for (const s of c.skipped) L.push(`- ${s.method}: not built (${s.reason})`);
  L.push("");
  return L;
}

/**
 * The `realisations` option of `toMarkdown`, checked.
 *
 * @param fn - the public function
 * @param value - the option
 * @returns the comparison, or undefined
 */
export function requireComparison(fn: string, value: unknown): RealisationComparison | undefined {
  if (value === undefined) return undefined;
  const c = value as Partial<RealisationComparison> | null;
  if (c === null || typeof c !== "object" || !Array.isArray(c.candidates) || c.candidates.length === 0 || typeof c.reason !== "string" || !Number.isInteger(c.chosen)) {
    throw new InvalidArgumentError({ fn, path: "options.realisations", received: value, message: "expected the result of compareRealisations(result)" });
  }
  c.candidates.forEach((k, i) => {
    if (k === null || typeof k !== "object" || typeof k.method !== "string" || !(k.yield >= 0 && k.yield <= 1)) {
      throw new InvalidArgumentError({ fn, path: `options.realisations.candidates.${i}`, received: k, message: "expected a candidate as compareRealisations returned it" });
    }
  });
  return c as RealisationComparison;
}
