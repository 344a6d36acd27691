/**
 * The human-readable summary of a design printed by the command line: the
 * stage table, the checks against the mask, the verdict, warnings, steps
 * taken and cautions.
 *
 * @module
 */
import type { DesignRealisation, DesignResult } from "../design/index.ts";
import { chosenActiveLadder } from "../design/realisation.ts";
import { DESIGN_CAUTIONS } from "../report/index.ts";
import { verdictLine } from "../design/verdict.ts";
import { hertz } from "../design/text.ts";
import { textTable } from "../display.ts";
import { formatValue } from "../units/index.ts";

/** Rows laid out in columns two spaces apart (the first row is the heading). */
export function table(rows: readonly (readonly string[])[]): string {
  return textTable(rows[0] ?? [], rows.slice(1));
}

const hz = (x: number): string => hertz(x);
const p4 = (x: number): string => Number(x.toPrecision(4)).toString();

/** The human-readable summary printed for a design. */
export function formatSummary(r: DesignResult, extra: readonly string[] = []): string {
  const v = r.verification;
  const out: string[] = [];
  out.push(
    `${r.family} ${r.spec.response}, ${r.filterOrder} poles in ${r.stages.length} stage${r.stages.length === 1 ? "" : "s"} (prototype order ${r.order}, minimum ${r.minimumOrder})`,
  );
  out.push(`why: ${r.familyChoice.reason}`, "");
  // Columns for the pole with the real op-amp, only when the design has them.
  const real = r.stages.some((s) => s.asBuiltWithOpamp !== undefined);
  const rows: string[][] = [
    [
      "stage",
      "topology",
      "kind",
      "f0 target",
      "f0 as built",
      ...(real ? ["f0 with op-amp"] : []),
      "Q target",
      "Q as built",
      ...(real ? ["Q with op-amp"] : []),
      "gain",
      "peak gain at stage output",
      "GBW required",
      "parts",
    ],
  ];
  for (const s of r.stages) {
    const w = s.asBuiltWithOpamp;
    rows.push([
      String(s.index),
      s.topology,
      s.kind,
      hz(s.target.f0Hz),
      hz(s.asBuilt.f0Hz),
      ...(real ? [w === undefined ? "-" : hz(w.f0Hz)] : []),
      s.target.q === undefined ? "-" : p4(s.target.q),
      s.asBuilt.q === undefined ? "-" : p4(s.asBuilt.q),
      ...(real ? [w?.q === undefined ? "-" : p4(w.q)] : []),
      p4(s.asBuilt.gain),
      `${(20 * Math.log10(s.peakGain)).toFixed(2)} dB`,
      hz(s.gbwDemandHz),
      Object.entries(s.components)
        .map(([k, x]) => `${k}=${formatValue(x, { digits: 3, unit: k.startsWith("C") ? "F" : "Ω", space: false })}`)
        .join(" "),
    ]);
  }
  out.push(table(rows), "");
  const s = r.spec;
  out.push(
    table([
      ["check", "as built", "spec", "margin"],
      ["passband loss", `${v.passbandLossDb.toFixed(3)} dB`, `<= ${s.maxLossDb} dB`, `${v.passbandMarginDb.toFixed(3)} dB`],
      ["stopband attenuation", `${v.stopbandAttenuationDb.toFixed(2)} dB`, `>= ${s.minAttenuationDb} dB`, `${v.stopbandMarginDb.toFixed(3)} dB`],
      ["gain", `${v.gainDb.toFixed(3)} dB`, `${v.targetGainDb.toFixed(3)} +- ${s.gainToleranceDb} dB`, `${v.gainMarginDb.toFixed(3)} dB`],
      ["polarity", v.polarity, s.polarity, v.polarityOk ? "ok" : "not met"],
    ]),
    "",
  );
  out.push(
    `${boardsWork(r) ? "MEETS" : "DOES NOT MEET"} the spec: ${realisedAs(r)}${verdictLine(r)}; op-amp ${v.opamp.kind === "ideal" ? "ideal" : `GBW ${hz(v.opamp.gbwHz)}`}`,
  );
  const h = v.headroom;
  if (h !== undefined) {
    out.push(
      `headroom at ${p4(h.inputPeakV)} V peak in, ${p4(h.outputSwingV)} V swing: worst ${h.worstOpamp} ${h.worstMarginDb.toFixed(2)} dB${h.clips ? " (CLIPS)" : ""}`,
      `dynamic range ${h.dynamicRange.rangeDb.toFixed(1)} dB (largest unclipped input ${p4(h.dynamicRange.maxInputPeakV)} V peak, output noise ${formatValue(h.dynamicRange.noiseRmsV, { digits: 3, unit: "V" })} rms, ${h.dynamicRange.opampNoise ? "resistors and op-amps" : "resistors only"})`,
    );
  }
  if (r.warnings.length > 0) {
    out.push("", "warnings:");
    for (const w of r.warnings) out.push(`  - ${w.stage === undefined ? "" : `stage ${w.stage}: `}${w.message}`);
  }
  if (r.actions.length > 0) {
    out.push("", "steps taken:");
    for (const a of r.actions) out.push(`  - ${a.message}`);
  }
  if (extra.length > 0) out.push("", ...extra);
  out.push("", "cautions:");
  for (const c of DESIGN_CAUTIONS) out.push(`  - ${c}`);
  return `${out.join("\n")}\n`;
}

/** Whether the boards that will be built work: the chosen active ladder's verdict, else the cascade's. */
export function boardsWork(r: DesignResult): boolean {
  return chosenActiveLadder(r) === undefined ? r.verification.boardsMeetSpec : (r.realisation as DesignRealisation).boardsMeetSpec;
}

/** The words that say a chosen active ladder is what the verdict is of (empty for the cascade). */
export function realisedAs(r: DesignResult): string {
  const k = chosenActiveLadder(r);
  if (k === undefined) return "";
  const pc = (x: number): string => `${(x * 100).toFixed(1)} %`;
  return `realised as the ${k.method} active ladder (${k.opamps} op-amps), ${pc(k.yield)} of ${k.boards} boards meet the mask (95 % interval from ${pc(k.lower95)}), nominal margin ${k.nominalMarginDb.toFixed(3)} dB; the cascade below: `;
}
