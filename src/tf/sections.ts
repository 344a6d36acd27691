/**
 * Factor a zpk transfer function into first- and second-order sections, and
 * back.
 *
 * Pairing follows the usual cascade-design rule: conjugate poles form
 * second-order denominators; pole pairs are visited in order of decreasing Q
 * and each takes the nearest remaining complex zero pair (zero/pole proximity
 * keeps each section's peak gain low; G. S. Moschytz and P. Horn, "Active
 * Filter Design Handbook", Wiley 1981, ch. 1; E. Lueder, "A decomposition of a
 * transfer function minimizing distortion and inband losses", Bell Syst. Tech.
 * J. 49(3):455-469, 1970). Real zeros go to the nearest real pole, zeros at
 * the origin are spread one per second-order section first (bandpass) and
 * then a second one each (highpass), then to first-order sections. Real poles
 * stay first-order unless a zero pair needs a second-order denominator.
 *
 * The band split (`zerosAtOrigin: "band-split"`) pairs the origin zeros the
 * other way: as many as each section takes (two for a second-order one, one
 * for a first-order one) in order of increasing pole frequency, so a bandpass made from an all-pole lowpass becomes highpass
 * sections on the lower band edge's poles and lowpass sections on the upper
 * edge's (with one bandpass section in the middle when the count is odd). The
 * product is the same transfer function; what changes is which circuits can
 * build it (a wide band's sections then have the low Q of the edge poles, and
 * one-op-amp lowpass and highpass stages build them; common practice, no
 * source).
 *
 * Each section is normalised to unit "natural" gain (lowpass: DC gain 1,
 * highpass: HF gain 1, bandpass: gain 1 at w0, lowpass-notch: DC gain 1,
 * highpass-notch and symmetric notch: HF gain 1, allpass: magnitude 1,
 * general: monic numerator); the remaining constant goes into the cascade gain.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import type { Complex } from "../math/complex.ts";
import { nearestConjugate } from "../math/check.ts";
import { requireOptions } from "../validate.ts";
import { requireCascade, requireProperStable, requireSection, requireZpk } from "./check.ts";
import type { FirstOrderSection, NotchType, SecondOrderSection, Section, SectionCascade, SectionKind, Zpk } from "./types.ts";

/** Order in which {@link toSections} lists the sections. */
export type SectionOrdering = "ascending-q" | "descending-q" | "as-given";

/** Options of {@link toSections}. */
export interface ToSectionsOptions {
  /**
   * Section order in the cascade: `"ascending-q"` (first-order sections, then
   * second-order by increasing Q, ties by increasing w0), `"descending-q"`
   * (the reverse), or `"as-given"` (order of the poles in `zpk.poles`).
   * @defaultValue "ascending-q"
   */
  readonly order?: SectionOrdering;
  /**
   * How zeros at the origin are shared among the second-order sections:
   * `"spread"` (one per section first, giving bandpass sections) or
   * `"band-split"` (two per section, lowest pole frequency first, giving
   * highpass sections below and lowpass sections above; see the module header).
   * @defaultValue "spread"
   */
  readonly zerosAtOrigin?: OriginZeroSharing;
}

/** How {@link toSections} shares zeros at the origin among second-order sections. */
export type OriginZeroSharing = "spread" | "band-split";

/** Largest root magnitude (rad/s) that {@link toSections} accepts: section coefficients hold w0^2, which must not overflow. */
export const MAX_SECTION_FREQUENCY = 1e150;

/** Smallest pole magnitude (rad/s) that {@link toSections} accepts: a section's w0^2 and the gain's 1/w0^2 factor must not underflow or overflow. */
export const MIN_SECTION_FREQUENCY = 1e-150;

/** Relative tolerance for classifying zeros (on the jw axis, at a pole mirror, symmetric notch). */
const CLASSIFY_TOL = 1e-9;

interface Slot {
  /** Poles of the slot: one real pole or two (a conjugate pair or two real poles). */
  readonly poles: Complex[];
  /** Zeros assigned so far. */
  readonly zeros: Complex[];
  /** Index of the first pole in the input, for "as-given" ordering. */
  readonly firstIndex: number;
}

function capacity(slot: Slot): number {
  return slot.poles.length - slot.zeros.length;
}

