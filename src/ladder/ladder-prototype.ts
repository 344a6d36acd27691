/**
 * Normalised doubly terminated lowpass LC ladders (1 rad/s, element values
 * in henries and farads for the given source resistance) for every
 * approximation family: closed forms for Butterworth and Chebyshev I
 * (closed-form.ts), general synthesis from the transfer function for every
 * family (synthesis.ts), the modified ("type b") form for even-order
 * elliptic and Chebyshev II (type-b.ts).
 *
 * Terminations: with minimum-phase reflection zeros a series-first ladder
 * ends in loadOhms >= sourceOhms and a shunt-first ladder in loadOhms <=
 * sourceOhms. An odd-order ladder (same kind of arm at both ends) for the
 * other side is the ladder for the reciprocal ratio turned end to end and
 * scaled in impedance (reciprocity: the transfer keeps its poles and zeros);
 * an even-order ladder for the other side does not exist in that form and is
 * refused. An even-order Chebyshev I ladder cannot have equal terminations
 * (its DC loss is the ripple): its default load is the ratio
 * (eps + sqrt(1 + eps^2))^2 (series-first) or its reciprocal (shunt-first),
 * and a requested load must lie at or beyond it.
 * Accuracy: closed forms a few ulp; synthesis checked on its own result (the
 * ladder's response against `transfer` on 600 points must agree to 1e-10 dB,
 * else the call is refused). Measured in test/ladder at orders 2-12, both
 * forms, equal and 600/50 ohm terminations: element values within 6e-15
 * (relative) of a 60-digit mpmath synthesis; the ladder's response within
 * 1e-12 dB of `transfer` for the all-pole families and within 2e-11 dB for
 * elliptic and Chebyshev II (down to -300 dB, away from the notches).
 * References: see the headers of the files named above.
 *
 * @module
 */
import { checkedPrototype } from "../approx/prototype.ts";
import { freezeZpk } from "../approx/internal.ts";
import { InvalidArgumentError, UnrealisableError } from "../errors.ts";
import type { Zpk } from "../tf/types.ts";
import { requireInRange, requireInteger, requireOneOf, requireOptions } from "../validate.ts";
import type { BesselNormalization, FamilyName } from "../approx/types.ts";
import { closedFormLoadRatio, closedFormReflection, closedFormValues } from "./closed-form.ts";
import { ladderDeviationDb } from "./self-check.ts";
import { dcGain, synthesizeLadder } from "./synthesis.ts";
import { typeB } from "./type-b.ts";
import { LADDER_FORMS, type LadderElement, type LadderForm, type LadderPrototype } from "./types.ts";

/** How the element values are found. */
export type LadderMethod = "auto" | "closed-form" | "synthesis";

/** Every ladder method, in a stable order. */
export const LADDER_METHODS: readonly LadderMethod[] = Object.freeze(["auto", "closed-form", "synthesis"] as const);

/** Highest order of the general synthesis (closed forms go to the family's own limit). */
export const LADDER_SYNTHESIS_MAX_ORDER = 16;

/** Largest load-to-source resistance ratio (and its reciprocal the smallest) accepted. */
export const MAX_TERMINATION_RATIO = 1e6;

/** Largest deviation (dB) of the synthesised ladder's response from `transfer` that the self-check accepts. */
export const SELF_CHECK_DB = 1e-10;

/** Arguments of {@link ladderPrototype}: the family fields of `prototype` plus the ladder's own. */
export interface LadderPrototypeSpec {
  /** Approximation family. */
  readonly family: FamilyName;
  /** Order: from 1 to the family's limit (closed forms) or {@link LADDER_SYNTHESIS_MAX_ORDER} (synthesis). */
  readonly order: number;
  /** Passband ripple in dB; required by `chebyshev1` and `elliptic`. */
  readonly rippleDb?: number;
  /** Stopband attenuation in dB; required by `chebyshev2` and `elliptic`. */
  readonly attenuationDb?: number;
  /**
   * Bessel normalisation (ignored by other families).
   * @defaultValue "phase"
   */
  readonly normalization?: BesselNormalization;
  /**
   * Which arm comes first from the source.
   * @defaultValue "series-first"
   */
  readonly form?: LadderForm;
  /**
   * Source resistance in ohms, from 1e-6 to 1e9.
   * @defaultValue 1
   */
  readonly sourceOhms?: number;
  /**
   * Load resistance in ohms, from 1e-6 to 1e9 and within a ratio of 1e6 of the source.
   * @defaultValue sourceOhms, or for an even-order Chebyshev I ladder the ratio its ripple needs
   */
  readonly loadOhms?: number;
  /**
   * `"closed-form"` (Butterworth and Chebyshev I only), `"synthesis"` (every
   * family), or `"auto"`: closed forms where they exist, else synthesis.
   * @defaultValue "auto"
   */
  readonly method?: LadderMethod;
}

const FN = "ladderPrototype";

function epsOf(rippleDb: number): number {
  return Math.sqrt(Math.expm1((rippleDb / 10) * Math.LN10));
}

