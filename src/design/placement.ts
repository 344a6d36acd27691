/**
 * Placing a design inside the slack of its mask.
 *
 * Method: a normalised lowpass prototype H(jW) meets a passband loss Ap up to
 * W_p* (the largest W with loss <= Ap on [0, W]) and a stopband attenuation As
 * from W_s* on (the smallest W with attenuation >= As on [W, inf)). The
 * frequency transforms (lowpass-to-lowpass, -highpass, -bandpass, -bandstop;
 * e.g. M. E. Van Valkenburg, "Analog Filter Design", 1982, ch. 13, and the
 * scipy.signal lp2*_zpk definitions) map the spec edges onto prototype
 * frequencies, so each transform's free parameter (natural frequency a, or
 * bandwidth B at the centre sqrt(wp1 wp2)) has a closed interval in which the
 * exact design meets the mask:
 *   lowpass  a in [wp / W_p*, ws / W_s*]
 *   highpass a in [W_s* ws, W_p* wp]
 *   bandpass B in [max_i |wp_i^2 - w0^2| / (wp_i W_p*), min_i |ws_i^2 - w0^2| / (ws_i W_s*)]
 *   bandstop B in [max_i W_s* |w0^2 - ws_i^2| / ws_i, min_i W_p* |w0^2 - wp_i^2| / wp_i]
 * For bandpass and bandstop the centre w0 is free as well; it is chosen to
 * make the interval widest (golden-section search on log w0), which for an
 * asymmetric mask can save an order over fixing w0 = sqrt(wp1 wp2).
 * The design is placed at the geometric middle of the interval (or at another
 * log position), so that part rounding, which moves frequencies by a few
 * tenths of a percent, moves the response towards neither edge first
 * (common practice, no source).
 *
 * W_p* and W_s* are found by a log-grid scan (200 points per decade) followed
 * by bisection to 1e-12 relative; loss comparisons allow 1e-5 dB so that an
 * equiripple prototype designed exactly at the limit counts as meeting it.
 *
 * @module
 */
import type { Zpk } from "../tf/types.ts";
import {
  frequencyResponse,
  logGrid,
  lowpassToBandpass,
  lowpassToBandstop,
  lowpassToHighpass,
  lowpassToLowpass,
} from "../tf/index.ts";
import { packZpk } from "../tf/packed.ts";
import { packedMagnitudeAt } from "../tf/response.ts";
import { TWO_PI } from "../units/constants.ts";
import { geometricBisect, goldenMax } from "../math/optimize.ts";
import type { DesignSpec } from "./spec.ts";

const DB_SLACK = 1e-5;
/** Edge refinement: at most 80 halvings, to 1e-13 relative. */
const EDGE_BISECTION = { relWidth: 1e-13, maxIterations: 80 } as const;

/** Magnitude of a zpk system at the given angular frequencies. */
export function zpkMagnitude(zpk: Zpk, w: Float64Array): Float64Array {
  const h = frequencyResponse(zpk, w);
  const out = new Float64Array(w.length);
  for (let i = 0; i < w.length; i++) out[i] = Math.hypot(h.re[i] as number, h.im[i] as number);
  return out;
}

/** The prototype frequencies up to which the passband and from which the stopband are met. */
export interface PrototypeEdges {
  /** Largest W with loss <= Ap on [0, W]. */
  readonly passW: number;
  /** Smallest W with attenuation >= As on [W, inf). */
  readonly stopW: number;
  /** Highest level of the prototype (its passband reference). */
  readonly peak: number;
}

/**
 * Find W_p* and W_s* of a normalised lowpass prototype.
 *
 * @param zpk - normalised lowpass prototype
 * @param lossDb - passband loss limit Ap
 * @param attenuationDb - stopband attenuation limit As
 * @returns the two edges and the prototype's peak level
 */
export function prototypeEdges(zpk: Zpk, lossDb: number, attenuationDb: number): PrototypeEdges {
  // the same prototype is placed many times over a design (family choice, attempts, recovery, yield ladder)
  let byLimits = edgesCache.get(zpk);
  if (byLimits === undefined) edgesCache.set(zpk, (byLimits = new Map()));
  const key = `${lossDb} ${attenuationDb}`;
  let edges = byLimits.get(key);
  if (edges === undefined) byLimits.set(key, (edges = computeEdges(zpk, lossDb, attenuationDb)));
  return edges;
}

