/**
 * The plain, readonly data a design returns: the chosen family and order, the
 * stages with their parts, the as-built verification against the mask, the
 * warnings and the actions the pipeline took.
 *
 * Everything here is JSON-safe (numbers, strings, plain arrays and objects),
 * so a result can be stored and read back (see the report layer).
 *
 * @module
 */
import type { DesignRealisation } from "./realisation.ts";
import type { FamilyName } from "../approx/index.ts";
import type { AsBuiltPole } from "../topologies/as-built.ts";
import type { StageFigures, StageKind } from "../topologies/types.ts";
import type { DesignSpec, FamilyPriority } from "./spec.ts";

/** Relative errors of the as-built figures against the target (0.01 = 1 %). */
export interface StageErrors {
  /** |f0 as built / f0 target - 1| (for a third-order stage, the larger of the pole pair's and the real pole's). */
  readonly f0: number;
  /** |Q as built / Q target - 1| (0 for first order). */
  readonly q: number;
  /** |fz as built / fz target - 1| (0 when no zero). */
  readonly fz: number;
  /** |gain as built / gain target - 1|. */
  readonly gain: number;
}

/** One stage of the cascade as it will be built. */
export interface DesignStage {
  /** Position in the cascade, from 1 (driven by the filter input). */
  readonly index: number;
  /** Topology id (see the topology registry). */
  readonly topology: string;
  /** Topology's human-readable name. */
  readonly topologyName: string;
  /** Why this topology was chosen. */
  readonly topologyReason: string;
  /** What the stage realises. */
  readonly kind: StageKind;
  /** Stage order (1, 2, or 3 for a real pole and a pole pair in one stage). */
  readonly order: 1 | 2 | 3;
  /** Component values in SI units keyed by reference designator, unique across the cascade (`R1`, `C3`, ...). */
  readonly components: Readonly<Record<string, number>>;
  /** The topology's own name for each designator (`{ R3: "R1" }`), for reading its schematic. */
  readonly localNames: Readonly<Record<string, string>>;
  /** Op-amp designators used by the stage (`U1`, ...). */
  readonly opamps: readonly string[];
  /** Tolerance of each part as a fraction (0.01 for 1 %), keyed like `components`: what the BOM asks for. */
  readonly tolerances: Readonly<Record<string, number>>;
  /** What the stage should realise. */
  readonly target: StageFigures;
  /** What the stage realises with the preferred values on the board (ideal op-amp). */
  readonly asBuilt: StageFigures;
  /**
   * Relative errors of `asBuilt` against `target`. For a stage pre-distorted
   * for a real op-amp these include the deliberate pre-distortion; the pole it
   * really has with that op-amp is `asBuiltWithOpamp`.
   */
  readonly errors: StageErrors;
  /** Relative errors had each part been rounded to its nearest preferred value on its own (before joint re-tuning). */
  readonly plainSnapErrors: StageErrors;
  /**
   * Largest gain from the filter input to this stage's output, V/V (partial
   * cascade, as built with the spec's op-amp): the true maximum, found by
   * search from a decade below the mask's lowest edge to a decade above its
   * highest (widened to the passbands the mask checks, e.g. a highpass's up to
   * its top), DC and the high-frequency limit.
   */
  readonly peakGain: number;
  /** Frequency of that peak, Hz (0 at DC; the top of the span when the high-frequency limit is the largest). */
  readonly peakHz: number;
  /** Gain-bandwidth product (Hz) the stage's op-amp needs for about 1 % accuracy of f0 and Q. */
  readonly gbwDemandHz: number;
  /**
   * The pole the preferred values on the board have WITH the spec's op-amp
   * model (f0 in Hz; Q for a second-order stage). Present only when the spec
   * names a non-ideal op-amp (and the pole could be found).
   */
  readonly asBuiltWithOpamp?: AsBuiltPole;
  /**
   * How the stage's design target was pre-distorted for the op-amp's finite
   * gain-bandwidth: design f0 / wanted f0, design Q / wanted Q and design
   * gain / wanted gain (1 except for bandpass stages with a free gain, whose
   * gain at f0 is corrected too). Present only for pre-distorted stages
   * (second order, non-ideal op-amp).
   */
  readonly predistortion?: StagePredistortion;
  /**
   * The largest gain from the filter input to every op-amp output of the
   * stage, internal nodes of multi-amplifier stages included (found as
   * `peakGain` is), one entry per op-amp in the order of `opamps`.
   */
  readonly opampPeaks: readonly OpampPeak[];
}

