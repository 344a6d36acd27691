/**
 * A Markdown design summary: what was asked, what was chosen and why, the
 * stages and their parts, the as-built check against the mask, warnings, the
 * steps the pipeline took, and the cautions that apply to building it.
 *
 * @module
 */
import { realisationLines, requireComparison } from "./realisation.ts";
import { chosenActiveLadder } from "../design/realisation.ts";
import type { RealisationComparison } from "../analysis/index.ts";
import { formatValue } from "../units/index.ts";
import type { DesignResult } from "../design/index.ts";
import { bomLines } from "./bom.ts";
import { opampRequirements } from "../analysis/index.ts";
import { requireDesignResult } from "../design/check.ts";
import { verdictLine } from "../design/verdict.ts";
import { hertz } from "../design/text.ts";
import { headroomLines } from "./headroom.ts";
import { requireSchematics, schematicLines, type MarkdownSchematics } from "./markdown-schematics.ts";
import { requireOptions } from "../validate.ts";

/** Options of {@link toMarkdown}. */
export interface MarkdownOptions {
  /**
   * Each stage's schematic after the stage list: `"inline"` writes the SVG
   * into the Markdown (shown by renderers that allow HTML, such as VS Code,
   * Jupyter and typedoc; GitHub does not), a file name containing `{stage}`
   * (`"img/stage-{stage}.svg"`) links one image per stage, which you write
   * with `toSvgSchematic(result, { stage })`, and `"none"` leaves them out.
   * @defaultValue "none"
   */
  readonly schematics?: MarkdownSchematics;
  /**
   * A comparison from `compareRealisations(result)`: a section with every
   * realisation's op-amps and yield on the same boards, and the choice.
   * @defaultValue the design's own comparison (`result.realisation`, from a spec's
   *   `realisation: "auto"` or `"active-ladder"`), else no such section
   */
  readonly realisations?: RealisationComparison;
}

const f3 = (x: number): string => hertz(x);
const n4 = (x: number): string => Number(x.toPrecision(4)).toString();
const dB = (x: number, d = 3): string => `${x.toFixed(d)} dB`;
const pct = (x: number): string => `${(x * 100).toFixed(3)} %`;

/** The cautions printed with every design (reports and command line). */
export const DESIGN_CAUTIONS: readonly string[] = [
  "Op-amps have supply, input common-mode and output-swing limits: check that every stage output (see the peak gain column) stays inside them at the largest input you expect, and that the chosen op-amp is stable at the gain each stage uses.",
  "Equipment connected to the mains, or to a patient or other person, needs isolation and must follow its own safety standards; this library does not design isolation or protection.",
  "These results are a design aid. Check them against local codes and licensed professional practice before use wherever safety is involved, and verify the built circuit by measurement.",
];

function edges(e: readonly number[]): string {
  return e.map(f3).join(" – ");
}

/** The boards section: the yield, the tolerances it was measured at, and the alternatives the yield search measured. */
function yieldSection(result: DesignResult): string[] {
  const y = result.verification.yield;
  const list = (xs: readonly number[]): string => xs.map(pct).join(", ");
  const L: string[] = ["## Boards as built (yield)", ""];
  L.push(
    `${y.boards} boards were built from parts drawn ${y.distribution === "uniform" ? "uniformly within" : "normally (tolerance = 3σ) within"} their tolerances (resistors ${list(y.resistorTolerances)}; capacitors ${list(y.capacitorTolerances)}; seed ${y.seed}), each with the op-amp model, and checked against the mask and for stability: **${pct(y.fraction)}** passed, 95 % interval [${pct(y.lower95)}, ${pct(y.upper95)}] (Wilson score). Target ${pct(y.target)}: **${y.met ? "met" : "NOT met"}**.${y.unstableBoards > 0 ? ` ${y.unstableBoards} boards were unstable.` : ""} Each part's tolerance is in the BOM.`,
    "",
  );
  if (result.yieldAlternatives.length > 1) {
    L.push("Designs measured on the way (the chosen one in bold):", "");
    L.push("| change | family | order | op-amps | R tol. | C tol. | yield | 95 % interval | boards | target |", "|---|---|---|---|---|---|---|---|---|---|");
    for (const a of result.yieldAlternatives) {
      const b = (x: string): string => (a.chosen ? `**${x}**` : x);
      L.push(`| ${b(a.change)} | ${a.family} | ${a.order} | ${a.opamps} | ${pct(a.resistorTolerance)} | ${pct(a.capacitorTolerance)} | ${b(pct(a.fraction))} | [${pct(a.lower95)}, ${pct(a.upper95)}] | ${a.boards} | ${a.met ? "met" : "not met"} |`);
    }
    L.push("");
  }
  return L;
}

