/**
 * All roots of a real polynomial by the Aberth-Ehrlich simultaneous iteration.
 *
 * Method: Aberth's iteration `z_i <- z_i - N_i / (1 - N_i sum_{j!=i} 1/(z_i - z_j))`,
 * `N_i = p(z_i)/p'(z_i)`, applied Gauss-Seidel style (O. Aberth, "Iteration
 * methods for finding all zeros of a polynomial simultaneously", Math. Comp.
 * 27(122):339-344, 1973; L. W. Ehrlich, "A modified Newton method for
 * polynomials", Commun. ACM 10(2):107-108, 1967). Starting points lie on circles
 * whose radii come from the upper convex hull (Newton polygon) of
 * `(k, log|a_k|)`, and each root stops once `|p(z)|` is below the rounding-error
 * bound of Horner's rule (D. A. Bini, "Numerical computation of polynomial
 * zeros by means of Aberth's method", Numer. Algorithms 13:179-200, 1996,
 * sections 3 and 4). The iteration is then continued with `p` and `p'`
 * evaluated in double-double arithmetic (T. J. Dekker, "A floating-point
 * technique for extending the available precision", Numer. Math. 18:224-242,
 * 1971), which polishes each root to full double precision unless the root is
 * ill conditioned beyond about 1e16 with respect to the coefficients. The
 * inclusion radius `n |p(z)/p'(z)|` (a disc that contains a root; P. Henrici,
 * "Applied and Computational Complex Analysis" vol. 1, Wiley 1974, thm 6.4g)
 * decides which roots are real; the others are paired into exact conjugates.
 *
 * Accuracy: error about `u * cond(root)` with `u = 2^-53` relative to the
 * polynomial whose coefficients are exactly `coeffs` (plus `lowParts`), where
 * `cond` is measured as in Higham's "Accuracy and Stability of Numerical
 * Algorithms" 2nd ed., 2002, eq. 5.3; roughly 1e-16 relative for well
 * separated roots. Exact coefficients that do not fit in one double (such as
 * the Bessel coefficients beyond order 10) can be passed as `coeffs + lowParts`.
 *
 * @module
 */
import { ConvergenceError, InvalidArgumentError } from "../errors.ts";
import type { Complex } from "./complex.ts";
import { requireOptions } from "../validate.ts";
import { requireNumberArray } from "./check.ts";

/** Options of {@link polyRoots}. */
export interface PolyRootsOptions {
  /**
   * Low-order parts of the coefficients, same length as `coeffs`: the exact
   * coefficient `k` is `coeffs[k] + lowParts[k]` (a double-double value). Use
   * this when the exact coefficients need more than 53 bits and the roots are
   * ill conditioned (see {@link reverseBesselRoots}).
   * @defaultValue all zero
   */
  readonly lowParts?: readonly number[];
}

const EPS = 2 ** -53;
const SPLITTER = 134217729; // 2^27 + 1, Dekker's splitting constant

// Double-double scratch results (avoid allocating tuples in the inner loops).
let oH = 0;
let oL = 0;

/** (ah + al) + (bh + bl), accurate double-double addition (Dekker 1971; D. H. Bailey's QD library). */
function ddAdd(ah: number, al: number, bh: number, bl: number): void {
  let s = ah + bh;
  let v = s - ah;
  let e = ah - (s - v) + (bh - v);
  const t = al + bl;
  v = t - al;
  const f = al - (t - v) + (bl - v);
  e += t;
  let s2 = s + e;
  e -= s2 - s;
  s = s2;
  e += f;
  s2 = s + e;
  oL = e - (s2 - s);
  oH = s2;
}

/** (ah + al) * b with Dekker's exact product of two doubles. */
function ddMulD(ah: number, al: number, b: number): void {
  const p = ah * b;
  let t = SPLITTER * ah;
  const ahh = t - (t - ah);
  const ahl = ah - ahh;
  t = SPLITTER * b;
  const bhh = t - (t - b);
  const bhl = b - bhh;
  let e = ahh * bhh - p + ahh * bhl + ahl * bhh + ahl * bhl;
  e += al * b;
  const s = p + e;
  oL = e - (s - p);
  oH = s;
}

