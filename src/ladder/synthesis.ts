/**
 * General synthesis of a doubly terminated lowpass LC ladder from its
 * transfer function, by the Darlington (Belevitch) method.
 *
 * Method: S21 = sqrt(K) H with H the prototype (peak gain 1) and
 * K = 4 r / ((1 + r)^2 |H(0)|^2), r = R_load / R_source; the reflection
 * polynomial F and a pole polynomial E consistent with it to double-double
 * precision come from the Feldtkeller equation (characteristic.ts); the input
 * immittance is W = (E + F) / (E - F), an impedance for the series-first form
 * and an admittance for the shunt-first form (S. Darlington, "Synthesis of
 * reactance 4-poles which produce prescribed insertion loss characteristics",
 * J. Math. Phys. 18:257-353, 1939; V. Belevitch, "Classical Network Theory",
 * Holden-Day, 1968, ch. 9); its arms by continued fractions with zero shifting
 * (extraction.ts), trying the orders of the finite transmission zeros listed
 * by {@link zeroOrders} until every element is positive.
 * With minimum-phase reflection zeros (F(0) / F's leading coefficient >= 0),
 * W(0) >= 1: the series-first form ends in r >= 1, the shunt-first form in
 * r <= 1 (the caller turns odd-order ladders around for the other side).
 * Where extended precision is used: every polynomial (E, F, N, the
 * characteristic polynomial, the immittance and its remainders) is held in
 * double-double; the prototype's poles and zeros and the reflection zeros on
 * the axis are doubles. Accuracy (measured, orders 2-12): the elements agree
 * with a 60-digit synthesis to 6e-15 relative; the discarded remainders stay
 * below 1e-15 of their polynomials for elliptic ladders to order 11 and grow
 * with order and selectivity (about 5e-10 for a 12th-order 0.5 dB / 20 dB
 * elliptic), which the public function's self-check turns into a refusal.
 *
 * @module
 */
import type { Complex } from "../math/complex.ts";
import { ddAdd, ddSub, ddToNumber, type DD } from "../math/double-double.ts";
import type { Zpk } from "../tf/types.ts";
import { ddFromRoots, hurwitzFactor, matchedReflection, reflectionPolynomial } from "./characteristic.ts";
import { extractLadder, type Extraction } from "./extraction.ts";
import type { LadderElement, LadderForm } from "./types.ts";

/** Why a synthesis did not give a ladder (the public function turns this into a typed error). */
export type SynthesisFailure =
  | "gain-above-peak"
  | "not-consistent"
  | "no-positive-ladder"
  | "termination-mismatch";

/** A synthesised ladder, normalised to a 1 ohm source. */
export interface SynthesisResult {
  /** Arms from the source end. */
  readonly elements: readonly LadderElement[];
  /** Load resistance the extraction ended in (ohms, source 1 ohm). */
  readonly loadRatio: number;
  /** Largest discarded remainder of the extraction, relative. */
  readonly worstResidual: number;
  /** The order of the finite transmission zeros (rad/s) along the ladder. */
  readonly zeroOrder: readonly number[];
}

/** DC gain |H(0)| of a zpk without zeros or poles at the origin. */
export function dcGain(h: Zpk): number {
  let g = Math.abs(h.gain);
  for (const z of h.zeros) g *= Math.hypot(z.re, z.im);
  for (const p of h.poles) g /= Math.hypot(p.re, p.im);
  return g;
}

/**
 * |S11|^2 at the transmission peaks for load ratio r, from the DC gain of the
 * prototype (1 at a peak at DC, else below 1): rho2 = 1 - 4 r / ((1 + r)^2 |H(0)|^2),
 * written as ((r - 1) / (r + 1))^2 when the peak is at DC so that r = 1 gives 0 exactly.
 * Values within 1e-24 of 0 (and, when the peak is not at DC, within 1e-13) are 0.
 *
 * @param h0 - |H(0)| of the prototype
 * @param r - load ratio
 * @returns rho2 (negative: r not realisable)
 * @throws never (unchecked)
 * @example
 * ```ts
 * peakReflection(1, 1); //=> 0
 * ```
 */
export function peakReflection(h0: number, r: number): number {
  const d = (r - 1) / (r + 1);
  const atDc = Math.abs(h0 - 1) <= 1e-12;
  const rho2 = atDc ? d * d : 1 - (1 - d * d) / (h0 * h0);
  if (Math.abs(rho2) <= (atDc ? 1e-24 : 1e-13)) return 0;
  return rho2;
}

