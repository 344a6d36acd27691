/**
 * The filter specification types: the {@link FilterSpec} an engineer writes,
 * in hertz and decibels, its parts, and the canonical {@link DesignSpec} that
 * validation brings it to.
 *
 * @module
 */
import type { OpAmpModel } from "../circuit/types.ts";
import type { FamilyName } from "../approx/index.ts";
import type { SeriesName } from "../parts/index.ts";

import type { PartDistribution } from "../evaluate/boards.ts";
import type { LcLadderOptions } from "./lc-ladder-options.ts";

export type { PartDistribution };

/** How the yield is confirmed by Monte Carlo boards. */
export interface YieldCheckSpec {
  /**
   * Most boards built to decide whether the yield target is met (256 to
   * 100000; boards come in blocks of 256 and the run stops as soon as the
   * 95 % interval lies on one side of the target).
   * @defaultValue 2048
   */
  readonly maxBoards?: number;
  /**
   * Seed of the boards' part draws (an integer), so a design repeats exactly.
   * @defaultValue 1
   */
  readonly seed?: number;
}

/** The four responses a filter can have. */
export type ResponseType = "lowpass" | "highpass" | "bandpass" | "bandstop";

/**
 * How the family is chosen when the spec does not name one:
 * - `fewest-op-amps`: the family whose circuit needs the fewest op-amps, then
 *   the fewest stages (ties go to the candidate with the most room for part
 *   rounding). Op-amps are what a board pays for in parts, power and noise,
 *   so this is the default;
 * - `fewest-stages`: the family that meets the mask with the fewest stages
 *   (second-order sections), then the fewest op-amps; a notch section built
 *   as a multi-amplifier stage still counts as one stage;
 * - `flattest-delay`: the family whose passband group delay varies least;
 * - `monotonic`: the fewest stages among families with a monotonic passband
 *   (Butterworth, Legendre, Bessel, Chebyshev II).
 */
export type FamilyPriority = "fewest-op-amps" | "fewest-stages" | "flattest-delay" | "monotonic";

/** Sign requirement on the passband gain. */
export type Polarity = "non-inverting" | "inverting" | "either";

/** A frequency, resistance or capacitance: a number in SI units, or a string in engineering notation (`"20k"`, `"4k7"`, `"100n"`). */
export type Quantity = number | string;

/** One band edge (lowpass, highpass) or a pair of edges (bandpass, bandstop), low edge first. */
export type EdgeInput = Quantity | readonly [Quantity, Quantity];

/** The passband of the spec. */
export interface PassbandSpec {
  /** Passband edge in Hz (lowpass, highpass) or the two edges `[low, high]` (bandpass, bandstop), each from 1 mHz to 1 GHz. */
  readonly edgeHz: EdgeInput;
  /** Largest loss allowed anywhere in the passband, in dB, relative to the passband's highest level (0.001 to 20). */
  readonly maxLossDb: number;
  /**
   * Highpass and bandstop only: the highest frequency, Hz, up to which the
   * upper passband is checked (every real op-amp ends a passband somewhere).
   * @defaultValue 100 times the upper passband edge
   */
  readonly topHz?: Quantity;
}

/** The stopband of the spec. */
export interface StopbandSpec {
  /** Stopband edge in Hz (lowpass, highpass) or the two edges `[low, high]` (bandpass, bandstop), each from 1 mHz to 1 GHz. */
  readonly edgeHz: EdgeInput;
  /** Smallest attenuation allowed anywhere in the stopband, in dB, relative to the passband's highest level. */
  readonly minAttenuationDb: number;
}

/** The passband gain: give `db` or `vPerV` (not both). */
export interface GainSpec {
  /** Passband gain in dB (the magnitude; use `polarity` for the sign). */
  readonly db?: number;
  /** Passband gain in V/V; a negative value asks for an inverting filter. */
  readonly vPerV?: number;
  /**
   * Sign requirement.
   * @defaultValue `"inverting"` when `vPerV` is negative, otherwise `"either"`
   */
  readonly polarity?: Polarity;
  /**
   * How far the as-built passband level may sit from the requested gain, in dB
   * (common practice, no source).
   * @defaultValue 0.25
   */
  readonly toleranceDb?: number;
}

