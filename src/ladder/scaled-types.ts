/**
 * Plain-data types of a doubly terminated LC ladder scaled to the user's
 * band (hertz) and terminations (ohms): every inductor and capacitor with its
 * designator, value and the two nodes it connects, the arms they form, and
 * the transfer function the ladder realises.
 *
 * Nodes: `"0"` is ground; the input port (where the source resistance
 * connects) is `"in"`, the output port (across the load) is `"out"`, the
 * junctions between them `"n1"`, `"n2"`, ... in order from the source, and the
 * nodes inside arm k `"a<k>_1"`, `"a<k>_2"`, ... A ladder with no series arm
 * (one shunt capacitor) has one port node, `"out"`.
 *
 * @module
 */
import type { FamilyName } from "../approx/types.ts";
import type { Zpk } from "../tf/types.ts";
import type { LadderForm } from "./types.ts";

/** The response a scaled ladder has. */
export type LadderResponse = "lowpass" | "highpass" | "bandpass" | "bandstop";

/** Every ladder response, in a stable order. */
export const LADDER_RESPONSES: readonly LadderResponse[] = Object.freeze(["lowpass", "highpass", "bandpass", "bandstop"] as const);

/** Where a lowpass or highpass ladder puts the prototype's 1 rad/s. */
export interface LadderEdge {
  /** Response. */
  readonly response: "lowpass" | "highpass";
  /** The frequency (Hz) the prototype's 1 rad/s maps to. */
  readonly edgeHz: number;
}

/** Where a bandpass or bandstop ladder puts the prototype's 1 rad/s. */
export interface LadderBand {
  /** Response. */
  readonly response: "bandpass" | "bandstop";
  /** Centre frequency (Hz), the geometric mean of the two edges. */
  readonly centreHz: number;
  /** Bandwidth (Hz) between the two edges. */
  readonly bandwidthHz: number;
  /** Lower edge (Hz): where the prototype's 1 rad/s maps below the centre. */
  readonly lowerHz: number;
  /** Upper edge (Hz): where the prototype's 1 rad/s maps above the centre. */
  readonly upperHz: number;
}

/** The frequency placement of a scaled ladder. */
export type LadderPlacement = LadderEdge | LadderBand;

/** One inductor or capacitor of a scaled ladder. */
export interface LadderComponent {
  /** Reference designator: `"L1"`, `"L2"`, ... and `"C1"`, `"C2"`, ... numbered from the source end. */
  readonly designator: string;
  /** `"L"` (inductor, value in henries) or `"C"` (capacitor, value in farads). */
  readonly kind: "L" | "C";
  /** Inductance (H) or capacitance (F), > 0. */
  readonly value: number;
  /** One node it connects. */
  readonly a: string;
  /** The other node it connects (`"0"` for ground). */
  readonly b: string;
  /** The arm it belongs to, 1-based from the source end. */
  readonly arm: number;
}

/** One arm of a scaled ladder: the components between two nodes. */
export interface LadderArm {
  /** 1-based position from the source end. */
  readonly index: number;
  /** `"series"` (in the signal path) or `"shunt"` (from a junction to ground). */
  readonly position: "series" | "shunt";
  /** The node on the source side (the junction, for a shunt arm). */
  readonly a: string;
  /** The node on the load side (`"0"` for a shunt arm). */
  readonly b: string;
  /** Designators of the arm's components. */
  readonly designators: readonly string[];
}

/** A doubly terminated LC ladder scaled to hertz and ohms. */
export interface ScaledLadder {
  /** Approximation family of the prototype. */
  readonly family: FamilyName;
  /** Order of the lowpass prototype (bandpass and bandstop ladders have twice as many poles). */
  readonly order: number;
  /** Which arm comes first from the source end. */
  readonly form: LadderForm;
  /** Where the prototype's 1 rad/s went, and the response. */
  readonly placement: LadderPlacement;
  /** Source resistance (ohms). */
  readonly sourceOhms: number;
  /** Load resistance (ohms). */
  readonly loadOhms: number;
  /** Node where the source resistance connects. */
  readonly inputNode: string;
  /** Node across the load. */
  readonly outputNode: string;
  /** The arms, from the source end. */
  readonly arms: readonly LadderArm[];
  /** Every inductor and capacitor, from the source end. */
  readonly components: readonly LadderComponent[];
  /**
   * V(load) / V(source emf) in rad/s: the prototype's transfer under the same
   * frequency transform (impedance scaling leaves it unchanged).
   */
  readonly transfer: Zpk;
}