/** Load ratio an even-order Chebyshev I ladder needs with full transmission at the ripple peaks. */
function chebyshevEvenRatio(order: number, rippleDb: number, form: LadderForm): number {
  const r = closedFormLoadRatio(order, epsOf(rippleDb), 0);
  return form === "series-first" ? r : 1 / r;
}

function other(form: LadderForm): LadderForm {
  return form === "series-first" ? "shunt-first" : "series-first";
}

/** The ladder turned end to end and scaled in impedance by `k` (an odd-order ladder keeps its form). */
function reversedScaled(elements: readonly LadderElement[], k: number): LadderElement[] {
  return [...elements].reverse().map((e) => scaleElement(e, k));
}

/** Impedance scaling by k: L times k, C divided by k. */
function scaleElement(e: LadderElement, k: number): LadderElement {
  if (e.kind === "series-L") {
    return e.parallelC === undefined
      ? { kind: e.kind, value: e.value * k }
      : { kind: e.kind, value: e.value * k, parallelC: e.parallelC / k };
  }
  return e.seriesL === undefined
    ? { kind: e.kind, value: e.value / k }
    : { kind: e.kind, value: e.value / k, seriesL: e.seriesL * k };
}

function refuseSide(order: number, form: LadderForm, r: number): never {
  const need = form === "series-first" ? "at least" : "at most";
  throw new UnrealisableError({
    fn: FN,
    path: "loadOhms",
    received: r,
    message: `an even-order ${form} ladder ends in a load ${need} the source resistance (load/source ratio ${need === "at least" ? ">= 1" : "<= 1"}); use form "${other(form)}" for this load, or exchange sourceOhms and loadOhms`,
  });
}

/** Closed-form arms, normalised to a 1 ohm source, for a ratio on the form's natural side. */
function closedFormArms(order: number, eps: number | null, r: number, form: LadderForm): LadderElement[] {
  const core = form === "series-first" ? r : 1 / r; // >= 1
  // Butterworth and odd Chebyshev: ((r - 1)/(r + 1))^2, exactly 0 at r = 1. Even Chebyshev: computed with
  // cancellation near the ripple's own ratio, where rounding (below 1e-13; the caller has refused loads
  // short of that ratio) is set to 0, as the g-values depend on sqrt(rho2) and the response only on rho2.
  const raw = closedFormReflection(order, eps, core);
  const rho2 = eps !== null && order % 2 === 0 && raw <= 1e-13 ? 0 : raw;
  const g = closedFormValues(order, eps, rho2);
  return g.map((value, i) => ({ kind: (i % 2 === 0) === (form === "series-first") ? "series-L" : "shunt-C", value }));
}

interface Target {
  readonly zpk: Zpk;
  readonly variant?: "type-b";
}

function targetOf(family: FamilyName, order: number, proto: Zpk): Target {
  if (order % 2 === 0 && (family === "elliptic" || family === "chebyshev2")) {
    const t = typeB(proto, family === "chebyshev2");
    if (t === null) {
      throw new UnrealisableError({
        fn: FN,
        path: "order",
        received: order,
        message: "the reflection zeros of this even-order prototype could not be located for its type b form; use an odd order",
      });
    }
    return { zpk: t.zpk, variant: "type-b" };
  }
  return { zpk: proto };
}

function synthesisArms(target: Zpk, r: number, form: LadderForm, spec: Record<string, unknown>): LadderElement[] {
  const res = synthesizeLadder(target, r, form);
  if (typeof res !== "string") return [...res.elements];
  const what =
    res === "no-positive-ladder"
      ? "no order of the finite transmission zeros gives a ladder of positive elements (they lie too close to the passband for this order); raise attenuationDb or lower the order"
      : res === "gain-above-peak"
        ? "the prototype's gain exceeds its peak somewhere, so no passive ladder realises it"
        : "the synthesis loses too many digits for this order and selectivity (the prototype's poles lie very close to the jw axis); lower the order, raise attenuationDb or raise rippleDb";
  throw new UnrealisableError({ fn: FN, path: "order", received: spec["order"], message: what });
}

/**
 * Normalised doubly terminated lowpass LC ladder of an approximation family
 * (elements from the source end, 1 rad/s, values in henries and farads for
 * the given source resistance), with the voltage transfer V(load) / V(source emf)
 * it realises. Even-order elliptic and Chebyshev II ladders realise the type b
 * form (`variant: "type-b"`, `transfer` is that form's, with two transmission
 * zeros at infinity instead of the highest finite pair).
 *
 * @param spec - family fields as `prototype` in `filterwright/approx`, plus `form`, `sourceOhms`, `loadOhms` and `method`
 * @returns the ladder, frozen
 * @throws {@link InvalidArgumentError} when a field is missing or out of range (the path names it)
 * @throws {@link UnrealisableError} when no ladder of this form has these terminations, or the
 *   general synthesis finds no ladder of positive elements or cannot reach its accuracy (the message says what to change)
 * @example
 * ```ts
 * ladderPrototype({ family: "butterworth", order: 3 }).elements.map((e) => e.value);
 * //=> [0.9999999999999999, 2, 0.9999999999999999]
 * ```
 */
