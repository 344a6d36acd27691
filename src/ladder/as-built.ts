/**
 * An LC ladder as built: every value snapped to the nearest member (in
 * logarithmic distance) of its IEC 60063 series, inductors from E12 or E24,
 * capacitors from the user's series, each with its tolerance, and the losses
 * of real parts as series resistances.
 *
 * Loss model: an inductor of unloaded quality factor Q at frequency f0 is an
 * ideal inductor in series with R = 2 pi f0 L / Q (a constant resistance, so
 * its Q grows in proportion to frequency away from f0; real inductors add
 * skin-effect and core losses that this model leaves out); a capacitor is an
 * ideal capacitor in series with a constant ESR. To first order in 1/Q the
 * loss such parts add at the centre of a bandpass ladder is
 * 4.343 sum(g_k) / (w Q) dB (S. B. Cohn, "Dissipation loss in
 * multiple-coupled-resonator filters", Proc. IRE 47(8), 1959, the midband
 * formula, recalled from memory), which test/ladder/as-built.test.ts checks against the
 * nodal analysis.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { seriesTable, SERIES_NAMES, type SeriesName } from "../parts/eseries.ts";
import { snapToSeries } from "../parts/snap.ts";
import { requireZpk } from "../tf/check.ts";
import { TWO_PI } from "../units/constants.ts";
import { requireInRange, requireOneOf, requireOptions } from "../validate.ts";
import { INDUCTOR_SERIES, type AsBuiltComponent, type AsBuiltLadder, type InductorSeries } from "./as-built-types.ts";
import { requireLadderNetwork } from "./check-ladder.ts";
import type { ScaledLadder } from "./scaled-types.ts";

/**
 * The inductor Q used when none is given: 50 at the ladder's edge or centre,
 * a usual unloaded Q of small wire-wound and ferrite-cored inductors at their
 * working frequency (common practice, no source).
 */
export const DEFAULT_INDUCTOR_Q = 50;

/** Highest inductor Q accepted (a nearly ideal inductor). */
export const MAX_INDUCTOR_Q = 1e6;

/** Options of {@link asBuiltLadder}. */
export interface AsBuiltLadderOptions {
  /**
   * Series of the inductors.
   * @defaultValue "E12"
   */
  readonly inductorSeries?: InductorSeries;
  /**
   * Inductor tolerance as a fraction (0 exclusive to 0.5).
   * @defaultValue the series' usual tolerance: E12 10 %, E24 5 %
   */
  readonly inductorTolerance?: number;
  /**
   * Series of the capacitors.
   * @defaultValue "E12"
   */
  readonly capacitorSeries?: SeriesName;
  /**
   * Capacitor tolerance as a fraction (0 exclusive to 0.5).
   * @defaultValue the series' usual tolerance
   */
  readonly capacitorTolerance?: number;
  /**
   * Unloaded Q of every inductor at `qFrequencyHz`, from 1 to 1e6.
   * @defaultValue {@link DEFAULT_INDUCTOR_Q} (50)
   */
  readonly inductorQ?: number;
  /**
   * The frequency (Hz) at which `inductorQ` holds.
   * @defaultValue the ladder's edge (lowpass, highpass) or centre (bandpass, bandstop)
   */
  readonly qFrequencyHz?: number;
  /**
   * ESR of every capacitor, ohms (0 or more).
   * @defaultValue 0 (no capacitor loss)
   */
  readonly capacitorEsrOhms?: number;
}

const KNOWN = ["inductorSeries", "inductorTolerance", "capacitorSeries", "capacitorTolerance", "inductorQ", "qFrequencyHz", "capacitorEsrOhms"];

function fail(fn: string, path: string, received: unknown, message: string): never {
  throw new InvalidArgumentError({ fn, path, received, message });
}

function ladderFrequencyHz(fn: string, ladder: ScaledLadder): number {
  const p = (ladder as { placement?: unknown }).placement;
  const f = p !== null && typeof p === "object" ? ((p as Record<string, unknown>)["edgeHz"] ?? (p as Record<string, unknown>)["centreHz"]) : undefined;
  if (typeof f !== "number" || !Number.isFinite(f) || f <= 0) {
    fail(fn, "ladder.placement", p, "expected the placement of a ladder from scaleLadder (edgeHz or centreHz), or give options.qFrequencyHz");
  }
  return f;
}

interface Plan {
  inductorSeries: InductorSeries;
  capacitorSeries: SeriesName;
  inductorTolerance: number;
  capacitorTolerance: number;
  inductorQ: number;
  qFrequencyHz: number;
  capacitorEsrOhms: number;
}

