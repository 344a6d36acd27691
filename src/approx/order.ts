/**
 * Minimum order and natural frequency for a lowpass, highpass, bandpass or
 * bandstop specification, for every family; and the Bessel order for a
 * group-delay flatness requirement.
 *
 * Method: each specification is reduced to a lowpass prototype stopband ratio
 * Omega_s by the standard transforms (lowpass ws/wp, highpass wp/ws, bandpass
 * min |(ws^2 - wp1 wp2) / (ws (wp2 - wp1))|, bandstop the reciprocal), taking
 * the tighter stopband edge; for bandstop the passband edges are first moved
 * to geometric symmetry about the stopband (wp1 wp2 = ws1 ws2), which is the
 * optimum that scipy.signal's *ord functions seek numerically. Orders then
 * follow the closed forms: Butterworth n >= log10((10^(As/10) - 1) /
 * (10^(Ap/10) - 1)) / (2 log10 Omega_s); Chebyshev I/II n >= acosh(sqrt(...)) /
 * acosh(Omega_s); elliptic n >= K(k) K'(k1) / (K'(k) K(k1)) with k = 1/Omega_s,
 * k1 = sqrt((10^(Ap/10) - 1) / (10^(As/10) - 1)) (degree equation). Bessel and
 * Legendre, which have no closed form, are searched order by order on the
 * prototype magnitude. References: R. Schaumann and M. E. Van Valkenburg,
 * "Design of Analog Filters", Oxford University Press, 2001 (order formulas
 * and frequency transformations); H. J. Orchard and A. N. Willson Jr.,
 * "Elliptic functions for filter design", IEEE Trans. Circuits Syst. I
 * 44(4):273-287, 1997 (elliptic degree equation). Natural frequencies follow
 * scipy.signal.buttord/cheb1ord/cheb2ord/ellipord (analog=True).
 *
 * @module
 */
import { InvalidArgumentError, type Issue, SpecError, UnrealisableError } from "../errors.ts";
import { requireOptions, requirePositive } from "../validate.ts";
import { BESSEL_MAX_ORDER, BESSEL_NORMALIZATIONS, besselDelayGroupDelay, besselDelayMagnitude, besselScale } from "./bessel.ts";
import { EDGE_SEARCH } from "./internal.ts";
import { bracketRoot } from "../math/bracket.ts";
import { ellipticK, ellipticKp, modulusOf } from "./landen.ts";
import { legendreL } from "./legendre.ts";
import { familyMaxOrder, type PrototypeSpec } from "./prototype.ts";
import { FAMILY_NAMES, type BesselNormalization, type FamilyName } from "./types.ts";

/** The four responses {@link minimumOrder} handles. */
export type OrderResponse = "lowpass" | "highpass" | "bandpass" | "bandstop";

const RESPONSES: readonly OrderResponse[] = ["lowpass", "highpass", "bandpass", "bandstop"];

/** A specification for {@link minimumOrder}; frequencies are angular (rad/s). */
export interface MinimumOrderSpec {
  /** Approximation family. */
  readonly family: FamilyName;
  /** Response type. */
  readonly response: OrderResponse;
  /** Passband edge (lowpass, highpass) or edges `[low, high]` (bandpass, bandstop), rad/s. A one-element array is accepted for one edge. */
  readonly passbandW: number | readonly number[];
  /** Stopband edge or edges `[low, high]`, rad/s. */
  readonly stopbandW: number | readonly number[];
  /** Largest loss allowed across the passband, dB (greater than 0). */
  readonly passbandLossDb: number;
  /** Smallest attenuation required across the stopband, dB (greater than `passbandLossDb`). */
  readonly stopbandAttenuationDb: number;
  /**
   * Bessel only: the normalisation whose 1 rad/s `naturalW` refers to.
   * @defaultValue "phase"
   */
  readonly normalization?: BesselNormalization;
}

