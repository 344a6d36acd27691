/**
 * The element list of an active ladder as it is built: resistors and
 * capacitors placed with their computed values and rounded to their
 * preferred-value series (IEC 60063) on the way in, op-amps with the chosen
 * model, designators numbered in order, and the non-inverting output
 * amplifier the FDNR and GIC circuits end in.
 *
 * A resistor is the nearest member of its series. A capacitor that is a
 * member of its series stays as it is (the shared capacitor); any other is
 * the nearest member, or, when that is more than {@link PAIR_ABOVE} off, the
 * better of that and the best two members in parallel (src/parts/combine.ts).
 * A value outside the hard part window (100 ohms to 10 Mohm, 10 pF to 10 uF,
 * the design layer's limits) is an {@link UnrealisableError} that says which
 * way to move the shared capacitor.
 *
 * @module
 */
import { UnrealisableError } from "../../errors.ts";
import type { Element } from "../../circuit/types.ts";
import { bestCombination } from "../../parts/combine.ts";
import { isInSeries, snapToSeries } from "../../parts/snap.ts";
import type { ActiveLadderPart } from "./types.ts";
import { CAPACITOR_LIMITS_F, RESISTOR_LIMITS_OHMS, type ReadOptions } from "./options.ts";

/** Relative error above which a capacitor is made of two in parallel (0.5 %; common practice, no source). */
export const PAIR_ABOVE = 0.005;

/** An element list being built. */
export interface Builder {
  /** The public function building it (for errors). */
  readonly fn: string;
  /** The checked options. */
  readonly options: ReadOptions;
  /** Elements so far. */
  readonly elements: Element[];
  /** Resistors and capacitors so far. */
  readonly parts: ActiveLadderPart[];
  /** Designator counters. */
  readonly count: { R: number; C: number; U: number };
}

/**
 * A new element list, driven by the unit source `"Vin"` at node `"in"`.
 *
 * @param fn - public function name
 * @param options - checked options
 * @returns the builder
 */
export function startBuilder(fn: string, options: ReadOptions): Builder {
  return { fn, options, elements: [{ kind: "V", name: "Vin", a: "in", b: "0", ac: 1 }], parts: [], count: { R: 0, C: 0, U: 0 } };
}

function outOfWindow(b: Builder, kind: "resistor" | "capacitor", value: number, role: string): never {
  const lim = kind === "resistor" ? RESISTOR_LIMITS_OHMS : CAPACITOR_LIMITS_F;
  const low = value < lim.min;
  // a larger shared capacitor lowers every resistor; capacitors other than the shared one move with it
  const move = kind === "resistor" ? (low ? "smaller" : "larger") : low ? "larger" : "smaller";
  const unit = kind === "resistor" ? "ohms" : "F";
  throw new UnrealisableError({
    fn: b.fn,
    path: "options.capacitorF",
    received: b.options.capacitorF,
    message: `the ${kind} for ${role} would be ${value.toPrecision(3)} ${unit}, outside ${lim.min} to ${lim.max} ${unit}; choose a ${move} capacitor`,
  });
}

/**
 * Place a resistor, rounded to the resistor series unless values are exact.
 *
 * @param b - the builder
 * @param a - one node
 * @param c - the other node
 * @param ideal - computed value, ohms
 * @param role - what it does
 * @returns the value placed
 */
export function addResistor(b: Builder, a: string, c: string, ideal: number, role: string): number {
  if (b.options.probing !== true && !(ideal >= RESISTOR_LIMITS_OHMS.min && ideal <= RESISTOR_LIMITS_OHMS.max)) outOfWindow(b, "resistor", ideal, role);
  const value = b.options.exact ? ideal : snapToSeries(ideal, { series: b.options.resistorSeries }).value;
  const name = `R${++b.count.R}`;
  b.elements.push({ kind: "R", name, a, b: c, value });
  b.parts.push({ name, kind: "resistor", value, ideal, role });
  return value;
}

function pushCapacitor(b: Builder, a: string, c: string, value: number, ideal: number, role: string): void {
  const name = `C${++b.count.C}`;
  b.elements.push({ kind: "C", name, a, b: c, value });
  b.parts.push({ name, kind: "capacitor", value, ideal, role });
}

/**
 * Place a capacitor: as it is when exact or already a series member, else
 * the nearest member or two members in parallel (see the module header).
 *
 * @param b - the builder
 * @param a - one node
 * @param c - the other node
 * @param ideal - computed value, farads
 * @param role - what it does
 * @returns the total capacitance placed
 */
export function addCapacitor(b: Builder, a: string, c: string, ideal: number, role: string): number {
  if (b.options.probing !== true && !(ideal >= CAPACITOR_LIMITS_F.min && ideal <= CAPACITOR_LIMITS_F.max)) outOfWindow(b, "capacitor", ideal, role);
  const series = b.options.capacitorSeries;
  if (b.options.exact || isInSeries(ideal, series)) {
    pushCapacitor(b, a, c, ideal, ideal, role);
    return ideal;
  }
  const one = snapToSeries(ideal, { series });
  if (Math.abs(one.relativeError) > PAIR_ABOVE) {
    // capacitors in parallel add: the additive ("series") combination of the two values
    const pair = bestCombination(ideal, { series, kinds: ["series"] }).best;
    const [c1, c2] = pair.parts;
    if (Math.abs(pair.relativeError) < Math.abs(one.relativeError) && c2 <= CAPACITOR_LIMITS_F.max && c1 >= CAPACITOR_LIMITS_F.min && c2 >= CAPACITOR_LIMITS_F.min) {
      pushCapacitor(b, a, c, c1, ideal, `${role} (1 of 2 in parallel)`);
      pushCapacitor(b, a, c, c2, ideal, `${role} (2 of 2 in parallel)`);
      return c1 + c2;
    }
  }
  pushCapacitor(b, a, c, one.value, ideal, role);
  return one.value;
}

/**
 * Place an op-amp with the options' model.
 *
 * @param b - the builder
 * @param inP - non-inverting input node
 * @param inN - inverting input node
 * @param out - output node
 * @returns its designator
 */
export function addOpamp(b: Builder, inP: string, inN: string, out: string): string {
  const name = `U${++b.count.U}`;
  b.elements.push({ kind: "OA", name, inP, inN, out, model: b.options.opamp });
  return name;
}

/**
 * The non-inverting output amplifier from `node` to `"out"`: a follower for
 * a gain of 1, else gain 1 + Rf / Rg with Rg at `levelOhms` (rounded) and Rf
 * computed from the rounded Rg.
 *
 * @param b - the builder
 * @param node - the ladder's output node
 * @param gain - the amplifier's gain, >= 1
 * @param levelOhms - impedance level for Rg
 * @returns the gain as built
 */
export function addOutputAmplifier(b: Builder, node: string, gain: number, levelOhms: number): number {
  if (Math.abs(gain - 1) <= 1e-12) {
    addOpamp(b, node, "out", "out");
    return 1;
  }
  const rg = addResistor(b, "fb", "0", levelOhms, "output amplifier, to ground");
  const rf = addResistor(b, "out", "fb", (gain - 1) * rg, "output amplifier, feedback");
  addOpamp(b, node, "fb", "out");
  return 1 + rf / rg;
}
