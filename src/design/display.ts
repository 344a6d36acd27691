/**
 * How a design shows itself in a notebook: a heading, the verdict, the stage
 * table and the warnings as HTML, and the same as plain text for a terminal
 * front end (a few lines, not the whole result).
 *
 * @module
 */
import { escapeHtml, htmlTable, textTable, type MediaBundle } from "../display.ts";
import { formatValue } from "../units/index.ts";
import type { DesignResult, DesignStage } from "./types.ts";
import type { LcLadderDesign } from "./lc-ladder-types.ts";
import { verdictLine } from "./verdict.ts";
import { hertz, significant } from "./text.ts";

const STAGE_HEAD = ["stage", "topology", "kind", "f0 as built", "Q as built", "gain", "peak gain at stage output", "GBW required", "op-amps", "parts"] as const;

function partsText(st: DesignStage): string {
  return Object.entries(st.components)
    .map(([k, x]) => `${k} ${formatValue(x, { digits: 3, unit: k.startsWith("C") ? "F" : k.startsWith("L") ? "H" : "Ω" })}`)
    .join(", ");
}

function stageRow(st: DesignStage): string[] {
  return [
    String(st.index),
    st.topologyName,
    st.kind,
    hertz(st.asBuilt.f0Hz),
    st.asBuilt.q === undefined ? "–" : significant(st.asBuilt.q),
    significant(st.asBuilt.gain),
    `${(20 * Math.log10(st.peakGain)).toFixed(2)} dB at ${hertz(st.peakHz)}`,
    hertz(st.gbwDemandHz, 3),
    st.opamps.join(", "),
    partsText(st),
  ];
}

function heading(r: DesignResult): string {
  const response = r.spec.response[0]?.toUpperCase() + r.spec.response.slice(1);
  const opamps = r.stages.reduce((k, st) => k + st.opamps.length, 0);
  return `${response} filter: ${r.family}, ${r.filterOrder} poles, ${r.stages.length} stage${r.stages.length === 1 ? "" : "s"}, ${opamps} op-amp${opamps === 1 ? "" : "s"}`;
}

/**
 * The notebook bundle of a design: `text/html` (heading, verdict, stage
 * table, warnings) and `text/plain` (the same in a few lines).
 *
 * @param r - a design
 * @returns the bundle
 */
export function designBundle(r: DesignResult): MediaBundle {
  const ok = r.verification.boardsMeetSpec;
  const verdict = `${ok ? "Meets the spec" : "Does NOT meet the spec"}: the design ${verdictLine(r)}.`;
  const rows = r.stages.map(stageRow);
  const warnings = r.warnings.map((w) => `${w.stage === undefined ? "" : `stage ${w.stage}: `}${w.message}`);
  const html = [
    '<div class="filterwright-design">',
    `<p><strong>${escapeHtml(heading(r))}</strong></p>`,
    `<p style="color:${ok ? "#1a6b2a" : "#a32020"}">${escapeHtml(verdict)}</p>`,
    htmlTable(STAGE_HEAD, rows),
    warnings.length === 0 ? "" : `<p>Warnings:</p><ul>${warnings.map((w) => `<li>${escapeHtml(w)}</li>`).join("")}</ul>`,
    "</div>",
  ].join("");
  const plain = [
    heading(r),
    verdict,
    textTable(STAGE_HEAD.slice(0, 8), rows.map((row) => row.slice(0, 8))),
    ...(warnings.length === 0 ? [] : [`${warnings.length} warning${warnings.length === 1 ? "" : "s"} (see result.warnings)`]),
  ].join("\n");
  return { "text/html": html, "text/plain": plain };
}

/**
 * The notebook bundle of a passive LC ladder design: heading, verdict
 * (nominal margins and the boards' yield) and the parts table.
 *
 * @param d - the ladder design
 * @returns the bundle
 */
export function lcLadderBundle(d: LcLadderDesign): MediaBundle {
  const v = d.verification;
  const y = v.yield;
  const pc = (x: number): string => `${significant(x * 100, 3)} %`;
  const ok = v.meetsSpec && y.met;
  const response = d.spec.response[0]?.toUpperCase() + d.spec.response.slice(1);
  const title = `${response} LC ladder: ${d.family}, order ${d.order}, ${d.form}, ${formatValue(d.ladder.sourceOhms, { unit: "Ω" })} / ${formatValue(d.ladder.loadOhms, { unit: "Ω" })}`;
  const verdict =
    `${ok ? "Meets the spec" : "Does NOT meet the spec"}: nominal ${v.meetsSpec ? "meets" : "misses"} the mask (passband loss ${v.passbandLossDb.toFixed(3)} dB, stopband ${v.stopbandAttenuationDb.toFixed(2)} dB, margin ${v.marginDb.toFixed(3)} dB); ` +
    `${pc(y.fraction)} of ${y.boards} boards [${pc(y.lower95)}, ${pc(y.upper95)}] at ${pc(y.inductorTolerance)} L / ${pc(y.capacitorTolerance)} C (target ${pc(y.target)}: ${y.met ? "met" : "NOT met"}).`;
  const head = ["designators", "part", "value", "tolerance", "requirement"];
  const rows = d.parts.map((p) => [p.designators.join(", "), p.part, p.valueText, p.toleranceText, p.requirement]);
  return {
    "text/html": `<div class="filterwright-design"><p><strong>${escapeHtml(title)}</strong></p><p style="color:${ok ? "#1a6b2a" : "#a32020"}">${escapeHtml(verdict)}</p>${htmlTable(head, rows)}<p>${escapeHtml(d.reason)}</p></div>`,
    "text/plain": [title, verdict, textTable(head.slice(0, 4), rows.map((r) => r.slice(0, 4)))].join("\n"),
  };
}