/** Preferred-value series and value windows for the parts. */
export interface PartsSpec {
  /**
   * Series for capacitors.
   * @defaultValue `"E12"`
   */
  readonly capacitorSeries?: SeriesName;
  /**
   * Series for resistors.
   * @defaultValue `"E96"`
   */
  readonly resistorSeries?: SeriesName;
  /**
   * Capacitor tolerance as a fraction (0.02 for 2 %), fixing it for every
   * capacitor: what the BOM asks for and what the yield assumes. When it is
   * not given, the design starts from the default and may pick a tighter
   * class, per capacitor, where the yield target needs one (and says so).
   * Filters use C0G/NP0 ceramic or film capacitors (stable, low loss, no
   * voltage coefficient), stocked in E12/E24 values at 1 %, 2 % and 5 %.
   * @defaultValue 0.05 (C0G/NP0 or film; common practice, no source), or the series' own tolerance when tighter (E48: 0.02, E96: 0.01)
   */
  readonly capacitorTolerance?: number;
  /**
   * Resistor tolerance as a fraction (0.001 for 0.1 %), fixing it for every
   * resistor. When it is not given, the design starts from the default and
   * may pick a tighter class per resistor where the yield target needs one.
   * @defaultValue the usual tolerance of `resistorSeries` (E96: 0.01)
   */
  readonly resistorTolerance?: number;
  /**
   * How part values spread within their tolerance for the yield: `"uniform"`
   * over +-tolerance (the bound a "+-t %" part guarantees, and the
   * conservative choice when the maker's distribution is unknown), or
   * `"normal"` with the tolerance as three standard deviations (draws beyond
   * it drawn again).
   * @defaultValue "uniform"
   */
  readonly distribution?: PartDistribution;
  /**
   * Smallest resistor wanted, ohms. Left out, the window follows the
   * filter's frequency (common practice, no source; see
   * `defaultResistorWindow`): a decade either side of
   * `10 kΩ · sqrt(1.59 kHz / f)` held between 2 kΩ and 316 kΩ, f the
   * geometric mean of the band edges, so low-frequency filters get a high
   * impedance (small, low-leakage capacitors) and high-frequency filters a
   * low one (capacitors well above stray capacitance, within op-amp drive).
   * No resistor below 100 Ω or above 10 MΩ is used unless the window given
   * here is wider.
   * @defaultValue a decade below the frequency's level (200 Ω to 31.6 kΩ)
   */
  readonly resistorMinOhm?: Quantity;
  /**
   * Largest resistor wanted, ohms (see `resistorMinOhm` for the default).
   * @defaultValue a decade above the frequency's level (20 kΩ to 3.16 MΩ)
   */
  readonly resistorMaxOhm?: Quantity;
  /**
   * Smallest capacitor considered, farads (common practice, no source: film
   * and C0G/NP0 parts; below about 10 pF board and op-amp input capacitance
   * dominate). No capacitor below 10 pF is used unless the window is wider.
   * @defaultValue 1e-11
   */
  readonly capacitorMinF?: Quantity;
  /**
   * Largest capacitor considered, farads (common practice, no source: film
   * capacitors above about 10 µF are large and costly; levels that need
   * more than 1 µF are avoided where another level keeps the resistors
   * inside their window).
   * @defaultValue 1e-5
   */
  readonly capacitorMaxF?: Quantity;
}

/** A real op-amp described by its open-loop DC gain and gain-bandwidth product (single-pole model). */
export interface OpAmpSpec {
  /** Open-loop DC gain in V/V (e.g. 1e5 for 100 dB), from 10 to 1e9. */
  readonly a0: number;
  /** Gain-bandwidth product in Hz, from 1 Hz to 100 GHz and above the spec's highest passband frequency (its edges and `passband.topHz`). */
  readonly gbwHz: Quantity;
}

/**
 * A filter specification as the engineer writes it.
 *
 * @example
 * ```ts
 * const spec: FilterSpec = {
 *   response: "lowpass",
 *   passband: { edgeHz: "2k", maxLossDb: 0.5 },
 *   stopband: { edgeHz: "12k", minAttenuationDb: 60 },
 * };
 * ```
 */
