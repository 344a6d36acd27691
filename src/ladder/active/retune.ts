/**
 * The re-tune of an active ladder after rounding: with every capacitor
 * fixed at its stock value (the coarser series), the resistors are chosen
 * jointly among their neighbouring preferred values so that the circuit as
 * built (with the op-amp model it was designed for) has the poles, notch
 * frequencies and, where the realisation trims it, the level at the edge of
 * the target: the exact ideal-op-amp circuit's, the conditions the
 * pre-distortion matches (./predistort.ts).
 *
 * Method: the error is a vector of rows in nepers of response: for each
 * target pole, the shift of the circuit's own pole (Newton's method on the
 * nodal equations from the target's, ./conditions.ts) over its distance to
 * the jw axis, |Re p| (near a pole of Q the response moves by about that
 * fraction, the pole's half bandwidth being |Re p|); for each zero, the
 * notch frequency's shift over its distance to the nearest pole; where the
 * realisation trims it, the log of the level at the edge. It is linearised,
 * `r(d) = r_c + J (d - d_c)`, d the logs of the resistors over their
 * nearest preferred values, J by forward differences through the nodal
 * equations (the Gauss-Newton model of the pre-distortion). The discrete
 * problem, least squares over a box of preferred values (each resistor
 * within {@link RETUNE_STEPS} steps of its nearest) with a small penalty
 * {@link RETUNE_PENALTY} on the moves and a trust-region term
 * `lambda ||d - d_c||^2` (K. Levenberg, "A method for the solution of
 * certain non-linear problems in least squares", Quart. Appl. Math.
 * 2:164-168, 1944; D. W. Marquardt, "An algorithm for least-squares
 * estimation of nonlinear parameters", SIAM J. Appl. Math. 11(2):431-441,
 * 1963), is solved by successive rounding: the continuous least-squares
 * solution of the free resistors, the one resistor (and its bracketing
 * value) whose rounding leaves the least cost with the rest re-solved fixed
 * first, until none is free; the nearest-plane method of L. Babai, "On
 * Lovász' lattice reduction and the nearest lattice point problem",
 * Combinatorica 6(1):1-13, 1986, with a greedy order in place of the
 * lattice reduction. Then a local search from that set and from the current
 * one: single moves to any value of the box, pairs to any values, triples
 * of one-step moves (common practice, no source). The set is then
 * evaluated on the circuit itself: kept when its error is lower (lambda
 * shrunk fourfold, the model rebuilt there), else lambda grown tenfold and
 * the search repeated, up to {@link RETUNE_ROUNDS} linearisations.
 *
 * Accuracy: the search is a heuristic, not a proof of the best set; a set
 * is kept only when the circuit's own error (nodal analysis, not the
 * model) is lower and its poles, op-amps' included, stay in the open left
 * half-plane (Routh array of its characteristic polynomial), so the result
 * is never worse than plain rounding by that error. Measured for the
 * 7th-order Chebyshev I lowpass of the yield benchmark (E96 resistors, E12
 * capacitors, single-pole op-amps of 3 MHz to 1 GHz, leapfrog and FDNR):
 * the largest pole error falls from 0.08-0.98 dB to 0.008-0.075 dB, and
 * the as-built passband lies within 0.034 dB of the exact ideal-op-amp
 * circuit's, against up to 0.153 dB rounded only (docs/benchmarks.md, the
 * ladder-yield section; test/ladder/active/retune.test.ts).
 *
 * @module
 */
import type { Circuit, Element, OpAmpModel } from "../../circuit/types.ts";
import { assembleMna } from "../../circuit/mna.ts";
import type { SeriesName } from "../../parts/eseries.ts";
import { nextInSeries } from "../../parts/snap.ts";
import type { Complex } from "../../math/complex.ts";
import { abs, refine, referencePoints, solveDense, TransferAt, transferOf, type BuiltLadder, type Point } from "./conditions.ts";
import { RESISTOR_LIMITS_OHMS } from "./options.ts";
import { circuitPolynomials } from "../../evaluate/circuit-boards.ts";
import { rightHalfPlaneRoots } from "../../evaluate/stability.ts";
import type { ActiveLadderRetune } from "./types.ts";