/** The result of {@link minimumOrder}. */
export interface MinimumOrderResult {
  /** The family. */
  readonly family: FamilyName;
  /** The response type. */
  readonly response: OrderResponse;
  /** Smallest order meeting the specification (may exceed `maxOrder`; see `beyondRange`). */
  readonly order: number;
  /**
   * Where 1 rad/s of the family's prototype goes (lowpass, highpass: one value;
   * bandpass, bandstop: the two band frequencies, ascending) so that the loss at
   * the passband edge is exactly `passbandLossDb`: the -3 dB frequency for
   * Butterworth and Legendre, the passband edge for Chebyshev I and elliptic,
   * the stopband edge for Chebyshev II (as scipy's `*ord` functions), and for
   * Bessel the frequency of 1 rad/s in the chosen normalisation.
   */
  readonly naturalW: number | readonly [number, number];
  /** True when `order` exceeds the family's supported range (`maxOrder`). */
  readonly beyondRange: boolean;
  /** Highest order the family's prototype function accepts. */
  readonly maxOrder: number;
  /** Lowpass-prototype stopband-to-passband frequency ratio after the band reduction. */
  readonly stopbandRatio: number;
  /** Passband edges used (bandstop: moved to geometric symmetry with the stopband, as scipy does). */
  readonly passbandW: number | readonly [number, number];
  /** Arguments for {@link prototype} that build the matching prototype. */
  readonly prototype: PrototypeSpec;
}

/**
 * How far the Bessel and Legendre order searches of {@link minimumOrder} go
 * before giving up. They evaluate the magnitude without roots, so they look
 * past the prototypes' own limits ({@link familyMaxOrder}) and report such an
 * order with `beyondRange: true`.
 */
export const ORDER_SEARCH_LIMIT: Readonly<Record<"bessel" | "legendre", number>> = Object.freeze({ bessel: 100, legendre: 60 });

/** A closed range of accepted numbers. */
export interface AcceptedRange {
  /** Smallest accepted value (for the stopband attenuation: exclusive). */
  readonly min: number;
  /** Largest accepted value. */
  readonly max: number;
}

/** The accepted ranges of {@link minimumOrder}'s numbers (see {@link ORDER_RANGES}). */
export interface OrderRanges {
  /** Every band edge, rad/s. */
  readonly edgeW: AcceptedRange;
  /** Smallest relative separation of two edges that must differ (high >= low * (1 + this)). */
  readonly edgeSeparation: number;
  /** `passbandLossDb`, dB. */
  readonly passbandLossDb: AcceptedRange;
  /** `stopbandAttenuationDb`, dB (above `min`, and above the passband loss). */
  readonly stopbandAttenuationDb: AcceptedRange;
}

/**
 * Accepted ranges of {@link minimumOrder}'s numbers. Edges: 1e-9 to 1e15
 * rad/s (products and squares of two edges stay far inside the double
 * range); two edges of a band, and a stopband edge and its passband edge,
 * at least a relative 1e-9 apart (closer than that the transition band
 * cannot be resolved in doubles). Passband loss: 1e-9 dB to 60 dB.
 * Stopband attenuation: up to 400 dB (10^40 in power, so the order formulas
 * stay finite). Chosen so every result is finite (common practice, no source).
 */
export const ORDER_RANGES: OrderRanges = Object.freeze({
  edgeW: Object.freeze({ min: 1e-9, max: 1e15 }),
  edgeSeparation: 1e-9,
  passbandLossDb: Object.freeze({ min: 1e-9, max: 60 }),
  stopbandAttenuationDb: Object.freeze({ min: 0, max: 400 }),
});

interface CheckedSpec {
  family: FamilyName;
  response: OrderResponse;
  wp: number[];
  ws: number[];
  gpass: number;
  gstop: number;
  norm: BesselNormalization;
}

/** Whether `hi` lies above `lo` by the smallest resolvable relative separation. */
function apart(lo: number, hi: number): boolean {
  return hi >= lo * (1 + ORDER_RANGES.edgeSeparation);
}

function edgeList(issues: Issue[], path: string, value: unknown, count: number): number[] {
  const arr = typeof value === "number" ? [value] : Array.isArray(value) ? (value as unknown[]) : null;
  if (arr === null || arr.length !== count) {
    issues.push({
      path,
      received: value,
      message: count === 1 ? "expected one edge frequency in rad/s (a number)" : "expected two edge frequencies [low, high] in rad/s",
    });
    return [];
  }
  const out: number[] = [];
  arr.forEach((x, i) => {
    const { min, max } = ORDER_RANGES.edgeW;
    if (typeof x !== "number" || !Number.isFinite(x) || x < min || x > max) {
      issues.push({ path: count === 1 && typeof value === "number" ? path : `${path}.${i}`, received: x, message: `expected a frequency from ${min} to ${max} rad/s` });
    } else out.push(x);
  });
  if (out.length === count && count === 2 && !(apart(out[0] as number, out[1] as number))) {
    issues.push({ path, received: value, message: `expected [low, high] with high above low by a relative ${ORDER_RANGES.edgeSeparation} at least` });
    return [];
  }
  return out.length === count ? out : [];
}

