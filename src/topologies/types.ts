/**
 * The one shape every active-filter topology has: what it realises, how to
 * design it for a target section, its netlist, its as-built response and its
 * limits. Adding a topology is adding one file that exports a
 * {@link Topology} and one line in the registry.
 *
 * Frequencies here are in hertz (`f0Hz`, `fzHz`), as the design layer above
 * expects.
 *
 * @module
 */
import type { Element, OpAmpModel } from "../circuit/types.ts";

/** Section kinds a stage can realise (first-, second- or third-order). */
export type StageKind =
  | "lowpass"
  | "highpass"
  | "bandpass"
  | "lowpass-notch"
  | "highpass-notch"
  | "notch"
  | "allpass";

/**
 * What one stage must do.
 *
 * `gain` is the stage's gain (V/V, negative for an inverting stage) at its
 * reference frequency: DC for lowpass and lowpass-notch, high frequency for
 * highpass and highpass-notch, f0 for bandpass, DC (= HF) for notch and allpass.
 */
export interface StageTarget {
  /**
   * Section order: 1, 2, or 3 for a real pole and a pole pair built by one
   * stage (third-order lowpass and highpass).
   */
  readonly order: 1 | 2 | 3;
  /** What the section does. */
  readonly kind: StageKind;
  /** Pole frequency in Hz. */
  readonly f0Hz: number;
  /** Pole Q (second and third order; ignored for first order). */
  readonly q?: number;
  /** Zero frequency in Hz, for notch kinds. */
  readonly fzHz?: number;
  /** Frequency of the real pole in Hz (third order only; `f0Hz` and `q` are then the pole pair's). */
  readonly realPoleHz?: number;
  /** Gain at the reference frequency (V/V, sign included). */
  readonly gain: number;
}

/**
 * The designer's free choices for one stage. Which fields a topology reads is
 * documented on the topology; unknown fields are ignored.
 */
export interface StageChoices {
  /** Chosen capacitor value in farads (the usual way to fix the impedance level). */
  readonly capacitor?: number;
  /** Chosen resistor value in ohms (alternative way to fix the impedance level). */
  readonly resistor?: number;
  /** Capacitor ratio where the topology has one (meaning documented per topology). */
  readonly capacitorRatio?: number;
  /** Resistor ratio where the topology has one (meaning documented per topology). */
  readonly resistorRatio?: number;
}

/** Component values of one stage, keyed by the topology's local designators (`R1`, `C2`, `Rf`, ...), SI units. */
export type ComponentValues = Readonly<Record<string, number>>;

/** The figures that describe a built stage. */
export interface StageFigures {
  /** Pole frequency in Hz (for a third-order stage, the pole pair's). */
  readonly f0Hz: number;
  /** Pole Q (for a first-order stage, 0.5 is never used: the field is absent). */
  readonly q?: number;
  /** Zero frequency in Hz, for notch kinds. */
  readonly fzHz?: number;
  /** Frequency of the real pole in Hz (third-order stages only). */
  readonly realPoleHz?: number;
  /** Gain at the reference frequency (V/V, sign included). */
  readonly gain: number;
  /**
   * Damping of the zero pair, `|N1| / (2 sqrt(N0 N2))` for a numerator
   * `N2 s^2 + N1 s + N0`: 0 when the zeros sit on the jw axis (a perfect
   * notch), about 1/(2 Qz) otherwise. Present only for topologies whose
   * zeros leave the axis when the parts do not balance, while f0, Q, fz and
   * gain stay put (the single-amplifier notch sections); a value search
   * should drive it to 0 as well.
   */
  readonly zeroDamping?: number;
}

/** Node and name mapping used when a stage is placed into a larger circuit. */
export interface StagePlacement {
  /** Node driving the stage. */
  readonly input: string;
  /** Node the stage's output drives. */
  readonly output: string;
  /** Prefix for internal node names, unique per stage (e.g. `"s1_"`). */
  readonly nodePrefix: string;
  /** Maps a local designator (`R1`) to the designator used in the circuit (`R3`). */
  readonly rename?: (local: string) => string;
  /** Op-amp model for every op-amp in the stage. */
  readonly opamp: OpAmpModel;
}

/**
 * A stage's as-built transfer function as real polynomials in the scaled
 * variable `z = s / scale`: `H(s) = num(z) / den(z)`, descending powers
 * (numpy's convention), the largest denominator coefficient 1.
 */
export interface AsBuiltPolynomials {
  /** Numerator coefficients, descending powers of z. */
  readonly num: Float64Array;
  /** Denominator coefficients, descending powers of z. */
  readonly den: Float64Array;
  /** The scale (rad/s): z = s / scale; the stage's ideal natural frequency. */
  readonly scale: number;
}