function dist(a: Complex, b: Complex): number {
  return Math.hypot(a.re - b.re, a.im - b.im);
}

/** A real value or the upper member (im > 0) of a conjugate pair, with its input index. */
export interface PairRepresentative {
  /** The real value as given, or the pair's mean upper member. */
  readonly v: Complex;
  /** The smaller input index of the value or pair. */
  readonly i: number;
  /** True for a real value, false for a conjugate pair. */
  readonly real: boolean;
}

/**
 * Real values and the upper members of conjugate pairs, in input order
 * (conjugate-closed input assumed: each non-real value is matched with its
 * nearest unused conjugate, and the pair is represented by their mean).
 */
export function pairRepresentatives(values: readonly Complex[]): PairRepresentative[] {
  const out: PairRepresentative[] = [];
  const used = new Uint8Array(values.length);
  values.forEach((v, i) => {
    if (used[i] === 1) return;
    used[i] = 1;
    if (v.im === 0) {
      out.push({ v, i, real: true });
      return;
    }
    // the conjugate partner (validated to exist)
    const best = nearestConjugate(values, v, used).index;
    used[best] = 1;
    const u = values[best] as Complex;
    out.push({ v: { re: (v.re + u.re) / 2, im: (Math.abs(v.im) + Math.abs(u.im)) / 2 }, i: Math.min(i, best), real: false });
  });
  return out;
}

/** Split into real values and the upper members (im > 0) of conjugate pairs, keeping input indices. */
function splitPairs(values: readonly Complex[]): { real: { v: Complex; i: number }[]; upper: { v: Complex; i: number }[] } {
  const real: { v: Complex; i: number }[] = [];
  const upper: { v: Complex; i: number }[] = [];
  for (const r of pairRepresentatives(values)) (r.real ? real : upper).push({ v: r.v, i: r.i });
  return { real, upper };
}

/** Denominator coefficients [1, a1, a0] of a slot's poles. */
function slotDen(poles: readonly Complex[]): { a1: number; a0: number } {
  if (poles.length === 1) return { a1: 1, a0: -(poles[0] as Complex).re };
  const p = poles[0] as Complex;
  const q = poles[1] as Complex;
  if (p.im !== 0) return { a1: -2 * p.re, a0: p.re * p.re + p.im * p.im };
  return { a1: -(p.re + q.re), a0: p.re * q.re };
}

function close(a: number, b: number, scale: number): boolean {
  return Math.abs(a - b) <= CLASSIFY_TOL * scale;
}

/** Make one section and its leftover gain factor from a slot. */
function buildSection(slot: Slot): { section: Section; factor: number } {
  const zs = slot.zeros;
  if (slot.poles.length === 1) {
    const w0 = -(slot.poles[0] as Complex).re;
    const den: [number, number, number] = [0, 1, w0];
    if (zs.length === 0) {
      const s: FirstOrderSection = { order: 1, num: [0, 0, w0], den, w0, kind: "lowpass" };
      return { section: s, factor: 1 / w0 };
    }
    const z = (zs[0] as Complex).re;
    let kind: FirstOrderSection["kind"] = "general";
    if (z === 0) kind = "highpass";
    else if (close(z, w0, w0)) kind = "allpass";
    const b0 = kind === "highpass" ? 0 : kind === "allpass" ? -w0 : -z;
    return { section: { order: 1, num: [0, 1, b0], den, w0, kind }, factor: 1 };
  }
  const { a1, a0 } = slotDen(slot.poles);
  const w0 = Math.sqrt(a0);
  const q = w0 / a1;
  const den: [number, number, number] = [1, a1, a0];
  const base = { order: 2 as const, den, w0, q };
  if (zs.length === 0) {
    const s: SecondOrderSection = { ...base, num: [0, 0, a0], kind: "lowpass" };
    return { section: s, factor: 1 / a0 };
  }
  if (zs.length === 1) {
    const z = (zs[0] as Complex).re;
    if (z === 0) {
      const s: SecondOrderSection = { ...base, num: [0, a1, 0], kind: "bandpass" };
      return { section: s, factor: 1 / a1 };
    }
    return { section: { ...base, num: [0, 1, -z], kind: "general" }, factor: 1 };
  }
  const z1 = zs[0] as Complex;
  const z2 = zs[1] as Complex;
  let c1: number;
  let c0: number;
  if (z1.im !== 0) {
    c1 = -2 * z1.re;
    c0 = z1.re * z1.re + z1.im * z1.im;
  } else {
    c1 = -(z1.re + z2.re);
    c0 = z1.re * z2.re;
  }
  if (z1.re === 0 && z1.im === 0 && z2.re === 0 && z2.im === 0) {
    return { section: { ...base, num: [1, 0, 0], kind: "highpass" }, factor: 1 };
  }
  if (z1.im !== 0 && z1.re === 0) {
    const wz = Math.abs(z1.im);
    const notchType: NotchType = close(wz, w0, w0) ? "symmetric" : wz > w0 ? "lowpass-notch" : "highpass-notch";
    if (notchType === "lowpass-notch") {
      const k = a0 / (wz * wz);
      return { section: { ...base, num: [k, 0, a0], kind: "notch", wz, notchType }, factor: 1 / k };
    }
    return { section: { ...base, num: [1, 0, wz * wz], kind: "notch", wz, notchType }, factor: 1 };
  }
  if (close(c1, -a1, Math.abs(a1)) && close(c0, a0, a0)) {
    return { section: { ...base, num: [1, -a1, a0], kind: "allpass" }, factor: 1 };
  }
  const kind: SectionKind = "general";
  return { section: { ...base, num: [1, c1, c0], kind }, factor: 1 };
}

