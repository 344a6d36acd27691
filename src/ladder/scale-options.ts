/**
 * The options of {@link scaleLadder} and their check: the response, where the
 * prototype's 1 rad/s goes (an edge in hertz, or a band as its two edges or
 * its centre and width), and the terminations in ohms.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { TWO_PI } from "../units/constants.ts";
import { requireOneOf, requireOptions, requirePositive } from "../validate.ts";
import { LADDER_RESPONSES, type LadderPlacement, type LadderResponse } from "./scaled-types.ts";
import type { LadderPrototype } from "./types.ts";

/** Relative mismatch accepted between the given terminations' ratio and the prototype's. */
export const TERMINATION_RATIO_TOLERANCE = 1e-9;

/** Options of {@link scaleLadder}. */
export interface ScaleLadderOptions {
  /**
   * The response of the scaled ladder.
   * @defaultValue "lowpass"
   */
  readonly response?: LadderResponse;
  /**
   * Lowpass and highpass: the frequency (Hz) the prototype's 1 rad/s maps to
   * (the -3 dB point of a Butterworth prototype, the ripple edge of a
   * Chebyshev I or elliptic one). Bandpass and bandstop: the two edges
   * `[lowerHz, upperHz]` the prototype's 1 rad/s maps to; give these or
   * `centreHz` with `bandwidthHz`.
   */
  readonly edgeHz?: number | readonly [number, number];
  /** Bandpass and bandstop: the centre frequency (Hz), the geometric mean of the edges; with `bandwidthHz`. */
  readonly centreHz?: number;
  /** Bandpass and bandstop: the width (Hz) between the edges; with `centreHz`. */
  readonly bandwidthHz?: number;
  /**
   * Source resistance (ohms). Give it, `loadOhms`, or both: the ratio of the
   * two is the prototype's, so one sets the other.
   * @defaultValue loadOhms times the prototype's source-to-load ratio
   */
  readonly sourceOhms?: number;
  /**
   * Load resistance (ohms).
   * @defaultValue sourceOhms times the prototype's load-to-source ratio
   */
  readonly loadOhms?: number;
}

/** The checked options as the numerical core takes them (angular frequencies). */
export interface ScaleTarget {
  /** Response. */
  readonly response: LadderResponse;
  /** Lowpass/highpass: the cut-off; bandpass/bandstop: the centre (rad/s). */
  readonly w0: number;
  /** Bandpass/bandstop: the bandwidth (rad/s); 1 otherwise. */
  readonly bandwidth: number;
  /** The impedance scale: ohms per prototype ohm. */
  readonly impedance: number;
  /** Source resistance (ohms). */
  readonly sourceOhms: number;
  /** Load resistance (ohms). */
  readonly loadOhms: number;
  /** The placement in hertz, for the result. */
  readonly placement: LadderPlacement;
}

function fail(fn: string, path: string, received: unknown, message: string): never {
  throw new InvalidArgumentError({ fn, path, received, message });
}

function readEdge(fn: string, o: Record<string, unknown>, response: "lowpass" | "highpass"): LadderPlacement {
  for (const k of ["centreHz", "bandwidthHz"]) {
    if (o[k] !== undefined) fail(fn, `options.${k}`, o[k], `a ${response} ladder has one edge: give edgeHz alone`);
  }
  if (o["edgeHz"] === undefined) fail(fn, "options.edgeHz", undefined, `expected the ${response} edge in Hz (where the prototype's 1 rad/s goes)`);
  if (Array.isArray(o["edgeHz"])) fail(fn, "options.edgeHz", o["edgeHz"], `a ${response} ladder has one edge: give one number of Hz`);
  const edgeHz = requirePositive(fn, "options.edgeHz", o["edgeHz"]);
  return { response, edgeHz };
}

function band(response: "bandpass" | "bandstop", centreHz: number, bandwidthHz: number): LadderPlacement {
  const half = bandwidthHz / 2;
  const upperHz = Math.hypot(centreHz, half) + half;
  return { response, centreHz, bandwidthHz, lowerHz: (centreHz * centreHz) / upperHz, upperHz };
}

