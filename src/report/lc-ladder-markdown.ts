/**
 * A Markdown summary of a passive LC ladder design (`designLcLadder`): what
 * was asked, the family, order and form chosen and why, the ladder from the
 * source end with each part's design value and the preferred value built,
 * the as-built check against the mask (inductor loss included, levels from
 * the lossless level RL / (RS + RL)), the boards' yield, the bill of
 * materials and the cautions that apply to building it.
 *
 * @module
 */
import type { LcLadderDesign } from "../design/lc-ladder-types.ts";
import { hertz } from "../design/text.ts";
import { InvalidArgumentError } from "../errors.ts";
import { formatValue } from "../units/index.ts";
import { DESIGN_CAUTIONS } from "./markdown.ts";

/**
 * Cautions of a passive ladder beyond the general ones (common practice, no
 * source): what the as-built model leaves out of a real inductor and of the
 * terminations.
 */
export const LADDER_CAUTIONS: readonly string[] = [
  "The model gives each inductor its value, tolerance and Q only: choose parts whose self-resonant frequency lies well above the highest frequency the stopband must hold, whose saturation current exceeds the peak current, and keep their fields apart (shielded parts, or coils at right angles) so they do not couple.",
  "The response assumes the stated source and load resistances: the ladder's passband depends on both terminations, so match or buffer them as designed.",
];

const n4 = (x: number): string => Number(x.toPrecision(4)).toString();
const dB = (x: number, d = 3): string => `${x.toFixed(d)} dB`;
const pct = (x: number): string => `${Number((x * 100).toPrecision(3))} %`;
const ohms = (x: number): string => formatValue(x, { digits: 4, unit: "Ω" });
const part = (kind: "L" | "C", x: number): string => formatValue(x, { digits: 4, unit: kind === "L" ? "H" : "F" });

/** The design, checked to be one from `designLcLadder` as far as this report reads it. */
function requireLadderDesign(design: unknown): LcLadderDesign {
  const d = design as Partial<LcLadderDesign> | null;
  const ok =
    d !== null &&
    typeof d === "object" &&
    typeof d.spec === "object" &&
    d.spec !== null &&
    typeof d.asBuilt === "object" &&
    d.asBuilt !== null &&
    Array.isArray(d.asBuilt.components) &&
    Array.isArray(d.asBuilt.arms) &&
    Array.isArray(d.parts) &&
    typeof d.verification === "object" &&
    d.verification !== null &&
    typeof d.verification.yield === "object";
  if (!ok) throw new InvalidArgumentError({ fn: "lcLadderMarkdown", path: "design", received: design, message: "expected a design from designLcLadder" });
  return d as LcLadderDesign;
}

/** One line: the nominal verdict and the boards'. */
function verdict(d: LcLadderDesign): string {
  const v = d.verification;
  const y = v.yield;
  const nominal = v.meetsSpec ? `meets the mask as built, margin ${dB(v.marginDb)}` : `misses the mask as built by ${dB(-v.marginDb)}`;
  return `${nominal}; ${pct(y.fraction)} of ${y.boards} boards [${pct(y.lower95)}, ${pct(y.upper95)}] at ${pct(y.inductorTolerance)} L / ${pct(y.capacitorTolerance)} C (target ${pct(y.target)}: ${y.met ? "met" : "not met"})`;
}

/**
 * Render a passive LC ladder design as a Markdown summary.
 *
 * @param design - a design from `designLcLadder`
 * @returns Markdown text
 * @throws {@link InvalidArgumentError} when `design` is not a ladder design
 * @example
 * ```ts
 * const d = designLcLadder({ response: "lowpass", passband: { edgeHz: "30M", maxLossDb: 1 }, stopband: { edgeHz: "60M", minAttenuationDb: 40 } });
 * lcLadderMarkdown(d).split("\n")[0]; //=> "# Lowpass LC ladder: elliptic, order 5" (the family and order chosen)
 * ```
 */