function checkSpec(spec: MinimumOrderSpec): CheckedSpec {
  const fn = "minimumOrder";
  const s = requireOptions(fn, "spec", spec);
  const issues: Issue[] = [];
  const family = s["family"] as FamilyName;
  if (!(FAMILY_NAMES as readonly unknown[]).includes(family)) {
    issues.push({ path: "family", received: s["family"], message: `expected one of ${FAMILY_NAMES.map((f) => `"${f}"`).join(", ")}` });
  }
  const response = s["response"] as OrderResponse;
  const okResponse = (RESPONSES as readonly unknown[]).includes(response);
  if (!okResponse) {
    issues.push({ path: "response", received: s["response"], message: `expected one of ${RESPONSES.map((f) => `"${f}"`).join(", ")}` });
  }
  const count = response === "bandpass" || response === "bandstop" ? 2 : 1;
  const wp = okResponse ? edgeList(issues, "passbandW", s["passbandW"], count) : [];
  const ws = okResponse ? edgeList(issues, "stopbandW", s["stopbandW"], count) : [];
  const gpass = s["passbandLossDb"];
  const gstop = s["stopbandAttenuationDb"];
  const lossRange = ORDER_RANGES.passbandLossDb;
  const attMax = ORDER_RANGES.stopbandAttenuationDb.max;
  const okPass = typeof gpass === "number" && Number.isFinite(gpass) && gpass >= lossRange.min && gpass <= lossRange.max;
  if (!okPass) issues.push({ path: "passbandLossDb", received: gpass, message: `expected a loss from ${lossRange.min} dB to ${lossRange.max} dB` });
  if (!(typeof gstop === "number" && Number.isFinite(gstop) && gstop > 0 && gstop <= attMax)) {
    issues.push({ path: "stopbandAttenuationDb", received: gstop, message: `expected an attenuation greater than 0 dB and at most ${attMax} dB` });
  } else if (okPass && !(gstop > (gpass as number))) {
    issues.push({
      path: "stopbandAttenuationDb",
      received: gstop,
      message: `the stopband attenuation must be greater than the passband loss (${gpass as number} dB)`,
    });
  }
  let norm: BesselNormalization = "phase";
  if (s["normalization"] !== undefined) {
    if ((BESSEL_NORMALIZATIONS as readonly unknown[]).includes(s["normalization"])) norm = s["normalization"] as BesselNormalization;
    else issues.push({ path: "normalization", received: s["normalization"], message: 'expected "delay", "magnitude" or "phase"' });
  }
  if (wp.length === count && ws.length === count && okResponse) {
    const [p0, p1] = wp as [number, number];
    const [s0, s1] = ws as [number, number];
    if (response === "lowpass" && !apart(p0, s0)) {
      issues.push({ path: "stopbandW", received: s["stopbandW"], message: `a lowpass stopband edge must lie above the passband edge (${p0} rad/s)` });
    } else if (response === "highpass" && !apart(s0, p0)) {
      issues.push({ path: "stopbandW", received: s["stopbandW"], message: `a highpass stopband edge must lie below the passband edge (${p0} rad/s)` });
    } else if (response === "bandpass" && !(apart(s0, p0) && apart(p1, s1))) {
      issues.push({ path: "stopbandW", received: s["stopbandW"], message: `a bandpass stopband [low, high] must enclose the passband [${p0}, ${p1}] rad/s` });
    } else if (response === "bandstop" && !(apart(p0, s0) && apart(s1, p1))) {
      issues.push({ path: "stopbandW", received: s["stopbandW"], message: `a bandstop stopband [low, high] must lie inside the passband edges [${p0}, ${p1}] rad/s` });
    }
  }
  if (issues.length > 0) throw new SpecError(fn, issues);
  return { family, response, wp, ws, gpass: gpass as number, gstop: gstop as number, norm };
}

