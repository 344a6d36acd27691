/**
 * Plain-data circuit elements with named nodes. Node `"0"` is ground.
 * Values are SI (ohms, farads, henries, volts).
 *
 * @module
 */

/** A resistor between two nodes. */
export interface Resistor {
  /** Element kind. */
  readonly kind: "R";
  /** Reference designator, e.g. `"R1"`. */
  readonly name: string;
  /** Positive node. */
  readonly a: string;
  /** Negative node. */
  readonly b: string;
  /** Resistance in ohms (> 0). */
  readonly value: number;
}

/** A capacitor between two nodes. */
export interface Capacitor {
  /** Element kind. */
  readonly kind: "C";
  /** Reference designator, e.g. `"C1"`. */
  readonly name: string;
  /** Positive node. */
  readonly a: string;
  /** Negative node. */
  readonly b: string;
  /** Capacitance in farads (> 0). */
  readonly value: number;
}

/** An inductor between two nodes. */
export interface Inductor {
  /** Element kind. */
  readonly kind: "L";
  /** Reference designator, e.g. `"L1"`. */
  readonly name: string;
  /** Positive node. */
  readonly a: string;
  /** Negative node. */
  readonly b: string;
  /** Inductance in henries (> 0). */
  readonly value: number;
}

/** An independent voltage source (AC magnitude `ac`, phase 0) from `a` (+) to `b` (-). */
export interface VoltageSource {
  /** Element kind. */
  readonly kind: "V";
  /** Reference designator, e.g. `"Vin"`. */
  readonly name: string;
  /** Positive node. */
  readonly a: string;
  /** Negative node. */
  readonly b: string;
  /** AC magnitude in volts. */
  readonly ac: number;
}

/** A voltage-controlled voltage source: `v(a) - v(b) = gain * (v(cp) - v(cn))`. */
export interface Vcvs {
  /** Element kind. */
  readonly kind: "E";
  /** Reference designator, e.g. `"E1"`. */
  readonly name: string;
  /** Positive output node. */
  readonly a: string;
  /** Negative output node. */
  readonly b: string;
  /** Positive controlling node. */
  readonly cp: string;
  /** Negative controlling node. */
  readonly cn: string;
  /** Voltage gain. */
  readonly gain: number;
}

/** The ideal op-amp: a nullor (infinite gain, the inputs at equal voltage, no input current). */
export interface IdealOpAmpModel {
  /** Model kind. */
  readonly kind: "ideal";
}

/** Finite DC gain and one pole: `A(s) = a0 / (1 + s / wp)` with `wp = 2 pi gbwHz / a0`. */
export interface SinglePoleOpAmpModel {
  /** Model kind. */
  readonly kind: "single-pole";
  /** DC open-loop gain (V/V, > 0). */
  readonly a0: number;
  /** Gain-bandwidth product in Hz (> 0). */
  readonly gbwHz: number;
}

/** The single-pole model followed by a series output resistance. */
export interface SinglePoleRoutOpAmpModel {
  /** Model kind. */
  readonly kind: "single-pole-rout";
  /** DC open-loop gain (V/V, > 0). */
  readonly a0: number;
  /** Gain-bandwidth product in Hz (> 0). */
  readonly gbwHz: number;
  /** Open-loop output resistance in ohms (>= 0). */
  readonly routOhm: number;
}

/**
 * Op-amp models:
 * - `ideal`: a nullor (infinite gain, the inputs at equal voltage, no input current).
 * - `single-pole`: `A(s) = a0 / (1 + s / wp)` with `wp = 2 pi gbwHz / a0`.
 * - `single-pole-rout`: the single-pole model followed by an output resistance.
 */
export type OpAmpModel = IdealOpAmpModel | SinglePoleOpAmpModel | SinglePoleRoutOpAmpModel;

/** An op-amp with non-inverting input `inP`, inverting input `inN` and output `out` (referred to ground). */
export interface OpAmp {
  /** Element kind. */
  readonly kind: "OA";
  /** Reference designator, e.g. `"U1"`. */
  readonly name: string;
  /** Non-inverting input node. */
  readonly inP: string;
  /** Inverting input node. */
  readonly inN: string;
  /** Output node. */
  readonly out: string;
  /** Model used in analysis and in the exported netlist. */
  readonly model: OpAmpModel;
}

/** Any circuit element. */
export type Element = Resistor | Capacitor | Inductor | VoltageSource | Vcvs | OpAmp;

/** A circuit: a title and a list of elements. Ground is node `"0"`. */
export interface Circuit {
  /** Title line (first line of a SPICE netlist). */
  readonly title: string;
  /** Elements. */
  readonly elements: readonly Element[];
}
