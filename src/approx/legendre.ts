/**
 * Legendre ("optimum L") lowpass prototype: the steepest roll-off at the
 * band edge among all-pole filters with a monotonic magnitude.
 *
 * Method: |H(jw)|^2 = 1 / (1 + L_n(w^2)) with, for odd n = 2k + 1,
 * L_n(w^2) = int_{-1}^{2w^2-1} [sum_{i=0}^{k} a_i P_i(x)]^2 dx,
 * a_i = (2i + 1) / (sqrt(2) (k + 1))
 * (A. Papoulis, "Optimum filters with monotonic response", Proc. IRE 46(3),
 * 1958, pp. 606-609), and for even n = 2k + 2,
 * L_n(w^2) = int_{-1}^{2w^2-1} (x + 1) [sum a_i P_i(x)]^2 dx with
 * a_i = (2i + 1) / sqrt((k + 1)(k + 2)) on i = 0, 2, 4, ... (k even) or
 * i = 1, 3, 5, ... (k odd), zero otherwise (M. Fukada, "Optimum filters of
 * even orders with monotonic response", IRE Trans. Circuit Theory CT-6(3),
 * 1959, pp. 277-281). L_n(0) = 0 and L_n(1) = 1, so 1 rad/s is the -3 dB point.
 * The coefficients of L_n(u) are built exactly in rational BigInt arithmetic;
 * the poles are the left-half-plane square roots s = +-sqrt(-u) of the roots
 * u of 1 + L_n(u), found by {@link polyRoots} on the exact integer coefficients
 * given as double-double values (Aberth iteration polished in double-double
 * arithmetic). Accuracy: ~1e-14 relative up to order 20 against mpmath.
 * The magnitude without roots (order searches) integrates the positive
 * integrand by Gauss-Legendre quadrature, exact for its degree, so nothing cancels.
 *
 * @module
 */
import type { Complex } from "../math/complex.ts";
import { csqrt } from "../math/complex.ts";
import { polyRoots } from "../math/roots.ts";
import type { Zpk } from "../tf/types.ts";
import { requireInteger } from "../validate.ts";
import { freezeZpk, prodNeg } from "./internal.ts";

/** Highest Legendre order accepted. */
export const LEGENDRE_MAX_ORDER = 20;

// ---------------------------------------------------------------- exact rationals
interface Rat {
  readonly n: bigint;
  readonly d: bigint;
}

function gcd(a: bigint, b: bigint): bigint {
  let x = a < 0n ? -a : a;
  let y = b < 0n ? -b : b;
  while (y !== 0n) [x, y] = [y, x % y];
  return x;
}

function rat(n: bigint, d = 1n): Rat {
  if (n === 0n) return { n: 0n, d: 1n };
  const g = gcd(n, d);
  const s = d < 0n ? -1n : 1n;
  return { n: (s * n) / g, d: (s * d) / g };
}

const R0 = rat(0n);
const radd = (a: Rat, b: Rat): Rat => rat(a.n * b.d + b.n * a.d, a.d * b.d);
const rmul = (a: Rat, b: Rat): Rat => rat(a.n * b.n, a.d * b.d);

function polyMulRat(a: readonly Rat[], b: readonly Rat[]): Rat[] {
  const out: Rat[] = new Array<Rat>(a.length + b.length - 1).fill(R0);
  a.forEach((x, i) => b.forEach((y, j) => (out[i + j] = radd(out[i + j] as Rat, rmul(x, y)))));
  return out;
}

function polyAddRat(a: readonly Rat[], b: readonly Rat[]): Rat[] {
  const out: Rat[] = [];
  for (let i = 0; i < Math.max(a.length, b.length); i++) out.push(radd(a[i] ?? R0, b[i] ?? R0));
  return out;
}

/** Legendre polynomial P_i, ascending coefficients (Bonnet's recursion). */
function legendrePolyRat(i: number): Rat[] {
  let p0: Rat[] = [rat(1n)];
  let p1: Rat[] = [R0, rat(1n)];
  if (i === 0) return p0;
  for (let m = 1; m < i; m++) {
    const bm = BigInt(m);
    const xp = [R0, ...p1].map((c) => rmul(c, rat(2n * bm + 1n, bm + 1n)));
    const next = polyAddRat(xp, p0.map((c) => rmul(c, rat(-bm, bm + 1n))));
    p0 = p1;
    p1 = next;
  }
  return p1;
}