function readOptions(fn: string, options: unknown, ladder: ScaledLadder): Plan {
  const o = requireOptions(fn, "options", options);
  for (const k of Object.keys(o)) if (!KNOWN.includes(k)) fail(fn, `options.${k}`, o[k], `unknown option; expected one of ${KNOWN.join(", ")}`);
  const inductorSeries = o["inductorSeries"] === undefined ? "E12" : requireOneOf(fn, "options.inductorSeries", o["inductorSeries"], INDUCTOR_SERIES);
  const capacitorSeries = o["capacitorSeries"] === undefined ? "E12" : requireOneOf(fn, "options.capacitorSeries", o["capacitorSeries"], SERIES_NAMES);
  const tol = (k: string, s: SeriesName): number =>
    o[k] === undefined ? seriesTable(fn, k, s).tolerance : requireInRange(fn, `options.${k}`, o[k], { min: 0, max: 0.5, exclusiveMin: true });
  const q = o["inductorQ"] === undefined ? DEFAULT_INDUCTOR_Q : requireInRange(fn, "options.inductorQ", o["inductorQ"], { min: 1, max: MAX_INDUCTOR_Q });
  const fq = o["qFrequencyHz"] === undefined ? ladderFrequencyHz(fn, ladder) : requireInRange(fn, "options.qFrequencyHz", o["qFrequencyHz"], { min: 0, max: 1e12, exclusiveMin: true });
  const esr = o["capacitorEsrOhms"] === undefined ? 0 : requireInRange(fn, "options.capacitorEsrOhms", o["capacitorEsrOhms"], { min: 0, max: 1e6 });
  return {
    inductorSeries,
    capacitorSeries,
    inductorTolerance: tol("inductorTolerance", inductorSeries),
    capacitorTolerance: tol("capacitorTolerance", capacitorSeries),
    inductorQ: q,
    qFrequencyHz: fq,
    capacitorEsrOhms: esr,
  };
}

function build(c: ScaledLadder["components"][number], plan: Plan): AsBuiltComponent {
  const inductor = c.kind === "L";
  const series = inductor ? plan.inductorSeries : plan.capacitorSeries;
  const value = snapToSeries(c.value, { series }).value;
  const seriesOhms = inductor ? (TWO_PI * plan.qFrequencyHz * value) / plan.inductorQ : plan.capacitorEsrOhms;
  return Object.freeze({
    designator: c.designator,
    kind: c.kind,
    value,
    a: c.a,
    b: c.b,
    arm: c.arm,
    designValue: c.value,
    series,
    tolerance: inductor ? plan.inductorTolerance : plan.capacitorTolerance,
    seriesOhms,
  });
}

/**
 * The ladder as built from preferred-value parts: each inductor and capacitor
 * snapped to the nearest member of its series, with its tolerance, and each
 * part's loss as a series resistance (inductors from their Q at a stated
 * frequency, capacitors from an optional ESR), ready for {@link ladderParts}
 * and for `ladderCircuit` (filterwright/circuit).
 *
 * @param ladder - a ladder from {@link scaleLadder}
 * @param options - series, tolerances, inductor Q and its frequency, capacitor ESR
 * @returns the as-built ladder: the same arms and nodes, the parts as built,
 *   the exact ladder's transfer as `designTransfer`, and the loss model
 * @throws {@link InvalidArgumentError} naming the field: a malformed ladder, an
 *   unknown series, a tolerance outside (0, 0.5], a Q outside 1 to 1e6, a
 *   non-positive frequency or a negative ESR
 * @example
 * ```ts
 * const prototype = { family: "butterworth", order: 3, form: "shunt-first", // g = 1, 2, 1
 *   elements: [{ kind: "shunt-C", value: 1 }, { kind: "series-L", value: 2 }, { kind: "shunt-C", value: 1 }],
 *   sourceOhms: 1, loadOhms: 1, transfer: { ...butterworth(3), gain: 0.5 } } as const;
 * const built = asBuiltLadder(scaleLadder(prototype, { edgeHz: 10e6, sourceOhms: 50 }), { inductorQ: 60 });
 * built.components[1];
 * //=> { designator: "L1", kind: "L", value: 1.5e-6, a: "in", b: "out", arm: 2, designValue: 1.5915494309189533e-6,
 * //     series: "E12", tolerance: 0.1, seriesOhms: 1.5707963267948968 }
 * ```
 */
export function asBuiltLadder(ladder: ScaledLadder, options: AsBuiltLadderOptions = {}): AsBuiltLadder {
  const fn = "asBuiltLadder";
  requireLadderNetwork(fn, "ladder", ladder);
  const transfer = requireZpk(fn, "ladder.transfer", (ladder as { transfer?: unknown }).transfer);
  const plan = readOptions(fn, options, ladder);
  const { components: _exact, transfer: _t, ...rest } = ladder;
  return Object.freeze({
    ...rest,
    components: Object.freeze(ladder.components.map((c) => build(c, plan))),
    designTransfer: transfer,
    inductorSeries: plan.inductorSeries,
    capacitorSeries: plan.capacitorSeries,
    losses: Object.freeze({ inductorQ: plan.inductorQ, qFrequencyHz: plan.qFrequencyHz, capacitorEsrOhms: plan.capacitorEsrOhms }),
  });
}
