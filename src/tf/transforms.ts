/**
 * Frequency transformations of a normalised lowpass prototype (cut-off
 * 1 rad/s) in zeros/poles/gain form:
 *
 * - lowpass to lowpass:  s -> s / w0
 * - lowpass to highpass: s -> w0 / s
 * - lowpass to bandpass: s -> (s^2 + w0^2) / (B s)
 * - lowpass to bandstop: s -> B s / (s^2 + w0^2)
 *
 * (R. Schaumann and M. E. Van Valkenburg, "Design of Analog Filters", Oxford
 * University Press, 2001, chapter on frequency transformations; the mappings
 * of zeros and poles and the gain conventions are those documented for
 * scipy.signal.lp2lp_zpk, lp2hp_zpk, lp2bp_zpk and lp2bs_zpk, so results
 * compare one to one: the lowpass-to-lowpass gain is `k w0^(np - nz)`, the
 * highpass and bandstop gains keep the high-frequency / DC gain
 * `k prod(-z) / prod(-p)`, the bandpass gain is `k B^(np - nz)`.)
 *
 * Under the band maps each prototype root `r` gives the two roots of
 * `x^2 - 2 h x + w0^2 = 0`, with `h = r B / 2` (bandpass) or `h = (B/2) / r`
 * (bandstop). They are computed as `x1 = h + sign * sqrt(h^2 - w0^2)`, with the
 * sign that avoids cancellation, and `x2 = w0^2 / x1` (the product of the
 * roots), so both keep full relative accuracy. Conjugate pairs are produced
 * from one member and its mirror, so the results are exactly
 * conjugate-symmetric.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { cdiv, cmul, csqrt, type Complex } from "../math/complex.ts";
import { requireOptions, requirePositive } from "../validate.ts";
import { requireZpk } from "./check.ts";
import { pairRepresentatives } from "./sections.ts";
import type { Zpk } from "./types.ts";

/** Options of {@link lowpassToLowpass} and {@link lowpassToHighpass}. */
export interface CutoffOptions {
  /** New cut-off (rad/s) that the prototype's 1 rad/s maps to; > 0. */
  readonly w0: number;
}

/** Options of {@link lowpassToBandpass} and {@link lowpassToBandstop}. */
export interface BandOptions {
  /** Centre frequency (rad/s), the geometric mean of the band edges; > 0. */
  readonly w0: number;
  /** Bandwidth B (rad/s) between the band edges that the prototype's 1 rad/s maps to; > 0. */
  readonly bandwidth: number;
}

/** Both roots of x^2 - 2 h x + w0^2 = 0 (h complex), accurately. */
function quadraticPair(h: Complex, w0: number): [Complex, Complex] {
  const w2 = w0 * w0;
  const s = csqrt({ re: h.re * h.re - h.im * h.im - w2, im: 2 * h.re * h.im });
  // choose the sign that adds h and s constructively
  const dot = h.re * s.re + h.im * s.im;
  const x1 = dot >= 0 ? { re: h.re + s.re, im: h.im + s.im } : { re: h.re - s.re, im: h.im - s.im };
  if (x1.re === 0 && x1.im === 0) return [x1, x1];
  const x2 = cdiv({ re: w2, im: 0 }, x1);
  return [x1, x2];
}

/** Map each representative through the band transform and emit conjugate-closed roots. */
function bandRoots(values: readonly Complex[], halfB: number, w0: number, invert: boolean): Complex[] {
  const out: Complex[] = [];
  for (const { v: r } of pairRepresentatives(values)) {
    // bandpass: h = r B/2; bandstop: h = (B/2) / r
    const h = invert ? cdiv({ re: halfB, im: 0 }, r) : { re: r.re * halfB, im: r.im * halfB };
    const [x1, x2] = quadraticPair(h, w0);
    if (r.im === 0) {
      // real prototype root: two real roots or one conjugate pair
      if (x1.im === 0 && x2.im === 0) out.push({ re: x1.re, im: 0 }, { re: x2.re, im: 0 });
      else {
        const re = (x1.re + x2.re) / 2;
        const im = (Math.abs(x1.im) + Math.abs(x2.im)) / 2;
        out.push({ re, im }, { re, im: -im });
      }
    } else {
      out.push(x1, { re: x1.re, im: -x1.im }, x2, { re: x2.re, im: -x2.im });
    }
  }
  return out;
}