/** Multiply x by 2^e without intermediate overflow or underflow of the power. */
function scale2(x: number, e: number): number {
  let r = x;
  let k = e;
  while (k > 1000) {
    r *= 2 ** 1000;
    k -= 1000;
  }
  while (k < -1000) {
    r *= 2 ** -1000;
    k += 1000;
  }
  return r * 2 ** k;
}

/** Result of one Horner pass: p(z), p'(z) and the rounding bound sum |a_k| |z|^k. */
interface Eval {
  pr: number;
  pi: number;
  dr: number;
  di: number;
  bound: number;
}

function evalDouble(hi: Float64Array, zr: number, zi: number, out: Eval): void {
  let pr = 0;
  let pi = 0;
  let dr = 0;
  let di = 0;
  let b = 0;
  const az = Math.hypot(zr, zi);
  for (let k = 0; k < hi.length; k++) {
    if (k > 0) {
      const t = dr * zr - di * zi + pr;
      di = dr * zi + di * zr + pi;
      dr = t;
    }
    const t = pr * zr - pi * zi + (hi[k] as number);
    pi = pr * zi + pi * zr;
    pr = t;
    b = b * az + Math.abs(hi[k] as number);
  }
  out.pr = pr;
  out.pi = pi;
  out.dr = dr;
  out.di = di;
  out.bound = b;
}

function evalDoubleDouble(hi: Float64Array, lo: Float64Array, zr: number, zi: number, out: Eval): void {
  let prh = 0;
  let prl = 0;
  let pih = 0;
  let pil = 0;
  let drh = 0;
  let drl = 0;
  let dih = 0;
  let dil = 0;
  let b = 0;
  const az = Math.hypot(zr, zi);
  for (let k = 0; k < hi.length; k++) {
    b = b * az + Math.abs(hi[k] as number);
    if (k > 0) {
      // d = d * z + p
      ddMulD(drh, drl, zr);
      const a1h = oH;
      const a1l = oL;
      ddMulD(dih, dil, zi);
      ddAdd(a1h, a1l, -oH, -oL);
      ddAdd(oH, oL, prh, prl);
      const nrh = oH;
      const nrl = oL;
      ddMulD(drh, drl, zi);
      const b1h = oH;
      const b1l = oL;
      ddMulD(dih, dil, zr);
      ddAdd(b1h, b1l, oH, oL);
      ddAdd(oH, oL, pih, pil);
      dih = oH;
      dil = oL;
      drh = nrh;
      drl = nrl;
    }
    // p = p * z + a_k
    ddMulD(prh, prl, zr);
    const a1h = oH;
    const a1l = oL;
    ddMulD(pih, pil, zi);
    ddAdd(a1h, a1l, -oH, -oL);
    ddAdd(oH, oL, hi[k] as number, lo[k] as number);
    const nrh = oH;
    const nrl = oL;
    ddMulD(prh, prl, zi);
    const b1h = oH;
    const b1l = oL;
    ddMulD(pih, pil, zr);
    ddAdd(b1h, b1l, oH, oL);
    pih = oH;
    pil = oL;
    prh = nrh;
    prl = nrl;
  }
  out.pr = prh + prl;
  out.pi = pih + pil;
  out.dr = drh + drl;
  out.di = dih + dil;
  out.bound = b;
}

