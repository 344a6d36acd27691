/**
 * Plain-data types of the active simulations of a doubly terminated LC
 * ladder: the options every realisation shares and the circuit it returns.
 *
 * @module
 */
import type { Circuit, OpAmpModel } from "../../circuit/types.ts";
import type { SeriesName } from "../../parts/eseries.ts";
import type { Zpk } from "../../tf/types.ts";
import type { LadderPrototype } from "../types.ts";

/** An inclusive window of part values. */
export interface PartWindow {
  /** Smallest value. */
  readonly min: number;
  /** Largest value. */
  readonly max: number;
}

/** Which published method a realisation follows. */
export type ActiveLadderMethod = "gic-inductor" | "fdnr" | "leapfrog";

/** Options every active ladder realisation takes. */
export interface ActiveLadderOptions {
  /**
   * The frequency, Hz, that the prototype's 1 rad/s maps to (the passband
   * edge of the normalised ladder: the ripple edge of a Chebyshev or
   * elliptic ladder, the 3 dB point of a Butterworth one), from 1 mHz to 1 GHz.
   */
  readonly edgeHz: number;
  /**
   * The capacitor every integrator, GIC and terminating capacitor uses
   * where the method lets them share one value, farads (10 pF to 10 µF; a
   * member of `capacitorSeries`). The impedance level follows from it.
   * @defaultValue the member of `capacitorSeries` nearest 1 / (2 pi edgeHz R)
   *   with R = 10 kΩ (1 kΩ for the FDNR method and for GIC ladders with
   *   finite zeros, whose DC path resistors sit `dcPathRatio` times higher)
   */
  readonly capacitorF?: number;
  /**
   * Preferred-value series of the resistors.
   * @defaultValue "E96"
   */
  readonly resistorSeries?: SeriesName;
  /**
   * Preferred-value series of the capacitors.
   * @defaultValue "E12"
   */
  readonly capacitorSeries?: SeriesName;
  /**
   * `"preferred"`: every part rounded to its series (a capacitor the method
   * cannot give the shared value made of two in parallel when one alone is
   * further than 0.5 % off), then the resistors re-tuned (`retune`);
   * `"exact"`: the computed values, unrounded.
   * @defaultValue "preferred"
   */
  readonly values?: "preferred" | "exact";
  /**
   * Op-amp model of every op-amp, in the circuit and its netlist. With a
   * single-pole model the values are pre-distorted for its gain-bandwidth
   * (`predistort`, on by default; predistort.ts); without it a 7th-order
   * Chebyshev I's passband departs from the target by about
   * 250 edgeHz / GBW dB (0.25 dB at GBW = 1000 edgeHz) with each of the three
   * methods (measured here).
   * @defaultValue `{ kind: "ideal" }`
   */
  readonly opamp?: OpAmpModel;
  /**
   * Passband peak gain of the whole circuit, V/V (0.01 to 100): the
   * ladder's largest transfer (at maximum power transfer) is taken to it.
   * @defaultValue 1
   */
  readonly gain?: number;
  /**
   * Pre-distort the ladder for the op-amp model: move the normalised
   * element values, and add a loss per arm (a resistor across an inner
   * leapfrog integrator's capacitor, a capacitor across a GIC resistor), so
   * that the exact circuit with these op-amps has the poles and notch
   * frequencies it has with ideal ones, then round (./predistort.ts).
   * Ignored with ideal op-amps. An op-amp too slow for it is refused.
   * @defaultValue true when `opamp` is not ideal
   */
  readonly predistort?: boolean;
  /**
   * Re-tune after rounding: with the capacitors at their stock values,
   * choose the resistors jointly among their neighbouring preferred values
   * (up to three steps from the nearest) so that the circuit as built, with
   * the op-amp model the values were designed for (the options' when
   * pre-distorted, else ideal), has the target's poles, notch frequencies
   * and level (./retune.ts). Ignored with exact values.
   * @defaultValue true
   */
  readonly retune?: boolean;
}