/** Preferred-value steps on either side of a resistor's nearest value the search may go. */
export const RETUNE_STEPS = 3;
/** Penalty on the squared log move of each resistor off its nearest value, in squared nepers per squared neper (a one-step E96 move, 0.024, costs 6e-8, a 0.002 dB row). */
export const RETUNE_PENALTY = 1e-4;
/** Largest number of linearisations. */
export const RETUNE_ROUNDS = 6;
/** Largest number of searches (a search whose set the circuit does not confirm is retried with a smaller trust region). */
const RETUNE_TRIES = 12;
/** The first trust-region weight (squared nepers per squared neper of move). */
const RETUNE_LAMBDA = 1e-3;
/** Relative step of the forward differences (on log values). */
const FD_STEP = 1e-6;
/** Largest number of local-search moves per round. */
const MAX_MOVES = 400;

/** What the re-tune matches: the reference points, their scales, the level, the op-amp model of the conditions. */
export interface RetuneTarget {
  /** The target's poles and zeros (one per conjugate pair). */
  readonly points: readonly Point[];
  /** Each point's scale: |Re p| for a pole, the distance to the nearest pole for a zero. */
  readonly scales: readonly number[];
  /** The ideal circuit's magnitude at the edge. */
  readonly g: number;
  /** Whether the level at the edge is a condition. */
  readonly level: boolean;
  /** The op-amp model the conditions are evaluated with (the one the values were designed for). */
  readonly opamp: OpAmpModel;
}

/**
 * The target of a re-tune from the exact ideal-op-amp circuit.
 *
 * @param ideal - the circuit with ideal op-amps and exact values
 * @param level - whether the level at the edge is a condition
 * @param opamp - the op-amp model the values were designed for
 * @returns the target
 */
export function retuneTarget(ideal: BuiltLadder, level: boolean, opamp: OpAmpModel): RetuneTarget {
  const t = transferOf(ideal);
  const g = abs(t.at({ re: 0, im: ideal.frequencyScale }));
  const points = referencePoints(ideal, t, g);
  const poles = points.filter((p) => p.pole).flatMap((p) => [p.s, { re: p.s.re, im: -p.s.im }]);
  const scales = points.map((p) => (p.pole ? Math.abs(p.s.re) : Math.min(...poles.map((q) => Math.hypot(q.re - p.s.re, q.im - p.s.im)))));
  return { points, scales, g, level, opamp };
}

/** A circuit's error rows (module header) and its poles and zeros near the reference points (the next evaluation's starts). */
interface Rows {
  readonly r: number[];
  readonly roots: Complex[];
}

/**
 * The error rows of a circuit against the target: its own poles and zeros,
 * by Newton's method from `starts` (the target's points, or a nearby
 * circuit's roots), against the target's; null when singular or lost.
 */
function rowsOf(elements: readonly Element[], l: BuiltLadder, t: RetuneTarget, starts?: readonly Complex[]): Rows | null {
  const circuit: Circuit = { title: l.circuit.title, elements };
  let tr: TransferAt;
  try {
    tr = new TransferAt(assembleMna(circuit), l.source, l.output);
  } catch {
    return null;
  }
  const r: number[] = t.level ? [Math.log(abs(tr.at({ re: 0, im: l.frequencyScale })) / t.g)] : [];
  const roots: Complex[] = [];
  t.points.forEach((p, i) => {
    const w = t.scales[i] as number;
    const q = refine(tr, starts?.[i] ?? p.s, p.pole, t.g);
    roots.push(q);
    if (!p.pole) {
      // the notch frequency: the op-amps' loss leaves the zero a little off the axis, which no value moves back
      r.push((q.im - p.s.im) / w);
      return;
    }
    r.push((q.re - p.s.re) / w);
    if (!p.real) r.push((q.im - p.s.im) / w);
  });
  return r.every(Number.isFinite) ? { r, roots } : null;
}