/** Cascade from a validated zpk (internal core). */
export function toSectionsUnchecked(system: Zpk, ordering: SectionOrdering, zerosAtOrigin: OriginZeroSharing = "spread"): SectionCascade {
  // Snap near-axis zeros onto the jw axis and near-real values onto the real axis.
  const zerosIn = system.zeros.map((z) => {
    const m = Math.hypot(z.re, z.im);
    if (z.im !== 0 && Math.abs(z.re) <= CLASSIFY_TOL * m) return { re: 0, im: z.im };
    return z;
  });
  const poles = splitPairs(system.poles);
  const zeros = splitPairs(zerosIn);

  const pairSlots: Slot[] = poles.upper.map(({ v, i }) => ({ poles: [v, { re: v.re, im: -v.im }], zeros: [], firstIndex: i }));
  let realPoles = poles.real.map(({ v, i }) => ({ v, i }));
  const slots: Slot[] = [...pairSlots];

  // (a) complex zero pairs: pole pairs by decreasing Q take the nearest zero pair.
  const zeroPairs = zeros.upper.map(({ v }) => v);
  const takenZ = new Uint8Array(zeroPairs.length);
  const byQ = [...pairSlots].sort((x, y) => {
    const a = slotDen(x.poles);
    const b = slotDen(y.poles);
    return Math.sqrt(b.a0) / b.a1 - Math.sqrt(a.a0) / a.a1;
  });
  for (const slot of byQ) {
    let best = -1;
    let bestD = Infinity;
    zeroPairs.forEach((z, j) => {
      if (takenZ[j] === 1) return;
      const d = dist(z, slot.poles[0] as Complex);
      if (d < bestD) {
        bestD = d;
        best = j;
      }
    });
    if (best < 0) break;
    takenZ[best] = 1;
    const z = zeroPairs[best] as Complex;
    slot.zeros.push(z, { re: z.re, im: -z.im });
  }
  // Leftover zero pairs get a second-order denominator made of the two nearest real poles.
  zeroPairs.forEach((z, j) => {
    if (takenZ[j] === 1) return;
    realPoles.sort((a, b) => dist(a.v, z) - dist(b.v, z));
    const [p1, p2] = realPoles;
    if (p1 === undefined || p2 === undefined) return; // cannot happen for proper systems (checked by caller)
    realPoles = realPoles.slice(2);
    slots.push({ poles: [p1.v, p2.v], zeros: [z, { re: z.re, im: -z.im }], firstIndex: Math.min(p1.i, p2.i) });
  });
  const firstSlots: Slot[] = realPoles.map(({ v, i }) => ({ poles: [v], zeros: [], firstIndex: i }));
  slots.push(...firstSlots);

  // (b) real non-zero zeros: nearest real pole with room, else the nearest slot with room.
  const origin = zeros.real.filter(({ v }) => v.re === 0).length;
  for (const { v } of zeros.real) {
    if (v.re === 0) continue;
    let best: Slot | undefined;
    let bestD = Infinity;
    for (const slot of firstSlots) {
      if (capacity(slot) < 1) continue;
      const d = dist(v, slot.poles[0] as Complex);
      if (d < bestD) {
        bestD = d;
        best = slot;
      }
    }
    if (best === undefined) {
      for (const slot of slots) {
        if (capacity(slot) < 1) continue;
        const d = dist(v, slot.poles[0] as Complex);
        if (d < bestD) {
          bestD = d;
          best = slot;
        }
      }
    }
    best?.zeros.push(v);
  }

  // (c) zeros at the origin: one per second-order slot, then a second one, then
  // first-order slots; for the band split, two per slot by increasing w0.
  let left = origin;
  const second = slots.filter((s) => s.poles.length === 2);
  if (zerosAtOrigin === "band-split") {
    // every slot by its pole frequency (a first-order slot's is |p|), lowest first, filled to capacity
    const w2 = (x: Slot): number => (x.poles.length === 2 ? slotDen(x.poles).a0 : (x.poles[0] as Complex).re ** 2);
    for (const slot of [...slots].sort((x, y) => w2(x) - w2(y))) {
      while (left > 0 && capacity(slot) >= 1) {
        slot.zeros.push({ re: 0, im: 0 });
        left--;
      }
    }
  }
  for (const pass of [2, 1]) {
    for (const slot of second) {
      if (left > 0 && capacity(slot) >= pass) {
        slot.zeros.push({ re: 0, im: 0 });
        left--;
      }
    }
  }
  for (const slot of slots) {
    if (left > 0 && slot.poles.length === 1 && capacity(slot) >= 1) {
      slot.zeros.push({ re: 0, im: 0 });
      left--;
    }
  }

  let gain = system.gain;
  const built = slots.map((slot) => {
    const { section, factor } = buildSection(slot);
    gain *= factor;
    return { section, firstIndex: slot.firstIndex };
  });
  const qOf = (s: Section): number => (s.order === 1 ? -Infinity : s.q);
  if (ordering === "as-given") built.sort((a, b) => a.firstIndex - b.firstIndex);
  else {
    built.sort((a, b) => qOf(a.section) - qOf(b.section) || a.section.w0 - b.section.w0 || a.firstIndex - b.firstIndex);
    if (ordering === "descending-q") built.reverse();
  }
  return Object.freeze({
    sections: Object.freeze(built.map(({ section }) => freezeSection(section))),
    gain,
  });
}

