/**
 * The shape check of a {@link LadderPrototype} that every public function
 * taking one runs first: a known family and form, arms that alternate from
 * the form's first kind, finite positive values, finite positive
 * terminations, and a stable proper transfer function of the ladder's order
 * with no root at s = 0 (the highpass and bandstop maps send it to infinity).
 *
 * @module
 */
import { FAMILY_NAMES } from "../approx/types.ts";
import { InvalidArgumentError } from "../errors.ts";
import { requireZpk } from "../tf/check.ts";
import { requireInteger, requireOneOf, requirePositive } from "../validate.ts";
import { LADDER_FORMS, type LadderElement, type LadderPrototype } from "./types.ts";

/** Largest number of arms a ladder may have. */
export const LADDER_MAX_ARMS = 64;

function fail(fn: string, path: string, received: unknown, message: string): never {
  throw new InvalidArgumentError({ fn, path, received, message });
}

function checkElement(fn: string, path: string, raw: unknown, kind: "series-L" | "shunt-C"): LadderElement {
  if (raw === null || typeof raw !== "object" || Array.isArray(raw)) fail(fn, path, raw, `expected an arm { kind: "${kind}", value }`);
  const e = raw as Record<string, unknown>;
  if (e["kind"] !== kind) {
    fail(fn, `${path}.kind`, e["kind"], `expected "${kind}": the arms alternate between "series-L" and "shunt-C" from the form's first kind`);
  }
  requirePositive(fn, `${path}.value`, e["value"]);
  const extra = kind === "series-L" ? "parallelC" : "seriesL";
  const wrong = kind === "series-L" ? "seriesL" : "parallelC";
  if (e[wrong] !== undefined) {
    fail(fn, `${path}.${wrong}`, e[wrong], `a "${kind}" arm takes "${extra}" for its transmission zero, not "${wrong}"; remove it`);
  }
  if (e[extra] !== undefined) requirePositive(fn, `${path}.${extra}`, e[extra]);
  return raw as LadderElement;
}

function checkTransfer(fn: string, path: string, value: unknown, order: number): void {
  const t = requireZpk(fn, path, value);
  if (t.poles.length !== order) {
    fail(fn, `${path}.poles`, t.poles.length, `expected ${order} poles, one per arm (the ladder's order)`);
  }
  if (t.zeros.length > order) fail(fn, `${path}.zeros`, t.zeros.length, `expected at most ${order} zeros (a proper transfer function)`);
  t.poles.forEach((p, i) => {
    if (!(p.re < 0)) fail(fn, `${path}.poles[${i}]`, p, "expected a pole in the open left half-plane (a lossless ladder between resistors is stable)");
  });
  t.zeros.forEach((z, i) => {
    if (z.re === 0 && z.im === 0) fail(fn, `${path}.zeros[${i}]`, z, "a lowpass ladder has no zero at s = 0; remove it");
  });
  if (t.gain === 0) fail(fn, `${path}.gain`, t.gain, "expected a non-zero gain");
}

/**
 * Check a ladder prototype (internal form that names the calling function).
 *
 * @param fn - public function name for messages
 * @param path - dotted path of the argument, e.g. `"prototype"`
 * @param value - the value to check
 * @returns the value, typed
 * @throws {@link InvalidArgumentError} at the first problem, with its path
 * @example
 * ```ts
 * requireLadderPrototype("scaleLadder", "prototype", { family: "butterworth", order: 1, form: "shunt-first",
 *   elements: [{ kind: "shunt-C", value: 2 }], sourceOhms: 1, loadOhms: 1,
 *   transfer: { zeros: [], poles: [{ re: -1, im: 0 }], gain: 0.5 } }).order; //=> 1
 * ```
 */
export function requireLadderPrototype(fn: string, path: string, value: unknown): LadderPrototype {
  if (value === null || typeof value !== "object" || Array.isArray(value)) {
    fail(fn, path, value, "expected a ladder prototype { family, order, form, elements, sourceOhms, loadOhms, transfer }");
  }
  const p = value as Record<string, unknown>;
  requireOneOf(fn, `${path}.family`, p["family"], FAMILY_NAMES);
  const order = requireInteger(fn, `${path}.order`, p["order"], { min: 1, max: LADDER_MAX_ARMS });
  const form = requireOneOf(fn, `${path}.form`, p["form"], LADDER_FORMS);
  const elements = p["elements"];
  if (!Array.isArray(elements)) fail(fn, `${path}.elements`, elements, "expected an array of arms from the source end");
  if (elements.length !== order) {
    fail(fn, `${path}.elements`, elements.length, `expected ${order} arms, one per order of the prototype`);
  }
  const first = form === "series-first" ? 0 : 1;
  elements.forEach((e, i) => {
    checkElement(fn, `${path}.elements[${i}]`, e, (i + first) % 2 === 0 ? "series-L" : "shunt-C");
  });
  requirePositive(fn, `${path}.sourceOhms`, p["sourceOhms"]);
  requirePositive(fn, `${path}.loadOhms`, p["loadOhms"]);
  checkTransfer(fn, `${path}.transfer`, p["transfer"], order);
  return value as LadderPrototype;
}
