/**
 * The as-built response of a design sampled for a plot: magnitude (dB),
 * phase (degrees, unwrapped) and group delay (s), on a frequency grid that
 * src/report/plot/adaptive.ts refines where the curves turn, from the
 * stages' own responses with the design's op-amp model multiplied along the
 * cascade (src/design/verify.ts `cascadeResponse`, as the verification and
 * the curve export use). Group delay is the central difference of the phase
 * over +-1e-6 relative frequency, as src/design/verify.ts `responseCurve`
 * takes it.
 *
 * @module
 */
import type { DesignResult } from "../../design/index.ts";
import { builtStages } from "../../design/response.ts";
import { cascadeResponse, type BuiltStage } from "../../design/verify.ts";
import type { OpAmpModel } from "../../circuit/types.ts";
import { TWO_PI } from "../../units/constants.ts";
import { adaptiveSample, type CurveEvaluator } from "./adaptive.ts";

/** What to sample. */
export type ResponseQuantity = "magnitude" | "phase" | "group-delay";

const DELTA = 1e-6;
const DEG = 180 / Math.PI;

/**
 * The curves of a built cascade at given frequencies, in the order asked:
 * dB, wrapped phase in degrees ((-180, 180]), group delay in seconds.
 *
 * @param stages - the stages as built
 * @param opamp - op-amp model
 * @param quantities - what to compute
 * @returns the evaluator
 */
export function responseEvaluator(stages: readonly BuiltStage[], opamp: OpAmpModel, quantities: readonly ResponseQuantity[]): CurveEvaluator {
  const delay = quantities.includes("group-delay");
  return (f) => {
    const n = f.length;
    const h = cascadeResponse(stages, f, opamp);
    let lo: { re: Float64Array; im: Float64Array } | null = null;
    let hi: { re: Float64Array; im: Float64Array } | null = null;
    if (delay) {
      lo = cascadeResponse(stages, f.map((x) => x * (1 - DELTA)), opamp);
      hi = cascadeResponse(stages, f.map((x) => x * (1 + DELTA)), opamp);
    }
    return quantities.map((q) => {
      const out = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        const re = h.re[i] as number;
        const im = h.im[i] as number;
        if (q === "magnitude") out[i] = 20 * Math.log10(Math.hypot(re, im));
        else if (q === "phase") out[i] = Math.atan2(im, re) * DEG;
        else {
          const a = lo as { re: Float64Array; im: Float64Array };
          const b = hi as { re: Float64Array; im: Float64Array };
          let dp = Math.atan2(b.im[i] as number, b.re[i] as number) - Math.atan2(a.im[i] as number, a.re[i] as number);
          while (dp > Math.PI) dp -= TWO_PI;
          while (dp < -Math.PI) dp += TWO_PI;
          out[i] = -dp / (TWO_PI * 2 * DELTA * (f[i] as number));
        }
      }
      return out;
    });
  };
}

/**
 * Unwrap a phase in degrees: each step taken as the one within +-180 of the
 * one before; the first value is kept in (-180, 180].
 *
 * @param wrapped - phases in (-180, 180]
 * @returns the unwrapped phases
 */
export function unwrapDegrees(wrapped: Float64Array): Float64Array {
  const out = new Float64Array(wrapped.length);
  let offset = 0;
  for (let i = 0; i < wrapped.length; i++) {
    const v = wrapped[i] as number;
    if (i > 0) {
      const prev = out[i - 1] as number;
      offset += -360 * Math.round((v + offset - prev) / 360);
    }
    out[i] = v + offset;
  }
  return out;
}

/** What {@link sampleResponse} needs to size its tolerances. */
export interface SampleTarget {
  /** First frequency, Hz. */
  readonly startHz: number;
  /** Last frequency, Hz. */
  readonly stopHz: number;
  /** Plot height, pixels (a tolerance of a fraction of a pixel). */
  readonly heightPx: number;
  /** The value range the plot will show per quantity (data units), from which a pixel's worth follows. */
  readonly ranges: readonly (readonly [number, number])[];
  /** Most points. @defaultValue 4000 */
  readonly maxPoints?: number;
}

/** Fraction of a pixel a drawn segment may miss the curve by. */
export const PIXEL_TOLERANCE = 0.2;

/**
 * Sample a design's as-built response for a plot (see the module header):
 * 200 log-spaced points refined until every drawn segment is within
 * {@link PIXEL_TOLERANCE} pixel of the curve (values beyond the shown range by
 * more than half of it are not chased), every peak and notch of the
 * magnitude searched to its true extreme.
 *
 * @param result - a design (checked by the caller)
 * @param quantities - what to sample
 * @param target - span, plot height, shown ranges
 * @returns the frequencies and one array per quantity (phase unwrapped)
 */
export function sampleResponse(result: DesignResult, quantities: readonly ResponseQuantity[], target: SampleTarget): { freqHz: Float64Array; curves: Float64Array[] } {
  const evaluate = responseEvaluator(builtStages(result), result.spec.opamp, quantities);
  const tol = target.ranges.map(([a, b]) => (PIXEL_TOLERANCE * Math.abs(b - a)) / target.heightPx);
  const s = adaptiveSample(evaluate, {
    startHz: target.startHz,
    stopHz: target.stopHz,
    initialPoints: 200,
    maxPoints: target.maxPoints ?? 4000,
    tolerance: tol,
    clamp: target.ranges.map(([a, b]) => [Math.min(a, b) - Math.abs(b - a) / 2, Math.max(a, b) + Math.abs(b - a) / 2] as const),
    period: quantities.map((q) => (q === "phase" ? 360 : null)),
    polish: quantities.map((q) => q === "magnitude"),
  });
  return { freqHz: s.freqHz, curves: s.curves.map((c, i) => (quantities[i] === "phase" ? unwrapDegrees(c) : c)) };
}
