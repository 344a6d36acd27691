/**
 * A lowpass ladder by the FDNR transformation: every impedance divided by
 * s, so that inductors become resistors, resistors capacitors and
 * capacitors frequency-dependent negative resistances (D elements,
 * `Z = 1 / (s^2 D)`), each D a GIC with two capacitors.
 *
 * Method: L. T. Bruton, "Network transfer functions using the concept of
 * frequency-dependent negative resistance", IEEE Trans. Circuit Theory
 * 16(3):406-408, 1969. Dividing every impedance by `s / Kf` leaves every
 * voltage ratio unchanged, so the transfer to the load node is the
 * ladder's. In the divided network a series inductor l is a resistor
 * Km l, a shunt capacitor c a grounded D = c / (Km Kf^2) (./gic.ts,
 * capacitors at Z1 and Z5), a shunt series resonator a resistor above a
 * grounded D, the terminations RS, RL capacitors 1 / (Km Kf RS),
 * 1 / (Km Kf RL); Km is chosen so that the source capacitor is the shared
 * capacitor (and with equal terminations so is the load's).
 *
 * DC path: in that network the source and load are capacitors, so the
 * ladder's nodes, and the op-amp inputs on them, have no DC path. A
 * resistor Ra = dcPathRatio Km RS across the source capacitor and
 * Rb = RL (Ra + sum of the series resistors) / RS across the load
 * capacitor give one and keep the DC gain exactly RL / (RS + RL) (common
 * practice, no source beyond the paper). Their effect is part of the
 * circuit, so of every analysis of it: in the undivided ladder they are
 * inductors Ra / Km and Rb / Km (normalised) across the terminations, which
 * move the response near `edgeHz / dcPathRatio`: for ratios of 1000 and
 * more by at most about 30 / dcPathRatio dB for the ladders tested
 * (Butterworth orders 1-10, Chebyshev I of 0.5 dB orders 2-10), odd orders
 * the most (0.027 dB at the default 1000), even orders below 0.0005 dB;
 * 0.27 dB at a ratio of 100 (test/ladder/active/fdnr-lowpass.test.ts).
 *
 * Accuracy: with ideal op-amps and exact values the circuit is the
 * divided ladder with those two resistors exactly (below 1e-9 dB from it).
 *
 * @module
 */
import { lowpassToLowpass } from "../../tf/transforms.ts";
import type { LadderPrototype } from "../types.ts";
import { addCapacitor, addOutputAmplifier, addResistor, startBuilder, type Builder } from "./build.ts";
import { addGicFdnr } from "./gic.ts";
import { amplifierGain } from "./gic-highpass.ts";
import { DC_PATH_LEVEL_OHMS, ladderDegree, readActiveOptions, readDcPathRatio, requireLadder, type ReadOptions } from "./options.ts";
import { realiseLadder, type BuiltLadder } from "./predistort.ts";
import type { Zpk } from "../../tf/types.ts";
import type { ActiveLadder, ActiveLadderOptions, ActiveLadderPart, DcPathOptions } from "./types.ts";

/** Options of {@link fdnrLowpassLadder}. */
export interface FdnrLadderOptions extends ActiveLadderOptions, DcPathOptions {}

/** The arms placed from node `a1` on; returns the last node and the sum of the series resistors. */
function placeArms(b: Builder, p: LadderPrototype, km: number, o: ReadOptions): { node: string; seriesOhms: number } {
  let node = "a1";
  let nodes = 1;
  let gics = 0;
  let seriesOhms = 0;
  const levelOhms = 1 / (o.kf * o.capacitorF);
  p.elements.forEach((e, i) => {
    const arm = `arm ${i + 1}`;
    if (e.kind === "series-L") {
      const next = `a${++nodes}`;
      seriesOhms += addResistor(b, node, next, km * e.value, `${arm}: series resistor (inductor / s)`);
      node = next;
      return;
    }
    let at = node;
    if (e.seriesL !== undefined) {
      at = `r${i + 1}`;
      addResistor(b, node, at, km * e.seriesL, `${arm}: resonator resistor (inductor / s)`);
    }
    addGicFdnr(b, at, `d${++gics}_`, { d: e.value / (km * o.kf * o.kf), levelOhms, compensation: o.armTrim?.[i] ?? 0 }, `${arm}: FDNR (capacitor / s)`);
  });
  return { node, seriesOhms };
}

