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
 * DC path: a node between two series capacitors whose shunt arm is a
 * resonator (a ladder with finite zeros) is reached only through
 * capacitors; a resistor of dcPathRatio times the reactance at the edge
 * across the capacitor before it gives it one (common practice, no source).
 * Above the edge its effect falls with frequency; with the default ratio of
 * 1000 it moves the passband by at most 0.023 dB for the elliptic ladders
 * tested (orders 3 and 5; test/ladder/active/gic-highpass.test.ts). All-pole ladders need
 * none: every node has a grounded inductor or a termination.
 *
 * Accuracy: with ideal op-amps and exact values the circuit is the passive
 * highpass ladder (with those resistors) exactly, so for an all-pole ladder
 * its response is the prototype's transfer mapped to highpass, to rounding
 * (below 1e-9 dB; test/ladder/active/gic-highpass.test.ts).
 *
 * @module
 */
import { UnrealisableError } from "../../errors.ts";
import { lowpassToHighpass } from "../../tf/transforms.ts";
import type { LadderPrototype } from "../types.ts";
import { addCapacitor, addOutputAmplifier, addResistor, startBuilder, type Builder } from "./build.ts";
import { addGicInductor } from "./gic.ts";
import { DC_PATH_LEVEL_OHMS, DEFAULT_LEVEL_OHMS, ladderDegree, readActiveOptions, readDcPathRatio, requireLadder, type ReadOptions } from "./options.ts";
import { realiseLadder, type BuiltLadder } from "./predistort.ts";
import type { Zpk } from "../../tf/types.ts";
import type { ActiveLadder, ActiveLadderOptions, ActiveLadderPart, DcPathOptions } from "./types.ts";

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

/** Options of {@link gicHighpassLadder}. */
export interface GicHighpassOptions extends ActiveLadderOptions, DcPathOptions {}

/** A series capacitor placed, and whether the node after it has a DC path. */
interface SeriesArm {
  readonly from: string;
  readonly to: string;
  readonly farads: number;
  readonly arm: number;
  grounded: boolean;
}

/** The ladder's arms placed from node `a1` on; returns the last node and the series capacitors. */
function placeArms(b: Builder, p: LadderPrototype, km: number, o: ReadOptions): { node: string; series: SeriesArm[] } {
  let node = "a1";
  let nodes = 1;
  let gics = 0;
  const series: SeriesArm[] = [];
  const levelOhms = 1 / (o.kf * o.capacitorF);
  p.elements.forEach((e, i) => {
    const arm = `arm ${i + 1}`;
    if (e.kind === "series-L") {
      const next = `a${++nodes}`;
      const farads = addCapacitor(b, node, next, 1 / e.value / (km * o.kf), `${arm}: series capacitor`);
      series.push({ from: node, to: next, farads, arm: i + 1, grounded: false });
      node = next;
      return;
    }
    const henries = (km * (1 / e.value)) / o.kf;
    let at = node;
    if (e.seriesL !== undefined) {
      at = `r${i + 1}`;
      addCapacitor(b, node, at, 1 / e.seriesL / (km * o.kf), `${arm}: resonator capacitor`);
    } else {
      const last = series[series.length - 1];
      if (last !== undefined && last.to === node) last.grounded = true;
    }
    addGicInductor(b, at, `g${++gics}_`, { henries, levelOhms, compensation: o.armTrim?.[i] ?? 0 }, `${arm}: grounded inductor`);
  });
  return { node, series };
}

/**
 * A resistor across each series capacitor whose far node has no DC path
 * (only capacitors reach it: a node between series capacitors whose shunt
 * arm is a resonator), of dcPathRatio times the capacitor's reactance at
 * the edge; the last node has the load. Returns the resistors placed.
 */
function placeDcPaths(b: Builder, series: readonly SeriesArm[], last: string, ratio: number): ActiveLadderPart[] {
  const out: ActiveLadderPart[] = [];
  for (const c of series) {
    if (c.grounded || c.to === last) continue;
    addResistor(b, c.from, c.to, ratio / (b.options.kf * c.farads), `arm ${c.arm}: DC path across the series capacitor`);
    out.push(b.parts[b.parts.length - 1] as ActiveLadderPart);
  }
  return out;
}

/**
 * A highpass filter from a normalised lowpass ladder: the ladder mapped to
 * highpass, its grounded inductors simulated by Antoniou GICs, buffered by a
 * non-inverting output amplifier.
 *
 * @param prototype - the normalised lowpass ladder (1 rad/s), no capacitor
 *   across a series inductor (use the form whose zeros sit in the shunt arms)
 * @param options - the highpass edge, the shared capacitor, series, values, op-amp, gain, DC path ratio
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
export function gicHighpassLadder(prototype: LadderPrototype, options: GicHighpassOptions): ActiveLadder {
  const fn = "gicHighpassLadder";
  const p = requireLadder(fn, prototype, "grounded-capacitors");
  const transfer = p.transfer;
  // a ladder with finite zeros needs DC path resistors dcPathRatio times above its level: a lower level
  const resonators = p.elements.some((e) => e.seriesL !== undefined);
  const o = readActiveOptions(fn, options, resonators ? DC_PATH_LEVEL_OHMS : DEFAULT_LEVEL_OHMS);
  const ratio = readDcPathRatio(fn, options);
  const gain = amplifierGain(fn, p, o.gain);
  return realiseLadder(fn, p, o, (q, opamp, exact, armTrim, probing) => buildGic(fn, q, transfer, { ...o, opamp, exact, armTrim, probing }, ratio, gain), {
    gain: false,
    load: false,
    // the compensation capacitor of each GIC (shunt arms), as a fraction of the shared one: start at edge / GBW
    start: (i: number, r: number) => ((p.elements[i] as LadderPrototype["elements"][number]).kind === "shunt-C" ? r : 0),
  });
}

/** The circuit of a checked prototype (its element values as given) with checked options, DC path ratio and amplifier gain. */
function buildGic(fn: string, p: LadderPrototype, transfer: Zpk, o: ReadOptions, ratio: number, gain: number): BuiltLadder {
  const firstSeries = p.elements.find((e) => e.kind === "series-L");
  // capacitor first: the first series capacitor (1 / l normalised) is the shared one
  const anchor = firstSeries === undefined ? 1 / p.sourceOhms : 1 / firstSeries.value;
  const km = anchor / (o.kf * o.capacitorF);
  const b = startBuilder(fn, o);
  addResistor(b, "in", "a1", km * p.sourceOhms, "source termination");
  const { node: last, series } = placeArms(b, p, km, o);
  const dc = placeDcPaths(b, series, last, ratio);
  addResistor(b, last, "0", km * p.loadOhms, "load termination");
  addOutputAmplifier(b, last, gain, 1 / (o.kf * o.capacitorF));
  const hp = lowpassToHighpass(transfer, { w0: o.kf });
  return Object.freeze({
    method: "gic-inductor",
    response: "highpass",
    circuit: Object.freeze({ title: `GIC highpass ladder, order ${ladderDegree(p)}`, elements: Object.freeze(b.elements) }),
    source: "Vin",
    output: "out",
    parts: Object.freeze(b.parts),
    opampCount: b.count.U,
    target: Object.freeze({ ...hp, gain: hp.gain * gain }),
    dcPath: Object.freeze({ ratio, resistors: Object.freeze(dc) }),
    inverting: false,
    impedanceScale: km,
    frequencyScale: o.kf,
  });
}