export interface FilterSpec {
  /** What the filter passes. */
  readonly response: ResponseType;
  /** Passband edge(s) and largest loss. */
  readonly passband: PassbandSpec;
  /** Stopband edge(s) and smallest attenuation. */
  readonly stopband: StopbandSpec;
  /**
   * Passband gain.
   * @defaultValue 0 dB (unity), either polarity
   */
  readonly gain?: GainSpec;
  /**
   * Approximation family, or `"auto"` to choose one by `priority`.
   * @defaultValue `"auto"`
   */
  readonly family?: FamilyName | "auto";
  /**
   * What the automatic family choice optimises (ignored when a family is named).
   * @defaultValue `"fewest-op-amps"`
   */
  readonly priority?: FamilyPriority;
  /**
   * Fixed prototype order (for bandpass and bandstop the circuit has twice as
   * many poles). When absent, the minimum order that meets the mask is used.
   */
  readonly order?: number;
  /**
   * Topology: `"auto"`; one topology id, used for every stage it can build
   * (the others are chosen automatically); or one entry per stage (each an id
   * or `"auto"`), which must fit its stage.
   * @defaultValue `"auto"`
   */
  readonly topology?: string | readonly string[];
  /**
   * Part series and value windows.
   * @defaultValue capacitors E12, resistors E96 within 1 kΩ-100 kΩ
   */
  readonly parts?: PartsSpec;
  /**
   * The op-amp used in every stage: `"ideal"`, or a single-pole model.
   * @defaultValue `"ideal"`
   */
  readonly opamp?: "ideal" | OpAmpSpec;
  /**
   * Fraction of boards, built from parts drawn within their tolerances, that
   * must meet the mask and be stable (0 < yieldTarget < 1). The design is
   * made for it and confirmed by Monte Carlo: the target is met when the
   * lower end of the yield's 95 % interval reaches it.
   * @defaultValue 0.95
   */
  readonly yieldTarget?: number;
  /**
   * How many boards the yield check may build, and their seed.
   * @defaultValue `{ maxBoards: 2048, seed: 1 }`
   */
  readonly yieldCheck?: YieldCheckSpec;
  /**
   * Signal levels, for the clipping check of every op-amp output (the
   * result's `verification.headroom`). With them, state-variable notch and
   * allpass stages whose loop nodes would come within 1 dB of the swing are
   * built at a lower internal level (the output summer takes the gain back,
   * at some cost in noise). Without them the peak gains to the op-amp
   * outputs are still reported, with no verdict.
   * @defaultValue none (no clipping check)
   */
  readonly levels?: LevelsSpec;
  /**
   * How the filter is realised: `"cascade"`, a cascade of biquad (and
   * first-order) stages; `"active-ladder"`, an op-amp simulation of the
   * doubly terminated LC ladder of the same prototype (leapfrog or FDNR for a
   * lowpass, grounded GIC inductors for a highpass; the one whose boards do
   * best is kept); `"auto"`, the cascade and the active ladders compared on
   * the same seeded boards, the one that reaches the yield target with the
   * fewest op-amps chosen (the result's `realisation` says why). A passive LC
   * ladder is asked for with `"lc-ladder"` ({@link LcLadderFilterSpec}); `auto`
   * never picks it, because it needs matched source and load terminations
   * and gives no gain or buffering, which changes the circuit around it.
   * @defaultValue `"cascade"`
   */
  readonly realisation?: ActiveRealisation;
}

/** The realisations a {@link FilterSpec} may ask for (`"lc-ladder"` is asked for with {@link LcLadderFilterSpec}). */
export type ActiveRealisation = "cascade" | "active-ladder" | "auto";

/** Every value of a spec's `realisation` field. */
export type Realisation = ActiveRealisation | "lc-ladder";

/**
 * A spec for a passive doubly terminated LC ladder: `designFilter` returns
 * an `LcLadderDesign` for it (the same as `designLcLadder(spec,
 * spec.lcLadder)`). The mask, family, order, capacitor and yield fields
 * apply; gain, polarity, op-amp, topology, signal-level and resistor fields
 * are not read.
 */
export interface LcLadderFilterSpec extends Omit<FilterSpec, "realisation"> {
  /** A passive LC ladder. */
  readonly realisation: "lc-ladder";
  /**
   * The ladder's terminations, form, inductors, capacitor tolerance, boards and seed.
   * @defaultValue the defaults of {@link LcLadderOptions}
   */
  readonly lcLadder?: LcLadderOptions;
}

/** An inclusive window of part values in SI units. */
export interface ValueWindow {
  /** Smallest value. */
  readonly min: number;
  /** Largest value. */
  readonly max: number;
}