/** Edges already found, per prototype object (prototypes are frozen) and limits. */
const edgesCache = new WeakMap<Zpk, Map<string, PrototypeEdges>>();

function computeEdges(zpk: Zpk, lossDb: number, attenuationDb: number): PrototypeEdges {
  const w = logGrid(1e-4, 1e5, 1801);
  const m = zpkMagnitude(zpk, w);
  // one-point values for the bisections: the same numbers as zpkMagnitude, without its per-call checks
  const packed = packZpk(zpk);
  const magAt = (x: number): number => packedMagnitudeAt(packed, x);
  let peak = 0;
  for (let i = 0; i < m.length; i++) peak = Math.max(peak, m[i] as number);
  peak = Math.max(peak, magAt(0));
  const loss = (x: number): number => 20 * Math.log10(peak / x);
  // Passband: first grid point (from below) where the loss exceeds Ap.
  let ip = -1;
  for (let i = 0; i < m.length; i++) {
    if (loss(m[i] as number) > lossDb + DB_SLACK) {
      ip = i;
      break;
    }
  }
  let passW: number;
  if (ip <= 0) passW = ip === 0 ? (w[0] as number) : (w[w.length - 1] as number);
  else {
    const tooLossy = (x: number): boolean => loss(magAt(x)) > lossDb + DB_SLACK;
    passW = geometricBisect(tooLossy, w[ip - 1] as number, w[ip] as number, EDGE_BISECTION).lo;
  }
  // Stopband: first grid point (from above) where the attenuation falls below As.
  let is = -1;
  for (let i = m.length - 1; i >= 0; i--) {
    if (loss(m[i] as number) < attenuationDb - DB_SLACK) {
      is = i;
      break;
    }
  }
  let stopW: number;
  if (is < 0) stopW = w[0] as number;
  else if (is === m.length - 1) stopW = 1e6; // never reaches As on the grid: far beyond any usable design
  else {
    const attenuates = (x: number): boolean => !(loss(magAt(x)) < attenuationDb - DB_SLACK);
    stopW = geometricBisect(attenuates, w[is] as number, w[is + 1] as number, EDGE_BISECTION).hi;
  }
  return { passW, stopW, peak };
}

/** The feasible interval of the transform's free parameter, in rad/s. */
export interface FeasibleInterval {
  /** Which parameter. */
  readonly parameter: "natural-frequency" | "bandwidth";
  /** Lower end, rad/s. */
  readonly low: number;
  /** Upper end, rad/s (below `low` when the prototype cannot meet the mask). */
  readonly high: number;
  /** Centre of the bandpass/bandstop transform, rad/s. */
  readonly centre?: number;
}

/**
 * The interval of the transform's free parameter in which the exact design
 * meets the mask (see the module header for the formulas).
 *
 * @param spec - canonical spec (edges in Hz)
 * @param edges - the prototype's W_p* and W_s*
 * @returns the interval in rad/s
 */
export function feasibleInterval(spec: DesignSpec, edges: PrototypeEdges): FeasibleInterval {
  const wp = spec.passbandHz.map((f) => TWO_PI * f);
  const ws = spec.stopbandHz.map((f) => TWO_PI * f);
  const { passW, stopW } = edges;
  const wp1 = wp[0] as number;
  const ws1 = ws[0] as number;
  switch (spec.response) {
    case "lowpass":
      return { parameter: "natural-frequency", low: wp1 / passW, high: ws1 / stopW };
    case "highpass":
      return { parameter: "natural-frequency", low: stopW * ws1, high: passW * wp1 };
    case "bandpass":
    case "bandstop":
      return bestCentre(spec.response, wp, ws, passW, stopW);
  }
}