/** The largest gain from the filter input to one op-amp output. */
export interface OpampPeak {
  /** The op-amp's designator (`U1`, ...), as in `opamps`. */
  readonly opamp: string;
  /** The gain, V/V. */
  readonly gain: number;
  /** Where it peaks, Hz (0 at DC; the top of the span when the high-frequency limit is the largest). */
  readonly hz: number;
  /** The topology's local name of the node it drives (`"out"` for the stage output). */
  readonly node: string;
}

/** One op-amp output against the output swing. */
export interface HeadroomOpamp {
  /** The op-amp's designator. */
  readonly opamp: string;
  /** Its stage (from 1). */
  readonly stage: number;
  /** Its largest output amplitude for the largest input, volts peak. */
  readonly peakV: number;
  /** Where it occurs, Hz. */
  readonly hz: number;
  /** `20 log10(outputSwingV / peakV)`, dB (negative: it clips). */
  readonly marginDb: number;
}

/** The clipping check of every op-amp output at the spec's signal levels. */
export interface Headroom {
  /** Largest input amplitude, volts peak. */
  readonly inputPeakV: number;
  /** The op-amps' output swing, volts peak. */
  readonly outputSwingV: number;
  /** The op-amp with the least margin. */
  readonly worstOpamp: string;
  /** Its margin, dB. */
  readonly worstMarginDb: number;
  /** Whether any op-amp output exceeds the swing (any margin below zero). */
  readonly clips: boolean;
  /** Every op-amp, in cascade order. */
  readonly opamps: readonly HeadroomOpamp[];
  /** The dynamic range at these levels: the largest unclipped signal over the output noise. */
  readonly dynamicRange: DynamicRange;
}

/**
 * The dynamic range of a design at its spec's levels: the largest input
 * that clips no op-amp output (`min over op-amps of swing / gain`), carried
 * to the output by the passband gain as a sinusoid (RMS = peak / sqrt 2),
 * over the RMS output noise across the response span (every resistor's
 * thermal noise at 300.15 K and, when the spec's levels give them, every
 * op-amp's input voltage and current noise; src/circuit/noise.ts).
 */
export interface DynamicRange {
  /** The largest input amplitude that clips no op-amp output, volts peak. */
  readonly maxInputPeakV: number;
  /** RMS output noise over `bandHz`, volts. */
  readonly noiseRmsV: number;
  /** `20 log10((maxInputPeakV * passband gain / sqrt 2) / noiseRmsV)`, dB. */
  readonly rangeDb: number;
  /** The band the noise is integrated over, Hz (the response span). */
  readonly bandHz: readonly [number, number];
  /** Whether op-amp noise is counted (else resistors only, and the range is an upper bound). */
  readonly opampNoise: boolean;
}

/** How a stage's design target was pre-distorted for a finite-GBW op-amp. */
export interface StagePredistortion {
  /** Design f0 / wanted f0. */
  readonly f0Factor: number;
  /** Design Q / wanted Q. */
  readonly qFactor: number;
  /** Design gain / wanted gain (1 unless the stage's gain at f0 was corrected). */
  readonly gainFactor: number;
}