/** Which Legendre indices carry weight, the squared scale and whether the (x+1) weight applies. */
function construction(order: number): { idx: number[]; scale2: Rat; even: boolean } {
  if (order % 2 === 1) {
    const k = (order - 1) / 2;
    const idx = Array.from({ length: k + 1 }, (_, i) => i);
    return { idx, scale2: rat(1n, 2n * BigInt(k + 1) ** 2n), even: false };
  }
  const k = (order - 2) / 2;
  const idx: number[] = [];
  for (let i = k % 2 === 0 ? 0 : 1; i <= k; i += 2) idx.push(i);
  return { idx, scale2: rat(1n, BigInt((k + 1) * (k + 2))), even: true };
}

const lCache = new Map<number, Rat[]>();

/** Exact coefficients (ascending powers of u = w^2) of L_n(u). */
export function legendreLCoefficients(order: number): readonly Rat[] {
  const hit = lCache.get(order);
  if (hit) return hit;
  const { idx, scale2, even } = construction(order);
  let v: Rat[] = [R0];
  for (const i of idx) v = polyAddRat(v, legendrePolyRat(i).map((c) => rmul(c, rat(BigInt(2 * i + 1)))));
  let integrand = polyMulRat(v, v).map((c) => rmul(c, scale2));
  if (even) integrand = polyMulRat(integrand, [rat(1n), rat(1n)]);
  // Antiderivative with F(-1) = 0.
  const F: Rat[] = [R0, ...integrand.map((c, j) => rmul(c, rat(1n, BigInt(j + 1))))];
  let atMinus1 = R0;
  F.forEach((c, j) => (atMinus1 = radd(atMinus1, j % 2 === 0 ? c : rmul(c, rat(-1n)))));
  F[0] = radd(F[0] as Rat, rmul(atMinus1, rat(-1n)));
  // Substitute x = 2u - 1.
  let out: Rat[] = [R0];
  let pow: Rat[] = [rat(1n)];
  F.forEach((c, j) => {
    if (j > 0) pow = polyMulRat(pow, [rat(-1n), rat(2n)]);
    out = polyAddRat(out, pow.map((t) => rmul(t, c)));
  });
  while (out.length > 1 && (out[out.length - 1] as Rat).n === 0n) out.pop();
  lCache.set(order, out);
  return out;
}

/**
 * The exact coefficients of Papoulis' L_n(u) (with u = w^2, so that
 * |H(jw)|^2 = 1 / (1 + L_n(w^2))) as rational strings `"p"` or `"p/q"`, in
 * ascending powers of u, for display and for checking against published tables.
 *
 * @param order - filter order, 1 to {@link LEGENDRE_MAX_ORDER}
 * @returns the coefficients of u^0, u^1, ..., u^n
 * @throws {@link InvalidArgumentError} when `order` is not an integer in range
 * @example
 * ```ts
 * legendreLCoefficientStrings(3); //=> ["0", "1", "-3", "3"]   (L_3 = 3u^3 - 3u^2 + u)
 * ```
 */
export function legendreLCoefficientStrings(order: number): string[] {
  requireInteger("legendreLCoefficientStrings", "order", order, { min: 1, max: LEGENDRE_MAX_ORDER });
  return legendreLCoefficients(order).map((c) => (c.d === 1n ? `${c.n}` : `${c.n}/${c.d}`));
}

// ---------------------------------------------------------------- magnitude by quadrature
const gaussCache = new Map<number, { x: Float64Array; w: Float64Array }>();

/**
 * Gauss-Legendre nodes and weights on [-1, 1] by Newton's method on P_m from
 * the asymptotic initial guesses cos(pi (i - 1/4) / (m + 1/2)) (P. J. Davis and
 * P. Rabinowitz, "Methods of Numerical Integration", 2nd ed., Academic Press,
 * 1984, sec. 2.7).
 */
function gaussLegendre(m: number): { x: Float64Array; w: Float64Array } {
  const hit = gaussCache.get(m);
  if (hit) return hit;
  const x = new Float64Array(m);
  const w = new Float64Array(m);
  for (let i = 1; i <= m; i++) {
    let z = Math.cos((Math.PI * (i - 0.25)) / (m + 0.5));
    let dp = 1;
    for (let it = 0; it < 100; it++) {
      let p0 = 1;
      let p1 = z;
      for (let j = 2; j <= m; j++) {
        const p2 = ((2 * j - 1) * z * p1 - (j - 1) * p0) / j;
        p0 = p1;
        p1 = p2;
      }
      const pm = m === 1 ? z : p1;
      const pm1 = m === 1 ? 1 : p0;
      dp = (m * (z * pm - pm1)) / (z * z - 1);
      const dz = pm / dp;
      z -= dz;
      if (Math.abs(dz) < 1e-16) break;
    }
    x[i - 1] = z;
    w[i - 1] = 2 / ((1 - z * z) * dp * dp);
  }
  const res = { x, w };
  gaussCache.set(m, res);
  return res;
}