/** prod(-z) / prod(-p), real part (the real gain correction of the HP and BS maps). */
function dcRatio(system: Zpk): number {
  let v: Complex = { re: 1, im: 0 };
  const n = Math.max(system.zeros.length, system.poles.length);
  for (let i = 0; i < n; i++) {
    const z = system.zeros[i];
    const p = system.poles[i];
    if (z !== undefined) v = cmul(v, { re: -z.re, im: -z.im });
    if (p !== undefined) v = cdiv(v, { re: -p.re, im: -p.im });
  }
  return v.re;
}

function check(fn: string, system: Zpk, options: unknown, band: boolean): { w0: number; bandwidth: number } {
  requireZpk(fn, "system", system);
  const opts = requireOptions(fn, "options", options);
  if (options === undefined) {
    throw new InvalidArgumentError({ fn, path: "options", received: options, message: band ? "expected { w0, bandwidth }" : "expected { w0 }" });
  }
  const w0 = requirePositive(fn, "options.w0", opts["w0"]);
  const bandwidth = band ? requirePositive(fn, "options.bandwidth", opts["bandwidth"]) : 1;
  if (system.zeros.length > system.poles.length) {
    throw new InvalidArgumentError({
      fn,
      path: "system.zeros",
      received: system.zeros.length,
      message: `the prototype has more zeros (${system.zeros.length}) than poles (${system.poles.length}); give a proper prototype`,
    });
  }
  return { w0, bandwidth };
}

function rejectOrigin(fn: string, system: Zpk): void {
  for (const [list, name] of [
    [system.zeros, "zeros"],
    [system.poles, "poles"],
  ] as const) {
    list.forEach((r, i) => {
      if (r.re === 0 && r.im === 0) {
        throw new InvalidArgumentError({
          fn,
          path: `system.${name}[${i}]`,
          received: r,
          message: "a root at s = 0 maps to infinity under this transform; remove it from the prototype",
        });
      }
    });
  }
}

function freeze(zeros: Complex[], poles: Complex[], gain: number): Zpk {
  return Object.freeze({ zeros: Object.freeze(zeros), poles: Object.freeze(poles), gain });
}

/**
 * Lowpass prototype to lowpass with cut-off `w0`: `s -> s / w0`. Roots scale
 * by `w0`; the gain becomes `k w0^(np - nz)` so the DC gain is unchanged.
 *
 * @param system - lowpass prototype (cut-off 1 rad/s)
 * @param options - `{ w0 }`, the new cut-off in rad/s
 * @returns the scaled lowpass
 * @throws {@link InvalidArgumentError} when the zpk is malformed, improper, or `w0` is not positive
 * @example
 * ```ts
 * lowpassToLowpass(zpk([], [{ re: -1, im: 0 }], 1), { w0: 10 });
 * //=> { zeros: [], poles: [{ re: -10, im: 0 }], gain: 10 }
 * ```
 */
export function lowpassToLowpass(system: Zpk, options: CutoffOptions): Zpk {
  const { w0 } = check("lowpassToLowpass", system, options, false);
  const degree = system.poles.length - system.zeros.length;
  return freeze(
    system.zeros.map((z) => ({ re: z.re * w0, im: z.im * w0 })),
    system.poles.map((p) => ({ re: p.re * w0, im: p.im * w0 })),
    system.gain * w0 ** degree,
  );
}

/**
 * Lowpass prototype to highpass with cut-off `w0`: `s -> w0 / s`. Each root
 * `r` becomes `w0 / r`, `np - nz` zeros are added at the origin, and the gain
 * becomes `k prod(-z) / prod(-p)` so the high-frequency gain equals the
 * prototype's DC gain.
 *
 * @param system - lowpass prototype (cut-off 1 rad/s), no root at s = 0
 * @param options - `{ w0 }`, the highpass cut-off in rad/s
 * @returns the highpass
 * @throws {@link InvalidArgumentError} when the zpk is malformed, improper, has a root at s = 0, or `w0` is not positive
 * @example
 * ```ts
 * lowpassToHighpass(zpk([], [{ re: -1, im: 0 }], 1), { w0: 10 });
 * //=> { zeros: [{ re: 0, im: 0 }], poles: [{ re: -10, im: 0 }], gain: 1 }
 * ```
 */