/** Band reduction: the prototype stopband ratio and the passband edges actually used. */
function reduce(c: CheckedSpec): { nat: number; passb: number[] } {
  const [p0, p1] = c.wp as [number, number];
  const [s0, s1] = c.ws as [number, number];
  switch (c.response) {
    case "lowpass":
      return { nat: s0 / p0, passb: [p0] };
    case "highpass":
      return { nat: p0 / s0, passb: [p0] };
    case "bandpass": {
      const f = (s: number): number => Math.abs((s * s - p0 * p1) / (s * (p0 - p1)));
      return { nat: Math.min(f(s0), f(s1)), passb: [p0, p1] };
    }
    case "bandstop": {
      // Move one passband edge inwards to geometric symmetry with the stopband (never past it).
      let a = p0;
      let b = p1;
      if (a * b < s0 * s1) a = Math.min((s0 * s1) / b, s0);
      else if (a * b > s0 * s1) b = Math.max((s0 * s1) / a, s1);
      const f = (s: number): number => Math.abs((s * (a - b)) / (s * s - a * b));
      return { nat: Math.min(f(s0), f(s1)), passb: [a, b] };
    }
  }
}

const pow10m1 = (x: number): number => Math.expm1(x * Math.LN10);

/** Prototype frequency (in the family's units) where the loss equals gpass, at order n. */
function passbandEdgeOf(c: CheckedSpec, n: number): number {
  const GPASS = 10 ** (0.1 * c.gpass);
  const GSTOP = 10 ** (0.1 * c.gstop);
  switch (c.family) {
    case "butterworth":
      return 1 / (GPASS - 1) ** (-1 / (2 * n));
    case "chebyshev1":
    case "elliptic":
      return 1;
    case "chebyshev2":
      return 1 / Math.cosh(Math.acosh(Math.sqrt((GSTOP - 1) / (GPASS - 1))) / n);
    case "bessel": {
      const target = 10 ** (-c.gpass / 20);
      const f = (w: number): number => Math.log(besselDelayMagnitude(n, w) / target);
      let hi = 2 + Math.sqrt(n);
      while (f(hi) > 0) hi *= 2;
      return bracketRoot(f, 0, hi, EDGE_SEARCH) / besselScale(n, c.norm);
    }
    case "legendre": {
      const target = pow10m1(0.1 * c.gpass);
      const f = (w: number): number => legendreL(n, w * w) - target;
      let hi = 2;
      while (f(hi) < 0) hi *= 2;
      return bracketRoot(f, 0, hi, EDGE_SEARCH);
    }
  }
}

/** Does order n of a searched family meet the spec at prototype ratio nat? */
function searchedMeets(c: CheckedSpec, n: number, nat: number): boolean {
  if (c.family === "bessel") {
    const target = 10 ** (-c.gpass / 20);
    const f = (w: number): number => Math.log(besselDelayMagnitude(n, w) / target);
    let hi = 2 + Math.sqrt(n);
    while (f(hi) > 0) hi *= 2;
    const wpDelay = bracketRoot(f, 0, hi, EDGE_SEARCH);
    return -20 * Math.log10(besselDelayMagnitude(n, nat * wpDelay)) >= c.gstop;
  }
  const wp = passbandEdgeOf(c, n);
  return 10 * Math.log10(1 + legendreL(n, (nat * wp) ** 2)) >= c.gstop;
}

function orderFor(c: CheckedSpec, nat: number): number {
  const GPASS = 10 ** (0.1 * Math.abs(c.gpass));
  const GSTOP = 10 ** (0.1 * Math.abs(c.gstop));
  switch (c.family) {
    case "butterworth":
      return Math.ceil(Math.log10((GSTOP - 1) / (GPASS - 1)) / (2 * Math.log10(nat)));
    case "chebyshev1":
    case "chebyshev2":
      return Math.ceil(Math.acosh(Math.sqrt((GSTOP - 1) / (GPASS - 1))) / Math.acosh(nat));
    case "elliptic": {
      const m = modulusOf(1 / nat);
      const m1 = modulusOf(Math.sqrt(pow10m1(0.1 * c.gpass) / pow10m1(0.1 * c.gstop)));
      return Math.ceil((ellipticK(m) * ellipticKp(m1)) / (ellipticKp(m) * ellipticK(m1)));
    }
    case "bessel":
    case "legendre": {
      const limit = ORDER_SEARCH_LIMIT[c.family];
      for (let n = 1; n <= limit; n++) if (searchedMeets(c, n, nat)) return n;
      throw new UnrealisableError({
        fn: "minimumOrder",
        path: "stopbandAttenuationDb",
        received: c.gstop,
        message:
          c.family === "bessel"
            ? `no Bessel order up to ${limit} meets this transition band (the Bessel response tends to a Gaussian, so the loss ratio between two frequencies approaches the square of their ratio at high order); widen the transition band, lower the attenuation or choose another family`
            : `no Legendre order up to ${limit} meets this transition band; widen it, lower the attenuation or choose another family`,
      });
    }
  }
}