/**
 * Factor a zpk transfer function into a cascade of first- and second-order
 * sections (see the module header for the pairing rule and the gain
 * normalisation). Near-axis zeros (|Re| <= 1e-9 |z|) are treated as lying on
 * the jw axis and give `notch` sections with `wz` and `notchType`.
 *
 * @param system - transfer function with poles in the open left half-plane
 *   and no more zeros than poles
 * @param options - section ordering and the sharing of zeros at the origin
 * @returns the cascade; `evalCascade(result, s)` equals `evalZpk(system, s)`
 * @throws {@link InvalidArgumentError} when the zpk is malformed, has more zeros than poles, a pole not in the open left half-plane, a root beyond {@link MAX_SECTION_FREQUENCY} or a pole below {@link MIN_SECTION_FREQUENCY}, a cascade gain that leaves the double range, or an unknown ordering
 * @example
 * ```ts
 * // 2nd-order Butterworth lowpass at 1 rad/s with a DC gain of 2
 * const c = toSections(zpk([], [{ re: -Math.SQRT1_2, im: Math.SQRT1_2 }, { re: -Math.SQRT1_2, im: -Math.SQRT1_2 }], 2));
 * c.sections[0].kind; //=> "lowpass"
 * c.sections[0].q;    //=> 0.7071067811865475
 * c.gain;             //=> 1.9999999999999996 (2 up to rounding of w0^2)
 * ```
 */
