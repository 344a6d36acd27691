/**
 * A transfer function packed for the curve loops of `response.ts` and
 * `magnitude.ts`: conjugate root pairs as one quadratic factor, a cascade's
 * section polynomials in flat arrays with its constant numerators folded
 * into the gain, the jw-axis poles listed once; and the cache that validates
 * and packs a deeply frozen system only once.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import type { Complex } from "../math/complex.ts";
import { isCascade, requireSystem } from "./check.ts";
import type { SectionCascade, Zpk } from "./types.ts";

/** Squared magnitudes of the products inside this range (both) take the fast path. */
export const SAFE_LO = 1e-280;
export const SAFE_HI = 1e280;

/** Reject a grid point equal to `im`, the imaginary part of a jw-axis pole. */
function rejectAxisPole(fn: string, im: number, w: Float64Array): void {
  for (let i = 0; i < w.length; i++) {
    if (w[i] === im) {
      throw new InvalidArgumentError({
        fn,
        path: `w[${i}]`,
        received: w[i],
        message: "this frequency is a pole on the jw axis, where the response is infinite; move the grid point",
      });
    }
  }
}

/** Reject a grid point that lands exactly on a jw-axis pole (the response would be infinite). */
export function checkNoAxisPole(fn: string, poles: readonly Complex[], w: Float64Array): void {
  for (const p of poles) if (p.re === 0) rejectAxisPole(fn, p.im, w);
}

/**
 * Imaginary parts of a cascade's jw-axis poles, read from its sections'
 * denominators without forming the zpk: the same root formulas as
 * `fromSections` (sections.ts, quadRoots), so the same values, in the same
 * order, as {@link checkNoAxisPole} on `fromSections(cascade).poles` would scan.
 */
function cascadeAxisPoles(cascade: SectionCascade): Float64Array {
  const out: number[] = [];
  for (const sec of cascade.sections) {
    const [a2, a1, a0] = sec.den;
    if (a2 === 0) {
      // one root -a0/a1 (none when a1 is 0 too)
      if (a1 !== 0 && -a0 / a1 === 0) out.push(0);
      continue;
    }
    const h = a1 / (2 * a2);
    const c = a0 / a2;
    const disc = h * h - c;
    if (disc < 0) {
      // the pair -h +- j sqrt(-disc)
      if (h === 0) out.push(Math.sqrt(-disc), -Math.sqrt(-disc));
    } else if (c === 0) out.push(0); // roots 0 and -2h
    else {
      const r1 = -(h + (h >= 0 ? 1 : -1) * Math.sqrt(disc));
      if (r1 === 0 || c / r1 === 0) out.push(0);
    }
  }
  return Float64Array.from(out);
}

/** Imaginary parts of the jw-axis poles (Re = 0) of a pole list, in order. */
function zpkAxisPoles(poles: readonly Complex[]): Float64Array {
  let m = 0;
  for (const p of poles) if (p.re === 0) m++;
  const out = new Float64Array(m);
  m = 0;
  for (const p of poles) if (p.re === 0) out[m++] = p.im;
  return out;
}

/**
 * Factors packed into typed arrays for the point-by-point loops (one array
 * per kind, so that the loop body reads one typed array).
 */
export interface PackedFactors {
  /** `[a^2, 2 a, b]` of each conjugate pair `-a +- j b` (b >= 0). */
  readonly pairs: Float64Array;
  /** `[a, b]` of each single root `-a + j b`. */
  readonly singles: Float64Array;
}

/** Scratch of {@link pack}: which roots are already taken (grown when a list is longer). */
let taken = new Uint8Array(64);

/**
 * Pack the roots: exact conjugate pairs (equal real parts, opposite
 * imaginary parts) become one quadratic factor each, in the order of their
 * first member; the other roots stay single. One buffer holds both arrays.
 */
export function pack(roots: readonly Complex[]): PackedFactors {
  const n = roots.length;
  if (taken.length < n) taken = new Uint8Array(2 * n);
  const used = taken;
  used.fill(0, 0, n);
  const pairsEnd = 3 * (n >> 1);
  const buf = new Float64Array(pairsEnd + 2 * n);
  let np = 0;
  let ns = pairsEnd;
  for (let i = 0; i < n; i++) {
    if (used[i] === 1) continue;
    used[i] = 1;
    const r = roots[i] as Complex;
    const a = -r.re;
    if (r.im !== 0) {
      let j = i + 1;
      while (j < n && !(used[j] === 0 && (roots[j] as Complex).re === r.re && (roots[j] as Complex).im === -r.im)) j++;
      if (j < n) {
        used[j] = 1;
        buf[np++] = a * a;
        buf[np++] = 2 * a;
        buf[np++] = Math.abs(r.im);
        continue;
      }
    }
    buf[ns++] = a;
    buf[ns++] = r.im;
  }
  return { pairs: buf.subarray(0, np), singles: buf.subarray(pairsEnd, ns) };
}

