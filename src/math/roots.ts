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
 * inclusion radius `n |p(z)/p'(z)|` (the disc of that radius about z contains
 * a root; a classical result, see P. Henrici, "Applied and Computational
 * Complex Analysis" vol. 1, Wiley 1974, chapter 6)
 * decides which roots are real; the others are paired into exact conjugates.
 *
 * Accuracy: error about `u * cond(root)` with `u = 2^-53` relative to the
 * polynomial whose coefficients are exactly `coeffs` (plus `lowParts`), where
 * `cond` is the usual root condition number `sum|a_k||z|^k / |z p'(z)|`
 * (N. J. Higham, "Accuracy and Stability of Numerical Algorithms", 2nd ed.,
 * SIAM 2002, section 5.1); roughly 1e-16 relative for well
 * separated roots. Exact coefficients that do not fit in one double (such as
 * the Bessel coefficients beyond order 10) can be passed as `coeffs + lowParts`.
 *
 * @module
 */
import { ConvergenceError, InvalidArgumentError } from "../errors.ts";
import { cdiv, type Complex } from "./complex.ts";
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

/** Horner pass in double: writes p(z), p'(z) and the bound sum |a_k| |z|^k into out[0..4]. */
function hornerDouble(c: Float64Array, zr: number, zi: number, out: Float64Array): void {
  let pr = 0;
  let pi = 0;
  let dr = 0;
  let di = 0;
  let b = 0;
  const az = Math.hypot(zr, zi);
  for (let k = 0; k < c.length; k++) {
    if (k > 0) {
      const t = dr * zr - di * zi + pr;
      di = dr * zi + di * zr + pi;
      dr = t;
    }
    const t = pr * zr - pi * zi + (c[k] as number);
    pi = pr * zi + pi * zr;
    pr = t;
    b = b * az + Math.abs(c[k] as number);
  }
  out[0] = pr;
  out[1] = pi;
  out[2] = dr;
  out[3] = di;
  out[4] = b;
}

/** Horner pass in double-double arithmetic on coefficients hi + lo; same outputs as {@link hornerDouble}. */
function hornerDoubleDouble(hi: Float64Array, lo: Float64Array, zr: number, zi: number, out: Float64Array): void {
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
  out[0] = prh + prl;
  out[1] = pih + pil;
  out[2] = drh + drl;
  out[3] = dih + dil;
  out[4] = b;
}

/** The polynomial in the forms the iteration needs: coefficients and their reversal, hi and lo parts. */
interface Poly {
  readonly n: number;
  readonly h: Float64Array;
  readonly l: Float64Array;
  readonly hRev: Float64Array;
  readonly lRev: Float64Array;
}

/** Newton correction N = p(z)/p'(z) and whether |p(z)| is at the evaluation's rounding level. */
interface Newton {
  nr: number;
  ni: number;
  /** p'(z) = 0 while p(z) != 0: the correction is infinite. */
  inf: boolean;
  /** |p(z)| is below the rounding-error bound of the evaluation. */
  small: boolean;
}

const scratch = new Float64Array(5);

/**
 * Newton correction at z. For |z| > 1 the reversed polynomial is evaluated
 * at 1/z, so that nothing overflows: with p(z) = z^n q(1/z),
 * p/p' = z q / (n q - y q') where y = 1/z (Bini 1996, section 5).
 */
function newtonAt(poly: Poly, zr: number, zi: number, dd: boolean, res: Newton): void {
  const n = poly.n;
  const tol = 4 * (n + 1) * (dd ? EPS * EPS : EPS);
  const az = Math.hypot(zr, zi);
  let numr: number;
  let numi: number;
  let denr: number;
  let deni: number;
  if (az <= 1) {
    if (dd) hornerDoubleDouble(poly.h, poly.l, zr, zi, scratch);
    else hornerDouble(poly.h, zr, zi, scratch);
    numr = scratch[0] as number;
    numi = scratch[1] as number;
    denr = scratch[2] as number;
    deni = scratch[3] as number;
  } else {
    const y = cdiv({ re: 1, im: 0 }, { re: zr, im: zi });
    if (dd) hornerDoubleDouble(poly.hRev, poly.lRev, y.re, y.im, scratch);
    else hornerDouble(poly.hRev, y.re, y.im, scratch);
    const qr = scratch[0] as number;
    const qi = scratch[1] as number;
    const dqr = scratch[2] as number;
    const dqi = scratch[3] as number;
    // numerator z q, denominator n q - y q'
    numr = zr * qr - zi * qi;
    numi = zr * qi + zi * qr;
    denr = n * qr - (y.re * dqr - y.im * dqi);
    deni = n * qi - (y.re * dqi + y.im * dqr);
  }
  res.small = Math.hypot(scratch[0] as number, scratch[1] as number) <= tol * (scratch[4] as number);
  if (scratch[0] === 0 && scratch[1] === 0) {
    res.nr = 0;
    res.ni = 0;
    res.inf = false;
    return;
  }
  if (denr === 0 && deni === 0) {
    res.nr = 0;
    res.ni = 0;
    res.inf = true;
    return;
  }
  const q = cdiv({ re: numr, im: numi }, { re: denr, im: deni });
  res.nr = q.re;
  res.ni = q.im;
  res.inf = !Number.isFinite(q.re) || !Number.isFinite(q.im);
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

/** Aberth correction w for root i given its Newton correction N: w = N / (1 - N S). */
function aberthStep(i: number, zr: Float64Array, zi: Float64Array, e: Newton, w: Float64Array): void {
  const n = zr.length;
  const xr = zr[i] as number;
  const xi = zi[i] as number;
  let sr = 0;
  let si = 0;
  for (let j = 0; j < n; j++) {
    if (j === i) continue;
    const t = cdiv({ re: 1, im: 0 }, { re: xr - (zr[j] as number), im: xi - (zi[j] as number) });
    sr += t.re;
    si += t.im;
  }
  if (e.inf) {
    // N infinite: the correction tends to 1/S
    const t = cdiv({ re: 1, im: 0 }, { re: sr, im: si });
    w[0] = t.re;
    w[1] = t.im;
    return;
  }
  const nr = e.nr;
  const ni = e.ni;
  const t = cdiv({ re: nr, im: ni }, { re: 1 - (nr * sr - ni * si), im: -(nr * si + ni * sr) });
  w[0] = t.re;
  w[1] = t.im;
}

/** Roots of a polynomial of degree >= 2 with a non-zero constant term (core). */
function aberth(hi: Float64Array, lo: Float64Array): { roots: Complex[]; radius: Float64Array } {
  const n = hi.length - 1;
  // Scale x = c y with c a power of two so that the roots are near the unit circle (exact).
  const ce = Math.round((Math.log2(Math.abs(hi[n] as number)) - Math.log2(Math.abs(hi[0] as number))) / n);
  const c = 2 ** ce;
  let maxLog = -Infinity;
  for (let i = 0; i <= n; i++) {
    const a = Math.abs(hi[i] as number);
    if (a > 0) maxLog = Math.max(maxLog, Math.log2(a) + (n - i) * ce);
  }
  const shift = Math.round(maxLog);
  const h = new Float64Array(n + 1);
  const l = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) {
    h[i] = scale2(hi[i] as number, (n - i) * ce - shift);
    l[i] = scale2(lo[i] as number, (n - i) * ce - shift);
  }
  const poly: Poly = { n, h, l, hRev: h.slice().reverse(), lRev: l.slice().reverse() };
  const zr = new Float64Array(n);
  const zi = new Float64Array(n);
  startingPoints(h, zr, zi);
  const done = new Uint8Array(n);
  const nw: Newton = { nr: 0, ni: 0, inf: false, small: false };
  const w = new Float64Array(2);
  const step = (i: number): void => {
    aberthStep(i, zr, zi, nw, w);
    const nr = (zr[i] as number) - (w[0] as number);
    const ni = (zi[i] as number) - (w[1] as number);
    // a non-finite step (overflow far from the roots) is skipped; the other roots move on
    if (Number.isFinite(nr) && Number.isFinite(ni)) {
      zr[i] = nr;
      zi[i] = ni;
    }
  };
  let remaining = n;
  const maxPlain = 100 + 10 * n;
  for (let it = 0; it < maxPlain && remaining > 0; it++) {
    for (let i = 0; i < n; i++) {
      if (done[i] === 1) continue;
      newtonAt(poly, zr[i] as number, zi[i] as number, false, nw);
      if (nw.small) {
        done[i] = 1;
        remaining--;
        continue;
      }
      step(i);
    }
  }
  // Polishing: the same iteration with p, p' in double-double arithmetic.
  const radius = new Float64Array(n).fill(Infinity);
  const active = new Uint8Array(n).fill(1);
  let nActive = n;
  for (let it = 0; it < 100 + 10 * n && nActive > 0; it++) {
    for (let i = 0; i < n; i++) {
      if (active[i] === 0) continue;
      const xr = zr[i] as number;
      const xi = zi[i] as number;
      newtonAt(poly, xr, xi, true, nw);
      radius[i] = nw.inf ? Infinity : n * Math.hypot(nw.nr, nw.ni);
      aberthStep(i, zr, zi, nw, w);
      const wm = Math.hypot(w[0] as number, w[1] as number);
      step(i);
      // Stop when the step is at rounding level, or |p| is at the double-double noise floor.
      if (wm <= 2 * EPS * Math.hypot(xr, xi) || nw.small) {
        active[i] = 0;
        nActive--;
      }
    }
  }
  const roots: Complex[] = [];
  for (let i = 0; i < n; i++) {
    const re = (zr[i] as number) * c;
    const im = (zi[i] as number) * c;
    const r = (radius[i] as number) * c;
    // accept a root when it is finite and its inclusion disc is small, or |p| is at rounding level
    if (!Number.isFinite(re) || !Number.isFinite(im) || (active[i] === 1 && !(r <= 1e-3 * Math.hypot(re, im)))) {
      throw new ConvergenceError({
        fn: "polyRoots",
        path: "coeffs",
        message: `the Aberth iteration did not converge for root ${i} of ${n}; check for extreme coefficient ranges`,
      });
    }
    roots.push({ re, im });
    radius[i] = Math.max(Number.isFinite(r) ? r : 0, 8 * EPS * Math.hypot(re, im));
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
