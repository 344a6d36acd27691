/**
 * A lowpass ladder by leapfrog (operational) simulation: one integrator per
 * reactive arm, each computing its arm's state (a shunt capacitor's
 * voltage, a series inductor's current times RS) from its neighbours', the
 * terminations as the losses of the first and last integrators, and a
 * transmission zero by capacitive feed-forward between the states on either
 * side of the arm that makes it.
 *
 * Method: F. E. J. Girling & E. F. Good, "Active filters 12: the leapfrog
 * or active-ladder synthesis", Wireless World 76:341-345, 1970. The arm
 * equations of the doubly terminated ladder,
 * `x_k = (a_k x_{k-1} - b_k x_{k+1} - d_k x_k) / s` with `x_0` the source,
 * `a_k = b_k = 1 / (c_k RS)` for a shunt capacitor c_k and `RS / l_k` for a
 * series inductor l_k, and the losses `d_1` (the source resistance seen by
 * the first arm) and `d_n` (the load's by the last), are built with
 * integrators that alternate: odd arms an inverting (Miller) integrator,
 * even arms an inverting integrator followed by a unity inverter. With the
 * signs of the states alternating in pairs (- - + + - - ...) every
 * connection is then a plain resistor into a summing node, and each loss a
 * resistor across its integrating capacitor. Every integrator has the
 * shared capacitor; the time constants are set by the resistors,
 * R = 1 / (w C) for a coefficient w (rad/s) = Kf times the normalised one.
 * The source enters the first integrator with weight `k a_1`, where `k`
 * takes the ladder's level at maximum power transfer, sqrt(RL / RS) / 2
 * (over RL / RS when the last arm is an inductor, whose state is then
 * `RS I`), to the gain asked for. The output is the last integrator's state
 * with its sign (node `x<n>`), or for an even last arm its inverse at the
 * integrator's own output (node `u<n>`) when that is the positive one: the
 * circuit inverts when n = 1, 5, 9, ... (mod 4).
 *
 * Transmission zeros: an inner arm's extra element (a capacitor across a
 * series inductor, an inductor in series with a shunt capacitor) adds to the
 * total capacitance (inductance) X of the states on either side and couples
 * them directly: `x_k` gains `(e / X_k) x_{k +- 2}`, built as a capacitor
 * `C e / X_k` from the other state's node (its inverse, `u`, into an even
 * integrator) into the summing node. Both follow from the ladder's own node
 * equations (shunt states) and loop equations (series states) with the extra
 * element's current or voltage written out (common practice, no source
 * beyond Girling & Good).
 * An end arm with a zero is refused: its extra element would meet the
 * termination.
 *
 * With a real op-amp the builder is pre-distorted (./predistort.ts): the
 * element values, the source weight and a loss on each inner integrator (a
 * resistor across its capacitor, made as a T of two 1 MΩ arms and a shunt
 * above {@link T_NETWORK_ABOVE_OHMS}) are moved so that the circuit with
 * that op-amp has the ideal circuit's poles, notch frequencies and level.
 *
 * Accuracy: with ideal op-amps and exact values the integrators solve the
 * ladder's state equations exactly, so the response is the prototype's
 * transfer scaled (below 1e-9 dB; test/ladder/active/leapfrog.test.ts).
 *
 * @module
 */
import { UnrealisableError } from "../../errors.ts";
import { lowpassToLowpass } from "../../tf/transforms.ts";
import type { LadderPrototype } from "../types.ts";
import { addCapacitor, addOpamp, addResistor, startBuilder, type Builder } from "./build.ts";
import { ladderDegree, readActiveOptions, requireLadder, type ReadOptions } from "./options.ts";
import type { ActiveLadder, ActiveLadderOptions } from "./types.ts";
import { realiseLadder, type BuiltLadder } from "./predistort.ts";
import type { Zpk } from "../../tf/types.ts";

/** One integrator's inputs: the node of each signal and its coefficient (normalised, rad/s). */
interface Inputs {
  readonly from: readonly (readonly [string, number])[];
  /** Loss across the integrating capacitor (normalised, rad/s), 0 for none. */
  readonly loss: number;
  /** Direct (capacitive) inputs: the node and the ratio of the feed-forward capacitor to the integrating one. */
  readonly feedForward: readonly (readonly [string, number])[];
}

type Arm = LadderPrototype["elements"][number];

/** The element an arm adds to its neighbours' states: a series arm's parallel capacitor, a shunt arm's series inductor. */
const extraOf = (e: Arm | undefined): number => (e === undefined ? 0 : ((e.kind === "series-L" ? e.parallelC : e.seriesL) ?? 0));

/**
 * The coefficients of arm k (0-based): from the previous state (or the
 * source), to the next, the loss, and the direct couplings from the states
 * two arms away (through the neighbours' extra elements).
 */