const sumSq = (r: ArrayLike<number>): number => {
  let s = 0;
  for (let i = 0; i < r.length; i++) s += (r[i] as number) ** 2;
  return s;
};

/** The grid of one resistor: its preferred values around its nearest one, ascending, within the part window. */
function gridOf(value: number, series: SeriesName): number[] {
  const vals = [value];
  let d = value;
  let u = value;
  for (let k = 0; k < RETUNE_STEPS; k++) {
    d = nextInSeries(d, { series, direction: "down" });
    u = nextInSeries(u, { series, direction: "up" });
    if (d >= RESISTOR_LIMITS_OHMS.min) vals.unshift(d);
    if (u <= RESISTOR_LIMITS_OHMS.max) vals.push(u);
  }
  return vals;
}

/** The linear model of one round: residual rc at dc, the Jacobian's columns, their Gram matrix and J^T rc. */
interface Model {
  readonly rc: readonly number[];
  readonly dc: readonly number[];
  readonly cols: readonly (readonly number[])[];
  /** J^T J, row-major. */
  readonly gram: Float64Array;
  /** J^T rc. */
  readonly jr: Float64Array;
  /** The trust-region weight on the move from dc (Levenberg-Marquardt). */
  readonly lambda: number;
}

function makeModel(rc: readonly number[], dc: readonly number[], cols: readonly (readonly number[])[], lambda: number): Model {
  const m = cols.length;
  const gram = new Float64Array(m * m);
  const jr = new Float64Array(m);
  const dot = (x: readonly number[], y: readonly number[]): number => x.reduce((acc, v, i) => acc + v * (y[i] as number), 0);
  for (let j = 0; j < m; j++) {
    jr[j] = dot(cols[j] as number[], rc);
    for (let q = j; q < m; q++) gram[j * m + q] = gram[q * m + j] = dot(cols[j] as number[], cols[q] as number[]);
  }
  return { rc, dc, cols, gram, jr, lambda };
}

/** Cost of d under the model: ||rc + J (d - dc)||^2 + mu ||d||^2 + lambda ||d - dc||^2. */
function modelCost(m: Model, d: readonly number[]): number {
  const r = m.rc.slice();
  let step = 0;
  d.forEach((v, j) => {
    const dv = v - (m.dc[j] as number);
    step += dv * dv;
    if (dv !== 0) (m.cols[j] as number[]).forEach((c, i) => (r[i] = (r[i] as number) + c * dv));
  });
  return sumSq(r) + RETUNE_PENALTY * sumSq(d) + m.lambda * step;
}

/**
 * The continuous least-squares values of the free resistors with the others
 * at `d`: the model cost (see {@link modelCost}) least over d[free]; returns
 * d with them filled in and the cost, or null when singular.
 */
function solveFree(m: Model, d: readonly number[], free: readonly number[]): { d: number[]; cost: number } | null {
  const out = d.slice();
  if (free.length === 0) return { d: out, cost: modelCost(m, out) };
  const n = d.length;
  const isFree = new Uint8Array(n);
  for (const j of free) isFree[j] = 1;
  // u: the move from dc with every free resistor at 0
  const u = d.map((v, j) => (isFree[j] === 1 ? 0 : v) - (m.dc[j] as number));
  const k = free.length;
  const mat = new Array<number>(k * k);
  const rhs = new Array<number>(k);
  for (let p = 0; p < k; p++) {
    const jp = free[p] as number;
    for (let q = 0; q < k; q++) mat[p * k + q] = m.gram[jp * n + (free[q] as number)] as number;
    mat[p * k + p] = (mat[p * k + p] as number) + RETUNE_PENALTY + m.lambda;
    // J_F^T (rc + J u)
    let s = m.jr[jp] as number;
    for (let j = 0; j < n; j++) if (u[j] !== 0) s += (m.gram[jp * n + j] as number) * (u[j] as number);
    rhs[p] = m.lambda * (m.dc[jp] as number) - s;
  }
  const y = solveDense(k, mat, rhs);
  if (y === null) return null;
  free.forEach((j, p) => (out[j] = y[p] as number));
  return { d: out, cost: modelCost(m, out) };
}

