/**
 * Argument checks used once, at the public boundary of each function.
 *
 * Each check throws an {@link InvalidArgumentError} that names the function,
 * the dotted path of the field, the value received and what is accepted, and
 * otherwise returns the value narrowed to its type. The numerical cores
 * beneath the public functions assume valid input.
 *
 * @module
 */
import { InvalidArgumentError } from "./errors.ts";

/**
 * Require a finite number.
 *
 * @param fn - public function name, for the message
 * @param path - dotted field path
 * @param value - value to check
 * @returns the value as a number
 * @throws {@link InvalidArgumentError} when not a finite number
 * @example
 * ```ts
 * requireFinite("f", "gain", 2); //=> 2
 * ```
 */
export function requireFinite(fn: string, path: string, value: unknown): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new InvalidArgumentError({
      fn,
      path,
      received: value,
      message: "expected a finite number",
    });
  }
  return value;
}

/**
 * Require a finite number strictly greater than zero.
 *
 * @param fn - public function name, for the message
 * @param path - dotted field path
 * @param value - value to check
 * @returns the value as a number
 * @throws {@link InvalidArgumentError} when not a finite positive number
 * @example
 * ```ts
 * requirePositive("f", "edgeHz", 1000); //=> 1000
 * ```
 */
export function requirePositive(fn: string, path: string, value: unknown): number {
  if (typeof value !== "number" || !Number.isFinite(value) || value <= 0) {
    throw new InvalidArgumentError({
      fn,
      path,
      received: value,
      message: "expected a finite number greater than zero",
    });
  }
  return value;
}

/**
 * Require a finite number within `[min, max]` (inclusive).
 *
 * @param fn - public function name, for the message
 * @param path - dotted field path
 * @param value - value to check
 * @param range - inclusive bounds
 * @returns the value as a number
 * @throws {@link InvalidArgumentError} when not finite or outside the range
 * @example
 * ```ts
 * requireInRange("f", "rippleDb", 0.5, { min: 0, max: 10 }); //=> 0.5
 * ```
 */
export function requireInRange(
  fn: string,
  path: string,
  value: unknown,
  range: { readonly min: number; readonly max: number; readonly exclusiveMin?: boolean },
): number {
  const v = requireFinite(fn, path, value);
  const lowOk = range.exclusiveMin === true ? v > range.min : v >= range.min;
  if (!lowOk || v > range.max) {
    const lo = range.exclusiveMin === true ? `greater than ${range.min}` : `at least ${range.min}`;
    throw new InvalidArgumentError({
      fn,
      path,
      received: value,
      message: `expected a number ${lo} and at most ${range.max}`,
    });
  }
  return v;
}

/**
 * Require an integer within `[min, max]` (inclusive).
 *
 * @param fn - public function name, for the message
 * @param path - dotted field path
 * @param value - value to check
 * @param range - inclusive bounds
 * @returns the value as a number
 * @throws {@link InvalidArgumentError} when not an integer in range
 * @example
 * ```ts
 * requireInteger("butterworth", "order", 4, { min: 1, max: 64 }); //=> 4
 * ```
 */
export function requireInteger(
  fn: string,
  path: string,
  value: unknown,
  range: { readonly min: number; readonly max: number },
): number {
  if (typeof value !== "number" || !Number.isInteger(value) || value < range.min || value > range.max) {
    throw new InvalidArgumentError({
      fn,
      path,
      received: value,
      message: `expected an integer from ${range.min} to ${range.max}`,
    });
  }
  return value;
}

/**
 * Require one of a fixed set of strings.
 *
 * @param fn - public function name, for the message
 * @param path - dotted field path
 * @param value - value to check
 * @param allowed - accepted values
 * @returns the value narrowed to the union
 * @throws {@link InvalidArgumentError} when not one of `allowed`
 * @example
 * ```ts
 * requireOneOf("bessel", "normalization", "delay", ["delay", "magnitude", "phase"] as const); //=> "delay"
 * ```
 */
export function requireOneOf<const T extends string>(
  fn: string,
  path: string,
  value: unknown,
  allowed: readonly T[],
): T {
  if (typeof value !== "string" || !(allowed as readonly string[]).includes(value)) {
    throw new InvalidArgumentError({
      fn,
      path,
      received: value,
      message: `expected one of ${allowed.map((a) => JSON.stringify(a)).join(", ")}`,
    });
  }
  return value as T;
}

/**
 * Require a plain object (not null, not an array) or `undefined`.
 *
 * @param fn - public function name, for the message
 * @param path - dotted field path
 * @param value - value to check
 * @returns the object, or an empty object when `undefined`
 * @throws {@link InvalidArgumentError} when neither an object nor undefined
 * @example
 * ```ts
 * requireOptions("bessel", "options", undefined); //=> {}
 * ```
 */
export function requireOptions(fn: string, path: string, value: unknown): Record<string, unknown> {
  if (value === undefined) return {};
  if (typeof value !== "object" || value === null || Array.isArray(value)) {
    throw new InvalidArgumentError({
      fn,
      path,
      received: value,
      message: "expected an options object (or nothing)",
    });
  }
  return value as Record<string, unknown>;
}