function coefficients(p: LadderPrototype, k: number, sourceWeight: number, trim: number): { a: number; b: number; d: number; before: number; after: number } {
  const els = p.elements;
  const e = els[k] as Arm;
  const n = els.length;
  const rs = p.sourceOhms;
  const shunt = e.kind === "shunt-C";
  const [left, right] = [extraOf(els[k - 1]), extraOf(els[k + 1])];
  // the arm's own element and its neighbours' extras: the state's total capacitance or inductance
  const x = e.value + left + right;
  const w = shunt ? 1 / (x * rs) : rs / x;
  let d = trim;
  if (k === 0) d += shunt ? 1 / (x * rs) : rs / x;
  if (k === n - 1) d += shunt ? 1 / (x * p.loadOhms) : p.loadOhms / x;
  return { a: k === 0 ? w * sourceWeight : w, b: w, d, before: left / x, after: right / x };
}

/** Output node of integrator k (1-based): the state with its sign. */
const stateNode = (k: number): string => `x${k}`;

/** Above this a compensation loss resistor is made as a T network (ohms; common practice, no source). */
export const T_NETWORK_ABOVE_OHMS = 5e6;
/** The series arms of that T network, ohms. */
const T_ARM_OHMS = 1e6;

/**
 * The pre-distortion's loss across an inner integrator's capacitor: one
 * resistor, or above {@link T_NETWORK_ABOVE_OHMS} (a fast op-amp needs
 * little loss) a T of two 1 MΩ arms and a shunt `R1^2 / (R - 2 R1)` to
 * ground, whose transfer resistance is R.
 */
function addCompensationLoss(b: Builder, k: number, sum: string, out: string, ohms: number): void {
  const role = `integrator ${k}: loss (op-amp compensation)`;
  if (!(ohms > T_NETWORK_ABOVE_OHMS)) {
    addResistor(b, sum, out, ohms, role);
    return;
  }
  const mid = `m${k}`;
  const r1 = addResistor(b, out, mid, T_ARM_OHMS, `${role}, T arm`);
  const r2 = addResistor(b, mid, sum, T_ARM_OHMS, `${role}, T arm`);
  addResistor(b, mid, "0", (r1 * r2) / (ohms - r1 - r2), `${role}, T shunt`);
}

/** Place integrator k (1-based) with its inputs; even k get the inverter after. */
function placeIntegrator(b: Builder, k: number, n: number, inputs: Inputs, o: ReadOptions, inverterOhms: number): void {
  const sum = `s${k}`;
  const even = k % 2 === 0;
  const out = even ? `u${k}` : stateNode(k);
  const c = o.capacitorF;
  for (const [node, w] of inputs.from) addResistor(b, node, sum, 1 / (w * o.kf * c), `integrator ${k}: input from ${node === "in" ? "the source" : `integrator ${node.slice(1)}`}`);
  for (const [node, ratio] of inputs.feedForward) addCapacitor(b, node, sum, ratio * c, `integrator ${k}: feed-forward from integrator ${node.slice(1)}`);
  if (inputs.loss !== 0) {
    const ohms = 1 / (inputs.loss * o.kf * c);
    if (k === 1 || k === n) addResistor(b, sum, out, ohms, `integrator ${k}: loss (termination)`);
    else addCompensationLoss(b, k, sum, out, ohms);
  }
  addCapacitor(b, sum, out, c, `integrator ${k}: integrating capacitor`);
  addOpamp(b, "0", sum, out);
  if (even) {
    const t = `t${k}`;
    addResistor(b, out, t, inverterOhms, `inverter ${k}: input`);
    addResistor(b, t, stateNode(k), inverterOhms, `inverter ${k}: feedback`);
    addOpamp(b, "0", t, stateNode(k));
  }
}

/** Sign of state k (1-based) at node x_k: - - + + - - + + ... */
const stateSign = (k: number): number => (Math.floor((k - 1) / 2) % 2 === 0 ? -1 : 1);

/**
 * A lowpass filter from a normalised lowpass ladder by leapfrog
 * simulation: an integrator per arm (each even arm's followed by an
 * inverter), the terminations as losses of the end integrators, the
 * transmission zeros by feed-forward capacitors, every integrating
 * capacitor the shared one.
 *
 * @param prototype - the normalised lowpass ladder (1 rad/s), either form; transmission zeros in inner arms only
 * @param options - the passband edge, the shared capacitor, series, values, op-amp, gain
 * @returns the circuit, its parts, op-amp count and the transfer it realises (`inverting` for n = 1, 5, 9, ...)
 * @throws {@link InvalidArgumentError} for a malformed prototype or option (the path names it)
 * @throws {@link UnrealisableError} for a transmission zero in an end arm, or a part outside the
 *   hard window (the message says which way to move the capacitor)
 * @example
 * ```ts
 * const third = { family: "butterworth", order: 3, form: "shunt-first", sourceOhms: 1, loadOhms: 1,
 *   elements: [{ kind: "shunt-C", value: 1 }, { kind: "series-L", value: 2 }, { kind: "shunt-C", value: 1 }],
 *   transfer: { zeros: [], poles: [{ re: -1, im: 0 }, { re: -0.5, im: 0.866 }, { re: -0.5, im: -0.866 }], gain: 0.5 } };
 * const f = leapfrogLowpassLadder(third, { edgeHz: 1000, capacitorF: 10e-9 });
 * f.opampCount; //=> 4
 * f.inverting; //=> false
 * ```
 */