export function lowpassToHighpass(system: Zpk, options: CutoffOptions): Zpk {
  const fn = "lowpassToHighpass";
  const { w0 } = check(fn, system, options, false);
  rejectOrigin(fn, system);
  const inv = (r: Complex): Complex => cdiv({ re: w0, im: 0 }, r);
  const zeros = system.zeros.map(inv);
  for (let i = system.zeros.length; i < system.poles.length; i++) zeros.push({ re: 0, im: 0 });
  return freeze(zeros, system.poles.map(inv), system.gain * dcRatio(system));
}

/**
 * Lowpass prototype to bandpass with centre `w0` and bandwidth `B`:
 * `s -> (s^2 + w0^2) / (B s)`. Each root `r` gives the two roots of
 * `x^2 - r B x + w0^2`, `np - nz` zeros are added at the origin, and the gain
 * becomes `k B^(np - nz)` so the gain at `w0` equals the prototype's DC gain.
 *
 * @param system - lowpass prototype (cut-off 1 rad/s)
 * @param options - `{ w0, bandwidth }` in rad/s
 * @returns the bandpass, of twice the prototype's order
 * @throws {@link InvalidArgumentError} when the zpk is malformed, improper, or `w0` / `bandwidth` is not positive
 * @example
 * ```ts
 * lowpassToBandpass(zpk([], [{ re: -1, im: 0 }], 1), { w0: 1, bandwidth: 1 });
 * //=> { zeros: [{ re: 0, im: 0 }], poles: [{ re: -0.5, im: 0.8660254037844386 }, { re: -0.5, im: -0.8660254037844386 }], gain: 1 }
 * ```
 */
export function lowpassToBandpass(system: Zpk, options: BandOptions): Zpk {
  const { w0, bandwidth } = check("lowpassToBandpass", system, options, true);
  const zeros = bandRoots(system.zeros, bandwidth / 2, w0, false);
  const degree = system.poles.length - system.zeros.length;
  for (let i = 0; i < degree; i++) zeros.push({ re: 0, im: 0 });
  return freeze(zeros, bandRoots(system.poles, bandwidth / 2, w0, false), system.gain * bandwidth ** degree);
}

/**
 * Lowpass prototype to bandstop with centre `w0` and bandwidth `B`:
 * `s -> B s / (s^2 + w0^2)`. Each root `r` gives the two roots of
 * `x^2 - (B / r) x + w0^2`, `np - nz` zero pairs are added at `+-j w0`, and the
 * gain becomes `k prod(-z) / prod(-p)` so the DC and high-frequency gains equal
 * the prototype's DC gain.
 *
 * @param system - lowpass prototype (cut-off 1 rad/s), no root at s = 0
 * @param options - `{ w0, bandwidth }` in rad/s
 * @returns the bandstop, of twice the prototype's order
 * @throws {@link InvalidArgumentError} when the zpk is malformed, improper, has a root at s = 0, or `w0` / `bandwidth` is not positive
 * @example
 * ```ts
 * lowpassToBandstop(zpk([], [{ re: -1, im: 0 }], 1), { w0: 1, bandwidth: 1 }).zeros;
 * //=> [{ re: 0, im: 1 }, { re: 0, im: -1 }]
 * ```
 */
export function lowpassToBandstop(system: Zpk, options: BandOptions): Zpk {
  const fn = "lowpassToBandstop";
  const { w0, bandwidth } = check(fn, system, options, true);
  rejectOrigin(fn, system);
  const zeros = bandRoots(system.zeros, bandwidth / 2, w0, true);
  for (let i = system.zeros.length; i < system.poles.length; i++) zeros.push({ re: 0, im: w0 }, { re: 0, im: -w0 });
  return freeze(zeros, bandRoots(system.poles, bandwidth / 2, w0, true), system.gain * dcRatio(system));
}
