/**
 * The options of {@link designLcLadder} and their check: the terminations,
 * the ladder's form, the inductors (series, tolerance, Q), the capacitors'
 * tolerance, and the Monte Carlo boards.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { INDUCTOR_SERIES, type InductorSeries } from "../ladder/as-built-types.ts";
import { DEFAULT_INDUCTOR_Q, MAX_INDUCTOR_Q } from "../ladder/as-built.ts";
import { LADDER_FORMS, type LadderForm } from "../ladder/types.ts";
import { MAX_TERMINATION_RATIO } from "../ladder/ladder-prototype.ts";
import { seriesTable } from "../parts/eseries.ts";
import { requireInRange, requireInteger, requireOneOf, requireOptions } from "../validate.ts";
import type { DesignSpec } from "./spec.ts";

/** Boards built when none are asked for. */
export const DEFAULT_LC_BOARDS = 1000;

/** Most boards one call builds. */
export const MAX_LC_BOARDS = 1_000_000;

/** Options of {@link designLcLadder}. */
export interface LcLadderOptions {
  /**
   * Source resistance, ohms (1e-6 to 1e9).
   * @defaultValue 50
   */
  readonly sourceOhms?: number;
  /**
   * Load resistance, ohms (1e-6 to 1e9, within a factor of 1e6 of the source).
   * @defaultValue sourceOhms, or for an even-order Chebyshev I ladder the load its ripple needs
   */
  readonly loadOhms?: number;
  /**
   * Which arm comes first from the source: `"series-first"` (an inductor
   * first in a lowpass) or `"shunt-first"` (a capacitor to ground first).
   * @defaultValue "shunt-first" (the fewer inductors of the two, for odd-order lowpass ladders)
   */
  readonly form?: LadderForm;
  /**
   * Series the inductors are bought in.
   * @defaultValue "E12"
   */
  readonly inductorSeries?: InductorSeries;
  /**
   * Inductor tolerance as a fraction (0 exclusive to 0.5).
   * @defaultValue the series' usual tolerance: E12 10 %, E24 5 %
   */
  readonly inductorTolerance?: number;
  /**
   * Unloaded Q of every inductor at the ladder's edge (or centre), 1 to 1e6.
   * @defaultValue 50
   */
  readonly inductorQ?: number;
  /**
   * Capacitor tolerance as a fraction (0 exclusive to 0.5).
   * @defaultValue the spec's capacitor tolerance
   */
  readonly capacitorTolerance?: number;
  /**
   * Tolerance of the source and load resistances in the Monte Carlo boards,
   * as a fraction (0 to 0.5). They are the system's, not the board's, so by
   * default they keep their values.
   * @defaultValue 0
   */
  readonly terminationTolerance?: number;
  /**
   * Monte Carlo boards built (1 to 1e6).
   * @defaultValue 1000
   */
  readonly boards?: number;
  /**
   * Seed of the part draws (an integer from 0 to 2^32 - 1).
   * @defaultValue the spec's yield seed
   */
  readonly seed?: number;
}

/** The checked options (internal). */
export interface LcLadderPlan {
  readonly sourceOhms: number;
  readonly loadOhms: number | undefined;
  readonly form: LadderForm;
  readonly inductorSeries: InductorSeries;
  readonly inductorTolerance: number;
  readonly inductorQ: number;
  readonly capacitorTolerance: number;
  readonly terminationTolerance: number;
  readonly boards: number;
  readonly seed: number;
}

const KNOWN = [
  "sourceOhms",
  "loadOhms",
  "form",
  "inductorSeries",
  "inductorTolerance",
  "inductorQ",
  "capacitorTolerance",
  "terminationTolerance",
  "boards",
  "seed",
];

const OHMS = { min: 1e-6, max: 1e9 } as const;
const TOLERANCE = { min: 0, max: 0.5, exclusiveMin: true } as const;

/**
 * Check the options of {@link designLcLadder} (internal).
 *
 * @param fn - public function name, for messages
 * @param options - the value to check
 * @param spec - the canonical spec (for its defaults)
 * @returns the options with their defaults
 * @throws {@link InvalidArgumentError} naming the field (`options.inductorQ`, ...)
 */
export function readLcLadderOptions(fn: string, options: unknown, spec: DesignSpec): LcLadderPlan {
  const o = requireOptions(fn, "options", options);
  for (const k of Object.keys(o)) {
    if (!KNOWN.includes(k)) throw new InvalidArgumentError({ fn, path: `options.${k}`, received: o[k], message: `unknown option; expected one of ${KNOWN.join(", ")}` });
  }
  const sourceOhms = o["sourceOhms"] === undefined ? 50 : requireInRange(fn, "options.sourceOhms", o["sourceOhms"], OHMS);
  const loadOhms = o["loadOhms"] === undefined ? undefined : requireInRange(fn, "options.loadOhms", o["loadOhms"], OHMS);
  if (loadOhms !== undefined) {
    const r = loadOhms / sourceOhms;
    if (!(r <= MAX_TERMINATION_RATIO && r >= 1 / MAX_TERMINATION_RATIO)) {
      throw new InvalidArgumentError({ fn, path: "options.loadOhms", received: loadOhms, message: `the load must lie within a factor of ${MAX_TERMINATION_RATIO} of sourceOhms (${sourceOhms})` });
    }
  }
  const form = o["form"] === undefined ? "shunt-first" : requireOneOf(fn, "options.form", o["form"], LADDER_FORMS);
  const inductorSeries = o["inductorSeries"] === undefined ? "E12" : requireOneOf(fn, "options.inductorSeries", o["inductorSeries"], INDUCTOR_SERIES);
  const inductorTolerance =
    o["inductorTolerance"] === undefined ? seriesTable(fn, "options.inductorSeries", inductorSeries).tolerance : requireInRange(fn, "options.inductorTolerance", o["inductorTolerance"], TOLERANCE);
  const inductorQ = o["inductorQ"] === undefined ? DEFAULT_INDUCTOR_Q : requireInRange(fn, "options.inductorQ", o["inductorQ"], { min: 1, max: MAX_INDUCTOR_Q });
  const capacitorTolerance = o["capacitorTolerance"] === undefined ? spec.capacitorTolerance : requireInRange(fn, "options.capacitorTolerance", o["capacitorTolerance"], TOLERANCE);
  const terminationTolerance = o["terminationTolerance"] === undefined ? 0 : requireInRange(fn, "options.terminationTolerance", o["terminationTolerance"], { min: 0, max: 0.5 });
  const boards = o["boards"] === undefined ? DEFAULT_LC_BOARDS : requireInteger(fn, "options.boards", o["boards"], { min: 1, max: MAX_LC_BOARDS });
  const seed = o["seed"] === undefined ? spec.yieldSeed : requireInteger(fn, "options.seed", o["seed"], { min: 0, max: 0xffffffff });
  return { sourceOhms, loadOhms, form, inductorSeries, inductorTolerance, inductorQ, capacitorTolerance, terminationTolerance, boards, seed };
}