export function toSections(system: Zpk, options?: ToSectionsOptions): SectionCascade {
  const fn = "toSections";
  requireZpk(fn, "system", system);
  const opts = requireOptions(fn, "options", options);
  let ordering: SectionOrdering = "ascending-q";
  if (opts["order"] !== undefined) {
    const o = opts["order"];
    if (o !== "ascending-q" && o !== "descending-q" && o !== "as-given") {
      throw new InvalidArgumentError({
        fn,
        path: "options.order",
        received: o,
        message: 'expected "ascending-q", "descending-q" or "as-given"',
      });
    }
    ordering = o;
  }
  const sharing = opts["zerosAtOrigin"] ?? "spread";
  if (sharing !== "spread" && sharing !== "band-split") {
    throw new InvalidArgumentError({ fn, path: "options.zerosAtOrigin", received: sharing, message: 'expected "spread" or "band-split"' });
  }
  requireProperStable(fn, system, {
    improper: "cannot be split into sections; give no more zeros than poles",
    unstable: "section poles must lie in the open left half-plane (Re < 0)",
  });
  for (const [list, name] of [
    [system.poles, "poles"],
    [system.zeros, "zeros"],
  ] as const) {
    list.forEach((r, i) => {
      const m = Math.hypot(r.re, r.im);
      if (m > MAX_SECTION_FREQUENCY || (name === "poles" && m < MIN_SECTION_FREQUENCY)) {
        throw new InvalidArgumentError({
          fn,
          path: `system.${name}[${i}]`,
          received: r,
          message: `section coefficients hold w0^2, so roots must be at most ${MAX_SECTION_FREQUENCY} rad/s in magnitude, and poles at least ${MIN_SECTION_FREQUENCY} rad/s`,
        });
      }
    });
  }
  const cascade = toSectionsUnchecked(system, ordering, sharing);
  if (!Number.isFinite(cascade.gain) || (cascade.gain === 0) !== (system.gain === 0) || !cascade.sections.every(finiteSection)) {
    throw new InvalidArgumentError({
      fn,
      path: "system",
      received: cascade.gain,
      message: "the cascade's gain (the zpk gain times each section's normalisation, such as 1/w0^2 for a lowpass section) leaves the double range; scale the frequencies towards 1 rad/s first",
    });
  }
  return cascade;
}

/** Freeze a section and its coefficient arrays (a cascade from {@link toSections} is frozen all through). */
function freezeSection(s: Section): Section {
  Object.freeze(s.num);
  Object.freeze(s.den);
  return Object.freeze(s);
}

/** Whether every number of a section is finite. */
function finiteSection(s: Section): boolean {
  const nums = [...s.num, ...s.den, s.w0, ...(s.order === 2 ? [s.q] : []), ...("wz" in s && s.wz !== undefined ? [s.wz] : [])];
  return nums.every(Number.isFinite);
}

/** Roots of b2 s^2 + b1 s + b0 (degree taken from the leading non-zero coefficient), stable formula. */
function quadRoots(b2: number, b1: number, b0: number): Complex[] {
  if (b2 === 0) {
    if (b1 === 0) return [];
    return [{ re: -b0 / b1, im: 0 }];
  }
  const h = b1 / (2 * b2);
  const c = b0 / b2;
  const disc = h * h - c;
  if (disc < 0) {
    const im = Math.sqrt(-disc);
    return [
      { re: -h, im },
      { re: -h, im: -im },
    ];
  }
  if (c === 0) return [{ re: 0, im: 0 }, { re: -2 * h, im: 0 }];
  const r1 = -(h + (h >= 0 ? 1 : -1) * Math.sqrt(disc));
  return [
    { re: r1, im: 0 },
    { re: c / r1, im: 0 },
  ];
}

/** Zpk from a validated cascade (internal core). */
export function fromSectionsUnchecked(cascade: SectionCascade): Zpk {
  const zeros: Complex[] = [];
  const poles: Complex[] = [];
  let gain = cascade.gain;
  for (const s of cascade.sections) {
    const [b2, b1, b0] = s.num;
    const [a2, a1, a0] = s.den;
    zeros.push(...quadRoots(b2, b1, b0));
    poles.push(...quadRoots(a2, a1, a0));
    gain *= b2 !== 0 ? b2 : b1 !== 0 ? b1 : b0;
  }
  return Object.freeze({ zeros: Object.freeze(zeros), poles: Object.freeze(poles), gain });
}

