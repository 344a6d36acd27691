/**
 * The checks every active ladder realisation runs at its public boundary:
 * its options (edge, capacitor, series, values, op-amp, gain) and the
 * normalised lowpass prototype it is given.
 *
 * @module
 */
import { InvalidArgumentError, UnrealisableError } from "../../errors.ts";
import { requireInRange, requireOneOf, requireOptions } from "../../validate.ts";
import { checkOpAmpModel } from "../../circuit/validate.ts";
import type { OpAmpModel } from "../../circuit/types.ts";
import { seriesTable, type SeriesName } from "../../parts/eseries.ts";
import { isInSeries, snapToSeries } from "../../parts/snap.ts";
import { TWO_PI } from "../../units/constants.ts";
import { requireLadderPrototype } from "../check-prototype.ts";
import type { LadderElement, LadderPrototype } from "../types.ts";
import type { PartWindow } from "./types.ts";

/** Resistors a realisation may place, ohms (the design layer's hard limits). */
export const RESISTOR_LIMITS_OHMS: PartWindow = Object.freeze({ min: 100, max: 10e6 });

/** Capacitors a realisation may place (and the shared capacitor it accepts), farads (the design layer's hard limits). */
export const CAPACITOR_LIMITS_F: PartWindow = Object.freeze({ min: 10e-12, max: 10e-6 });

/** The impedance level the default capacitor aims at, ohms (common practice, no source). */
export const DEFAULT_LEVEL_OHMS = 10e3;

/**
 * The impedance level the default capacitor aims at where DC path resistors
 * sit dcPathRatio times higher (the FDNR method, GIC ladders with finite
 * zeros), ohms (common practice, no source).
 */
export const DC_PATH_LEVEL_OHMS = 1e3;

/** Highest ladder order accepted. */
export const MAX_LADDER_ORDER = 20;

/** The checked options, every default filled in. */
export interface ReadOptions {
  /** Passband edge, Hz. */
  readonly edgeHz: number;
  /** Frequency scale 2 pi edgeHz, rad/s. */
  readonly kf: number;
  /** The shared capacitor, farads. */
  readonly capacitorF: number;
  /** Resistor series. */
  readonly resistorSeries: SeriesName;
  /** Capacitor series. */
  readonly capacitorSeries: SeriesName;
  /** Whether values are left unrounded. */
  readonly exact: boolean;
  /** Op-amp model. */
  readonly opamp: OpAmpModel;
  /** Passband peak gain, V/V. */
  readonly gain: number;
  /** Whether to pre-distort for the op-amp (false with an ideal one). */
  readonly predistort: boolean;
  /** Whether to re-tune the resistors after rounding (false with exact values). */
  readonly retune: boolean;
  /**
   * The pre-distortion's trim of each arm (internal; absent outside it): an
   * added loss of a leapfrog integrator (normalised, rad/s), a loss
   * conductance (normalised) across the arm's simulated element; one more entry after
   * the arms' is the log of a factor on the passband gain (leapfrog only:
   * the source weight).
   */
  readonly armTrim?: readonly number[] | undefined;
  /** Inside the pre-distortion's iteration: exact values, no part window (internal). */
  readonly probing?: boolean;
}

/**
 * Check the options shared by every realisation.
 *
 * @param fn - public function name
 * @param options - what the caller gave
 * @param levelOhms - the impedance level the default capacitor aims at
 * @returns the options with defaults
 * @throws {@link InvalidArgumentError} naming the field
 */