/** Map the prototype passband-loss frequency back to the natural frequency (frequencies) of the response. */
function naturalFrequency(c: CheckedSpec, passb: number[], wpProto: number): number | [number, number] {
  const [p0, p1] = passb as [number, number];
  switch (c.response) {
    case "lowpass":
      return p0 / wpProto;
    case "highpass":
      return p0 * wpProto;
    case "bandpass":
    case "bandstop": {
      const bw = c.response === "bandpass" ? (p1 - p0) / wpProto : (p1 - p0) * wpProto;
      const r = Math.sqrt((bw * bw) / 4 + p0 * p1);
      return [r - bw / 2, r + bw / 2];
    }
  }
}

/**
 * Smallest order of a family that meets a lowpass, highpass, bandpass or
 * bandstop specification, and the natural frequency that puts the loss at
 * the passband edge exactly at `passbandLossDb` (the semantics of
 * scipy.signal.buttord, cheb1ord, cheb2ord and ellipord with analog=True;
 * Bessel and Legendre by search on the prototype magnitude). A valid
 * specification whose order exceeds the family's range is still answered,
 * with `beyondRange: true`.
 *
 * @param spec - family, response, edges (rad/s), passband loss and stopband attenuation (dB)
 * @returns order, natural frequency (frequencies), range flag and the prototype arguments
 * @throws {@link SpecError} listing every problem (path per field): unknown family or response,
 *   wrong number of edges, a number outside its range ({@link ORDER_RANGES}: edges 1e-9 to 1e15 rad/s and a
 *   relative 1e-9 apart, loss 1e-9 to 60 dB, attenuation up to 400 dB), stopband inside the passband,
 *   attenuation not above the loss
 * @throws {@link UnrealisableError} when a Bessel or Legendre search passes {@link ORDER_SEARCH_LIMIT}
 * @example
 * ```ts
 * minimumOrder({ family: "butterworth", response: "lowpass", passbandW: 1000, stopbandW: 3000,
 *   passbandLossDb: 1, stopbandAttenuationDb: 40 });
 * //=> { family: "butterworth", response: "lowpass", order: 5, naturalW: 1144.6758819614981,
 * //     beyondRange: false, maxOrder: 64, stopbandRatio: 3, passbandW: 1000,
 * //     prototype: { family: "butterworth", order: 5 } }
 * ```
 */
export function minimumOrder(spec: MinimumOrderSpec): MinimumOrderResult {
  const c = checkSpec(spec);
  const { nat, passb } = reduce(c);
  if (!(nat > 1 && Number.isFinite(nat))) {
    throw new SpecError("minimumOrder", [
      { path: "stopbandW", received: spec.stopbandW, message: `the band reduction gives a stopband ratio of ${nat}, which cannot be resolved in doubles; move the stopband edges further from the passband edges` },
    ]);
  }
  const order = Math.max(1, orderFor(c, nat));
  const maxOrder = familyMaxOrder(c.family);
  const wpProto = passbandEdgeOf(c, order);
  const nw = naturalFrequency(c, passb, wpProto);
  const proto: PrototypeSpec =
    c.family === "chebyshev1"
      ? { family: c.family, order, rippleDb: c.gpass }
      : c.family === "chebyshev2"
        ? { family: c.family, order, attenuationDb: c.gstop }
        : c.family === "elliptic"
          ? { family: c.family, order, rippleDb: c.gpass, attenuationDb: c.gstop }
          : c.family === "bessel"
            ? { family: c.family, order, normalization: c.norm }
            : { family: c.family, order };
  return Object.freeze({
    family: c.family,
    response: c.response,
    order,
    naturalW: typeof nw === "number" ? nw : (Object.freeze(nw) as readonly [number, number]),
    beyondRange: order > maxOrder,
    maxOrder,
    stopbandRatio: nat,
    passbandW: passb.length === 1 ? (passb[0] as number) : (Object.freeze([passb[0], passb[1]]) as readonly [number, number]),
    prototype: Object.freeze(proto),
  });
}