/** Why the family was chosen. */
export interface FamilyCandidate {
  /** The family. */
  readonly family: FamilyName;
  /** Smallest prototype order meeting the mask, or `null` when none up to the limit does. */
  readonly order: number | null;
  /** Number of stages that order needs. */
  readonly stages: number | null;
  /** Op-amps that order needs with the simplest topologies that realise its sections (an estimate before topologies are chosen). */
  readonly opamps: number | null;
  /** Passband group-delay variation (max/min - 1) of that design, when computed. */
  readonly delayVariation?: number;
  /** Whether the family's passband is monotonic. */
  readonly monotonic: boolean;
  /**
   * What the design built for this family took, for the families the
   * pipeline built (the chosen one always: its count is the result's; others
   * when the chosen family's design took more op-amps than estimated, see
   * src/design/family-recount.ts). The choice ranks a built family that
   * meets the mask by this count instead of the estimate.
   */
  readonly built?: FamilyBuilt;
}

/** The op-amps and order of the design built for a family, and whether it met the mask. */
export interface FamilyBuilt {
  /** Op-amps on the board. */
  readonly opamps: number;
  /** Prototype order built. */
  readonly order: number;
  /** Whether its nominal board met the mask. */
  readonly meetsSpec: boolean;
}

/** How the family was chosen. */
export interface FamilyChoice {
  /** Whether the pipeline chose (true) or the spec named it (false). */
  readonly automatic: boolean;
  /** The priority the automatic choice followed. */
  readonly priority: FamilyPriority | null;
  /** Every candidate compared (empty when the family was named). */
  readonly candidates: readonly FamilyCandidate[];
  /** One or two sentences saying why. */
  readonly reason: string;
  /** Present when no order up to the limit meets the mask: what the mask would take. */
  readonly feasibility?: Feasibility;
}

/** The order one family needs for the mask (by its order formula; null when the formula cannot reach it). */
export interface NeededOrder {
  /** The family. */
  readonly family: FamilyName;
  /** Its order, or null. */
  readonly order: number | null;
}

/** One relaxation of the mask that alone makes it feasible (the other figures as given). */
export interface Relaxation {
  /** The spec field it moves. */
  readonly field: "stopband.minAttenuationDb" | "passband.maxLossDb" | "stopband.edgeHz" | "passband.edgeHz";
  /** The relaxed value (dB, or Hz: one edge or the two band edges). */
  readonly value: number | readonly number[];
  /** The relaxation in words, e.g. "stopband edge at 1.09 kHz or above". */
  readonly text: string;
}

/** What an infeasible mask would take (src/design/relax.ts). */
export interface Feasibility {
  /** The family the design uses. */
  readonly family: FamilyName;
  /** The highest order it may use. */
  readonly order: number;
  /** The order each family needs. */
  readonly neededOrders: readonly NeededOrder[];
  /** The nearest relaxations, each alone enough at `order` (may be empty). */
  readonly relaxations: readonly Relaxation[];
}

/**
 * Where the design sits inside the freedom the minimum order leaves: the
 * interval of the free parameter (the lowpass/highpass natural frequency, or
 * the bandpass/bandstop bandwidth) within which the ideal design meets the mask.
 */
export interface Placement {
  /** Which parameter was placed. */
  readonly parameter: "natural-frequency" | "bandwidth";
  /** Lower end of the feasible interval, Hz (above `highHz` when the order is too low). */
  readonly lowHz: number;
  /** Upper end of the feasible interval, Hz. */
  readonly highHz: number;
  /** The value used, Hz. */
  readonly chosenHz: number;
  /** Position inside the interval on a log scale (0 = low end, 0.5 = geometric middle). */
  readonly position: number;
  /** Centre frequency of the bandpass/bandstop transform, Hz (absent for lowpass/highpass). */
  readonly centreHz?: number;
  /** Passband ripple the prototype was designed with (Chebyshev I, elliptic), dB. */
  readonly designRippleDb?: number;
  /** Stopband attenuation the prototype was designed with (Chebyshev II, elliptic), dB. */
  readonly designAttenuationDb?: number;
}

