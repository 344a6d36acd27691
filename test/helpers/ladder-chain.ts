/**
 * An independent evaluator of a ladder's voltage transfer V(load) / V(source
 * emf) by chained ABCD (transmission) matrices in complex doubles, for the
 * ladder tests. It reads only the element list and the terminations, never
 * the ladder's `transfer` field.
 */
import type { LadderElement } from "../../src/ladder/types.ts";

interface C {
  re: number;
  im: number;
}

const mul = (a: C, b: C): C => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const add = (a: C, b: C): C => ({ re: a.re + b.re, im: a.im + b.im });
const inv = (a: C): C => {
  const d = a.re * a.re + a.im * a.im;
  return { re: a.re / d, im: -a.im / d };
};

/** Impedance of a series arm (L, or L parallel C) or admittance of a shunt arm (C, or C in series with L) at jw. */
function armImmittance(e: LadderElement, w: number): C {
  if (e.kind === "series-L") {
    const zl: C = { re: 0, im: w * e.value };
    if (e.parallelC === undefined) return zl;
    // Z = jwL / (1 - w^2 L C)
    return { re: 0, im: (w * e.value) / (1 - w * w * e.value * e.parallelC) };
  }
  const yc: C = { re: 0, im: w * e.value };
  if (e.seriesL === undefined) return yc;
  // Y = jwC / (1 - w^2 L C)
  return { re: 0, im: (w * e.value) / (1 - w * w * e.value * e.seriesL) };
}

/**
 * V(load) / V(source emf) of the doubly terminated ladder at s = jw.
 *
 * @param elements - arms from the source end
 * @param sourceOhms - source resistance
 * @param loadOhms - load resistance
 * @param w - angular frequency (rad/s)
 * @returns the complex voltage ratio
 */
export function chainTransfer(elements: readonly LadderElement[], sourceOhms: number, loadOhms: number, w: number): C {
  // [A B; C D] of the whole chain, source resistor first.
  let a: C = { re: 1, im: 0 };
  let b: C = { re: sourceOhms, im: 0 };
  let c: C = { re: 0, im: 0 };
  let d: C = { re: 1, im: 0 };
  for (const e of elements) {
    const x = armImmittance(e, w);
    if (e.kind === "series-L") {
      // times [1 Z; 0 1]
      b = add(b, mul(a, x));
      d = add(d, mul(c, x));
    } else {
      // times [1 0; Y 1]
      a = add(a, mul(b, x));
      c = add(c, mul(d, x));
    }
  }
  return inv(add(a, { re: b.re / loadOhms, im: b.im / loadOhms }));
}

/** |V(load) / V(source emf)| in dB. */
export function chainMagnitudeDb(elements: readonly LadderElement[], sourceOhms: number, loadOhms: number, w: number): number {
  const h = chainTransfer(elements, sourceOhms, loadOhms, w);
  return 20 * Math.log10(Math.hypot(h.re, h.im));
}