export function leapfrogLowpassLadder(prototype: LadderPrototype, options: ActiveLadderOptions): ActiveLadder {
  const fn = "leapfrogLowpassLadder";
  const p = requireLadder(fn, prototype, "any");
  for (const at of [0, p.elements.length - 1]) {
    const e = p.elements[at] as Arm;
    const field = e.kind === "series-L" ? "parallelC" : "seriesL";
    if (extraOf(e) > 0) {
      throw new UnrealisableError({ fn, path: `prototype.elements[${at}].${field}`, received: e[field], message: "an end arm with a transmission zero meets the termination, which the end integrator's loss cannot carry; use a ladder whose zeros sit in the inner arms (every usual elliptic and Chebyshev II form)" });
    }
  }
  const transfer = p.transfer;
  const o = readActiveOptions(fn, options);
  return realiseLadder(fn, p, o, (q, opamp, exact, armTrim, probing) => buildLeapfrog(fn, q, transfer, { ...o, opamp, exact, armTrim, probing }), {
    gain: true,
    load: false,
    // an inner integrator's loss is a resistor, so positive: start it at 3 edge / GBW, about where it ends (measured; no source)
    start: (i: number, ratio: number) => (i === 0 || i === p.elements.length - 1 ? 0 : 3 * ratio),
  });
}

/** The leapfrog circuit of a checked prototype (its element values as given) with checked options. */
function buildLeapfrog(fn: string, p: LadderPrototype, transfer: Zpk, o: ReadOptions): BuiltLadder {
  const n = p.elements.length;
  const lastSeries = (p.elements[n - 1] as LadderPrototype["elements"][number]).kind === "series-L";
  // the last state is RS I when the last arm is an inductor: the load voltage RL I is RL / RS times it
  const outputFactor = lastSeries ? p.loadOhms / p.sourceOhms : 1;
  const level = Math.sqrt(p.loadOhms / p.sourceOhms) / 2;
  // the source's weight: the output is k H / outputFactor, with H the ladder's transfer (peak `level`)
  const k = (o.gain * outputFactor * Math.exp(o.armTrim?.[n] ?? 0)) / level;
  const b = startBuilder(fn, o);
  const inverterOhms = 1 / (o.kf * o.capacitorF);
  for (let i = 1; i <= n; i++) {
    const { a, b: next, d, before, after } = coefficients(p, i - 1, k, o.armTrim?.[i - 1] ?? 0);
    const from: [string, number][] = [[i === 1 ? "in" : stateNode(i - 1), a]];
    if (i < n) from.push([stateNode(i + 1), next]);
    // the state two arms away, with the sign this integrator needs: x for an odd one, u (its inverse) for an even one
    const away = (m: number): string => (i % 2 === 1 ? stateNode(m) : `u${m}`);
    const feedForward: [string, number][] = [];
    if (before > 0) feedForward.push([away(i - 2), before]);
    if (after > 0) feedForward.push([away(i + 2), after]);
    placeIntegrator(b, i, n, { from, loss: d, feedForward }, o, inverterOhms);
  }
  // the output: x_n carries the state times its sign; an even arm's integrator output u_n carries minus that
  const sign = stateSign(n);
  const tap = sign > 0 || n % 2 === 1 ? stateNode(n) : `u${n}`;
  const inverting = sign < 0 && n % 2 === 1;
  const lp = lowpassToLowpass(transfer, { w0: o.kf });
  return Object.freeze({
    method: "leapfrog",
    response: "lowpass",
    circuit: Object.freeze({ title: `leapfrog lowpass ladder, order ${ladderDegree(p)}`, elements: Object.freeze(b.elements) }),
    source: "Vin",
    output: tap,
    parts: Object.freeze(b.parts),
    opampCount: b.count.U,
    target: Object.freeze({ ...lp, gain: ((lp.gain * o.gain) / level) * (inverting ? -1 : 1) }),
    dcPath: null,
    inverting,
    impedanceScale: 1 / (o.kf * o.capacitorF * p.sourceOhms),
    frequencyScale: o.kf,
  });
}
