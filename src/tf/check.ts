/**
 * Argument checks for `tf` values (zpk systems, sections, cascades, grids).
 * Internal module: not re-exported from the layer index.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requireComplexArray, requireConjugateClosed } from "../math/check.ts";
import type { Section, SectionCascade, Zpk } from "./types.ts";

/**
 * Require a {@link Zpk}: finite zeros and poles closed under conjugation and a
 * finite real gain.
 *
 * @param fn - public function name
 * @param path - dotted path of the argument
 * @param value - value to check
 * @returns the value as a Zpk
 * @throws {@link InvalidArgumentError} when malformed
 */
export function requireZpk(fn: string, path: string, value: unknown): Zpk {
  if (typeof value !== "object" || value === null || Array.isArray(value)) {
    throw new InvalidArgumentError({ fn, path, received: value, message: "expected a zpk object { zeros, poles, gain }" });
  }
  const v = value as Record<string, unknown>;
  const p = path === "" ? "" : `${path}.`;
  const zeros = requireComplexArray(fn, `${p}zeros`, v["zeros"]);
  const poles = requireComplexArray(fn, `${p}poles`, v["poles"]);
  requireConjugateClosed(fn, `${p}zeros`, zeros);
  requireConjugateClosed(fn, `${p}poles`, poles);
  const gain = v["gain"];
  if (typeof gain !== "number" || !Number.isFinite(gain)) {
    throw new InvalidArgumentError({ fn, path: `${p}gain`, received: gain, message: "expected a finite real gain" });
  }
  return value as Zpk;
}

function isTriple(x: unknown): x is readonly [number, number, number] {
  return (
    Array.isArray(x) && x.length === 3 && x.every((c) => typeof c === "number" && Number.isFinite(c))
  );
}

/**
 * Require a well-formed {@link Section}.
 *
 * @param fn - public function name
 * @param path - dotted path of the argument
 * @param value - value to check
 * @returns the value as a Section
 * @throws {@link InvalidArgumentError} when malformed
 */
export function requireSection(fn: string, path: string, value: unknown): Section {
  if (typeof value !== "object" || value === null) {
    throw new InvalidArgumentError({ fn, path, received: value, message: "expected a section object" });
  }
  const v = value as Record<string, unknown>;
  const p = path === "" ? "" : `${path}.`;
  if (v["order"] !== 1 && v["order"] !== 2) {
    throw new InvalidArgumentError({ fn, path: `${p}order`, received: v["order"], message: "expected 1 or 2" });
  }
  if (!isTriple(v["num"])) {
    throw new InvalidArgumentError({ fn, path: `${p}num`, received: v["num"], message: "expected three finite numbers [b2, b1, b0]" });
  }
  const den = v["den"];
  if (!isTriple(den)) {
    throw new InvalidArgumentError({ fn, path: `${p}den`, received: den, message: "expected three finite numbers" });
  }
  if (v["order"] === 1 ? den[0] !== 0 || den[1] !== 1 : den[0] !== 1) {
    throw new InvalidArgumentError({
      fn,
      path: `${p}den`,
      received: den,
      message: v["order"] === 1 ? "a first-order denominator must be [0, 1, w0]" : "a second-order denominator must be monic [1, w0/Q, w0^2]",
    });
  }
  if (v["order"] === 1 && v["num"][0] !== 0) {
    throw new InvalidArgumentError({ fn, path: `${p}num`, received: v["num"], message: "a first-order numerator must be [0, b1, b0]" });
  }
  return value as Section;
}

/**
 * Require a well-formed {@link SectionCascade}.
 *
 * @param fn - public function name
 * @param path - dotted path of the argument
 * @param value - value to check
 * @returns the value as a SectionCascade
 * @throws {@link InvalidArgumentError} when malformed
 */