/** The grid values bracketing x (the nearest two; one at the grid's ends). */
function bracket(grid: readonly number[], x: number): number[] {
  if (x <= (grid[0] as number)) return [grid[0] as number];
  if (x >= (grid[grid.length - 1] as number)) return [grid[grid.length - 1] as number];
  const i = grid.findIndex((v) => v >= x);
  return [grid[i - 1] as number, grid[i] as number];
}

/** Successive rounding (module header): every resistor on its grid. */
function successiveRounding(m: Model, grids: readonly (readonly number[])[]): number[] {
  let d = m.dc.slice();
  let free = grids.map((_, j) => j);
  let current = solveFree(m, d, free);
  while (free.length > 0 && current !== null) {
    let best: { j: number; v: number; next: { d: number[]; cost: number } } | null = null;
    for (const j of free) {
      for (const v of bracket(grids[j] as number[], current.d[j] as number)) {
        const w = current.d.slice();
        w[j] = v;
        const next = solveFree(m, w, free.filter((x) => x !== j));
        if (next !== null && (best === null || next.cost < best.next.cost)) best = { j, v, next };
      }
    }
    if (best === null) break;
    free = free.filter((x) => x !== best.j);
    current = best.next;
    d = current.d;
  }
  // whatever stayed free (a singular solve) goes to its nearest grid value
  return d.map((v, j) => {
    const g = grids[j] as number[];
    return g.reduce((a, b) => (Math.abs(b - v) < Math.abs(a - v) ? b : a), g[0] as number);
  });
}

/**
 * Local search from d under the model, best improvement first: a single
 * move to any value of a resistor's box, a pair of moves to any values of
 * both boxes, a triple of one-step moves. The cost change of a move is a
 * quadratic form in the moves (the Gram matrix and J^T r at d), so each
 * trial costs a few operations.
 */