/** What the pre-distortion for the op-amps did. */
export interface ActiveLadderPredistortion {
  /** Gauss-Newton steps taken. */
  readonly steps: number;
  /**
   * Largest relative distance (first order) of a natural frequency or zero
   * of the exact circuit with the op-amps from its place with ideal ones.
   */
  readonly poleError: number;
  /** The normalised ladder the circuit was built from (its `transfer` the original's). */
  readonly prototype: LadderPrototype;
  /**
   * Each arm's trim, from the source end: for leapfrog the loss added to the
   * arm's integrator (normalised, rad/s; a resistor across its capacitor),
   * for the FDNR and GIC methods the log of the ratio of the arm's GIC
   * resistor R2 to R3 (the element's value kept; 0 for an arm with no GIC).
   */
  readonly armTrim: readonly number[];
  /**
   * The level at the edge of the exact circuit with the op-amps over the
   * ideal one's, dB: near 0 for leapfrog (whose source weight is trimmed
   * too); for the FDNR and GIC methods what the op-amps leave of their loss.
   */
  readonly gainErrorDb: number;
}

/** What the re-tune after rounding did (./retune.ts). */
export interface ActiveLadderRetune {
  /** Resistors moved off their nearest preferred value. */
  readonly moved: number;
  /**
   * Largest first-order shift of the response near a reference point (a
   * pole's shift over its distance to the jw axis, a notch's over its
   * distance to the nearest pole, the level at the edge where it is
   * trimmed) of the circuit with every resistor at its nearest preferred
   * value, dB.
   */
  readonly errorBeforeDb: number;
  /** The same of the re-tuned circuit, dB (never above `errorBeforeDb`). */
  readonly errorAfterDb: number;
  /** Linearisations made. */
  readonly rounds: number;
}

/** Options of the realisations that add DC path resistors (the FDNR and GIC methods). */
export interface DcPathOptions {
  /**
   * How far above the impedance it shunts a DC path resistor sits (10 to
   * 1e6): the FDNR ladder's resistor across the source capacitor is
   * dcPathRatio times the scaled source resistance; the GIC ladder's across a
   * series capacitor dcPathRatio times that capacitor's reactance at edgeHz.
   * @defaultValue 1000
   */
  readonly dcPathRatio?: number;
}

/** The resistors a realisation adds so that every node has a DC path; their effect is part of the circuit. */
export interface DcPath {
  /** The ratio used. */
  readonly ratio: number;
  /** The resistors added, in circuit order (none when every node already has a DC path). */
  readonly resistors: readonly ActiveLadderPart[];
}

/** A part of an active ladder: its designator, its computed and its as-built value. */
export interface ActiveLadderPart {
  /** Designator in the circuit, e.g. `"R7"`, `"C3"`. */
  readonly name: string;
  /** Resistor or capacitor. */
  readonly kind: "resistor" | "capacitor";
  /** Value in the circuit (ohms or farads): preferred, or exact with `values: "exact"`. */
  readonly value: number;
  /** The computed value it stands for (for two capacitors in parallel, their sum's target). */
  readonly ideal: number;
  /** What the part does, in a few words. */
  readonly role: string;
}

/** An active realisation of a ladder, ready for nodal analysis and SPICE. */
export interface ActiveLadder {
  /** The method followed. */
  readonly method: ActiveLadderMethod;
  /** What the circuit passes. */
  readonly response: "lowpass" | "highpass";
  /** The circuit, driven by the voltage source `"Vin"` at node `"in"`, output at node {@link ActiveLadder.output}. */
  readonly circuit: Circuit;
  /** Name of the driving source. */
  readonly source: "Vin";
  /** Output node (`"out"`, the output amplifier's, for the GIC and FDNR methods; the last integrator's for leapfrog). */
  readonly output: string;
  /** Every resistor and capacitor, in circuit order. */
  readonly parts: readonly ActiveLadderPart[];
  /** Number of op-amps. */
  readonly opampCount: number;
  /**
   * The transfer function (rad/s) the circuit realises with ideal op-amps and
   * exact values: the prototype's transfer scaled to `edgeHz`, times the gain
   * factor, up to the documented effect of the DC path resistors
   * ({@link ActiveLadder.dcPath}).
   */
  readonly target: Zpk;
  /** The DC path resistors (null for leapfrog, where every node is driven by an op-amp). */
  readonly dcPath: DcPath | null;
  /** Whether the passband output is inverted (`target.gain` is then negative). */
  readonly inverting: boolean;
  /** Impedance scale Km (ohms per normalised ohm) of the realisation. */
  readonly impedanceScale: number;
  /** Frequency scale Kf = 2 pi edgeHz, rad/s. */
  readonly frequencyScale: number;
  /** The pre-distortion for the op-amps (null when none was made: ideal op-amps or `predistort: false`). */
  readonly predistortion: ActiveLadderPredistortion | null;
  /** The re-tune of the resistors after rounding (null when none was made: exact values or `retune: false`). */
  readonly retune: ActiveLadderRetune | null;
}