export function requireCascade(fn: string, path: string, value: unknown): SectionCascade {
  if (typeof value !== "object" || value === null) {
    throw new InvalidArgumentError({ fn, path, received: value, message: "expected a section cascade { sections, gain }" });
  }
  const v = value as Record<string, unknown>;
  const p = path === "" ? "" : `${path}.`;
  const sections = v["sections"];
  if (!Array.isArray(sections)) {
    throw new InvalidArgumentError({ fn, path: `${p}sections`, received: sections, message: "expected an array of sections" });
  }
  sections.forEach((s, i) => requireSection(fn, `${p}sections[${i}]`, s));
  const gain = v["gain"];
  if (typeof gain !== "number" || !Number.isFinite(gain)) {
    throw new InvalidArgumentError({ fn, path: `${p}gain`, received: gain, message: "expected a finite real gain" });
  }
  return value as SectionCascade;
}

/**
 * Require a proper zpk (no more zeros than poles) whose poles all lie in the
 * open left half-plane (Re < 0); the argument path is `system`.
 *
 * @param fn - public function name
 * @param system - a validated zpk
 * @param why - the end of the improper-system message (after "an improper system (n zeros, m poles) ") and the whole message for a pole with Re >= 0
 * @throws {@link InvalidArgumentError} when improper or a pole is not in the open left half-plane
 */
export function requireProperStable(fn: string, system: Zpk, why: { readonly improper: string; readonly unstable: string }): void {
  if (system.zeros.length > system.poles.length) {
    throw new InvalidArgumentError({
      fn,
      path: "system.zeros",
      received: system.zeros.length,
      message: `an improper system (${system.zeros.length} zeros, ${system.poles.length} poles) ${why.improper}`,
    });
  }
  system.poles.forEach((p, i) => {
    if (!(p.re < 0)) {
      throw new InvalidArgumentError({ fn, path: `system.poles[${i}]`, received: p, message: why.unstable });
    }
  });
}

/** True when the value looks like a cascade rather than a zpk (has `sections`). */
export function isCascade(value: unknown): value is SectionCascade {
  return typeof value === "object" && value !== null && "sections" in value;
}

/**
 * Require a zpk system or a section cascade.
 *
 * @param fn - public function name
 * @param path - dotted path of the argument
 * @param value - value to check
 * @returns the value, typed
 * @throws {@link InvalidArgumentError} when neither
 */
export function requireSystem(fn: string, path: string, value: unknown): Zpk | SectionCascade {
  if (isCascade(value)) return requireCascade(fn, path, value);
  return requireZpk(fn, path, value);
}

/**
 * Require a grid: a Float64Array (or number array) of finite values.
 *
 * @param fn - public function name
 * @param path - dotted path of the argument
 * @param value - value to check
 * @param opts - whether values must be non-negative, and whether strictly increasing
 * @returns the value as a Float64Array (copied when given as an array)
 * @throws {@link InvalidArgumentError} when malformed
 */
export function requireGrid(
  fn: string,
  path: string,
  value: unknown,
  opts: { readonly nonNegative?: boolean; readonly increasing?: boolean } = {},
): Float64Array {
  let arr: Float64Array;
  if (value instanceof Float64Array) arr = value;
  else if (Array.isArray(value) && value.every((x) => typeof x === "number")) arr = Float64Array.from(value as number[]);
  else {
    throw new InvalidArgumentError({ fn, path, received: value, message: "expected a Float64Array of finite numbers" });
  }
  const nonNegative = opts.nonNegative === true;
  const increasing = opts.increasing === true;
  for (let i = 0; i < arr.length; i++) {
    const x = arr[i] as number;
    if (!Number.isFinite(x) || (nonNegative && x < 0)) {
      throw new InvalidArgumentError({
        fn,
        path: `${path}[${i}]`,
        received: x,
        message: nonNegative ? "expected a finite number >= 0" : "expected a finite number",
      });
    }
    if (increasing && i > 0 && !(x > (arr[i - 1] as number))) {
      throw new InvalidArgumentError({ fn, path: `${path}[${i}]`, received: x, message: "expected strictly increasing values" });
    }
  }
  return arr;
}
