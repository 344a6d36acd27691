/**
 * How the analyses of a finished design show themselves in a notebook: a
 * Monte Carlo run as its yield and the spread of each mask figure, a noise
 * analysis as its RMS total and the largest contributors (HTML, and plain text
 * for a terminal front end).
 *
 * @module
 */
import { escapeHtml, htmlTable, textTable, type MediaBundle } from "../display.ts";
import { formatValue } from "../units/index.ts";
import { hertz, significant } from "../design/text.ts";
import type { MonteCarloResult, Spread } from "./tolerance.ts";
import type { NoiseAnalysisResult } from "./noise.ts";

const pct = (x: number): string => `${significant(x * 100, 3)} %`;
const dB = (x: number): string => (Number.isFinite(x) ? `${x.toFixed(3)} dB` : "–");

function bundle(title: string, lines: readonly string[], head: readonly string[], rows: readonly (readonly string[])[]): MediaBundle {
  return {
    "text/html": `<div class="filterwright-analysis"><p><strong>${escapeHtml(title)}</strong></p>${lines.map((l) => `<p>${escapeHtml(l)}</p>`).join("")}${htmlTable(head, rows)}</div>`,
    "text/plain": [title, ...lines, textTable(head, rows)].join("\n"),
  };
}

/**
 * The notebook bundle of a Monte Carlo run.
 *
 * @param mc - the run
 * @returns the bundle
 */
export function monteCarloBundle(mc: MonteCarloResult): MediaBundle {
  const row = (name: string, s: Spread): string[] => [name, dB(s.min), dB(s.median), dB(s.max)];
  return bundle(
    `Monte Carlo: ${mc.runs} boards, yield ${pct(mc.yield)} ± ${pct(mc.yieldStandardError)} (one standard error)`,
    [`Tolerances: resistors ${pct(mc.tolerances.resistor)}, capacitors ${pct(mc.tolerances.capacitor)}.`],
    ["figure", "min", "median", "max"],
    [
      row("worst margin over the mask", mc.marginDb),
      row("passband loss", mc.passbandLossDb),
      row("stopband attenuation", mc.stopbandAttenuationDb),
      row("passband level", mc.gainDb),
    ],
  );
}

/**
 * The notebook bundle of a noise analysis.
 *
 * @param n - the analysis
 * @returns the bundle
 */
export function noiseBundle(n: NoiseAnalysisResult): MediaBundle {
  const v = (x: number): string => formatValue(x, { digits: 3, unit: "V" });
  return bundle(
    `Output noise ${v(n.totalRmsV)} rms from ${hertz(n.bandHz[0], 3)} to ${hertz(n.bandHz[1], 3)}`,
    [`Referred to the input (passband gain ${significant(n.passbandGain)} V/V): ${v(n.totalRmsV / n.passbandGain)} rms.`],
    ["source", "rms at the output", "share of the noise power"],
    n.topContributors.slice(0, 8).map((c) => [c.name, v(c.rmsV), pct(c.powerFraction)]),
  );
}
