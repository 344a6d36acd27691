/**
 * The synthesis checks its own result: the ladder's voltage transfer
 * V(load) / V(source emf), evaluated from its elements by chained ABCD
 * (transmission) matrices in complex double arithmetic, against the transfer
 * function it is meant to realise, on a grid.
 *
 * Method: the chain [1 R_s; 0 1] prod(arm) with a series arm [1 Z; 0 1] and a
 * shunt arm [1 0; Y 1], H = 1 / (A + B / R_load) (the ABCD description of
 * cascaded two-ports, e.g. M. E. Van Valkenburg, "Network Analysis", 3rd ed.,
 * Prentice-Hall, 1974, ch. 11); the target by its factors. The grid: 600
 * points from 1e-2 to 1e2 rad/s, log spaced, with the points within 1e-3
 * (relative) of a transmission zero left out (there the dB value of either
 * side is set by its last digits). Accuracy of the evaluation: a few ulp per
 * arm away from the zeros.
 *
 * @module
 */
import type { Zpk } from "../tf/types.ts";
import type { LadderElement } from "./types.ts";

/** |V(load) / V(source emf)| of the ladder at jw. */
export function chainMagnitude(elements: readonly LadderElement[], sourceOhms: number, loadOhms: number, w: number): number {
  // A, B, C, D as (re, im) pairs; every arm immittance is purely imaginary.
  let ar = 1;
  let ai = 0;
  let br = sourceOhms;
  let bi = 0;
  let cr = 0;
  let ci = 0;
  let dr = 1;
  let di = 0;
  for (const e of elements) {
    const companion = e.kind === "series-L" ? e.parallelC : e.seriesL;
    const x = companion === undefined ? w * e.value : (w * e.value) / (1 - w * w * e.value * companion);
    if (e.kind === "series-L") {
      // B += A * jx, D += C * jx
      br -= ai * x;
      bi += ar * x;
      dr -= ci * x;
      di += cr * x;
    } else {
      ar -= bi * x;
      ai += br * x;
      cr -= di * x;
      ci += dr * x;
    }
  }
  const re = ar + br / loadOhms;
  const im = ai + bi / loadOhms;
  return 1 / Math.hypot(re, im);
}

/** |H(jw)| of a zpk by its factors. */
function zpkMagnitude(h: Zpk, w: number): number {
  let m = Math.abs(h.gain);
  for (const z of h.zeros) m *= Math.hypot(z.re, w - z.im);
  for (const p of h.poles) m /= Math.hypot(p.re, w - p.im);
  return m;
}

/**
 * Largest |dB difference| between the ladder's response and `transfer` on
 * the self-check grid (see the module header).
 *
 * @param elements - arms from the source end
 * @param sourceOhms - source resistance
 * @param loadOhms - load resistance
 * @param transfer - the transfer function the ladder should realise
 * @returns the largest deviation in dB (Infinity when a value is not finite)
 * @throws never (unchecked)
 * @example
 * ```ts
 * ladderDeviationDb([{ kind: "shunt-C", value: 2 }], 1, 1, { zeros: [], poles: [{ re: -1, im: 0 }], gain: 0.5 }); //=> 0
 * ```
 */
export function ladderDeviationDb(
  elements: readonly LadderElement[],
  sourceOhms: number,
  loadOhms: number,
  transfer: Zpk,
): number {
  let worst = 0;
  const count = 600;
  for (let i = 0; i < count; i++) {
    const w = 10 ** (-2 + (4 * i) / (count - 1));
    if (transfer.zeros.some((z) => Math.abs(w - Math.abs(z.im)) <= 1e-3 * w)) continue;
    const d = Math.abs(20 * Math.log10(chainMagnitude(elements, sourceOhms, loadOhms, w) / zpkMagnitude(transfer, w)));
    if (!Number.isFinite(d)) return Number.POSITIVE_INFINITY;
    if (d > worst) worst = d;
  }
  return worst;
}