/** The bandwidth interval for a given centre (see the module header; both edges of each band constrain). */
function bandInterval(
  response: "bandpass" | "bandstop",
  w0: number,
  wp: readonly number[],
  ws: readonly number[],
  passW: number,
  stopW: number,
): { low: number; high: number } {
  const d = (x: number): number => Math.abs(x * x - w0 * w0) / x;
  if (response === "bandpass") {
    return { low: Math.max(...wp.map((x) => d(x) / passW)), high: Math.min(...ws.map((x) => d(x) / stopW)) };
  }
  return { low: Math.max(...ws.map((x) => stopW * d(x))), high: Math.min(...wp.map((x) => passW * d(x))) };
}

/**
 * Bandpass/bandstop: the centre frequency is free too. The centre that gives
 * the widest bandwidth interval is found by golden-section search on log w0
 * over the inner band (between the passband edges for a bandpass, the stopband
 * edges for a bandstop), starting from the geometric centre of the passband.
 */
function bestCentre(
  response: "bandpass" | "bandstop",
  wp: readonly number[],
  ws: readonly number[],
  passW: number,
  stopW: number,
): FeasibleInterval {
  const inner = response === "bandpass" ? wp : ws;
  const width = (lw: number): number => {
    const iv = bandInterval(response, Math.exp(lw), wp, ws, passW, stopW);
    return Math.log(iv.high / iv.low);
  };
  const geometric = 0.5 * (Math.log(wp[0] as number) + Math.log(wp[1] as number));
  const best = goldenMax(width, [Math.log(inner[0] as number), Math.log(inner[1] as number)], { iterations: 80, width: 1e-12 });
  // Keep the passband's geometric centre unless the search finds a clearly wider interval.
  const lw = width(best) > width(geometric) + 1e-9 ? best : geometric;
  const w0 = Math.exp(lw);
  const iv = bandInterval(response, w0, wp, ws, passW, stopW);
  return { parameter: "bandwidth", low: iv.low, high: iv.high, centre: w0 };
}

/**
 * The interval in which a prototype's exact design meets the spec's mask: its
 * edges W_p*, W_s* against the spec's Ap, As, mapped through the transform.
 *
 * @param spec - canonical spec
 * @param zpk - normalised lowpass prototype
 * @returns the interval in rad/s (empty, `high < low`, when the prototype cannot meet the mask)
 */
export function prototypeInterval(spec: DesignSpec, zpk: Zpk): FeasibleInterval {
  return feasibleInterval(spec, prototypeEdges(zpk, spec.maxLossDb, spec.minAttenuationDb));
}

/** Whether raising the placed parameter helps the passband (true: lowpass, bandpass) or the stopband. */
export function upHelpsPassband(spec: DesignSpec): boolean {
  return spec.response === "lowpass" || spec.response === "bandpass";
}

/** Log-width of an interval (negative when infeasible). */
export function intervalWidth(iv: FeasibleInterval): number {
  return Math.log(iv.high / iv.low);
}

/**
 * The parameter value at a log position inside the interval (0 = low end,
 * 1 = high end). For an empty interval (high < low) the same formula gives a
 * point between the two, which balances the two shortfalls in frequency.
 */
export function placeInInterval(iv: FeasibleInterval, position: number): number {
  return iv.low * (iv.high / iv.low) ** position;
}

/**
 * Transform a normalised lowpass prototype to the spec's response with the
 * free parameter set to `value` (rad/s).
 *
 * @param spec - canonical spec
 * @param proto - normalised lowpass prototype
 * @param iv - the feasible interval (for the bandpass/bandstop centre)
 * @param value - natural frequency or bandwidth, rad/s
 * @returns the transformed zpk in rad/s
 */
export function transformPrototype(spec: DesignSpec, proto: Zpk, iv: FeasibleInterval, value: number): Zpk {
  switch (spec.response) {
    case "lowpass":
      return lowpassToLowpass(proto, { w0: value });
    case "highpass":
      return lowpassToHighpass(proto, { w0: value });
    case "bandpass":
      return lowpassToBandpass(proto, { w0: iv.centre as number, bandwidth: value });
    case "bandstop":
      return lowpassToBandstop(proto, { w0: iv.centre as number, bandwidth: value });
  }
}
