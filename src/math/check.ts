/**
 * Argument checks for arrays of numbers and complex values, shared by the
 * `math` and `tf` layers. Each check throws an {@link InvalidArgumentError}
 * naming the function, the dotted path (with the offending index) and the
 * value received. Internal module: not re-exported from the layer index.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import type { Complex } from "./complex.ts";

/**
 * Require an array (or typed array) of finite numbers with at least `minLength` entries.
 *
 * @param fn - public function name, for the message
 * @param path - dotted field path
 * @param value - value to check
 * @param minLength - smallest accepted length
 * @returns the value as a readonly array of numbers
 * @throws {@link InvalidArgumentError} when not such an array
 * @example
 * ```ts
 * requireNumberArray("polyEvalReal", "coeffs", [1, 2], 1); //=> [1, 2]
 * ```
 */
export function requireNumberArray(fn: string, path: string, value: unknown, minLength = 0): readonly number[] {
  const isArr = Array.isArray(value) || value instanceof Float64Array || value instanceof Float32Array;
  if (!isArr) {
    throw new InvalidArgumentError({ fn, path, received: value, message: "expected an array of finite numbers" });
  }
  const arr = value as ArrayLike<unknown>;
  if (arr.length < minLength) {
    throw new InvalidArgumentError({
      fn,
      path,
      received: value,
      message: `expected at least ${minLength} number${minLength === 1 ? "" : "s"}`,
    });
  }
  for (let i = 0; i < arr.length; i++) {
    const v = arr[i];
    if (typeof v !== "number" || !Number.isFinite(v)) {
      throw new InvalidArgumentError({ fn, path: `${path}[${i}]`, received: v, message: "expected a finite number" });
    }
  }
  return value as readonly number[];
}

/**
 * Require a complex value `{ re, im }` with finite parts.
 *
 * @param fn - public function name, for the message
 * @param path - dotted field path
 * @param value - value to check
 * @returns the value as a Complex
 * @throws {@link InvalidArgumentError} when not a finite complex value
 * @example
 * ```ts
 * requireComplex("polyEval", "z", { re: 1, im: 0 }); //=> { re: 1, im: 0 }
 * ```
 */
export function requireComplex(fn: string, path: string, value: unknown): Complex {
  if (typeof value !== "object" || value === null) {
    throw new InvalidArgumentError({ fn, path, received: value, message: "expected a complex value { re, im }" });
  }
  const v = value as { re?: unknown; im?: unknown };
  if (typeof v.re !== "number" || !Number.isFinite(v.re) || typeof v.im !== "number" || !Number.isFinite(v.im)) {
    throw new InvalidArgumentError({
      fn,
      path,
      received: value,
      message: "expected a complex value { re, im } with finite parts",
    });
  }
  return value as Complex;
}

/** Whether a value is a complex value `{ re, im }` with finite parts (what {@link requireComplex} accepts). */
function isFiniteComplex(value: unknown): boolean {
  if (typeof value !== "object" || value === null) return false;
  const v = value as { re?: unknown; im?: unknown };
  return typeof v.re === "number" && Number.isFinite(v.re) && typeof v.im === "number" && Number.isFinite(v.im);
}

/**
 * Require an array of complex values with finite parts.
 *
 * @param fn - public function name, for the message
 * @param path - dotted field path
 * @param value - value to check
 * @returns the value as a readonly array of Complex
 * @throws {@link InvalidArgumentError} when not such an array
 * @example
 * ```ts
 * requireComplexArray("polyFromRoots", "roots", [{ re: -1, im: 0 }]); //=> [{ re: -1, im: 0 }]
 * ```
 */
export function requireComplexArray(fn: string, path: string, value: unknown): readonly Complex[] {
  if (!Array.isArray(value)) {
    throw new InvalidArgumentError({ fn, path, received: value, message: "expected an array of complex values { re, im }" });
  }
  // the element path is built only for the element that fails
  for (let i = 0; i < value.length; i++) if (!isFiniteComplex(value[i])) requireComplex(fn, `${path}[${i}]`, value[i]);
  return value as readonly Complex[];
}

/**
 * The unused value nearest to the conjugate of `v` (first one on ties), for
 * pairing conjugates; mark `v` itself used before calling.
 *
 * @param values - the complex values
 * @param v - the value whose partner is wanted
 * @param used - 1 for indices already paired (skipped)
 * @returns the partner's index (-1 when every value is used) and its distance from conj(v)
 * @throws never
 * @example
 * ```ts
 * nearestConjugate([{ re: -1, im: 1 }, { re: -1, im: -1 }], { re: -1, im: 1 }, Uint8Array.of(1, 0)); //=> { index: 1, distance: 0 }
 * ```
 */
export function nearestConjugate(values: readonly Complex[], v: Complex, used: Uint8Array): { index: number; distance: number } {
  let index = -1;
  let distance = Infinity;
  for (let j = 0; j < values.length; j++) {
    if (used[j] === 1) continue;
    const u = values[j] as Complex;
    const d = Math.hypot(u.re - v.re, u.im + v.im);
    if (d < distance) {
      distance = d;
      index = j;
    }
  }
  return { index, distance };
}

/**
 * Require that complex values are closed under conjugation: every value with
 * a non-zero imaginary part has a partner equal to its conjugate within
 * `1e-9` relative (so the polynomial they define has real coefficients).
 *
 * @param fn - public function name, for the message
 * @param path - dotted field path
 * @param values - checked complex values
 * @throws {@link InvalidArgumentError} when a value lacks its conjugate partner
 * @example
 * ```ts
 * requireConjugateClosed("zpk", "poles", [{ re: -1, im: 1 }, { re: -1, im: -1 }]); // passes
 * ```
 */
export function requireConjugateClosed(fn: string, path: string, values: readonly Complex[]): void {
  const used = new Uint8Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const v = values[i] as Complex;
    if (v.im === 0 || used[i] === 1) continue;
    used[i] = 1;
    const tol = 1e-9 * Math.max(Math.hypot(v.re, v.im), Number.MIN_VALUE);
    const { index: best, distance: bestD } = nearestConjugate(values, v, used);
    if (best < 0 || bestD > tol) {
      throw new InvalidArgumentError({
        fn,
        path: `${path}[${i}]`,
        received: v,
        message: "complex values must come in conjugate pairs (each a+bj needs a matching a-bj) so the coefficients are real",
      });
    }
    used[best] = 1;
  }
}