/** Starting points on the circles of the Newton polygon of |a_k| (Bini 1996, section 4). */
function startingPoints(hi: Float64Array, zr: Float64Array, zi: Float64Array): void {
  const n = hi.length - 1;
  // ascending powers: a_k = hi[n - k]
  const ks: number[] = [];
  const ls: number[] = [];
  for (let k = 0; k <= n; k++) {
    const a = Math.abs(hi[n - k] as number);
    if (a === 0) continue;
    const l = Math.log(a);
    // upper convex hull, monotone chain
    while (ks.length >= 2) {
      const k1 = ks[ks.length - 2] as number;
      const l1 = ls[ls.length - 2] as number;
      const k2 = ks[ks.length - 1] as number;
      const l2 = ls[ls.length - 1] as number;
      if ((l2 - l1) * (k - k1) <= (l - l1) * (k2 - k1)) {
        ks.pop();
        ls.pop();
      } else break;
    }
    ks.push(k);
    ls.push(l);
  }
  const sigma = 0.7;
  let idx = 0;
  for (let s = 0; s + 1 < ks.length; s++) {
    const k1 = ks[s] as number;
    const k2 = ks[s + 1] as number;
    const m = k2 - k1;
    const r = Math.exp(((ls[s] as number) - (ls[s + 1] as number)) / m);
    for (let j = 0; j < m; j++) {
      const th = (2 * Math.PI * j) / m + (2 * Math.PI * k1) / n + sigma;
      zr[idx] = r * Math.cos(th);
      zi[idx] = r * Math.sin(th);
      idx++;
    }
  }
}

/** Aberth correction for root i given p and p' there; returns [wr, wi]. */
function aberthStep(i: number, zr: Float64Array, zi: Float64Array, e: Eval, w: Float64Array): void {
  const n = zr.length;
  const xr = zr[i] as number;
  const xi = zi[i] as number;
  let sr = 0;
  let si = 0;
  for (let j = 0; j < n; j++) {
    if (j === i) continue;
    const dr = xr - (zr[j] as number);
    const di = xi - (zi[j] as number);
    const m = dr * dr + di * di;
    sr += dr / m;
    si -= di / m;
  }
  const pm = Math.hypot(e.pr, e.pi);
  if (pm === 0) {
    w[0] = 0;
    w[1] = 0;
    return;
  }
  const dm = e.dr * e.dr + e.di * e.di;
  if (dm === 0) {
    // N infinite: the correction tends to 1/S
    const sm = sr * sr + si * si;
    w[0] = sr / sm;
    w[1] = -si / sm;
    return;
  }
  // N = p / p'
  const nr = (e.pr * e.dr + e.pi * e.di) / dm;
  const ni = (e.pi * e.dr - e.pr * e.di) / dm;
  // den = 1 - N S
  const denr = 1 - (nr * sr - ni * si);
  const deni = -(nr * si + ni * sr);
  const q = denr * denr + deni * deni;
  w[0] = (nr * denr + ni * deni) / q;
  w[1] = (ni * denr - nr * deni) / q;
}