/** A point of the as-built response. */
export interface ResponseCurve {
  /** Frequencies in Hz (log-spaced). */
  readonly freqHz: readonly number[];
  /** Magnitude in dB. */
  readonly magnitudeDb: readonly number[];
  /** Phase in degrees, unwrapped. */
  readonly phaseDeg: readonly number[];
  /** Group delay in seconds. */
  readonly groupDelayS: readonly number[];
}

/**
 * The yield of the design's boards: the fraction of boards, built from parts
 * drawn within their tolerances (each part its own, see
 * `DesignStage.tolerances`), that are stable and meet the mask, by seeded
 * Monte Carlo run until the 95 % interval decides against the target.
 */
export interface BoardYield {
  /** Fraction of the boards built that met the mask and were stable. */
  readonly fraction: number;
  /** Lower end of the fraction's 95 % Wilson score interval. */
  readonly lower95: number;
  /** Upper end of the 95 % interval. */
  readonly upper95: number;
  /** Boards built. */
  readonly boards: number;
  /** Whether `lower95 >= target`. */
  readonly met: boolean;
  /** The spec's yield target. */
  readonly target: number;
  /** Boards that met the mask and were stable. */
  readonly passed: number;
  /** Boards with a stage that was not stable (an oscillator; counted among the failures). */
  readonly unstableBoards: number;
  /** How part values were spread within their tolerances. */
  readonly distribution: "uniform" | "normal";
  /** Seed of the part draws. */
  readonly seed: number;
  /** The resistor tolerances used (distinct values, tightest first), fractions. */
  readonly resistorTolerances: readonly number[];
  /** The capacitor tolerances used (distinct values, tightest first), fractions. */
  readonly capacitorTolerances: readonly number[];
}

/** A design the yield search built and measured: what it would cost and what its boards do. */
export interface YieldAlternative {
  /** What the candidate changed from the nominal design. */
  readonly change: string;
  /** The family. */
  readonly family: FamilyName;
  /** The prototype order. */
  readonly order: number;
  /** Op-amps on the board. */
  readonly opamps: number;
  /** Resistor tolerance class (the loosest a resistor has). */
  readonly resistorTolerance: number;
  /** Capacitor tolerance class (the loosest a capacitor has). */
  readonly capacitorTolerance: number;
  /** Fraction of boards that met the mask. */
  readonly fraction: number;
  /** Lower end of its 95 % interval. */
  readonly lower95: number;
  /** Upper end of its 95 % interval. */
  readonly upper95: number;
  /** Boards built. */
  readonly boards: number;
  /** Whether it reaches the yield target. */
  readonly met: boolean;
  /** Whether this is the design returned. */
  readonly chosen: boolean;
}

/** The as-built circuit checked against the spec mask. */
export interface Verification {
  /**
   * Whether the nominal board (every part at its preferred value) meets the
   * mask and the polarity with every stage stable and (with signal levels)
   * no op-amp output clipping. Whether the boards as built do is
   * `boardsMeetSpec`.
   */
  readonly meetsSpec: boolean;
  /** The op-amp model the check used. */
  readonly opamp: DesignSpec["opamp"];
  /** Largest passband loss below the passband's highest level, dB. */
  readonly passbandLossDb: number;
  /** Where that worst loss occurs, Hz. */
  readonly passbandWorstHz: number;
  /** Spec's largest loss minus the as-built loss, dB (negative: fails). */
  readonly passbandMarginDb: number;
  /** Smallest stopband attenuation below the passband's highest level, dB. */
  readonly stopbandAttenuationDb: number;
  /** Where that worst attenuation occurs, Hz. */
  readonly stopbandWorstHz: number;
  /** As-built attenuation minus the spec's smallest attenuation, dB (negative: fails). */
  readonly stopbandMarginDb: number;
  /** As-built passband level (its highest point), dB. */
  readonly gainDb: number;
  /** Requested passband gain, dB. */
  readonly targetGainDb: number;
  /** `gainDb - targetGainDb`. */
  readonly gainErrorDb: number;
  /** Gain tolerance minus |gain error|, dB (negative: fails). */
  readonly gainMarginDb: number;
  /** Sign of the as-built passband gain. */
  readonly polarity: "inverting" | "non-inverting";
  /** Whether the polarity matches the spec's requirement. */
  readonly polarityOk: boolean;
  /** The smallest of the three margins, dB. */
  readonly marginDb: number;
  /** Whether every stage, as built with the op-amp model, has all its poles in the open left half-plane. */
  readonly stable: boolean;
  /** Stages (from 1) that are not stable: an unstable stage is an oscillator, and the design does not meet the spec. */
  readonly unstableStages: readonly number[];
  /**
   * Whether the boards work: the nominal board meets the spec (`meetsSpec`)
   * and the boards built from toleranced parts reach the yield target
   * (`yield.met`). This is the verdict the command line's exit code follows.
   */
  readonly boardsMeetSpec: boolean;
  /** The yield of boards built from parts drawn within their tolerances, against the spec's `yieldTarget`. */
  readonly yield: BoardYield;
  /** The same margins for the exact (unrounded) design, ideal op-amp: what rounding had to work with. */
  readonly idealMarginDb: number;
  /** The as-built response on 256 log-spaced points spanning the mask. */
  readonly curve: ResponseCurve;
  /** The clipping check at the spec's signal levels; present only when the spec gives `levels`. */
  readonly headroom?: Headroom;
}