/**
 * How far {@link besselOrderForDelay} searches. The group delay comes from
 * the polynomial recurrence, without roots, so the search is not bound by the
 * prototype's {@link BESSEL_MAX_ORDER}; orders beyond it are answered with
 * `beyondRange: true`.
 */
const BESSEL_DELAY_SEARCH_LIMIT = 200;

/** Arguments of {@link besselOrderForDelay}. */
export interface BesselDelaySpec {
  /** Largest allowed deviation of the group delay from its DC value, percent (greater than 0, below 100). */
  readonly maxDelayErrorPercent: number;
  /**
   * Highest frequency (rad/s) up to which the delay must stay within the limit.
   * Without `delaySeconds` it is in units of the delay-normalised prototype
   * (DC delay 1 s); with it, in rad/s of the real filter.
   */
  readonly upToW: number;
  /**
   * DC group delay of the real filter in seconds; the normalised frequency is then `upToW * delaySeconds`.
   * @defaultValue 1
   */
  readonly delaySeconds?: number;
}

/** The result of {@link besselOrderForDelay}. */
export interface BesselDelayResult {
  /** Smallest Bessel order whose delay error stays within the limit up to `upToW`. */
  readonly order: number;
  /** Delay error (percent of the DC delay) reached at `upToW` by that order. */
  readonly delayErrorPercent: number;
  /** True when `order` exceeds the Bessel prototype range. */
  readonly beyondRange: boolean;
  /** Highest order {@link bessel} accepts ({@link BESSEL_MAX_ORDER}). */
  readonly maxOrder: number;
}

/**
 * Smallest Bessel-Thomson order whose group delay stays within
 * `maxDelayErrorPercent` of its DC value from DC up to `upToW` (the delay of
 * a Bessel filter falls monotonically with frequency; it is checked on 64
 * points across the band). Evaluated without roots, by the Bessel polynomial
 * recurrence, so orders past {@link BESSEL_MAX_ORDER} are answered too
 * (`beyondRange: true`), up to the search limit of order 200.
 *
 * @param spec - delay error limit, band edge and optional DC delay
 * @returns the order and the error it reaches at the band edge
 * @throws {@link InvalidArgumentError} when a number is missing, non-positive, or the error is 100 % or more
 * @throws {@link UnrealisableError} when more than order 200 would be needed
 * @example
 * ```ts
 * besselOrderForDelay({ maxDelayErrorPercent: 1, upToW: 2 });
 * //=> { order: 5, delayErrorPercent: 0.0723292052475566, beyondRange: false, maxOrder: 30 }
 * ```
 */
export function besselOrderForDelay(spec: BesselDelaySpec): BesselDelayResult {
  const fn = "besselOrderForDelay";
  const s = requireOptions(fn, "spec", spec);
  const pct = requirePositive(fn, "maxDelayErrorPercent", s["maxDelayErrorPercent"]);
  if (pct >= 100) {
    throw new InvalidArgumentError({ fn, path: "maxDelayErrorPercent", received: pct, message: "expected a percentage below 100" });
  }
  const up = requirePositive(fn, "upToW", s["upToW"]);
  const delay = s["delaySeconds"] === undefined ? 1 : requirePositive(fn, "delaySeconds", s["delaySeconds"]);
  const wn = up * delay;
  for (let n = 1; n <= BESSEL_DELAY_SEARCH_LIMIT; n++) {
    let worst = 0;
    for (let i = 1; i <= 64; i++) {
      const e = Math.abs(1 - besselDelayGroupDelay(n, (wn * i) / 64)) * 100;
      if (e > worst) worst = e;
      if (worst > pct) break;
    }
    if (worst <= pct) {
      const atEdge = Math.abs(1 - besselDelayGroupDelay(n, wn)) * 100;
      return Object.freeze({ order: n, delayErrorPercent: atEdge, beyondRange: n > BESSEL_MAX_ORDER, maxOrder: BESSEL_MAX_ORDER });
    }
  }
  throw new UnrealisableError({
    fn,
    path: "upToW",
    received: up,
    message: `a Bessel filter would need more than order ${BESSEL_DELAY_SEARCH_LIMIT} to keep the delay within ${pct} % that far; lower upToW or allow more error`,
  });
}
