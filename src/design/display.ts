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