/** The canonical, validated form of a {@link FilterSpec}: every default filled in, every value a number in SI units. */
export interface DesignSpec {
  /** What the filter passes. */
  readonly response: ResponseType;
  /** Passband edge(s) in Hz, ascending (one for lowpass/highpass, two for bandpass/bandstop). */
  readonly passbandHz: readonly number[];
  /** Stopband edge(s) in Hz, ascending. */
  readonly stopbandHz: readonly number[];
  /** Highest frequency of the upper passband that is checked (highpass, bandstop), Hz. */
  readonly passbandTopHz: number | null;
  /** Largest passband loss, dB. */
  readonly maxLossDb: number;
  /** Smallest stopband attenuation, dB. */
  readonly minAttenuationDb: number;
  /** Passband gain magnitude, V/V (> 0). */
  readonly gain: number;
  /** Sign requirement on the passband gain. */
  readonly polarity: Polarity;
  /** Allowed distance of the as-built passband level from `gain`, dB. */
  readonly gainToleranceDb: number;
  /** Named family or `"auto"`. */
  readonly family: FamilyName | "auto";
  /** Priority of the automatic family choice. */
  readonly priority: FamilyPriority;
  /** Fixed prototype order, or `null` for the minimum order. */
  readonly order: number | null;
  /** Topology for every stage (`"auto"` or an id), used where `stageTopologies` has no entry. */
  readonly topology: string;
  /** Per-stage topology choices (`"auto"` or an id); empty when one choice applies to all. */
  readonly stageTopologies: readonly string[];
  /** Capacitor series. */
  readonly capacitorSeries: SeriesName;
  /** Resistor series. */
  readonly resistorSeries: SeriesName;
  /** Capacitor tolerance as a fraction. */
  readonly capacitorTolerance: number;
  /** Resistor tolerance as a fraction. */
  readonly resistorTolerance: number;
  /** Whether the spec fixed the capacitor tolerance (else the design may tighten it per part). */
  readonly capacitorToleranceFixed: boolean;
  /** Whether the spec fixed the resistor tolerance (else the design may tighten it per part). */
  readonly resistorToleranceFixed: boolean;
  /** How part values spread within their tolerance. */
  readonly partDistribution: PartDistribution;
  /** Resistor window, ohms. */
  readonly resistorRange: ValueWindow;
  /** Capacitor window, farads. */
  readonly capacitorRange: ValueWindow;
  /** Op-amp model for analysis. */
  readonly opamp: OpAmpModel;
  /** Fraction of boards that must meet the mask. */
  readonly yieldTarget: number;
  /** Most boards built by the yield check. */
  readonly yieldMaxBoards: number;
  /** Seed of the yield check's boards. */
  readonly yieldSeed: number;
  /** Signal levels for the clipping check, or `null` when the spec gives none. */
  readonly levels: SignalLevels | null;
  /** How the filter is realised. */
  readonly realisation: Realisation;
}

/** The signal levels of a spec: the largest input and the op-amps' output swing. */
export interface LevelsSpec {
  /**
   * Largest input amplitude, volts peak (a number or a string such as `"500m"`).
   * @defaultValue 1
   */
  readonly inputPeakV?: Quantity;
  /**
   * The op-amps' output swing, volts peak: the largest output amplitude
   * before clipping (common practice, no source: op-amps on +-15 V supplies
   * keep about +-10 V of clean swing into a few kilohms).
   * @defaultValue 10
   */
  readonly outputSwingV?: number;
  /**
   * Every op-amp's input voltage noise density, V/sqrt(Hz) (a number or a
   * string such as `"8n"`; 0 to 1e-3), white: counted in the dynamic range
   * the headroom check states.
   * @defaultValue 0 (resistor noise only; the dynamic range is then an upper bound)
   */
  readonly opampVoltageNoise?: Quantity;
  /**
   * Every op-amp's input current noise density at each input, A/sqrt(Hz) (0 to 1e-6), white.
   * @defaultValue 0
   */
  readonly opampCurrentNoise?: Quantity;
}

/** The canonical signal levels: every default filled in, volts peak. */
export interface SignalLevels {
  /** Largest input amplitude, volts peak. */
  readonly inputPeakV: number;
  /** The op-amps' output swing, volts peak. */
  readonly outputSwingV: number;
  /** Every op-amp's input voltage noise density, V/sqrt(Hz). */
  readonly opampVoltageNoise: number;
  /** Every op-amp's input current noise density, A/sqrt(Hz). */
  readonly opampCurrentNoise: number;
}
