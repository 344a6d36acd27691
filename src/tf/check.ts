/**
 * Argument checks for `tf` values (zpk systems, sections, cascades, grids).
 * Internal module: not re-exported from the layer index.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requireComplexArray, requireConjugateClosed } from "../math/check.ts";
import type { Complex } from "../math/complex.ts";
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
  const zeros = v["zeros"];
  const poles = v["poles"];
  const gain = v["gain"];
  // the common case without building a field path; any failure is reported by the full checks below
  if (typeof gain === "number" && Number.isFinite(gain) && isConjugateClosedArray(zeros) && isConjugateClosedArray(poles)) {
    return value as Zpk;
  }
  const p = path === "" ? "" : `${path}.`;
  requireComplexArray(fn, `${p}zeros`, zeros);
  requireComplexArray(fn, `${p}poles`, poles);
  requireConjugateClosed(fn, `${p}zeros`, zeros as readonly Complex[]);
  requireConjugateClosed(fn, `${p}poles`, poles as readonly Complex[]);
  if (typeof gain !== "number" || !Number.isFinite(gain)) {
    throw new InvalidArgumentError({ fn, path: `${p}gain`, received: gain, message: "expected a finite real gain" });
  }
  return value as Zpk;
}

/**
 * Whether the value is an array of finite complex values in which every
 * non-real value has its exact conjugate (equal real part, opposite
 * imaginary part) in one of the usual layouts: right after it
 * (`p, conj p, ...`) or mirrored (`conj p` at index `n - 1 - i`). Such an
 * array passes {@link requireComplexArray} and {@link requireConjugateClosed}
 * (an exact partner is at distance 0); a false answer is not an error, the
 * caller then runs those checks.
 */
function isConjugateClosedArray(value: unknown): boolean {
  if (!Array.isArray(value)) return false;
  const n = value.length;
  for (let i = 0; i < n; i++) {
    const c = value[i] as { re?: unknown; im?: unknown } | null;
    if (typeof c !== "object" || c === null) return false;
    const re = c.re;
    const im = c.im;
    if (typeof re !== "number" || typeof im !== "number" || !Number.isFinite(re) || !Number.isFinite(im)) return false;
  }
  const v = value as readonly Complex[];
  let adjacent = true;
  for (let i = 0; i < n && adjacent; i++) {
    const c = v[i] as Complex;
    if (c.im === 0) continue;
    const d = v[i + 1];
    if (d !== undefined && d.re === c.re && d.im === -c.im) i++;
    else adjacent = false;
  }
  if (adjacent) return true;
  for (let i = 0; i < n; i++) {
    const c = v[i] as Complex;
    if (c.im === 0) continue;
    const d = v[n - 1 - i] as Complex;
    if (d.re !== c.re || d.im !== -c.im) return false;
  }
  return true;
}

function isTriple(x: unknown): x is readonly [number, number, number] {
  if (!Array.isArray(x) || x.length !== 3) return false;
  for (let i = 0; i < 3; i++) {
    const c: unknown = x[i];
    if (typeof c !== "number" || !Number.isFinite(c)) return false;
  }
  return true;
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
  if (isSection(value)) return value as Section;
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

/** Whether {@link requireSection} accepts the value (without building a message). */
function isSection(value: unknown): boolean {
  if (typeof value !== "object" || value === null) return false;
  const v = value as Record<string, unknown>;
  const order = v["order"];
  const num = v["num"];
  const den = v["den"];
  if ((order !== 1 && order !== 2) || !isTriple(num) || !isTriple(den)) return false;
  return order === 1 ? den[0] === 0 && den[1] === 1 && num[0] === 0 : den[0] === 1;
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
  const sections = v["sections"];
  const gain = v["gain"];
  if (Array.isArray(sections) && typeof gain === "number" && Number.isFinite(gain) && sections.every(isSection)) {
    return value as SectionCascade;
  }
  const p = path === "" ? "" : `${path}.`;
  if (!Array.isArray(sections)) {
    throw new InvalidArgumentError({ fn, path: `${p}sections`, received: sections, message: "expected an array of sections" });
  }
  for (let i = 0; i < sections.length; i++) if (!isSection(sections[i])) requireSection(fn, `${p}sections[${i}]`, sections[i]);
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

/** The default options of {@link requireGrid} (one object, not one per call). */
const NO_GRID_OPTIONS: { readonly nonNegative?: boolean; readonly increasing?: boolean } = Object.freeze({});

/**
 * Whether every value is finite, without a branch per value: `x * 0` is 0
 * for finite x and NaN for an infinity or NaN, and NaN survives the sums
 * (four of them, so that the additions overlap).
 */
function allFinite(a: Float64Array): boolean {
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  const n = a.length;
  // the first n mod 4 values first (a loop reached on every call, so the
  // compiler has seen it before it compiles the main loop)
  const head = n & 3;
  for (let i = 0; i < head; i++) s0 += (a[i] as number) * 0;
  for (let i = head; i < n; i += 4) {
    s0 += (a[i] as number) * 0;
    s1 += (a[i + 1] as number) * 0;
    s2 += (a[i + 2] as number) * 0;
    s3 += (a[i + 3] as number) * 0;
  }
  return s0 + s1 + s2 + s3 === 0;
}

/**
 * Largest |w| on the grid: 0 for an empty grid, Infinity or NaN when a value
 * is not finite (Math.max propagates NaN), so a finite answer also proves
 * the grid finite.
 */
export function maxAbs(w: Float64Array): number {
  let m0 = 0;
  let m1 = 0;
  let m2 = 0;
  let m3 = 0;
  const n = w.length;
  const head = n & 3;
  for (let i = 0; i < head; i++) m0 = Math.max(m0, Math.abs(w[i] as number));
  for (let i = head; i < n; i += 4) {
    m0 = Math.max(m0, Math.abs(w[i] as number));
    m1 = Math.max(m1, Math.abs(w[i + 1] as number));
    m2 = Math.max(m2, Math.abs(w[i + 2] as number));
    m3 = Math.max(m3, Math.abs(w[i + 3] as number));
  }
  return Math.max(m0, m1, m2, m3);
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
  opts: { readonly nonNegative?: boolean; readonly increasing?: boolean } = NO_GRID_OPTIONS,
): Float64Array {
  let arr: Float64Array;
  if (value instanceof Float64Array) arr = value;
  else if (Array.isArray(value) && value.every((x) => typeof x === "number")) arr = Float64Array.from(value as number[]);
  else {
    throw new InvalidArgumentError({ fn, path, received: value, message: "expected a Float64Array of finite numbers" });
  }
  const nonNegative = opts.nonNegative === true;
  const increasing = opts.increasing === true;
  if (!nonNegative && !increasing && allFinite(arr)) return arr;
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
