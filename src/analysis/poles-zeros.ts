/**
 * The poles and zeros of a design as built: each stage's transfer function
 * with its preferred part values and the op-amp model (the op-amps' own
 * poles included), as roots, stage by stage and for the whole cascade.
 *
 * Method: each stage's as-built polynomials in `z = s / scale`
 * (src/evaluate/stage-polynomials.ts: the topology's closed form, or the
 * stage's nodal equations sampled on circles), their roots by the
 * Aberth-Ehrlich iteration with double-double polishing (src/math/roots.ts),
 * scaled back to rad/s. `N(z) = n0 prod(z - z_i)`, `D(z) = d0 prod(z - p_j)`
 * give `H(s) = (n0 / d0) scale^(deg D - deg N) prod(s - scale z_i) / prod(s - scale p_j)`.
 * Leading coefficients below 1e-13 of the largest (the top powers an ideal
 * op-amp leaves at rounding level) are dropped. Accuracy: the roots of
 * well-separated poles to about 1e-12 relative; a double zero at the origin
 * (a highpass) comes out exactly.
 *
 * @module
 */
import { ConvergenceError, InvalidArgumentError } from "../errors.ts";
import { requireOptions } from "../validate.ts";
import type { OpAmpModel } from "../circuit/types.ts";
import { checkOpAmpModel } from "../circuit/validate.ts";
import type { DesignResult } from "../design/index.ts";
import { requireDesignResult } from "../design/check.ts";
import { builtStages } from "../design/response.ts";
import { stagePolynomials } from "../evaluate/stage-polynomials.ts";
import type { Complex } from "../math/complex.ts";
import { polyRoots, sortRoots } from "../math/roots.ts";
import type { Zpk } from "../tf/types.ts";

/** Options of {@link designPolesZeros}. */
export interface DesignPolesZerosOptions {
  /**
   * Op-amp model of the stages.
   * @defaultValue the design's op-amp
   */
  readonly opamp?: OpAmpModel;
}

/** One stage's poles and zeros. */
export interface StagePolesZeros {
  /** The stage, from 1. */
  readonly stage: number;
  /** Its zeros, rad/s. */
  readonly zeros: readonly Complex[];
  /** Its poles, rad/s. */
  readonly poles: readonly Complex[];
  /** Its gain factor: `H(s) = gain prod(s - zeros) / prod(s - poles)`. */
  readonly gain: number;
}

/** Result of {@link designPolesZeros}. */
export interface DesignPolesZeros {
  /** Each stage, in cascade order. */
  readonly stages: readonly StagePolesZeros[];
  /** The whole cascade as zeros, poles (rad/s) and gain, for the `tf` layer's functions (`stepResponse`, `evalZpk`, ...). */
  readonly zpk: Zpk;
}

/** Drop leading coefficients at rounding level. */
function significant(c: Float64Array): number[] {
  let big = 0;
  for (const x of c) big = Math.max(big, Math.abs(x));
  let i = 0;
  while (i < c.length - 1 && Math.abs(c[i] as number) <= 1e-13 * big) i++;
  return Array.from(c.subarray(i));
}

/**
 * The poles and zeros of a design as built (see the module header).
 *
 * @param result - a design from `designFilter`
 * @param options - op-amp model
 * @returns per stage and for the cascade, rad/s
 * @throws {@link InvalidArgumentError} when `result` is not a design result, the op-amp model is malformed, or a stage's equations are singular with its parts
 * @throws {@link ConvergenceError} when a stage's roots cannot be found (not observed for these degrees)
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const pz = designPolesZeros(designFilter(spec));
 * pz.zpk.poles.length;                  //=> 3
 * pz.zpk.poles.every((p) => p.re < 0);  //=> true
 * ```
 */
export function designPolesZeros(result: DesignResult, options?: DesignPolesZerosOptions): DesignPolesZeros {
  const fn = "designPolesZeros";
  requireDesignResult(fn, result);
  const o = requireOptions(fn, "options", options);
  if (o["opamp"] !== undefined) checkOpAmpModel(fn, "options.opamp", o["opamp"]);
  const opamp = (o["opamp"] as OpAmpModel | undefined) ?? result.spec.opamp;
  const stages = builtStages(result).map((s, k): StagePolesZeros => {
    const p = stagePolynomials(s.topology, s.values, opamp);
    if (p === null) throw new InvalidArgumentError({ fn, path: `result.stages[${k}]`, message: "the stage's equations are singular with these parts; the design record is damaged" });
    const num = significant(p.num);
    const den = significant(p.den);
    const scaled = (r: Complex): Complex => ({ re: r.re * p.scale, im: r.im * p.scale });
    let zeros: Complex[];
    let poles: Complex[];
    try {
      zeros = num.length > 1 ? polyRoots(num).map(scaled) : [];
      poles = den.length > 1 ? polyRoots(den).map(scaled) : [];
    } catch (e) {
      if (e instanceof ConvergenceError) throw new ConvergenceError({ fn, path: `result.stages[${k}]`, message: `the roots of stage ${k + 1} were not found: ${e.message}` });
      throw e;
    }
    const gain = ((num[0] as number) / (den[0] as number)) * p.scale ** (den.length - num.length);
    return { stage: k + 1, zeros, poles, gain };
  });
  const zpk: Zpk = {
    zeros: sortRoots(stages.flatMap((s) => s.zeros)),
    poles: sortRoots(stages.flatMap((s) => s.poles)),
    gain: stages.reduce((g, s) => g * s.gain, 1),
  };
  return { stages, zpk };
}