/** A warning for the builder. */
export interface DesignWarning {
  /** Stable code. */
  readonly code:
    | "resistor-out-of-range"
    | "capacitor-out-of-range"
    | "large-capacitor-ratio"
    | "insufficient-gbw"
    | "polarity"
    | "gain-not-distributed"
    | "predistortion-failed"
    | "spec-not-met"
    | "unstable"
    | "yield-not-met"
    | "clips";
  /** Stage index (from 1), when the warning is about one stage. */
  readonly stage?: number;
  /** What is wrong and what to do about it. */
  readonly message: string;
}

/** Something the pipeline did to reach the result. */
export interface DesignAction {
  /** Stable code. */
  readonly code:
    | "placed-in-slack"
    | "re-tuned-to-mask"
    | "moved-placement"
    | "raised-order"
    | "tightened-prototype"
    | "sturdier-stages"
    | "kept-best-attempt"
    | "predistorted-for-gbw"
    | "centred-for-yield"
    | "tightened-tolerances"
    | "changed-family-for-yield"
    | "changed-family-for-op-amps"
    | "confirmed-yield";
  /** What it did and why. */
  readonly message: string;
}

/** The result of {@link designFilter}: readonly plain data. */
export interface DesignResult {
  /** The canonical spec the design answers. */
  readonly spec: DesignSpec;
  /** The approximation family used. */
  readonly family: FamilyName;
  /** How the family was chosen. */
  readonly familyChoice: FamilyChoice;
  /** Prototype order (the circuit has twice as many poles for bandpass and bandstop). */
  readonly order: number;
  /** Number of poles of the whole filter. */
  readonly filterOrder: number;
  /** Smallest order meeting the mask before rounding (the design may use more after raising it). */
  readonly minimumOrder: number;
  /** Where the design sits inside the slack of the mask. */
  readonly placement: Placement;
  /** The stages, in cascade order from the input. */
  readonly stages: readonly DesignStage[];
  /** As-built verification against the mask. */
  readonly verification: Verification;
  /** Warnings for the builder. */
  readonly warnings: readonly DesignWarning[];
  /** What the pipeline did to reach this result. */
  readonly actions: readonly DesignAction[];
  /** The designs the yield search built and measured, in the order tried (the chosen one marked). */
  readonly yieldAlternatives: readonly YieldAlternative[];
  /**
   * The realisations compared on the same boards and the one chosen, when
   * the spec asked for `realisation: "auto"` or `"active-ladder"` (absent
   * for the cascade). When an active ladder is chosen, the netlist, BOM and
   * report functions export it, and its `boardsMeetSpec` is the verdict.
   */
  readonly realisation?: DesignRealisation;
}