/** L_n(u) for u = w^2 >= 0, by exact-degree Gauss-Legendre quadrature of the positive integrand. */
export function legendreL(order: number, u: number): number {
  const odd = order % 2 === 1;
  const k = odd ? (order - 1) / 2 : (order - 2) / 2;
  const scale2 = odd ? 1 / (2 * (k + 1) ** 2) : 1 / ((k + 1) * (k + 2));
  const first = odd ? 0 : k % 2;
  const step = odd ? 1 : 2;
  const y = 2 * u - 1;
  const { x: tx, w: tw } = gaussLegendre(Math.ceil(order / 2) + 1);
  const half = (y + 1) / 2;
  let sum = 0;
  for (let q = 0; q < tx.length; q++) {
    const x = -1 + half * ((tx[q] as number) + 1);
    // v(x) = sum (2i + 1) P_i(x) over the chosen indices
    let p0 = 1;
    let p1 = x;
    let v = first === 0 ? 1 : 0;
    if (first <= 1 && 1 <= k && (odd || first === 1)) v += 3 * x;
    for (let i = 2; i <= k; i++) {
      const p2 = ((2 * i - 1) * x * p1 - (i - 1) * p0) / i;
      p0 = p1;
      p1 = p2;
      if ((i - first) % step === 0) v += (2 * i + 1) * p2;
    }
    const wt = odd ? 1 : x + 1;
    sum += (tw[q] as number) * wt * v * v;
  }
  return sum * half * scale2;
}

/** |H(jw)| of the Legendre prototype without computing its poles. */
export function legendreMagnitude(order: number, w: number): number {
  return 1 / Math.sqrt(1 + legendreL(order, w * w));
}

// ---------------------------------------------------------------- poles
/** Poles per order, computed once (freezeZpk copies them into every result). */
const poleCache = new Map<number, readonly Complex[]>();

function legendrePoles(order: number): Complex[] {
  const L = legendreLCoefficients(order);
  // Integer polynomial D (1 + L(u)) with D the common denominator, descending powers.
  let D = 1n;
  for (const c of L) D = (D / gcd(D, c.d)) * c.d;
  const ints = L.map((c) => (c.n * D) / c.d);
  ints[0] = (ints[0] as bigint) + D;
  const desc = [...ints].reverse();
  const hi = desc.map((c) => Number(c));
  const lo = desc.map((c, i) => Number(c - BigInt(hi[i] as number)));
  const us = polyRoots(hi, { lowParts: lo });
  const poles = us.map((u) => {
    const s = csqrt({ re: -u.re, im: -u.im });
    return s.re > 0 ? { re: -s.re, im: -s.im } : s;
  });
  // Exact conjugate pairs and an exactly real pole for odd orders.
  const out: Complex[] = [];
  for (const p of poles) {
    if (Math.abs(p.im) <= 1e-14 * Math.abs(p.re)) out.push({ re: p.re, im: 0 });
    else if (p.im > 0) out.push({ re: p.re, im: p.im }, { re: p.re, im: -p.im });
  }
  return out;
}

/**
 * Legendre ("optimum L") lowpass prototype of Papoulis (odd orders) and
 * Fukada (even orders): all-pole, monotonic magnitude with the steepest
 * possible slope at the band edge; -3 dB at 1 rad/s, DC gain 1. Orders 1 and 2
 * coincide with Butterworth.
 *
 * @param order - filter order, integer 1-20
 * @returns the prototype as zeros/poles/gain (rad/s)
 * @throws {@link InvalidArgumentError} when `order` is not an integer from 1 to 20
 * @example
 * ```ts
 * legendre(3).poles;
 * //=> [{ re: -0.6203318171301236, im: 0 }, { re: -0.345185619031197, im: 0.9008656355183781 },
 * //    { re: -0.345185619031197, im: -0.9008656355183781 }]
 * ```
 */
export function legendre(order: number): Zpk {
  requireInteger("legendre", "order", order, { min: 1, max: LEGENDRE_MAX_ORDER });
  let poles = poleCache.get(order);
  if (poles === undefined) {
    poles = Object.freeze(legendrePoles(order));
    poleCache.set(order, poles);
  }
  return freezeZpk([], poles, prodNeg(poles));
}