function readBand(fn: string, o: Record<string, unknown>, response: "bandpass" | "bandstop"): LadderPlacement {
  const edges = o["edgeHz"];
  const byCentre = o["centreHz"] !== undefined || o["bandwidthHz"] !== undefined;
  if (edges !== undefined && byCentre) {
    fail(fn, "options.edgeHz", edges, "give the band either as edgeHz [lowerHz, upperHz] or as centreHz with bandwidthHz, not both");
  }
  if (edges === undefined) {
    if (!byCentre) fail(fn, "options.edgeHz", edges, `expected the ${response} band: edgeHz [lowerHz, upperHz], or centreHz with bandwidthHz`);
    const centreHz = requirePositive(fn, "options.centreHz", o["centreHz"]);
    const bandwidthHz = requirePositive(fn, "options.bandwidthHz", o["bandwidthHz"]);
    return band(response, centreHz, bandwidthHz);
  }
  if (!Array.isArray(edges) || edges.length !== 2) fail(fn, "options.edgeHz", edges, "expected the two edges [lowerHz, upperHz] in Hz");
  const lo = requirePositive(fn, "options.edgeHz[0]", edges[0]);
  const hi = requirePositive(fn, "options.edgeHz[1]", edges[1]);
  if (!(hi > lo)) fail(fn, "options.edgeHz[1]", hi, `expected the upper edge above the lower one (${lo} Hz)`);
  const product = lo * hi;
  const centreHz = Number.isFinite(product) && product > 0 ? Math.sqrt(product) : Math.sqrt(lo) * Math.sqrt(hi);
  return { response, centreHz, bandwidthHz: hi - lo, lowerHz: lo, upperHz: hi };
}

function readTerminations(fn: string, o: Record<string, unknown>, prototype: LadderPrototype): { sourceOhms: number; loadOhms: number } {
  const ratio = prototype.loadOhms / prototype.sourceOhms;
  const rs = o["sourceOhms"] === undefined ? undefined : requirePositive(fn, "options.sourceOhms", o["sourceOhms"]);
  const rl = o["loadOhms"] === undefined ? undefined : requirePositive(fn, "options.loadOhms", o["loadOhms"]);
  if (rs === undefined && rl === undefined) {
    fail(fn, "options.sourceOhms", undefined, "expected the source resistance in ohms (or loadOhms): the ladder is scaled to its terminations");
  }
  const sourceOhms = rs ?? (rl as number) / ratio;
  const loadOhms = rl ?? (rs as number) * ratio;
  if (Math.abs(loadOhms / sourceOhms - ratio) > TERMINATION_RATIO_TOLERANCE * ratio) {
    fail(
      fn,
      "options.loadOhms",
      rl,
      `this prototype needs a load of ${ratio} times the source resistance (${sourceOhms * ratio} ohms for ${sourceOhms} ohms); give one of the two, or a prototype designed for these terminations`,
    );
  }
  if (!Number.isFinite(sourceOhms) || !Number.isFinite(loadOhms) || sourceOhms <= 0 || loadOhms <= 0) {
    fail(fn, rs === undefined ? "options.loadOhms" : "options.sourceOhms", rs ?? rl, "the other termination overflows; give a smaller resistance");
  }
  return { sourceOhms, loadOhms };
}

const KNOWN = new Set(["response", "edgeHz", "centreHz", "bandwidthHz", "sourceOhms", "loadOhms"]);

/**
 * Check the options of {@link scaleLadder} against a checked prototype (internal).
 *
 * @param fn - public function name for messages
 * @param options - the value to check
 * @param prototype - the checked prototype (for its termination ratio)
 * @returns the target in rad/s and the placement in Hz
 * @throws {@link InvalidArgumentError} naming the field
 * @example
 * ```ts
 * readScaleOptions("scaleLadder", { edgeHz: 1000, sourceOhms: 50 }, prototype).impedance; //=> 50 (a prototype with a 1-ohm source)
 * ```
 */
export function readScaleOptions(fn: string, options: unknown, prototype: LadderPrototype): ScaleTarget {
  if (options === undefined) fail(fn, "options", options, "expected { response, edgeHz (or centreHz and bandwidthHz), sourceOhms or loadOhms }");
  const o = requireOptions(fn, "options", options);
  for (const k of Object.keys(o)) {
    if (!KNOWN.has(k)) fail(fn, `options.${k}`, o[k], `unknown option; expected one of ${[...KNOWN].join(", ")}`);
  }
  const response = o["response"] === undefined ? "lowpass" : requireOneOf(fn, "options.response", o["response"], LADDER_RESPONSES);
  const placement = response === "lowpass" || response === "highpass" ? readEdge(fn, o, response) : readBand(fn, o, response);
  const { sourceOhms, loadOhms } = readTerminations(fn, o, prototype);
  const w0 = TWO_PI * ("edgeHz" in placement ? placement.edgeHz : placement.centreHz);
  const bandwidth = "bandwidthHz" in placement ? TWO_PI * placement.bandwidthHz : 1;
  return { response, w0, bandwidth, impedance: sourceOhms / prototype.sourceOhms, sourceOhms, loadOhms, placement };
}
