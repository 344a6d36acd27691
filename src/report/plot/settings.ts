/**
 * The options of a plot, checked once at the public boundary, with their
 * defaults filled in.
 *
 * @module
 */
import { InvalidArgumentError } from "../../errors.ts";
import { requireInRange, requireInteger, requireOneOf, requireOptions, requirePositive } from "../../validate.ts";
import type { DesignResult } from "../../design/index.ts";
import { responseSpanHz } from "../../design/verify.ts";
import type { MonteCarloEnvelope } from "../../analysis/envelope.ts";
import type { NoiseAnalysisOptions } from "../../analysis/noise.ts";
import { logTicksCore } from "./ticks.ts";

/** The kinds of plot. */
export const PLOT_KINDS = ["magnitude", "phase", "group-delay", "step", "pole-zero", "opamp-levels", "noise"] as const;

/** A kind of plot. */
export type PlotKind = (typeof PLOT_KINDS)[number];

/** The checked options of one plot. */
export interface PlotSettings {
  /** The kind. */
  readonly kind: PlotKind;
  /** Width, pixels. */
  readonly width: number;
  /** Height, pixels. */
  readonly height: number;
  /** The caller's title, or undefined for the kind's own. */
  readonly title: string | undefined;
  /** First frequency, Hz. */
  readonly startHz: number;
  /** Last frequency, Hz. */
  readonly stopHz: number;
  /** Whether the magnitude plot shades the spec's forbidden regions. */
  readonly mask: boolean;
  /** The Monte Carlo spread to draw on the magnitude plot. */
  readonly envelope: MonteCarloEnvelope | undefined;
  /** Options of the noise analysis the noise plot draws. */
  readonly noise: NoiseAnalysisOptions | undefined;
  /** Length of the step response shown, s (undefined: from the poles). */
  readonly durationS: number | undefined;
}

/** Check that a value looks like a {@link MonteCarloEnvelope}: the arrays of one length, the numbers in range. */
function requireEnvelope(fn: string, value: unknown): MonteCarloEnvelope {
  const e = requireOptions(fn, "options.envelope", value);
  const f = e["freqHz"];
  if (!(f instanceof Float64Array) || f.length < 2) throw new InvalidArgumentError({ fn, path: "options.envelope.freqHz", received: f, message: "expected the envelope from monteCarloEnvelope (a Float64Array of at least 2 frequencies)" });
  for (const key of ["nominalDb", "minDb", "maxDb", "lowerDb", "medianDb", "upperDb"]) {
    const a = e[key];
    if (!(a instanceof Float64Array) || a.length !== f.length) throw new InvalidArgumentError({ fn, path: `options.envelope.${key}`, received: a, message: `expected a Float64Array as long as freqHz (${f.length})` });
  }
  requireInteger(fn, "options.envelope.runs", e["runs"], { min: 1, max: 20000 });
  requireInteger(fn, "options.envelope.leftOut", e["leftOut"], { min: 0, max: 20000 });
  requireInRange(fn, "options.envelope.coverage", e["coverage"], { min: 0, max: 1, exclusiveMin: true });
  return value as MonteCarloEnvelope;
}

/** The frequency span: the caller's, or the design's response span widened to 1, 2 or 5 times a power of ten. */
function span(fn: string, result: DesignResult, o: Record<string, unknown>): readonly [number, number] {
  const [lo, hi] = responseSpanHz(result.spec);
  const wide = logTicksCore(lo, hi);
  const start = o["startHz"] === undefined ? undefined : requirePositive(fn, "options.startHz", o["startHz"]);
  const stop = o["stopHz"] === undefined ? undefined : requirePositive(fn, "options.stopHz", o["stopHz"]);
  const a = start ?? (stop !== undefined && stop <= wide.min ? stop / 100 : wide.min);
  const b = stop ?? (start !== undefined && start >= wide.max ? start * 100 : wide.max);
  if (!(b > a * (1 + 1e-9))) throw new InvalidArgumentError({ fn, path: "options.stopHz", received: b, message: `expected a frequency above startHz (${a} Hz)` });
  if (b > 1e12) throw new InvalidArgumentError({ fn, path: "options.stopHz", received: b, message: "expected at most 1 THz" });
  if (b / a > 1e9) throw new InvalidArgumentError({ fn, path: "options.startHz", received: a, message: "expected at most nine decades between startHz and stopHz" });
  return [a, b];
}

/**
 * Check a plot's options and fill in the defaults.
 *
 * @param fn - the public function, for the errors
 * @param result - the design (checked by the caller)
 * @param options - the options as given
 * @returns the settings
 * @throws {@link InvalidArgumentError} naming the option that is out of range
 */
export function plotSettings(fn: string, result: DesignResult, options: unknown): PlotSettings {
  const o = requireOptions(fn, "options", options);
  const kind = o["kind"] === undefined ? "magnitude" : requireOneOf(fn, "options.kind", o["kind"], PLOT_KINDS);
  const width = o["width"] === undefined ? 720 : requireInteger(fn, "options.width", o["width"], { min: 240, max: 4000 });
  const height = o["height"] === undefined ? 420 : requireInteger(fn, "options.height", o["height"], { min: 200, max: 4000 });
  const title = o["title"];
  if (title !== undefined && (typeof title !== "string" || title.length > 300)) throw new InvalidArgumentError({ fn, path: "options.title", received: title, message: "expected a string of at most 300 characters" });
  const mask = o["mask"];
  if (mask !== undefined && typeof mask !== "boolean") throw new InvalidArgumentError({ fn, path: "options.mask", received: mask, message: "expected true or false" });
  const [startHz, stopHz] = span(fn, result, o);
  const envelope = o["envelope"] === undefined ? undefined : requireEnvelope(fn, o["envelope"]);
  const noise = o["noise"] === undefined ? undefined : (requireOptions(fn, "options.noise", o["noise"]) as NoiseAnalysisOptions);
  const durationS = o["durationS"] === undefined ? undefined : requireInRange(fn, "options.durationS", o["durationS"], { min: 0, max: 1e6, exclusiveMin: true });
  return { kind, width, height, title, startHz, stopHz, mask: mask !== false, envelope, noise, durationS };
}