/**
 * Render a design as a Markdown summary.
 *
 * @param result - a design
 * @param options - whether and how to show the stages' schematics
 * @returns Markdown text
 * @throws {@link InvalidArgumentError} when `result` is not a design result (the path names the first bad field), or `schematics` is not one of its forms
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * toMarkdown(designFilter(spec)).split("\n")[0]; //=> "# Lowpass filter: elliptic, 3 poles"
 * toMarkdown(designFilter(spec), { schematics: "stage-{stage}.svg" }).includes("](stage-1.svg)"); //=> true
 * ```
 */
export function toMarkdown(result: DesignResult, options?: MarkdownOptions): string {
  requireDesignResult("toMarkdown", result);
  const o = requireOptions("toMarkdown", "options", options);
  const schematics = requireSchematics("toMarkdown", o["schematics"]);
  const realisations = requireComparison("toMarkdown", o["realisations"]) ?? result.realisation;
  const s = result.spec;
  const v = result.verification;
  const L: string[] = [];
  const title = s.response[0]?.toUpperCase() + s.response.slice(1);
  L.push(`# ${title} filter: ${result.family}, ${result.filterOrder} poles`, "");
  const pct = (x: number): string => `${Number((x * 100).toPrecision(3))} %`;
  const own = result.realisation;
  const ladder = chosenActiveLadder(result);
  if (own !== undefined && ladder !== undefined) {
    L.push(
      `**${own.boardsMeetSpec ? "Meets the spec" : "Does NOT meet the spec"}**: realised as the ${ladder.method} active ladder (${ladder.opamps} op-amps), whose nominal board has ${ladder.nominalMarginDb.toFixed(3)} dB of margin and whose boards meet the mask on ${pct(ladder.yield)} of ${ladder.boards} (95 % interval from ${pct(ladder.lower95)}, target ${pct(s.yieldTarget)}). ${own.reason} The netlist and BOM are of the ladder; the stages below are the biquad cascade it was compared with.`,
      "",
    );
  } else {
    L.push(
      `**${v.boardsMeetSpec ? "Meets the spec" : "Does NOT meet the spec"}**: the design ${verdictLine(result)}. ${result.stages.length} stage${result.stages.length === 1 ? "" : "s"}, ${result.stages.reduce((k, st) => k + st.opamps.length, 0)} op-amp(s).`,
      "",
    );
  }
  L.push("## Specification", "");
  L.push("| item | value |", "|---|---|");
  L.push(`| response | ${s.response} |`);
  L.push(`| passband edge(s) | ${edges(s.passbandHz)}, loss at most ${s.maxLossDb} dB |`);
  L.push(`| stopband edge(s) | ${edges(s.stopbandHz)}, attenuation at least ${s.minAttenuationDb} dB |`);
  L.push(`| gain | ${n4(20 * Math.log10(s.gain))} dB (${n4(s.gain)} V/V), polarity ${s.polarity}, tolerance ${s.gainToleranceDb} dB |`);
  if (s.realisation !== "cascade") L.push(`| realisation | ${s.realisation} |`);
  const tolText = (t: number, fixed: boolean): string => `±${pct(t)}${fixed ? "" : " (default; may be tightened per part)"}`;
  L.push(`| parts | capacitors ${s.capacitorSeries} ${tolText(s.capacitorTolerance, s.capacitorToleranceFixed)}, resistors ${s.resistorSeries} ${tolText(s.resistorTolerance, s.resistorToleranceFixed)} in ${formatValue(s.resistorRange.min, { unit: "Ω" })} – ${formatValue(s.resistorRange.max, { unit: "Ω" })}; spread ${s.partDistribution === "uniform" ? "uniform within tolerance" : "normal, tolerance = 3σ"} |`);
  L.push(`| yield target | ${pct(s.yieldTarget)} of boards (lower end of the 95 % interval), at most ${s.yieldMaxBoards} boards, seed ${s.yieldSeed} |`);
  L.push(`| op-amp | ${s.opamp.kind === "ideal" ? "ideal" : `A0 ${n4(s.opamp.a0)}, GBW ${f3(s.opamp.gbwHz)}`} |`);
  if (s.levels !== null) L.push(`| signal levels | input ${n4(s.levels.inputPeakV)} V peak, op-amp output swing ${n4(s.levels.outputSwingV)} V peak |`);
  L.push("");
  L.push("## Approximation", "");
  L.push(`Family **${result.family}**, prototype order ${result.order} (minimum ${result.minimumOrder}). ${result.familyChoice.reason}`, "");
  const p = result.placement;
  L.push(
    `The ${p.parameter === "bandwidth" ? "bandwidth" : "natural frequency"} can lie between ${f3(p.lowHz)} and ${f3(p.highHz)} for the exact design to meet the mask; it was placed at ${f3(p.chosenHz)} (position ${n4(p.position)} on a log scale).${p.designRippleDb === undefined ? "" : ` Design ripple ${n4(p.designRippleDb)} dB.`}${p.designAttenuationDb === undefined ? "" : ` Design stopband attenuation ${n4(p.designAttenuationDb)} dB.`}`,
    "",
  );
  L.push("## Stages", "");
  // Columns for the pole with the real op-amp, only when the design has them.
  const withOpamp = result.stages.some((st) => st.asBuiltWithOpamp !== undefined);
  L.push(
    `| stage | topology | kind | f0 target | f0 as built |${withOpamp ? " f0 with op-amp |" : ""} Q target | Q as built |${withOpamp ? " Q with op-amp |" : ""} gain target | gain as built | peak gain at stage output | GBW required |`,
    `|---|---|---|---|---|${withOpamp ? "---|" : ""}---|---|${withOpamp ? "---|" : ""}---|---|---|---|`,
  );
  for (const st of result.stages) {
    const w = st.asBuiltWithOpamp;
    const f0w = withOpamp ? ` ${w === undefined ? "–" : f3(w.f0Hz)} |` : "";
    const qw = withOpamp ? ` ${w?.q === undefined ? "–" : n4(w.q)} |` : "";
    L.push(
      `| ${st.index} | ${st.topologyName} | ${st.kind}${st.order === 3 ? " (third order)" : ""} | ${f3(st.target.f0Hz)} | ${f3(st.asBuilt.f0Hz)} |${f0w} ${st.target.q === undefined ? "–" : n4(st.target.q)} | ${st.asBuilt.q === undefined ? "–" : n4(st.asBuilt.q)} |${qw} ${n4(st.target.gain)} | ${n4(st.asBuilt.gain)} | ${dB(20 * Math.log10(st.peakGain), 2)} at ${f3(st.peakHz)} | ${f3(st.gbwDemandHz)} |`,
    );
  }
  if (withOpamp) {
    L.push(
      "",
      "\"as built\" is the pole of the preferred values with an ideal op-amp; \"with op-amp\" is the pole the same values have with the spec's op-amp model.",
    );
  }
  L.push("");
  for (const st of result.stages) {
    const parts = Object.entries(st.components)
      .map(([k, x]) => `${k} = ${formatValue(x, { digits: 3, unit: k.startsWith("C") ? "F" : "Ω" })}`)
      .join(", ");
    const pd = st.predistortion;
    const w = st.asBuiltWithOpamp;
    const real =
      pd === undefined || w === undefined
        ? ""
        : ` Pre-distorted for the op-amp's gain-bandwidth (design f0 x${n4(pd.f0Factor)}, Q x${n4(pd.qFactor)}${pd.gainFactor === 1 ? "" : `, gain x${n4(pd.gainFactor)}`}); with the op-amp: f0 error ${pct(Math.abs(w.f0Hz / st.target.f0Hz - 1))}${w.q === undefined || st.target.q === undefined ? "" : `, Q error ${pct(Math.abs(w.q / st.target.q - 1))}`}.`;
    const realPole =
      st.target.realPoleHz === undefined || st.asBuilt.realPoleHz === undefined
        ? ""
        : ` Real pole: target ${f3(st.target.realPoleHz)}, as built ${f3(st.asBuilt.realPoleHz)} (the f0 error is the larger of the pair's and the real pole's).`;
    L.push(
      `- Stage ${st.index} (${st.topology}; ${st.topologyReason}): ${parts}; ${st.opamps.join(", ")}.${realPole} f0 error ${pct(st.errors.f0)} (plain rounding: ${pct(st.plainSnapErrors.f0)}), Q error ${pct(st.errors.q)} (plain rounding: ${pct(st.plainSnapErrors.q)}).${real}`,
    );
  }
  L.push("");
  L.push(...schematicLines(result, schematics));
  L.push("## Verification (as built)", "");
  L.push("| check | as built | spec | margin |", "|---|---|---|---|");
  L.push(`| passband loss | ${dB(v.passbandLossDb)} (worst at ${f3(v.passbandWorstHz)}) | ≤ ${s.maxLossDb} dB | ${dB(v.passbandMarginDb)} |`);
  L.push(`| stopband attenuation | ${dB(v.stopbandAttenuationDb, 2)} (worst at ${f3(v.stopbandWorstHz)}) | ≥ ${s.minAttenuationDb} dB | ${dB(v.stopbandMarginDb)} |`);
  L.push(`| passband gain | ${dB(v.gainDb)} | ${dB(v.targetGainDb)} ± ${s.gainToleranceDb} dB | ${dB(v.gainMarginDb)} |`);
  L.push(`| polarity | ${v.polarity} | ${s.polarity} | ${v.polarityOk ? "ok" : "not met"} |`, "");
  L.push(`| stability | ${v.stable ? "every stage stable" : `stage ${v.unstableStages.join(", ")} unstable`} | all poles in the left half-plane | ${v.stable ? "ok" : "not met"} |`, "");
  L.push(`Op-amp model used: ${v.opamp.kind === "ideal" ? "ideal" : `single pole, A0 ${n4(v.opamp.a0)}, GBW ${f3(v.opamp.gbwHz)}`}. Worst margin of the exact (unrounded) design: ${dB(v.idealMarginDb)}.`, "");
  L.push(...yieldSection(result));
  if (realisations !== undefined) L.push(...realisationLines(realisations));
  L.push(...headroomLines(result));
  L.push("## What each op-amp must do", "");
  L.push("For a 1 V peak sinusoid at the input, anywhere in the plotted span:", "");
  L.push("| stage | op-amps | GBW required | peak output | at | slew rate | at |", "|---|---|---|---|---|---|---|");
  for (const q of opampRequirements(result)) {
    L.push(
      `| ${q.stage} | ${q.opamps.join(", ")} | ${f3(q.gbwDemandHz)} | ${n4(q.peakOutputV)} V | ${f3(q.peakHz)} | ${formatValue(q.slewRateVPerS, { digits: 3, unit: "V" })}/s | ${f3(q.slewHz)} |`,
    );
  }
  L.push("");
  if (result.warnings.length > 0) {
    L.push("## Warnings", "");
    for (const w of result.warnings) L.push(`- ${w.stage === undefined ? "" : `stage ${w.stage}: `}${w.message}`);
    L.push("");
  }
  if (result.actions.length > 0) {
    L.push("## What the pipeline did", "");
    for (const a of result.actions) L.push(`- ${a.message}`);
    L.push("");
  }
  L.push("## Bill of materials", "");
  L.push("| designators | part | value | RKM | series | tolerance | qty |", "|---|---|---|---|---|---|---|");
  for (const b of bomLines(result)) {
    L.push(`| ${b.designators.join(", ")} | ${b.part} | ${b.valueText} | ${b.rkm} | ${b.series} | ${b.tolerance} | ${b.quantity} |`);
  }
  L.push("", "## Cautions", "");
  for (const c of DESIGN_CAUTIONS) L.push(`- ${c}`);
  L.push("");
  return L.join("\n");
}