function localSearch(m: Model, grids: readonly (readonly number[])[], start: readonly number[]): number[] {
  const d = start.slice();
  const n = d.length;
  const G = m.gram;
  const idx = d.map((v, j) => (grids[j] as number[]).indexOf(v));
  // b = J^T r at d, r = rc + J (d - dc)
  const b = Float64Array.from(m.jr);
  d.forEach((v, j) => {
    const dv = v - (m.dc[j] as number);
    if (dv !== 0) for (let q = 0; q < n; q++) b[q] = (b[q] as number) + (G[q * n + j] as number) * dv;
  });
  const pen = (j: number, v: number): number => RETUNE_PENALTY * v * v + m.lambda * (v - (m.dc[j] as number)) ** 2;
  /** Cost change of one resistor's move by dv to value v: 2 dv b_j + dv^2 G_jj + its penalty's change. */
  const single = (j: number, v: number): number => {
    const dv = v - (d[j] as number);
    return 2 * dv * (b[j] as number) + dv * dv * (G[j * n + j] as number) + pen(j, v) - pen(j, d[j] as number);
  };
  const step = (j: number, k: number): number => ((grids[j] as number[])[k] as number) - (d[j] as number);
  const inBox = (j: number, k: number): boolean => k >= 0 && k < (grids[j] as number[]).length;
  for (let move = 0; move < MAX_MOVES; move++) {
    let bestDelta = -1e-18;
    let bestJs: number[] = [];
    let bestKs: number[] = [];
    for (let j = 0; j < n; j++) {
      const gj = grids[j] as number[];
      for (let k = 0; k < gj.length; k++) {
        if (k === idx[j]) continue;
        const sj = single(j, gj[k] as number);
        if (sj < bestDelta) [bestDelta, bestJs, bestKs] = [sj, [j], [k]];
        const dj = step(j, k);
        for (let q = j + 1; q < n; q++) {
          const gq = grids[q] as number[];
          const cross = 2 * dj * (G[j * n + q] as number);
          for (let l = 0; l < gq.length; l++) {
            if (l === idx[q]) continue;
            const delta = sj + single(q, gq[l] as number) + cross * step(q, l);
            if (delta < bestDelta) [bestDelta, bestJs, bestKs] = [delta, [j, q], [k, l]];
          }
        }
      }
    }
    for (let j = 0; j < n; j++) {
      for (const sj of [-1, 1]) {
        const kj = (idx[j] as number) + sj;
        if (!inBox(j, kj)) continue;
        const dj = step(j, kj);
        const ej = single(j, (grids[j] as number[])[kj] as number);
        for (let q = j + 1; q < n; q++) {
          for (const sq of [-1, 1]) {
            const kq = (idx[q] as number) + sq;
            if (!inBox(q, kq)) continue;
            const dq = step(q, kq);
            const eq = ej + single(q, (grids[q] as number[])[kq] as number) + 2 * dj * dq * (G[j * n + q] as number);
            for (let u = q + 1; u < n; u++) {
              for (const su of [-1, 1]) {
                const ku = (idx[u] as number) + su;
                if (!inBox(u, ku)) continue;
                const du = step(u, ku);
                const delta = eq + single(u, (grids[u] as number[])[ku] as number) + 2 * du * (dj * (G[j * n + u] as number) + dq * (G[q * n + u] as number));
                if (delta < bestDelta) [bestDelta, bestJs, bestKs] = [delta, [j, q, u], [kj, kq, ku]];
              }
            }
          }
        }
      }
    }
    if (bestJs.length === 0) break;
    bestJs.forEach((j, t) => {
      const dv = step(j, bestKs[t] as number);
      for (let q = 0; q < n; q++) b[q] = (b[q] as number) + (G[q * n + j] as number) * dv;
      d[j] = (grids[j] as number[])[bestKs[t] as number] as number;
      idx[j] = bestKs[t] as number;
    });
  }
  return d;
}

/** The largest row of an error vector, dB. */
const worstDb = (r: readonly number[]): number => (20 / Math.LN10) * Math.max(0, ...r.map(Math.abs));

/**
 * Re-tune a ladder built on preferred values: its resistors chosen jointly
 * (module header), its capacitors as they are.
 *
 * @param l - the ladder as built, every part on its series
 * @param target - what to match
 * @param series - the resistor series
 * @returns the ladder with its resistors re-chosen (parts and DC path records follow) and the record
 */
