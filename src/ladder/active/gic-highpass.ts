/**
 * A highpass ladder with its grounded inductors simulated by GICs.
 *
 * Method: the normalised lowpass ladder becomes a highpass one by
 * `s -> 1 / s` arm by arm (a series inductor l becomes a series capacitor
 * 1 / l, a shunt capacitor c a grounded inductor 1 / c, a shunt series
 * resonator a series resonator of the same zero frequency with its inductor
 * grounded: M. E. Van Valkenburg, "Analog Filter Design", Holt, Rinehart and
 * Winston, 1982, ch. 13), then scaled by R' = Km R, L' = Km L / Kf,
 * C' = C / (Km Kf) with Kf = 2 pi edgeHz and Km chosen so that the first
 * series capacitor is the shared capacitor (with no series arm, so that the
 * source resistance is 1 / (Kf C)). Each grounded inductor is an Antoniou
 * GIC (./gic.ts) with the shared capacitor at Z4, and the load node drives a
 * non-inverting output amplifier that takes the ladder's level at maximum
 * power transfer, sqrt(RL / RS) / 2, to the gain asked for.
 *
 * Accuracy: with ideal op-amps and exact values the circuit is the passive
 * ladder exactly, so its response is the prototype's transfer mapped to
 * highpass, to rounding (below 1e-9 dB; test/ladder/active/gic-highpass.test.ts).
 *
 * @module
 */
import { UnrealisableError } from "../../errors.ts";
import { requireZpk } from "../../tf/check.ts";
import { lowpassToHighpass } from "../../tf/transforms.ts";
import type { LadderPrototype } from "../types.ts";
import { addCapacitor, addOutputAmplifier, addResistor, startBuilder, type Builder } from "./build.ts";
import { addGicInductor } from "./gic.ts";
import { readActiveOptions, requireLadder, type ReadOptions } from "./options.ts";
import type { ActiveLadder, ActiveLadderOptions } from "./types.ts";

/**
 * The gain of the output amplifier that takes the ladder's level at maximum
 * power transfer, sqrt(RL / RS) / 2, to `gain`.
 *
 * @param fn - public function name
 * @param p - the prototype
 * @param gain - the gain asked for
 * @returns the amplifier's gain (>= 1)
 * @throws {@link UnrealisableError} when that would be below 1
 */
export function amplifierGain(fn: string, p: LadderPrototype, gain: number): number {
  const level = Math.sqrt(p.loadOhms / p.sourceOhms) / 2;
  const g = gain / level;
  if (g < 1 - 1e-12) {
    throw new UnrealisableError({ fn, path: "options.gain", received: gain, message: `the ladder's own passband level is ${level.toPrecision(4)} V/V and the output amplifier only raises it; ask for a gain of at least ${level.toPrecision(4)}, or attenuate after the filter` });
  }
  return Math.max(1, g);
}

/** The ladder's arms placed from node `a1` on; returns the last node. */
function placeArms(b: Builder, p: LadderPrototype, km: number, o: ReadOptions): string {
  let node = "a1";
  let nodes = 1;
  let gics = 0;
  const levelOhms = 1 / (o.kf * o.capacitorF);
  p.elements.forEach((e, i) => {
    const arm = `arm ${i + 1}`;
    if (e.kind === "series-L") {
      const next = `a${++nodes}`;
      addCapacitor(b, node, next, 1 / e.value / (km * o.kf), `${arm}: series capacitor`);
      node = next;
      return;
    }
    const henries = (km * (1 / e.value)) / o.kf;
    let at = node;
    if (e.seriesL !== undefined) {
      at = `r${i + 1}`;
      addCapacitor(b, node, at, 1 / e.seriesL / (km * o.kf), `${arm}: resonator capacitor`);
    }
    addGicInductor(b, at, `g${++gics}_`, { henries, levelOhms }, `${arm}: grounded inductor`);
  });
  return node;
}

/**
 * A highpass filter from a normalised lowpass ladder: the ladder mapped to
 * highpass, its grounded inductors simulated by Antoniou GICs, buffered by a
 * non-inverting output amplifier.
 *
 * @param prototype - the normalised lowpass ladder (1 rad/s), no capacitor
 *   across a series inductor (use the form whose zeros sit in the shunt arms)
 * @param options - the highpass edge, the shared capacitor, series, values, op-amp, gain
 * @returns the circuit, its parts, op-amp count and the transfer it realises
 * @throws {@link InvalidArgumentError} for a malformed prototype or option (the path names it)
 * @throws {@link UnrealisableError} for a capacitor across a series inductor, a gain below the
 *   ladder's own level, or a part outside the hard window (the message says which way to move the capacitor)
 * @example
 * ```ts
 * const third = { family: "butterworth", order: 3, form: "shunt-first", sourceOhms: 1, loadOhms: 1,
 *   elements: [{ kind: "shunt-C", value: 1 }, { kind: "series-L", value: 2 }, { kind: "shunt-C", value: 1 }],
 *   transfer: { zeros: [], poles: [{ re: -1, im: 0 }, { re: -0.5, im: 0.866 }, { re: -0.5, im: -0.866 }], gain: 0.5 } };
 * gicHighpassLadder(third, { edgeHz: 300, capacitorF: 10e-9 }).opampCount; //=> 5
 * ```
 */
export function gicHighpassLadder(prototype: LadderPrototype, options: ActiveLadderOptions): ActiveLadder {
  const fn = "gicHighpassLadder";
  const p = requireLadder(fn, prototype, "grounded-capacitors");
  const transfer = requireZpk(fn, "prototype.transfer", p.transfer);
  const o = readActiveOptions(fn, options);
  const gain = amplifierGain(fn, p, o.gain);
  const firstSeries = p.elements.find((e) => e.kind === "series-L");
  // capacitor first: the first series capacitor (1 / l normalised) is the shared one
  const anchor = firstSeries === undefined ? 1 / p.sourceOhms : 1 / firstSeries.value;
  const km = anchor / (o.kf * o.capacitorF);
  const b = startBuilder(fn, o);
  addResistor(b, "in", "a1", km * p.sourceOhms, "source termination");
  const last = placeArms(b, p, km, o);
  addResistor(b, last, "0", km * p.loadOhms, "load termination");
  addOutputAmplifier(b, last, gain, 1 / (o.kf * o.capacitorF));
  const hp = lowpassToHighpass(transfer, { w0: o.kf });
  return Object.freeze({
    method: "gic-inductor",
    response: "highpass",
    circuit: Object.freeze({ title: `GIC highpass ladder, order ${p.order}`, elements: Object.freeze(b.elements) }),
    source: "Vin",
    output: "out",
    parts: Object.freeze(b.parts),
    opampCount: b.count.U,
    target: Object.freeze({ ...hp, gain: hp.gain * gain }),
    inverting: false,
    impedanceScale: km,
    frequencyScale: o.kf,
  });
}