/** A zpk with its factors packed once (for the grid loop, and for repeated one-point evaluation: {@link packedMagnitudeAt}). */
export interface PackedZpk {
  /** The system (for the overflow-safe path). */
  readonly system: Zpk;
  /** Packed zeros. */
  readonly zeros: PackedFactors;
  /** Packed poles. */
  readonly poles: PackedFactors;
  /** Imaginary parts of the poles on the jw axis, in the order of `system.poles` (see {@link rejectAxisPoles}). */
  readonly axisPoles: Float64Array;
}

/** Pack a zpk (internal core, no checks). */
export function packZpk(system: Zpk): PackedZpk {
  return { system, zeros: pack(system.zeros), poles: pack(system.poles), axisPoles: zpkAxisPoles(system.poles) };
}

/**
 * A cascade packed for the grid loops: `[a2, a1, a0]` of every section's
 * denominator, `[b2, b1, b0]` of the numerators that are not constants, and
 * the gain with the constant numerators (`[0, 0, b0]`, as in lowpass
 * sections) multiplied in, so that they cost nothing per point. When that
 * product would leave the comfortable range, nothing is folded.
 */
export interface PackedCascade {
  /** The cascade (for the slow path). */
  readonly cascade: SectionCascade;
  /** Denominator coefficients, three per section. */
  readonly den: Float64Array;
  /** Coefficients of the numerators not folded into {@link PackedCascade.gain}, three per section. */
  readonly num: Float64Array;
  /** The cascade gain times the folded constant numerators. */
  readonly gain: number;
  /** Imaginary parts of the poles on the jw axis, in the order of `fromSections(cascade).poles` (see {@link rejectAxisPoles}). */
  readonly axisPoles: Float64Array;
}

/** Pack a cascade (internal core, no checks). */
export function packCascade(cascade: SectionCascade): PackedCascade {
  const m = cascade.sections.length;
  const den = new Float64Array(3 * m);
  const all = new Float64Array(3 * m);
  const rest = new Float64Array(3 * m);
  let nr = 0;
  let gain = cascade.gain;
  let exactZero = gain === 0;
  cascade.sections.forEach((sec, i) => {
    den.set(sec.den, 3 * i);
    all.set(sec.num, 3 * i);
    const [b2, b1, b0] = sec.num;
    if (b2 === 0 && b1 === 0) {
      gain *= b0;
      if (b0 === 0) exactZero = true;
    } else {
      rest.set(sec.num, nr);
      nr += 3;
    }
  });
  const axisPoles = cascadeAxisPoles(cascade);
  if (Number.isFinite(gain) && (exactZero || (Math.abs(gain) > SAFE_LO && Math.abs(gain) < SAFE_HI))) {
    return { cascade, den, num: rest.subarray(0, nr), gain, axisPoles };
  }
  return { cascade, den, num: all, gain: cascade.gain, axisPoles };
}

/** A validated system, packed: a zpk or a cascade. */
export type PackedSystem = PackedZpk | PackedCascade;

/**
 * Packed forms of the deeply frozen systems already validated (zpk() and
 * toSections() return such systems): their values cannot change, so a
 * repeated call (one-point evaluations in a loop, say) neither validates nor
 * packs them again. Systems that are not frozen are validated and packed on
 * every call. Entries go with their systems (weak keys).
 */
const packedSystems = new WeakMap<object, PackedSystem>();

/** Whether the system and every array and value inside it are frozen (its numbers then cannot change). */
function deeplyFrozen(system: Zpk | SectionCascade): boolean {
  if (!Object.isFrozen(system)) return false;
  if (isCascade(system)) {
    if (!Object.isFrozen(system.sections)) return false;
    for (const sec of system.sections) {
      if (!Object.isFrozen(sec) || !Object.isFrozen(sec.num) || !Object.isFrozen(sec.den)) return false;
    }
    return true;
  }
  if (!Object.isFrozen(system.zeros) || !Object.isFrozen(system.poles)) return false;
  for (const z of system.zeros) if (!Object.isFrozen(z)) return false;
  for (const p of system.poles) if (!Object.isFrozen(p)) return false;
  return true;
}

/**
 * Validate (as `requireSystem(fn, "system", ...)`) and pack a system for the
 * grid loops; a deeply frozen system is validated and packed once.
 *
 * @throws {@link InvalidArgumentError} when the system is malformed
 */
export function packSystem(fn: string, system: unknown): PackedSystem {
  if (typeof system === "object" && system !== null) {
    const hit = packedSystems.get(system);
    if (hit !== undefined) return hit;
  }
  const s = requireSystem(fn, "system", system);
  const packed = isCascade(s) ? packCascade(s) : packZpk(s);
  if (deeplyFrozen(s)) packedSystems.set(s, packed);
  return packed;
}

/** Reject a grid point that lands exactly on one of the packed system's jw-axis poles (as {@link checkNoAxisPole}). */
export function rejectAxisPoles(fn: string, p: PackedSystem, w: Float64Array): void {
  const axis = p.axisPoles;
  for (let i = 0; i < axis.length; i++) rejectAxisPole(fn, axis[i] as number, w);
}
