/**
 * Private helpers shared by the approximation families: building conjugate
 * pairs, freezing results, evaluating |H(jw)| of a zpk directly, and scaling
 * a prototype in frequency. Not exported from the layer index.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
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
 * Find a root of a continuous scalar function in a bracket [a, b] where
 * f(a) and f(b) differ in sign, by the Illinois variant of regula falsi with
 * bisection safeguard (M. Dowell and P. Jarratt, "A modified regula falsi
 * method for computing the root of an equation", BIT 11, 1971, pp. 168-174).
 * Converges to a relative width of ~4 ulp.
 */
export function bracketRoot(f: (x: number) => number, a: number, b: number): number {
  let x0 = a;
  let x1 = b;
  let f0 = f(x0);
  let f1 = f(x1);
  if (f0 === 0) return x0;
  if (f1 === 0) return x1;
  for (let i = 0; i < 400; i++) {
    let x2 = x1 - (f1 * (x1 - x0)) / (f1 - f0);
    const lo = Math.min(x0, x1);
    const hi = Math.max(x0, x1);
    if (!(x2 > lo && x2 < hi) || i % 5 === 4) x2 = 0.5 * (lo + hi);
    const f2 = f(x2);
    if (f2 === 0) return x2;
    if (f2 * f1 < 0) {
      x0 = x1;
      f0 = f1;
    } else {
      f0 /= 2;
    }
    x1 = x2;
    f1 = f2;
    if (Math.abs(x1 - x0) <= 2 * Number.EPSILON * Math.max(Math.abs(x0), Math.abs(x1))) break;
  }
  return Math.abs(f0) < Math.abs(f1) ? x0 : x1;
}

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
