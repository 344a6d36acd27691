/**
 * Private helpers shared by the approximation families: building conjugate
 * pairs, freezing results, evaluating |H(jw)| of a zpk directly, scaling
 * a prototype in frequency, and the stopping rules of the band-edge searches.
 * Not exported from the layer index.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import type { BracketRootOptions } from "../math/bracket.ts";
import type { Complex } from "../math/complex.ts";
import type { Zpk } from "../tf/types.ts";

/** Freeze a zpk and its arrays so callers cannot mutate shared results. */
export function freezeZpk(zeros: readonly Complex[], poles: readonly Complex[], gain: number): Zpk {
  return Object.freeze({
    zeros: Object.freeze(zeros.map((z) => Object.freeze({ re: z.re, im: z.im }))),
    poles: Object.freeze(poles.map((p) => Object.freeze({ re: p.re, im: p.im }))),
    gain,
  });
}

/**
 * Push `c` and its exact conjugate (upper half-plane member first). A value
 * whose imaginary part is zero is pushed once, with an exact zero imaginary part.
 */
export function pushPair(out: Complex[], c: Complex): void {
  if (c.im === 0) {
    out.push({ re: c.re, im: 0 });
    return;
  }
  const im = Math.abs(c.im);
  out.push({ re: c.re, im });
  out.push({ re: c.re, im: -im });
}

/**
 * Real product `prod(-r)` over a conjugate-symmetric set (pairs contribute
 * |r|^2, real members -r), computed without complex rounding of the
 * imaginary part.
 */
export function prodNeg(roots: readonly Complex[]): number {
  let acc = 1;
  for (const r of roots) {
    if (r.im === 0) acc *= -r.re;
    else if (r.im > 0) acc *= r.re * r.re + r.im * r.im;
  }
  return acc;
}

/**
 * |H(jw)| of a zpk, evaluated factor by factor (no polynomial expansion):
 * |k| prod|jw - z| / prod|jw - p|.
 */
export function zpkMagnitude(zpk: Zpk, w: number): number {
  let m = Math.abs(zpk.gain);
  for (const z of zpk.zeros) m *= Math.hypot(z.re, w - z.im);
  for (const p of zpk.poles) m /= Math.hypot(p.re, w - p.im);
  return m;
}

/**
 * Lowpass-to-lowpass frequency scaling s -> s / w0: zeros and poles times w0,
 * gain times w0^(poles - zeros) so that the response keeps its shape.
 */
export function scaleZpk(zpk: Zpk, w0: number): Zpk {
  const rel = zpk.poles.length - zpk.zeros.length;
  return freezeZpk(
    zpk.zeros.map((z) => ({ re: z.re * w0, im: z.im * w0 })),
    zpk.poles.map((p) => ({ re: p.re * w0, im: p.im * w0 })),
    zpk.gain * w0 ** rel,
  );
}

/**
 * Stopping rules of the approximation layer's band-edge searches with
 * {@link bracketRoot}: up to 400 steps, every fifth a bisection, to a bracket
 * of 2 ulp, returning the end with the smaller residual.
 */
export const EDGE_SEARCH: BracketRootOptions = Object.freeze({
  maxIterations: 400,
  bisectEvery: 5,
  relWidth: 2 * Number.EPSILON,
  result: "smaller-residual",
});

/**
 * Require an elliptic stopband attenuation greater than the passband ripple.
 *
 * @param fn - public function name
 * @param path - dotted path of the attenuation argument
 * @param db - the ripple and attenuation in dB
 * @throws {@link InvalidArgumentError} when the attenuation is not greater than the ripple
 */
export function requireAttenuationAboveRipple(
  fn: string,
  path: string,
  db: { readonly rippleDb: number; readonly attenuationDb: number },
): void {
  if (!(db.attenuationDb > db.rippleDb)) {
    throw new InvalidArgumentError({
      fn,
      path,
      received: db.attenuationDb,
      message: `the stopband attenuation must be greater than the passband ripple (${db.rippleDb} dB)`,
    });
  }
}