export function readActiveOptions(fn: string, options: unknown, levelOhms = DEFAULT_LEVEL_OHMS): ReadOptions {
  if (options === undefined) {
    throw new InvalidArgumentError({ fn, path: "options", received: options, message: "expected { edgeHz, ... }: give at least the passband edge in Hz" });
  }
  const o = requireOptions(fn, "options", options);
  const edgeHz = requireInRange(fn, "options.edgeHz", o["edgeHz"], { min: 1e-3, max: 1e9 });
  const kf = TWO_PI * edgeHz;
  const resistorSeries = o["resistorSeries"] === undefined ? "E96" : seriesTable(fn, "options.resistorSeries", o["resistorSeries"]).name;
  const capacitorSeries = o["capacitorSeries"] === undefined ? "E12" : seriesTable(fn, "options.capacitorSeries", o["capacitorSeries"]).name;
  let capacitorF: number;
  if (o["capacitorF"] === undefined) {
    const ideal = 1 / (kf * levelOhms);
    capacitorF = snapToSeries(Math.min(CAPACITOR_LIMITS_F.max, Math.max(CAPACITOR_LIMITS_F.min, ideal)), { series: capacitorSeries }).value;
  } else {
    capacitorF = requireInRange(fn, "options.capacitorF", o["capacitorF"], CAPACITOR_LIMITS_F);
    if (!isInSeries(capacitorF, capacitorSeries)) {
      const near = snapToSeries(capacitorF, { series: capacitorSeries }).value;
      throw new InvalidArgumentError({ fn, path: "options.capacitorF", received: capacitorF, message: `expected a member of the capacitor series ${capacitorSeries}, such as ${near}` });
    }
  }
  const values = o["values"] === undefined ? "preferred" : requireOneOf(fn, "options.values", o["values"], ["preferred", "exact"] as const);
  const opamp = (o["opamp"] ?? { kind: "ideal" }) as OpAmpModel;
  checkOpAmpModel(fn, "options.opamp", opamp);
  const gain = o["gain"] === undefined ? 1 : requireInRange(fn, "options.gain", o["gain"], { min: 0.01, max: 100 });
  const asked = o["predistort"] ?? true;
  if (typeof asked !== "boolean") throw new InvalidArgumentError({ fn, path: "options.predistort", received: asked, message: "expected true or false (or no field: true for a real op-amp)" });
  const retune = o["retune"] ?? true;
  if (typeof retune !== "boolean") throw new InvalidArgumentError({ fn, path: "options.retune", received: retune, message: "expected true or false (or no field: true)" });
  return { edgeHz, kf, capacitorF, resistorSeries, capacitorSeries, exact: values === "exact", opamp, gain, predistort: asked && opamp.kind !== "ideal", retune: retune && values !== "exact" };
}

/** Default of `dcPathRatio`. */
export const DEFAULT_DC_PATH_RATIO = 1000;

/**
 * Check `options.dcPathRatio`.
 *
 * @param fn - public function name
 * @param options - what the caller gave (already checked to be an object or undefined)
 * @returns the ratio
 * @throws {@link InvalidArgumentError} outside 10 to 1e6
 */
export function readDcPathRatio(fn: string, options: unknown): number {
  const raw = requireOptions(fn, "options", options)["dcPathRatio"];
  return raw === undefined ? DEFAULT_DC_PATH_RATIO : requireInRange(fn, "options.dcPathRatio", raw, { min: 10, max: 1e6 });
}

/** What a method needs of the ladder's arms. */
export type ArmRule =
  /** Every capacitor grounded: no capacitor across a series inductor (the GIC and FDNR methods). */
  | "grounded-capacitors"
  /** Any arms (the leapfrog method: an extra element couples the states on either side of it). */
  | "any";

function bad(fn: string, path: string, received: unknown, message: string): never {
  throw new InvalidArgumentError({ fn, path, received, message });
}

/** What a method cannot build of an arm's transmission zero. */
function checkArm(fn: string, path: string, e: LadderElement, rule: ArmRule): void {
  if (rule === "grounded-capacitors" && e.parallelC !== undefined) {
    throw new UnrealisableError({ fn, path: `${path}.parallelC`, received: e.parallelC, message: "a capacitor across a series inductor becomes a floating element this method cannot build with grounded GICs; use the ladder's other form (transmission zeros made by series resonators in the shunt arms)" });
  }
}

/**
 * Check a normalised lowpass ladder prototype for a method: the shape check
 * every ladder function runs (`requireLadderPrototype`), at most
 * {@link MAX_LADDER_ORDER} arms, terminations from 1e-6 to 1e6 ohms, and what
 * the method needs of the arms.
 *
 * @param fn - public function name
 * @param value - what the caller gave
 * @param rule - what the method needs of the arms
 * @returns the prototype
 * @throws {@link InvalidArgumentError} naming the field for a malformed prototype
 * @throws {@link UnrealisableError} when the arms need what the method cannot build
 */
export function requireLadder(fn: string, value: unknown, rule: ArmRule): LadderPrototype {
  const p = requireLadderPrototype(fn, "prototype", value);
  if (p.elements.length > MAX_LADDER_ORDER) bad(fn, "prototype.elements", p.elements.length, `expected at most ${MAX_LADDER_ORDER} arms for an active simulation`);
  for (const key of ["sourceOhms", "loadOhms"] as const) {
    if (!(p[key] >= 1e-6 && p[key] <= 1e6)) bad(fn, `prototype.${key}`, p[key], "expected a normalised termination from 1e-6 to 1e6 ohms");
  }
  p.elements.forEach((e, i) => checkArm(fn, `prototype.elements[${i}]`, e, rule));
  return p;
}

/**
 * The degree of a ladder's transfer function: one pole per arm (an arm's
 * extra element closes a capacitor loop or an inductor cut set with its
 * neighbours, so it adds a pair of zeros and no pole).
 *
 * @param p - a checked ladder
 * @returns its degree
 */
export function ladderDegree(p: LadderPrototype): number {
  return p.elements.length;
}