/**
 * The unchecked core of {@link Topology.polynomials}: writes the stage's
 * as-built `N(z)` and `D(z)` (z = s / scale) into `num` and `den`, descending
 * powers, right-aligned (the constant term last; leading entries zero), the
 * largest denominator coefficient 1. `values` holds the component values in
 * {@link Topology.componentNames} order; `num` and `den` need at least
 * {@link Topology.polynomialDegree} + 1 entries (with the ideal op-amp, whose
 * top coefficients are 0, `polynomialDegree - opampCount + 1` suffice).
 * Returns `scale`, or 0 when it declines (an op-amp model with an output
 * resistance, coefficients that overflow, or a non-zero coefficient that
 * does not fit the arrays): then use nodal analysis. No checks, no
 * allocation.
 */
export type PolynomialsInto = (values: Float64Array, opamp: OpAmpModel, scale: number, num: Float64Array, den: Float64Array) => number;

/** One circuit family, as data plus functions. */
export interface Topology {
  /** Stable identifier, kebab-case, e.g. `"sallen-key-lowpass-unity"`. */
  readonly id: string;
  /** Human-readable name. */
  readonly name: string;
  /** Stage order it builds. */
  readonly order: 1 | 2 | 3;
  /** Kinds it can realise. */
  readonly kinds: readonly StageKind[];
  /** Whether the passband gain is negative (inverting). */
  readonly inverting: boolean;
  /** Number of op-amps used. */
  readonly opampCount: number;
  /** Local designators of its components, in BOM order. */
  readonly componentNames: readonly string[];
  /** Source of the design equations (author, title, year, page or equation). */
  readonly reference: string;
  /**
   * Why a target cannot be realised with these choices, or `null` when it can.
   * The message says what to change.
   */
  readonly check: (target: StageTarget, choices: StageChoices) => string | null;
  /**
   * Component values that realise the target exactly (ideal op-amp).
   * Throws `UnrealisableError` when `check` would return a reason.
   */
  readonly design: (target: StageTarget, choices: StageChoices) => ComponentValues;
  /** Ideal-op-amp figures (f0, Q, fz, gain) from whatever values are on the board. */
  readonly figures: (values: ComponentValues) => StageFigures;
  /**
   * As-built complex response `H(j 2 pi f)` at each frequency, with the given
   * op-amp model (closed form where tractable, else nodal analysis).
   */
  readonly response: (
    values: ComponentValues,
    freqHz: Float64Array,
    opamp: OpAmpModel,
  ) => {
    /** Real parts, one per frequency. */
    readonly re: Float64Array;
    /** Imaginary parts, one per frequency. */
    readonly im: Float64Array;
  };
  /** The stage's elements placed between two nodes of a larger circuit. */
  readonly elements: (values: ComponentValues, placement: StagePlacement) => readonly Element[];
  /**
   * Gain-bandwidth product (Hz) an op-amp needs so that f0 and Q move by no
   * more than about 1 % (derived from the stage's finite-GBW response).
   */
  readonly gbwDemandHz: (target: StageTarget) => number;
  /**
   * Present when the topology has no free gain: the gain it necessarily has
   * for a target's f0, Q and kind (e.g. `3 - 1/Q` for the equal-component
   * Sallen-Key stage). `check` refuses any other gain.
   */
  readonly fixedGain?: (target: Omit<StageTarget, "gain">) => number;
  /**
   * Present when the topology has closed-form polynomials: the highest
   * degree of its numerator and denominator with the `ideal` and
   * `single-pole` op-amp models (2 + the op-amp count for a second-order
   * stage, or the passive network's order + the op-amp count where the
   * network is of higher order, as in the twin-T's 3 + 1; the ideal model
   * leaves the top coefficients 0).
   */
  readonly polynomialDegree?: number;
  /**
   * Present with {@link Topology.polynomialDegree}: the as-built transfer
   * function as real polynomials in `z = s / scale` (scale = the ideal
   * natural frequency 2 pi f0 of these values), derived in closed form from
   * the nodal equations with the op-amp's `A(s)`, every degree the model adds
   * included; `null` for the `single-pole-rout` model with a non-zero output
   * resistance (use nodal analysis there).
   */
  readonly polynomials?: (values: ComponentValues, opamp: OpAmpModel) => AsBuiltPolynomials | null;
  /** Present with {@link Topology.polynomials}: its unchecked, allocation-free core for the hot path. */
  readonly polynomialsInto?: PolynomialsInto;
}
