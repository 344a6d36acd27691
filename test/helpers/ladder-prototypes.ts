/**
 * Normalised doubly terminated lowpass ladders built by hand for the tests
 * of the active realisations (the synthesis of src/ladder is tested on its
 * own), and the passive ladder's response by chained ABCD matrices, an
 * evaluation independent of the nodal analysis.
 *
 * Butterworth: g_k = 2 sin((2k - 1) pi / (2n)), equal terminations.
 * Chebyshev I: the closed-form recurrence of G. L. Matthaei, L. Young,
 * E. M. T. Jones, "Microwave Filters, Impedance-Matching Networks, and
 * Coupling Structures", McGraw-Hill 1964, sec. 4.05, eqs. (4.05-5):
 * beta = ln coth(Lar / 17.37), gamma = sinh(beta / 2n) (17.37 is 40 / ln 10,
 * used here at full precision),
 * a_k = sin((2k - 1) pi / 2n), b_k = gamma^2 + sin^2(k pi / n),
 * g_1 = 2 a_1 / gamma, g_k = 4 a_{k-1} a_k / (b_{k-1} g_{k-1}),
 * g_{n+1} = 1 (n odd) or coth^2(beta / 4) (n even; the load resistance
 * after a shunt capacitor, the load conductance after a series inductor).
 */
import { butterworth, chebyshev1 } from "../../src/approx/index.ts";
import type { LadderElement, LadderForm, LadderPrototype } from "../../src/ladder/types.ts";
import type { Zpk } from "../../src/tf/types.ts";

function withGain(z: Zpk, factor: number): Zpk {
  return { zeros: z.zeros, poles: z.poles, gain: z.gain * factor };
}

function arms(g: readonly number[], form: LadderForm): LadderElement[] {
  return g.map((value, i) => ({ kind: (i % 2 === 0) === (form === "series-first") ? "series-L" : "shunt-C", value }));
}

/** The Butterworth ladder of order n, equal 1-ohm terminations. */
export function butterworthLadder(n: number, form: LadderForm): LadderPrototype {
  const g = Array.from({ length: n }, (_, i) => 2 * Math.sin(((2 * i + 1) * Math.PI) / (2 * n)));
  return { family: "butterworth", order: n, form, elements: arms(g, form), sourceOhms: 1, loadOhms: 1, transfer: withGain(butterworth(n), 0.5) };
}

/** The Chebyshev I ladder of order n and ripple rippleDb, 1-ohm source. */
export function chebyshev1Ladder(n: number, rippleDb: number, form: LadderForm): LadderPrototype {
  const beta = Math.log(1 / Math.tanh(rippleDb / (40 / Math.LN10)));
  const gamma = Math.sinh(beta / (2 * n));
  const a = (k: number): number => Math.sin(((2 * k - 1) * Math.PI) / (2 * n));
  const bk = (k: number): number => gamma ** 2 + Math.sin((k * Math.PI) / n) ** 2;
  const g = [(2 * a(1)) / gamma];
  for (let k = 2; k <= n; k++) g.push((4 * a(k - 1) * a(k)) / (bk(k - 1) * (g[k - 2] as number)));
  const last = n % 2 === 1 ? 1 : 1 / Math.tanh(beta / 4) ** 2;
  // g_{n+1} is a resistance after a shunt capacitor, a conductance after a series inductor
  const lastShunt = (n % 2 === 1) === (form === "shunt-first");
  const loadOhms = lastShunt ? last : 1 / last;
  const transfer = withGain(chebyshev1(n, { rippleDb }), Math.sqrt(loadOhms) / 2);
  return { family: "chebyshev1", order: n, form, elements: arms(g, form), sourceOhms: 1, loadOhms, transfer };
}

/** Extra inductors (normalised henries) across the terminations, as the FDNR method's DC path resistors make them. */
export interface TerminationInductors {
  /** Across the source resistance. */
  readonly source: number;
  /** Across the load resistance. */
  readonly load: number;
}

/**
 * V(load) / V(source emf) of the passive ladder at s = j w (rad/s), by
 * chained ABCD matrices in complex arithmetic.
 *
 * @param p - the ladder
 * @param w - angular frequency, rad/s (normalised)
 * @param extra - inductors across the terminations
 * @returns [re, im]
 */
export function passiveLadderResponse(p: LadderPrototype, w: number, extra?: TerminationInductors): [number, number] {
  type C = [number, number];
  const mul = (x: C, y: C): C => [x[0] * y[0] - x[1] * y[1], x[0] * y[1] + x[1] * y[0]];
  const add = (x: C, y: C): C => [x[0] + y[0], x[1] + y[1]];
  const inv = (x: C): C => {
    const d = x[0] * x[0] + x[1] * x[1];
    return [x[0] / d, -x[1] / d];
  };
  const s: C = [0, w];
  const par = (z1: C, z2: C): C => inv(add(inv(z1), inv(z2)));
  const zs: C = extra === undefined ? [p.sourceOhms, 0] : par([p.sourceOhms, 0], mul(s, [extra.source, 0]));
  const zl: C = extra === undefined ? [p.loadOhms, 0] : par([p.loadOhms, 0], mul(s, [extra.load, 0]));
  // ABCD of the whole chain: [A B; C D]
  let m: [C, C, C, C] = [[1, 0], [0, 0], [0, 0], [1, 0]];
  const times = (x: [C, C, C, C], y: [C, C, C, C]): [C, C, C, C] => [
    add(mul(x[0], y[0]), mul(x[1], y[2])),
    add(mul(x[0], y[1]), mul(x[1], y[3])),
    add(mul(x[2], y[0]), mul(x[3], y[2])),
    add(mul(x[2], y[1]), mul(x[3], y[3])),
  ];
  for (const e of p.elements) {
    if (e.kind === "series-L") {
      const zl1 = mul(s, [e.value, 0]);
      const z = e.parallelC === undefined ? zl1 : par(zl1, inv(mul(s, [e.parallelC, 0])));
      m = times(m, [[1, 0], z, [0, 0], [1, 0]]);
    } else {
      const zc = inv(mul(s, [e.value, 0]));
      const z = e.seriesL === undefined ? zc : add(zc, mul(s, [e.seriesL, 0]));
      m = times(m, [[1, 0], [0, 0], inv(z), [1, 0]]);
    }
  }
  // Vs = (A + B / ZL + Zs (C + D / ZL)) VL
  const yl = inv(zl);
  const denom = add(add(m[0], mul(m[1], yl)), mul(zs, add(m[2], mul(m[3], yl))));
  return inv(denom);
}

/**
 * The dual ladder (series and shunt arms exchanged, each element becoming
 * its dual of the same normalised value: a series inductor a shunt
 * capacitor, a shunt series resonator a series parallel tank), with the
 * terminations inverted; for 1-ohm terminations it has the same transfer.
 */
export function dualLadder(p: LadderPrototype): LadderPrototype {
  const elements: LadderElement[] = p.elements.map((e) =>
    e.kind === "series-L"
      ? { kind: "shunt-C", value: e.value, ...(e.parallelC === undefined ? {} : { seriesL: e.parallelC }) }
      : { kind: "series-L", value: e.value, ...(e.seriesL === undefined ? {} : { parallelC: e.seriesL }) },
  );
  return { ...p, form: p.form === "series-first" ? "shunt-first" : "series-first", elements, sourceOhms: 1 / p.sourceOhms, loadOhms: 1 / p.loadOhms };
}