export function retuneResistors(l: BuiltLadder, target: RetuneTarget, series: SeriesName): { ladder: BuiltLadder; record: ActiveLadderRetune } {
  const placed = l.circuit.elements;
  const evalElements = placed.map((e) => (e.kind === "OA" ? { ...e, model: target.opamp } : e));
  const rIdx = placed.flatMap((e, i) => (e.kind === "R" ? [i] : []));
  const base = rIdx.map((i) => (placed[i] as Element & { value: number }).value);
  const gridValues = base.map((v) => gridOf(v, series));
  const grids = gridValues.map((g, j) => g.map((v) => Math.log(v / (base[j] as number))));
  const elementsAt = (d: readonly number[]): Element[] => {
    const out = evalElements.slice();
    rIdx.forEach((i, j) => (out[i] = { ...(out[i] as Element & { kind: "R" }), value: (base[j] as number) * Math.exp(d[j] as number) }));
    return out;
  };
  const zero = base.map(() => 0);
  // a set is taken only when the circuit as placed (its own op-amps) keeps every pole in the open left half-plane
  const w0 = l.frequencyScale;
  const stable = (d: readonly number[]): boolean => {
    const elements = placed.map((e, i) => (e.kind === "R" ? { ...e, value: (base[rIdx.indexOf(i)] as number) * Math.exp(d[rIdx.indexOf(i)] as number) } : e));
    try {
      const p = circuitPolynomials({ title: l.circuit.title, elements }, { source: l.source, output: l.output, spanRadS: [w0 / 1000, w0 * 1000] }, w0);
      return p !== null && rightHalfPlaneRoots(p.den) === 0;
    } catch {
      // a circuit whose polynomials cannot be had is not taken
      return false;
    }
  };
  const first = rowsOf(elementsAt(zero), l, target);
  const r0 = first?.r ?? null;
  const unchanged = (before: number): { ladder: BuiltLadder; record: ActiveLadderRetune } => ({ ladder: l, record: Object.freeze({ moved: 0, errorBeforeDb: before, errorAfterDb: before, rounds: 0 }) });
  if (r0 === null) return unchanged(NaN);
  let best = { d: zero, r: r0, roots: (first as Rows).roots, cost: sumSq(r0) };
  let rounds = 0;
  let lambda = RETUNE_LAMBDA;
  let cols: number[][] | null = null;
  for (let tries = 0; tries < RETUNE_TRIES && rounds < RETUNE_ROUNDS; tries++) {
    if (cols === null) {
      cols = [];
      for (let j = 0; j < base.length; j++) {
        const w = best.d.slice();
        w[j] = (w[j] as number) + FD_STEP;
        const rj = rowsOf(elementsAt(w), l, target, best.roots)?.r ?? null;
        if (rj === null || rj.length !== best.r.length) return unchanged(worstDb(r0));
        cols.push(rj.map((v, i) => (v - (best.r[i] as number)) / FD_STEP));
      }
      rounds++;
    }
    const model = makeModel(best.r, best.d, cols, lambda);
    // from the successive rounding, and from where we are: the better under the model
    const found = localSearch(model, grids, successiveRounding(model, grids));
    const stay = localSearch(model, grids, best.d);
    const d = modelCost(model, found) <= modelCost(model, stay) ? found : stay;
    const next = rowsOf(elementsAt(d), l, target, best.roots);
    const r = next?.r ?? null;
    const cost = r === null ? Infinity : sumSq(r) + RETUNE_PENALTY * sumSq(d);
    if (r !== null && cost < best.cost * (1 - 1e-9) && stable(d)) {
      // a better set: linearise there, and trust the model further
      best = { d, r, roots: (next as Rows).roots, cost };
      cols = null;
      lambda /= 4;
    } else if (d.every((v, j) => v === best.d[j])) {
      break;
    } else {
      lambda *= 10;
    }
  }
  if (best.d === zero) return { ladder: l, record: Object.freeze({ moved: 0, errorBeforeDb: worstDb(r0), errorAfterDb: worstDb(r0), rounds }) };
  // every d is one of its grid's entries: take the series value itself
  const snapped = new Map(rIdx.map((i, j) => [(placed[i] as Element).name, (gridValues[j] as number[])[(grids[j] as number[]).indexOf(best.d[j] as number)] as number] as const));
  const elements = placed.map((e) => (e.kind === "R" ? { ...e, value: snapped.get(e.name) as number } : e));
  const parts = l.parts.map((p) => (p.kind === "resistor" ? Object.freeze({ ...p, value: snapped.get(p.name) as number }) : p));
  const byName = new Map(parts.map((p) => [p.name, p] as const));
  const dcPath = l.dcPath === null ? null : Object.freeze({ ...l.dcPath, resistors: Object.freeze(l.dcPath.resistors.map((p) => byName.get(p.name) ?? p)) });
  const moved = best.d.filter((v) => v !== 0).length;
  return {
    ladder: Object.freeze({ ...l, circuit: Object.freeze({ ...l.circuit, elements: Object.freeze(elements) }), parts: Object.freeze(parts), dcPath }),
    record: Object.freeze({ moved, errorBeforeDb: worstDb(r0), errorAfterDb: worstDb(best.r), rounds }),
  };
}