/** Roots of a polynomial of degree >= 2 with a non-zero constant term (core). */
function aberth(hi: Float64Array, lo: Float64Array): { roots: Complex[]; radius: Float64Array } {
  const n = hi.length - 1;
  // Scale x = c y with c a power of two so that the roots are near the unit circle (exact).
  const lead = Math.abs(hi[0] as number);
  const tail = Math.abs(hi[n] as number);
  const ce = Math.round(Math.log2(tail / lead) / n);
  const c = 2 ** ce;
  const h = new Float64Array(n + 1);
  const l = new Float64Array(n + 1);
  let maxLog = -Infinity;
  for (let i = 0; i <= n; i++) {
    const a = Math.abs(hi[i] as number);
    if (a > 0) maxLog = Math.max(maxLog, Math.log2(a) + (n - i) * ce);
  }
  const shift = Math.round(maxLog);
  for (let i = 0; i <= n; i++) {
    h[i] = scale2(hi[i] as number, (n - i) * ce - shift);
    l[i] = scale2(lo[i] as number, (n - i) * ce - shift);
  }
  const zr = new Float64Array(n);
  const zi = new Float64Array(n);
  startingPoints(h, zr, zi);
  const done = new Uint8Array(n);
  const ev: Eval = { pr: 0, pi: 0, dr: 0, di: 0, bound: 0 };
  const w = new Float64Array(2);
  let remaining = n;
  const maxPlain = 100 + 10 * n;
  for (let it = 0; it < maxPlain && remaining > 0; it++) {
    for (let i = 0; i < n; i++) {
      if (done[i] === 1) continue;
      evalDouble(h, zr[i] as number, zi[i] as number, ev);
      if (Math.hypot(ev.pr, ev.pi) <= 4 * (n + 1) * EPS * ev.bound) {
        done[i] = 1;
        remaining--;
        continue;
      }
      aberthStep(i, zr, zi, ev, w);
      zr[i] = (zr[i] as number) - (w[0] as number);
      zi[i] = (zi[i] as number) - (w[1] as number);
    }
  }
  // Polishing: the same iteration with p, p' in double-double arithmetic.
  const radius = new Float64Array(n);
  const active = new Uint8Array(n).fill(1);
  let nActive = n;
  for (let it = 0; it < 100 + 10 * n && nActive > 0; it++) {
    for (let i = 0; i < n; i++) {
      if (active[i] === 0) continue;
      const xr = zr[i] as number;
      const xi = zi[i] as number;
      evalDoubleDouble(h, l, xr, xi, ev);
      const dm = Math.hypot(ev.dr, ev.di);
      radius[i] = dm === 0 ? (Math.hypot(ev.pr, ev.pi) === 0 ? 0 : Infinity) : (n * Math.hypot(ev.pr, ev.pi)) / dm;
      aberthStep(i, zr, zi, ev, w);
      const wm = Math.hypot(w[0] as number, w[1] as number);
      const xm = Math.hypot(xr, xi);
      // Stop when the step is at rounding level, or |p| is at the double-double noise floor.
      if (wm <= 2 * EPS * xm || Math.hypot(ev.pr, ev.pi) <= 4 * (n + 1) * EPS * EPS * ev.bound) {
        active[i] = 0;
        nActive--;
        if (wm <= 2 * EPS * xm) continue;
      }
      zr[i] = xr - (w[0] as number);
      zi[i] = xi - (w[1] as number);
    }
  }
  const roots: Complex[] = [];
  for (let i = 0; i < n; i++) {
    const re = (zr[i] as number) * c;
    const im = (zi[i] as number) * c;
    if (!Number.isFinite(re) || !Number.isFinite(im) || !((radius[i] as number) * c <= 1e-3 * Math.hypot(re, im) + Number.MIN_VALUE)) {
      throw new ConvergenceError({
        fn: "polyRoots",
        path: "coeffs",
        message: `the Aberth iteration did not converge for root ${i} of ${n}; check for extreme coefficient ranges`,
      });
    }
    roots.push({ re, im });
    radius[i] = Math.max((radius[i] as number) * c, 8 * EPS * Math.hypot(re, im));
  }
  return { roots, radius };
}

/** Make near-real roots real and pair the others into exact conjugates. */
function conjugateCleanup(roots: readonly Complex[], radius: Float64Array): Complex[] {
  const real: number[] = [];
  let upper: number[] = [];
  let lower: number[] = [];
  roots.forEach((r, i) => {
    if (Math.abs(r.im) <= (radius[i] as number)) real.push(i);
    else if (r.im > 0) upper.push(i);
    else lower.push(i);
  });
  // Balance the two half-planes by declaring the least imaginary extras real.
  const byAbsIm = (a: number, b: number): number =>
    Math.abs((roots[a] as Complex).im) - Math.abs((roots[b] as Complex).im);
  if (upper.length !== lower.length) {
    const big = upper.length > lower.length ? upper : lower;
    big.sort(byAbsIm);
    const extra = big.length - Math.min(upper.length, lower.length);
    real.push(...big.slice(0, extra));
    if (big === upper) upper = big.slice(extra);
    else lower = big.slice(extra);
  }
  const out: Complex[] = [];
  for (const i of real) out.push({ re: (roots[i] as Complex).re, im: 0 });
  const usedLower = new Uint8Array(roots.length);
  for (const i of upper) {
    const a = roots[i] as Complex;
    let best = -1;
    let bestD = Infinity;
    for (const j of lower) {
      if (usedLower[j] === 1) continue;
      const b = roots[j] as Complex;
      const d = Math.hypot(a.re - b.re, a.im + b.im);
      if (d < bestD) {
        bestD = d;
        best = j;
      }
    }
    usedLower[best] = 1;
    const b = roots[best] as Complex;
    const re = (a.re + b.re) / 2;
    const im = (a.im - b.im) / 2;
    out.push({ re, im }, { re, im: -im });
  }
  return out;
}

