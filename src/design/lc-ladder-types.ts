/**
 * Plain-data types of a passive LC ladder designed from a spec
 * ({@link designLcLadder}): the choice, the placement, the ladder exact and as
 * built, its circuit and parts, and the proof of its boards.
 *
 * @module
 */
import type { FamilyName } from "../approx/types.ts";
import type { Circuit } from "../circuit/types.ts";
import type { AsBuiltLadder, InductorSeries } from "../ladder/as-built-types.ts";
import type { LadderPartLine } from "../ladder/parts-list.ts";
import type { ScaledLadder } from "../ladder/scaled-types.ts";
import type { LadderForm, LadderPrototype } from "../ladder/types.ts";
import type { DesignSpec } from "./spec.ts";
import type { LcLadderOptions } from "./lc-ladder-options.ts";

/** Where the ladder's prototype was put inside the mask's slack. */
export interface LcLadderPlacement {
  /**
   * The placed parameter: the natural frequency (lowpass, highpass: where
   * the prototype's 1 rad/s goes) or the bandwidth (bandpass, bandstop).
   */
  readonly parameter: "natural-frequency" | "bandwidth";
  /** Lowest value (Hz) at which the exact ladder meets the mask. */
  readonly lowHz: number;
  /** Highest such value, Hz (below `lowHz` when the ladder cannot meet the mask). */
  readonly highHz: number;
  /** The value used, Hz. */
  readonly chosenHz: number;
  /**
   * Where in the interval, on log frequency: 0 at `lowHz`, 1 at `highHz`
   * (one of 0, 0.1, ..., 1: the nominal as-built ladder's best margin).
   */
  readonly position: number;
  /** Bandpass and bandstop: the centre, Hz. */
  readonly centreHz?: number;
}

/** The boards' yield. */
export interface LcLadderYield {
  /** Fraction of the boards that met the mask. */
  readonly fraction: number;
  /** Lower end of its 95 % Wilson score interval. */
  readonly lower95: number;
  /** Upper end of the 95 % interval. */
  readonly upper95: number;
  /** Boards built. */
  readonly boards: number;
  /** Boards that met the mask. */
  readonly passed: number;
  /** Whether `lower95` reaches the spec's yield target. */
  readonly met: boolean;
  /** The spec's yield target. */
  readonly target: number;
  /** Seed of the part draws. */
  readonly seed: number;
  /** How part values were spread within their tolerances. */
  readonly distribution: "uniform" | "normal";
  /** Inductor tolerance drawn, fraction. */
  readonly inductorTolerance: number;
  /** Capacitor tolerance drawn, fraction. */
  readonly capacitorTolerance: number;
  /** Source and load resistance tolerance drawn, fraction (0: held). */
  readonly terminationTolerance: number;
  /** The board with the smallest margin (the earliest of equals). */
  readonly worstBoard: LcLadderBoard;
}

/** One Monte Carlo board. */
export interface LcLadderBoard {
  /** Its index in the run, from 0. */
  readonly index: number;
  /** Its margin against the mask, dB. */
  readonly marginDb: number;
  /** The value of every part drawn (H, F, ohms) by circuit element name, the loss resistances included. */
  readonly values: Readonly<Record<string, number>>;
}

/** The as-built ladder against the spec's mask. */
export interface LcLadderVerification {
  /**
   * Largest passband loss below the ladder's lossless level
   * (`levelDb`), dB: the parts' dissipation loss included.
   */
  readonly passbandLossDb: number;
  /** Where, Hz. */
  readonly passbandWorstHz: number;
  /** Passband margin, dB (`maxLossDb` minus the loss). */
  readonly passbandMarginDb: number;
  /** Smallest stopband attenuation below the lossless level, dB. */
  readonly stopbandAttenuationDb: number;
  /** Where, Hz. */
  readonly stopbandWorstHz: number;
  /** Stopband margin, dB (the attenuation minus `minAttenuationDb`). */
  readonly stopbandMarginDb: number;
  /** The smaller of the two margins, dB. */
  readonly marginDb: number;
  /** Whether the nominal as-built board meets the mask (`marginDb >= 0`). */
  readonly meetsSpec: boolean;
  /** The exact (unrounded, lossless) ladder's margin, dB, for comparison. */
  readonly exactMarginDb: number;
  /** The Monte Carlo boards. */
  readonly yield: LcLadderYield;
}

/** A passive doubly terminated LC ladder designed from a spec and proven on its boards. */
export interface LcLadderDesign {
  /** The canonical spec. */
  readonly spec: DesignSpec;
  /** Approximation family. */
  readonly family: FamilyName;
  /** Order of the lowpass prototype. */
  readonly order: number;
  /** Which arm comes first from the source. */
  readonly form: LadderForm;
  /** Why this family and order, in one sentence. */
  readonly reason: string;
  /** The normalised prototype ladder (1 rad/s, 1 ohm source). */
  readonly prototype: LadderPrototype;
  /** Where the prototype was placed. */
  readonly placement: LcLadderPlacement;
  /**
   * The lossless ladder's passband level, dB (V(load) / V(source emf)):
   * 20 log10(RL / (RS + RL)), or for an even-order Chebyshev I ladder the
   * level of its ripple peaks. Losses and attenuation are measured from it.
   */
  readonly levelDb: number;
  /** The exact ladder in hertz and ohms. */
  readonly ladder: ScaledLadder;
  /** The ladder of preferred-value, lossy parts. */
  readonly asBuilt: AsBuiltLadder;
  /** The as-built ladder's circuit (`VS`, `RS`, the parts and their loss resistances, `RL`). */
  readonly circuit: Circuit;
  /** The parts list, one line per value. */
  readonly parts: readonly LadderPartLine[];
  /** Inductor series used. */
  readonly inductorSeries: InductorSeries;
  /** The nominal check and the boards. */
  readonly verification: LcLadderVerification;
  /**
   * The options the design was made with, every default filled in (`loadOhms`
   * only when it was given): `designLcLadder(specToInput(spec), options)`
   * makes the same design, which is how `lcLadderFromJson` re-verifies one.
   */
  readonly options: Readonly<LcLadderOptions>;
}