/**
 * Recombine a cascade into one zpk transfer function (the inverse of
 * {@link toSections} up to the order of zeros and poles).
 *
 * @param cascade - the cascade
 * @returns the zpk with all section zeros and poles and the overall gain
 * @throws {@link InvalidArgumentError} when the cascade is malformed
 * @example
 * ```ts
 * fromSections({ gain: 1, sections: [{ order: 1, num: [0, 0, 2], den: [0, 1, 2], w0: 2, kind: "lowpass" }] });
 * //=> { zeros: [], poles: [{ re: -2, im: 0 }], gain: 2 }
 * ```
 */
export function fromSections(cascade: SectionCascade): Zpk {
  requireCascade("fromSections", "cascade", cascade);
  return fromSectionsUnchecked(cascade);
}

/** Section value at s, no checks (internal core). */
export function evalSectionUnchecked(section: Section, sr: number, si: number): Complex {
  const [b2, b1, b0] = section.num;
  const [a2, a1, a0] = section.den;
  // Horner on both
  const s2r = sr * sr - si * si;
  const s2i = 2 * sr * si;
  const nr = b2 * s2r + b1 * sr + b0;
  const ni = b2 * s2i + b1 * si;
  const dr = a2 * s2r + a1 * sr + a0;
  const di = a2 * s2i + a1 * si;
  if (Math.abs(dr) >= Math.abs(di)) {
    const r = di / dr;
    const d = dr + di * r;
    return { re: (nr + ni * r) / d, im: (ni - nr * r) / d };
  }
  const r = dr / di;
  const d = dr * r + di;
  return { re: (nr * r + ni) / d, im: (ni * r - nr) / d };
}

/**
 * Value of one section `(b2 s^2 + b1 s + b0) / (a2 s^2 + a1 s + a0)` at a complex frequency.
 *
 * @param section - the section
 * @param s - complex frequency (rad/s)
 * @returns the section's value at s
 * @throws {@link InvalidArgumentError} when the section or s is malformed
 * @example
 * ```ts
 * evalSection({ order: 1, num: [0, 0, 1], den: [0, 1, 1], w0: 1, kind: "lowpass" }, { re: 0, im: 1 });
 * //=> { re: 0.5, im: -0.5 }
 * ```
 */
export function evalSection(section: Section, s: Complex): Complex {
  requireSection("evalSection", "section", section);
  if (typeof s !== "object" || s === null || !Number.isFinite(s.re) || !Number.isFinite(s.im)) {
    throw new InvalidArgumentError({ fn: "evalSection", path: "s", received: s, message: "expected a complex value { re, im } with finite parts" });
  }
  return evalSectionUnchecked(section, s.re, s.im);
}

/** Cascade value at s, no checks (internal core). */
export function evalCascadeUnchecked(cascade: SectionCascade, sr: number, si: number): Complex {
  let re = cascade.gain;
  let im = 0;
  for (const sec of cascade.sections) {
    const v = evalSectionUnchecked(sec, sr, si);
    const t = re * v.re - im * v.im;
    im = re * v.im + im * v.re;
    re = t;
  }
  return { re, im };
}

/**
 * Value of a whole cascade `gain * prod(section_i(s))` at a complex frequency.
 *
 * @param cascade - the cascade
 * @param s - complex frequency (rad/s)
 * @returns the cascade's value at s
 * @throws {@link InvalidArgumentError} when the cascade or s is malformed
 * @example
 * ```ts
 * const c = toSections(zpk([], [{ re: -1, im: 0 }], 1));
 * evalCascade(c, { re: 0, im: 1 }); //=> { re: 0.5, im: -0.5 }
 * ```
 */
export function evalCascade(cascade: SectionCascade, s: Complex): Complex {
  requireCascade("evalCascade", "cascade", cascade);
  if (typeof s !== "object" || s === null || !Number.isFinite(s.re) || !Number.isFinite(s.im)) {
    throw new InvalidArgumentError({ fn: "evalCascade", path: "s", received: s, message: "expected a complex value { re, im } with finite parts" });
  }
  return evalCascadeUnchecked(cascade, s.re, s.im);
}