/**
 * Canonical order for root lists: ascending real part, then ascending
 * |imaginary part|, with the positive member of a conjugate pair first.
 */
export function sortRoots(roots: readonly Complex[]): Complex[] {
  return [...roots].sort((a, b) => a.re - b.re || Math.abs(a.im) - Math.abs(b.im) || b.im - a.im);
}

/**
 * All complex roots of a real polynomial, by Aberth-Ehrlich iteration with
 * double-double polishing (see the module header). Leading zero coefficients
 * are dropped; zero roots (trailing zero coefficients) are returned exactly.
 * Real roots have an imaginary part of exactly 0 and complex roots come in
 * exact conjugate pairs. The result is sorted by ascending real part, then
 * ascending |imaginary part|, with the `+` member of each pair first.
 *
 * @param coeffs - coefficients in descending powers, not all zero
 * @param options - optional low-order parts of the coefficients
 * @returns the roots, as many as the degree
 * @throws {@link InvalidArgumentError} when `coeffs` is empty, not finite, all zero, or `lowParts` has the wrong length
 * @throws {@link ConvergenceError} when the iteration fails to converge (not observed for degrees up to 60 with finite coefficients)
 * @example
 * ```ts
 * polyRoots([1, 0, -1]); //=> [{ re: -1, im: 0 }, { re: 1, im: 0 }]
 * polyRoots([1, 2, 2]);  //=> [{ re: -1, im: 1 }, { re: -1, im: -1 }]
 * ```
 */
export function polyRoots(coeffs: readonly number[], options?: PolyRootsOptions): Complex[] {
  const fn = "polyRoots";
  requireNumberArray(fn, "coeffs", coeffs, 1);
  const opts = requireOptions(fn, "options", options);
  let low: readonly number[] | undefined;
  if (opts["lowParts"] !== undefined) {
    low = requireNumberArray(fn, "options.lowParts", opts["lowParts"]);
    if (low.length !== coeffs.length) {
      throw new InvalidArgumentError({
        fn,
        path: "options.lowParts",
        received: low.length,
        message: `expected the same length as coeffs (${coeffs.length})`,
      });
    }
  }
  let start = 0;
  while (start < coeffs.length && coeffs[start] === 0 && (low === undefined || low[start] === 0)) start++;
  if (start === coeffs.length) {
    throw new InvalidArgumentError({
      fn,
      path: "coeffs",
      received: coeffs,
      message: "the zero polynomial has no defined roots; give at least one non-zero coefficient",
    });
  }
  let end = coeffs.length;
  while (end - 1 > start && coeffs[end - 1] === 0 && (low === undefined || low[end - 1] === 0)) end--;
  const zeroRoots = coeffs.length - end;
  const hi = new Float64Array(end - start);
  const lo = new Float64Array(end - start);
  for (let i = start; i < end; i++) {
    // renormalise each coefficient so hi carries the rounded sum
    const h = coeffs[i] as number;
    const l = low === undefined ? 0 : (low[i] as number);
    const s = h + l;
    hi[i - start] = s;
    lo[i - start] = l - (s - h);
  }
  const n = hi.length - 1;
  let found: Complex[] = [];
  if (n === 1) {
    found = [{ re: -((hi[1] as number) + (lo[1] as number)) / ((hi[0] as number) + (lo[0] as number)), im: 0 }];
  } else if (n >= 2) {
    const { roots, radius } = aberth(hi, lo);
    found = conjugateCleanup(roots, radius);
  }
  for (let i = 0; i < zeroRoots; i++) found.push({ re: 0, im: 0 });
  return sortRoots(found);
}