/**
 * Orders in which to extract the finite transmission zeros: first the zero
 * nearest the passband placed in the middle of the ladder and the others
 * alternately outwards (highest zeros at the ends), then ascending, then
 * descending, then every other permutation in lexicographic order of the
 * ascending list (at most 720 orders for six zeros).
 *
 * @param zeros - finite transmission zeros (rad/s), any order
 * @returns the candidate orders, without repeats
 * @throws never (unchecked)
 * @example
 * ```ts
 * zeroOrders([1.5, 2, 3])[0]; //=> [2, 1.5, 3]
 * ```
 */
export function zeroOrders(zeros: readonly number[]): number[][] {
  const asc = [...zeros].sort((a, b) => a - b);
  const middle: number[] = [];
  asc.forEach((z, i) => (i % 2 === 0 ? middle.push(z) : middle.unshift(z)));
  // middle is ... z3, z1, z0, z2 ... : lowest in the middle
  const out: number[][] = [];
  const seen = new Set<string>();
  const add = (o: number[]): void => {
    const key = o.join(",");
    if (!seen.has(key)) {
      seen.add(key);
      out.push(o);
    }
  };
  add(middle);
  add(asc);
  add([...asc].reverse());
  const permute = (rest: number[], acc: number[]): void => {
    if (rest.length === 0) {
      add(acc);
      return;
    }
    for (let i = 0; i < rest.length; i++) permute([...rest.slice(0, i), ...rest.slice(i + 1)], [...acc, rest[i] as number]);
  };
  permute(asc, []);
  return out;
}

function toElements(ex: Extraction, form: LadderForm): LadderElement[] {
  return ex.arms.map((arm, i) => {
    const series = (i % 2 === 0) === (form === "series-first");
    if (series) {
      return arm.companion === undefined
        ? { kind: "series-L", value: arm.value }
        : { kind: "series-L", value: arm.value, parallelC: arm.companion };
    }
    return arm.companion === undefined
      ? { kind: "shunt-C", value: arm.value }
      : { kind: "shunt-C", value: arm.value, seriesL: arm.companion };
  });
}

/** Relative coefficient distance of two polynomials of the same length. */
function coefficientDistance(a: readonly DD[], b: readonly DD[]): number {
  let num = 0;
  let den = 0;
  for (let i = 0; i < a.length; i++) {
    num = Math.max(num, Math.abs(ddToNumber(ddSub(a[i] as DD, b[i] as DD))));
    den = Math.max(den, Math.abs(ddToNumber(a[i] as DD)));
  }
  return num / den;
}

/**
 * Synthesise the ladder (unchecked core): `h` is a lowpass prototype with
 * peak gain 1, finite zeros on the jw axis only, at least one zero at
 * infinity; `r` is on the form's natural side (>= 1 series-first, <= 1 shunt-first).
 *
 * @param h - prototype transfer function
 * @param r - load ratio R_load / R_source
 * @param form - which arm comes first
 * @returns the ladder normalised to a 1 ohm source, or the reason it failed
 * @throws never (unchecked)
 * @example
 * ```ts
 * synthesizeLadder(butterworth(3), 1, "series-first").elements.map((e) => e.value); //=> [1, 2, 1]
 * ```
 */
export function synthesizeLadder(h: Zpk, r: number, form: LadderForm): SynthesisResult | SynthesisFailure {
  const order = h.poles.length;
  const e = ddFromRoots(h.poles, 1);
  const n = ddFromRoots(h.zeros, h.gain);
  const rho2 = peakReflection(dcGain(h), r);
  const matched = matchedReflection(h, e, n);
  if (matched === null) return "gain-above-peak";
  const f = reflectionPolynomial(matched, n, rho2);
  const e2 = hurwitzFactor(f, n, 1 - rho2);
  if (e2 === null || e2.length !== e.length || coefficientDistance(e, e2) > 1e-9) return "not-consistent";
  const a = e2.map((c, i) => ddAdd(c, f[i] as DD));
  const b = e2.map((c, i) => ddSub(c, f[i] as DD)).slice(1);
  const zeros = h.zeros.filter((z: Complex) => z.im > 0).map((z) => z.im);
  for (const zeroOrder of zeroOrders(zeros)) {
    const ex = extractLadder(a, b, zeroOrder, order);
    if (ex === null) continue;
    const lastSeries = ((order - 1) % 2 === 0) === (form === "series-first");
    const loadRatio = lastSeries ? ex.termination : 1 / ex.termination;
    if (Math.abs(loadRatio / r - 1) > 1e-8) return "termination-mismatch";
    return { elements: toElements(ex, form), loadRatio, worstResidual: ex.worstResidual, zeroOrder };
  }
  return "no-positive-ladder";
}
