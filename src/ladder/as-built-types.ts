/**
 * Plain-data types of an LC ladder as built: preferred-value parts
 * (IEC 60063) with their tolerances, and the losses of real parts as series
 * resistances (an inductor's from its Q at a stated frequency, a capacitor's
 * ESR).
 *
 * @module
 */
import type { SeriesName } from "../parts/eseries.ts";
import type { Zpk } from "../tf/types.ts";
import type { LadderComponent, ScaledLadder } from "./scaled-types.ts";

/** The series an inductor may be bought in. */
export type InductorSeries = "E12" | "E24";

/** Every inductor series, coarsest first. */
export const INDUCTOR_SERIES: readonly InductorSeries[] = Object.freeze(["E12", "E24"] as const);

/** One inductor or capacitor as built. */
export interface AsBuiltComponent extends LadderComponent {
  /** The preferred value (H or F), a member of `series`. */
  readonly value: number;
  /** The scaled ladder's exact value (H or F) it replaces. */
  readonly designValue: number;
  /** The series the value is from. */
  readonly series: SeriesName;
  /** Tolerance as a fraction (0.05 for 5 %). */
  readonly tolerance: number;
  /**
   * The part's loss as a resistance in series with it (ohms): an inductor's
   * winding resistance 2 pi f L / Q at the stated frequency, a capacitor's ESR.
   */
  readonly seriesOhms: number;
}

/** The loss model of the parts. */
export interface AsBuiltLosses {
  /** Inductor Q at `qFrequencyHz`. */
  readonly inductorQ: number;
  /** The frequency (Hz) at which `inductorQ` holds. */
  readonly qFrequencyHz: number;
  /** Capacitor ESR (ohms), the same for every capacitor; 0 for none. */
  readonly capacitorEsrOhms: number;
}

/** A doubly terminated LC ladder of preferred-value, lossy parts. */
export interface AsBuiltLadder extends Omit<ScaledLadder, "components" | "transfer"> {
  /** Every inductor and capacitor as built, from the source end. */
  readonly components: readonly AsBuiltComponent[];
  /** The exact ladder's transfer function (rad/s), the design the parts approximate. */
  readonly designTransfer: Zpk;
  /** Series of the inductors. */
  readonly inductorSeries: InductorSeries;
  /** Series of the capacitors. */
  readonly capacitorSeries: SeriesName;
  /** The loss model used. */
  readonly losses: AsBuiltLosses;
}