/**
 * A lowpass filter from a normalised lowpass ladder by the FDNR
 * transformation: resistors for the inductors, GIC FDNRs for the
 * capacitors, capacitors for the terminations with their DC path resistors,
 * and a non-inverting output amplifier.
 *
 * @param prototype - the normalised lowpass ladder (1 rad/s), no capacitor
 *   across a series inductor (use the form whose zeros sit in the shunt arms)
 * @param options - the passband edge, the shared capacitor, series, values,
 *   op-amp, gain, and the DC path ratio
 * @returns the circuit, its parts, op-amp count, the transfer it realises and the DC path resistors (across the source and load capacitors)
 * @throws {@link InvalidArgumentError} for a malformed prototype or option (the path names it)
 * @throws {@link UnrealisableError} for a capacitor across a series inductor, a gain below the
 *   ladder's own level, or a part outside the hard window (the message says which way to move the capacitor)
 * @example
 * ```ts
 * const third = { family: "butterworth", order: 3, form: "series-first", sourceOhms: 1, loadOhms: 1,
 *   elements: [{ kind: "series-L", value: 1 }, { kind: "shunt-C", value: 2 }, { kind: "series-L", value: 1 }],
 *   transfer: { zeros: [], poles: [{ re: -1, im: 0 }, { re: -0.5, im: 0.866 }, { re: -0.5, im: -0.866 }], gain: 0.5 } };
 * const f = fdnrLowpassLadder(third, { edgeHz: 1000, capacitorF: 100e-9 });
 * f.opampCount; //=> 3
 * f.dcPath.resistors.map((r) => r.value); //=> [1580000, 1580000] (1000 x 1.59 kΩ, rounded to E96)
 * ```
 */
export function fdnrLowpassLadder(prototype: LadderPrototype, options: FdnrLadderOptions): ActiveLadder {
  const fn = "fdnrLowpassLadder";
  const p = requireLadder(fn, prototype, "grounded-capacitors");
  const transfer = p.transfer;
  const o = readActiveOptions(fn, options, DC_PATH_LEVEL_OHMS);
  const ratio = readDcPathRatio(fn, options);
  const gain = amplifierGain(fn, p, o.gain);
  return realiseLadder(fn, p, o, (q, opamp, exact, armTrim, probing) => buildFdnr(fn, q, transfer, { ...o, opamp, exact, armTrim, probing }, ratio, gain), {
    gain: false,
    load: false,
    // the compensation capacitor of each GIC (shunt arms), as a fraction of the shared one: start at edge / GBW
    start: (i: number, r: number) => ((p.elements[i] as LadderPrototype["elements"][number]).kind === "shunt-C" ? r : 0),
  });
}

/** The circuit of a checked prototype (its element values as given) with checked options, DC path ratio and amplifier gain. */
function buildFdnr(fn: string, p: LadderPrototype, transfer: Zpk, o: ReadOptions, ratio: number, gain: number): BuiltLadder {
  // capacitor first: the source capacitor 1 / (Km Kf RS) is the shared one
  const km = 1 / (p.sourceOhms * o.kf * o.capacitorF);
  const b = startBuilder(fn, o);
  addCapacitor(b, "in", "a1", o.capacitorF, "source termination (resistor / s)");
  const ra = addResistor(b, "in", "a1", ratio * km * p.sourceOhms, "DC path across the source capacitor");
  const raPart = b.parts[b.parts.length - 1] as ActiveLadderPart;
  const { node, seriesOhms } = placeArms(b, p, km, o);
  addCapacitor(b, node, "0", 1 / (km * o.kf * p.loadOhms), "load termination (resistor / s)");
  addResistor(b, node, "0", (p.loadOhms * (ra + seriesOhms)) / p.sourceOhms, "DC path across the load capacitor");
  const rbPart = b.parts[b.parts.length - 1] as ActiveLadderPart;
  addOutputAmplifier(b, node, gain, km * p.sourceOhms);
  const lp = lowpassToLowpass(transfer, { w0: o.kf });
  return Object.freeze({
    method: "fdnr",
    response: "lowpass",
    circuit: Object.freeze({ title: `FDNR lowpass ladder, order ${ladderDegree(p)}`, elements: Object.freeze(b.elements) }),
    source: "Vin",
    output: "out",
    parts: Object.freeze(b.parts),
    opampCount: b.count.U,
    target: Object.freeze({ ...lp, gain: lp.gain * gain }),
    inverting: false,
    impedanceScale: km,
    frequencyScale: o.kf,
    dcPath: Object.freeze({ ratio, resistors: Object.freeze([raPart, rbPart]) }),
  });
}