export function ladderPrototype(spec: LadderPrototypeSpec): LadderPrototype {
  const s = requireOptions(FN, "", spec);
  const proto = checkedPrototype(FN, s);
  const family = s["family"] as FamilyName;
  const method = s["method"] === undefined ? "auto" : requireOneOf(FN, "method", s["method"], LADDER_METHODS);
  const closedFormFamily = family === "butterworth" || family === "chebyshev1";
  if (method === "closed-form" && !closedFormFamily) {
    throw new InvalidArgumentError({
      fn: FN,
      path: "method",
      received: method,
      message: `closed forms exist for "butterworth" and "chebyshev1" only; use "synthesis" or "auto" for "${family}"`,
    });
  }
  const useClosedForm = closedFormFamily && method !== "synthesis";
  const order = useClosedForm
    ? (s["order"] as number)
    : requireInteger(FN, "order", s["order"], { min: 1, max: LADDER_SYNTHESIS_MAX_ORDER });
  const form = s["form"] === undefined ? "series-first" : requireOneOf(FN, "form", s["form"], LADDER_FORMS);
  const sourceOhms = s["sourceOhms"] === undefined ? 1 : requireInRange(FN, "sourceOhms", s["sourceOhms"], { min: 1e-6, max: 1e9 });
  const rippleDb = family === "chebyshev1" ? (s["rippleDb"] as number) : 0;
  const cheb1Even = family === "chebyshev1" && order % 2 === 0;
  const loadOhms =
    s["loadOhms"] === undefined
      ? sourceOhms * (cheb1Even ? chebyshevEvenRatio(order, rippleDb, form) : 1)
      : requireInRange(FN, "loadOhms", s["loadOhms"], { min: 1e-6, max: 1e9 });
  const r = loadOhms / sourceOhms;
  if (!(r <= MAX_TERMINATION_RATIO && r >= 1 / MAX_TERMINATION_RATIO)) {
    throw new InvalidArgumentError({
      fn: FN,
      path: "loadOhms",
      received: loadOhms,
      message: `the load must lie within a factor of ${MAX_TERMINATION_RATIO} of sourceOhms (${sourceOhms})`,
    });
  }
  const target = targetOf(family, order, proto);
  const natural = form === "series-first" ? r >= 1 : r <= 1;
  if (!natural && order % 2 === 0) refuseSide(order, form, r);
  if (cheb1Even) requireChebyshevEvenLoad(order, rippleDb, form, r, loadOhms);
  const rNat = natural ? r : 1 / r;
  let arms: LadderElement[];
  if (useClosedForm) {
    arms = closedFormArms(order, family === "butterworth" ? null : epsOf(rippleDb), rNat, form);
  } else {
    arms = synthesisArms(target.zpk, rNat, form, s);
  }
  if (!natural) arms = reversedScaled(arms, r);
  const elements = arms.map((e) => Object.freeze(scaleElement(e, sourceOhms)));
  const transfer = freezeZpk(target.zpk.zeros, target.zpk.poles, (target.zpk.gain * (r / (1 + r))) / dcGain(target.zpk));
  if (!useClosedForm) selfCheck(elements, sourceOhms, loadOhms, transfer, order);
  const out: LadderPrototype = {
    family,
    order,
    form,
    elements: Object.freeze(elements),
    sourceOhms,
    loadOhms,
    transfer,
    ...(target.variant === undefined ? {} : { variant: target.variant }),
  };
  return Object.freeze(out);
}

function requireChebyshevEvenLoad(order: number, rippleDb: number, form: LadderForm, r: number, loadOhms: number): void {
  const limit = chebyshevEvenRatio(order, rippleDb, form);
  const ok = form === "series-first" ? r >= limit * (1 - 1e-12) : r <= limit * (1 + 1e-12);
  if (!ok) {
    throw new UnrealisableError({
      fn: FN,
      path: "loadOhms",
      received: loadOhms,
      message: `an even-order Chebyshev I ${form} ladder loses the ripple at DC, so the load/source ratio must be ${form === "series-first" ? "at least" : "at most"} ${limit} (the default); choose such a load, form "${other(form)}", or an odd order`,
    });
  }
}

function selfCheck(elements: readonly LadderElement[], sourceOhms: number, loadOhms: number, transfer: Zpk, order: number): void {
  const dev = ladderDeviationDb(elements, sourceOhms, loadOhms, transfer);
  if (!(dev <= SELF_CHECK_DB)) {
    throw new UnrealisableError({
      fn: FN,
      path: "order",
      received: order,
      message: `the synthesised ladder misses its transfer function by ${dev.toExponential(2)} dB (more than ${SELF_CHECK_DB} dB): the synthesis loses too many digits for this order and selectivity; lower the order, raise attenuationDb or raise rippleDb`,
    });
  }
}