export function lcLadderMarkdown(design: LcLadderDesign): string {
  const d = requireLadderDesign(design);
  const s = d.spec;
  const v = d.verification;
  const y = v.yield;
  const a = d.asBuilt;
  const L: string[] = [];
  const title = s.response[0]?.toUpperCase() + s.response.slice(1);
  L.push(`# ${title} LC ladder: ${d.family}, order ${d.order}`, "");
  const works = v.meetsSpec && y.met;
  L.push(`**${works ? "Meets the spec" : "Does NOT meet the spec"}**: the ladder ${verdict(d)}. ${a.components.length} parts, no op-amp.`, "");
  L.push("## Specification", "");
  L.push("| item | value |", "|---|---|");
  L.push(`| response | ${s.response} |`);
  L.push(`| passband edge(s) | ${s.passbandHz.map((x) => hertz(x)).join(" – ")}, loss at most ${s.maxLossDb} dB |`);
  L.push(`| stopband edge(s) | ${s.stopbandHz.map((x) => hertz(x)).join(" – ")}, attenuation at least ${s.minAttenuationDb} dB |`);
  L.push(`| terminations | source ${ohms(a.sourceOhms)}, load ${ohms(a.loadOhms)} |`);
  L.push(`| inductors | ${a.inductorSeries} ±${pct(y.inductorTolerance)}, Q ${n4(a.losses.inductorQ)} at ${hertz(a.losses.qFrequencyHz)} |`);
  L.push(`| capacitors | ${a.capacitorSeries} ±${pct(y.capacitorTolerance)}${a.losses.capacitorEsrOhms > 0 ? `, ESR ${ohms(a.losses.capacitorEsrOhms)}` : ""} |`);
  L.push(`| yield target | ${pct(y.target)} of boards (lower end of the 95 % interval), seed ${y.seed} |`);
  L.push("");
  L.push("## Approximation", "");
  L.push(`Family **${d.family}**, order ${d.order}, ${d.form} form. ${d.reason}`, "");
  const p = d.placement;
  L.push(
    `The ${p.parameter === "bandwidth" ? "bandwidth" : "natural frequency"} can lie between ${hertz(p.lowHz)} and ${hertz(p.highHz)} for the exact ladder to meet the mask; it was placed at ${hertz(p.chosenHz)} (position ${n4(p.position)} on a log scale).`,
    "",
  );
  L.push("## Ladder (from the source end)", "");
  L.push("| arm | position | part | design value | as built | series | tolerance | loss resistance |", "|---|---|---|---|---|---|---|---|");
  const byName = new Map(a.components.map((c) => [c.designator, c]));
  for (const arm of a.arms) {
    for (const name of arm.designators) {
      const c = byName.get(name);
      if (c === undefined) continue;
      L.push(
        `| ${arm.index} | ${arm.position} | ${c.designator} | ${part(c.kind, c.designValue)} | ${part(c.kind, c.value)} | ${c.series} | ±${pct(c.tolerance)} | ${c.seriesOhms > 0 ? ohms(c.seriesOhms) : "–"} |`,
      );
    }
  }
  L.push("");
  L.push("## Verification (as built)", "");
  L.push("Levels are measured from the lossless level RL / (RS + RL), so the inductors' loss counts against the passband.", "");
  L.push("| check | as built | spec | margin |", "|---|---|---|---|");
  L.push(`| passband loss | ${dB(v.passbandLossDb)} (worst at ${hertz(v.passbandWorstHz)}) | ≤ ${s.maxLossDb} dB | ${dB(v.passbandMarginDb)} |`);
  L.push(`| stopband attenuation | ${dB(v.stopbandAttenuationDb, 2)} (worst at ${hertz(v.stopbandWorstHz)}) | ≥ ${s.minAttenuationDb} dB | ${dB(v.stopbandMarginDb)} |`);
  L.push("");
  L.push(`Worst margin of the exact (unrounded, lossless) ladder: ${dB(v.exactMarginDb)}.`, "");
  L.push("## Boards as built (yield)", "");
  L.push(
    `${y.boards} boards were built from parts drawn ${y.distribution === "uniform" ? "uniformly within" : "normally (tolerance = 3σ) within"} their tolerances (inductors ±${pct(y.inductorTolerance)}, capacitors ±${pct(y.capacitorTolerance)}, terminations ${y.terminationTolerance > 0 ? `±${pct(y.terminationTolerance)}` : "held"}; seed ${y.seed}) and checked against the mask: **${pct(y.fraction)}** passed, 95 % interval [${pct(y.lower95)}, ${pct(y.upper95)}] (Wilson score). Target ${pct(y.target)}: **${y.met ? "met" : "NOT met"}**. The worst board (board ${y.worstBoard.index + 1} of ${y.boards}) ${y.worstBoard.marginDb >= 0 ? `met the mask with ${dB(y.worstBoard.marginDb)} to spare` : `missed it by ${dB(-y.worstBoard.marginDb)}`}.`,
    "",
  );
  L.push("## Bill of materials", "");
  L.push("| designators | part | value | RKM | series | tolerance | requirement | qty |", "|---|---|---|---|---|---|---|---|");
  for (const l of d.parts) L.push(`| ${l.designators.join(", ")} | ${l.part} | ${l.valueText} | ${l.rkm} | ${l.series} | ${l.toleranceText} | ${l.requirement === "" ? "–" : l.requirement} | ${l.quantity} |`);
  L.push("", "The SPICE netlist of the ladder as built comes from `lcLadderNetlist(design)` (or `filterwright ladder --netlist FILE`).", "");
  L.push("## Cautions", "");
  for (const c of [...LADDER_CAUTIONS, ...DESIGN_CAUTIONS.slice(1)]) L.push(`- ${c}`);
  L.push("");
  return L.join("\n");
}
