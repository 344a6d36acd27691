/**
 * One candidate LC ladder of {@link designLcLadder}: a family and order's
 * prototype ladder at the cascade's margin level, placed at a position in
 * its feasible interval, scaled, built from preferred lossy parts, and its
 * nominal figures against the mask measured from its lossless level.
 *
 * @module
 */
import type { FamilyName } from "../approx/types.ts";
import type { Circuit } from "../circuit/types.ts";
import { ladderCircuit, LADDER_SOURCE } from "../circuit/ladder.ts";
import { FilterwrightError, InvalidArgumentError, UnrealisableError } from "../errors.ts";
import { circuitPolynomials, type CircuitCompileOptions } from "../evaluate/circuit-boards.ts";
import { maskFigures, planMask, rationalSource, type MaskFigures, type MaskPlan, type ResponseSource } from "../evaluate/mask.ts";
import { asBuiltLadder } from "../ladder/as-built.ts";
import type { AsBuiltLadder } from "../ladder/as-built-types.ts";
import { ladderPrototype } from "../ladder/ladder-prototype.ts";
import { scaleLadder } from "../ladder/scale.ts";
import type { ScaledLadder } from "../ladder/scaled-types.ts";
import type { LadderPrototype } from "../ladder/types.ts";
import { frequencyResponse } from "../tf/index.ts";
import type { Zpk } from "../tf/types.ts";
import { TWO_PI } from "../units/constants.ts";
import { choosePrototype } from "./family.ts";
import type { LcLadderPlan } from "./lc-ladder-options.ts";
import type { LcLadderPlacement } from "./lc-ladder-types.ts";
import { placeInInterval, type FeasibleInterval } from "./placement.ts";
import type { DesignSpec } from "./spec.ts";
import { maskBands, spanRadS } from "./verify.ts";

/** The public function the errors name. */
export const LC_FN = "designLcLadder";

/** A family and order's prototype ladder, with the ripple it was designed with. */
export interface LadderCandidate {
  readonly prototype: LadderPrototype;
  /** Design ripple, dB (Chebyshev I, elliptic). */
  readonly rippleDb: number | undefined;
}

/**
 * The ladder's prototype for a family and order at the cascade's margin
 * level (normalised to a 1 ohm source; the load in the ratio asked for).
 *
 * @throws whatever `ladderPrototype` throws (see {@link reraised})
 */
export function prototypeAt(spec: DesignSpec, family: FamilyName, order: number, plan: LcLadderPlan): LadderCandidate {
  const p = choosePrototype(spec, family, order);
  const prototype = ladderPrototype({
    family,
    order,
    ...(p.rippleDb === undefined ? {} : { rippleDb: p.rippleDb }),
    ...(p.attenuationDb === undefined ? {} : { attenuationDb: p.attenuationDb }),
    ...(family === "bessel" ? { normalization: "magnitude" as const } : {}),
    form: plan.form,
    sourceOhms: 1,
    ...(plan.loadOhms === undefined ? {} : { loadOhms: plan.loadOhms / plan.sourceOhms }),
  });
  return { prototype, rippleDb: p.rippleDb };
}

/**
 * A ladder synthesis error re-raised as {@link designLcLadder}'s, with the
 * option or spec field it is about; anything else as it is.
 *
 * @param e - what was thrown
 */
export function reraised(e: unknown): never {
  if (!(e instanceof FilterwrightError) || e.fn !== "ladderPrototype") throw e;
  const path = e.path === "loadOhms" ? "options.loadOhms" : e.path === "form" ? "options.form" : "spec.order";
  const details = { fn: LC_FN, path, received: e.received, message: e.reason };
  throw e instanceof UnrealisableError ? new UnrealisableError(details) : new InvalidArgumentError(details);
}

/** |H(0)| of a zpk system (its poles and zeros off the origin). */
function dcMagnitude(zpk: Zpk): number {
  let m = Math.abs(zpk.gain);
  for (const z of zpk.zeros) m *= Math.hypot(z.re, z.im);
  for (const p of zpk.poles) m /= Math.hypot(p.re, p.im);
  return m;
}

/**
 * The lossless ladder's passband level, V/V: its DC level RL / (RS + RL),
 * raised by the ripple for an even-order Chebyshev I ladder (whose DC lies
 * at the bottom of its ripple).
 *
 * @param c - the candidate
 * @returns the level
 */
export function losslessLevel(c: LadderCandidate): number {
  const dc = dcMagnitude(c.prototype.transfer);
  return c.prototype.family === "chebyshev1" && c.prototype.order % 2 === 0 ? dc * 10 ** ((c.rippleDb as number) / 20) : dc;
}

/**
 * A zpk system (rad/s) as a mask source.
 *
 * @param zpk - the system
 * @returns the source
 */
export function zpkSource(zpk: Zpk): ResponseSource {
  const one = new Float64Array(1);
  return {
    magnitudeSquared: (w, out) => {
      const h = frequencyResponse(zpk, w);
      for (let i = 0; i < w.length; i++) out[i] = (h.re[i] as number) ** 2 + (h.im[i] as number) ** 2;
    },
    magnitudeSquaredAt: (w) => {
      one[0] = w;
      const h = frequencyResponse(zpk, one);
      return (h.re[0] as number) ** 2 + (h.im[0] as number) ** 2;
    },
    realPartAt: (w) => {
      one[0] = w;
      return frequencyResponse(zpk, one).re[0] as number;
    },
  };
}

/** A candidate built and checked. */
export interface BuiltLadder {
  readonly candidate: LadderCandidate;
  readonly interval: FeasibleInterval;
  /** Log position in the interval (0 low end, 1 high end). */
  readonly position: number;
  readonly placement: LcLadderPlacement;
  readonly level: number;
  readonly mask: MaskPlan;
  readonly ladder: ScaledLadder;
  readonly asBuilt: AsBuiltLadder;
  readonly circuit: Circuit;
  /** Compile options of the circuit (source, output, span). */
  readonly compile: CircuitCompileOptions;
  /** Scale of the circuit's polynomials, rad/s. */
  readonly radius: number;
  /** Nominal figures of the as-built circuit. */
  readonly figures: MaskFigures;
  /** The smaller of the nominal passband and stopband margins, dB. */
  readonly marginDb: number;
}

/**
 * The mask of a ladder: the spec's loss and attenuation limits measured from
 * the lossless level (no gain limit: a passive ladder's level is its terminations').
 *
 * @param spec - canonical spec
 * @param level - the lossless level, V/V
 * @returns the plan
 */
export function ladderMask(spec: DesignSpec, level: number): MaskPlan {
  return planMask(maskBands(spec), { maxLossDb: spec.maxLossDb, minAttenuationDb: spec.minAttenuationDb, gain: level, gainToleranceDb: Infinity, reference: level });
}

function placementAt(spec: DesignSpec, iv: FeasibleInterval, position: number): LcLadderPlacement {
  const value = placeInInterval(iv, position);
  return {
    parameter: iv.parameter,
    lowHz: iv.low / TWO_PI,
    highHz: iv.high / TWO_PI,
    chosenHz: value / TWO_PI,
    position,
    ...(iv.centre === undefined || spec.response === "lowpass" || spec.response === "highpass" ? {} : { centreHz: iv.centre / TWO_PI }),
  };
}

function scaled(spec: DesignSpec, prototype: LadderPrototype, placement: LcLadderPlacement, plan: LcLadderPlan): ScaledLadder {
  const r = spec.response;
  if (r === "lowpass" || r === "highpass") return scaleLadder(prototype, { response: r, edgeHz: placement.chosenHz, sourceOhms: plan.sourceOhms });
  return scaleLadder(prototype, { response: r, centreHz: placement.centreHz as number, bandwidthHz: placement.chosenHz, sourceOhms: plan.sourceOhms });
}

/**
 * Build a candidate at a position in its interval and check it nominally.
 *
 * @param spec - canonical spec
 * @param plan - checked options
 * @param candidate - the prototype ladder
 * @param interval - its feasible interval in the mask
 * @param position - log position in the interval
 * @returns the built ladder and its figures
 */
export function buildLadder(spec: DesignSpec, plan: LcLadderPlan, candidate: LadderCandidate, interval: FeasibleInterval, position: number): BuiltLadder {
  const placement = placementAt(spec, interval, position);
  const ladder = scaled(spec, candidate.prototype, placement, plan);
  const asBuilt = asBuiltLadder(ladder, {
    inductorSeries: plan.inductorSeries,
    inductorTolerance: plan.inductorTolerance,
    capacitorSeries: spec.capacitorSeries,
    capacitorTolerance: plan.capacitorTolerance,
    inductorQ: plan.inductorQ,
  });
  const circuit = ladderCircuit(asBuilt);
  const level = losslessLevel(candidate);
  const mask = ladderMask(spec, level);
  const radius = TWO_PI * ("edgeHz" in ladder.placement ? ladder.placement.edgeHz : ladder.placement.centreHz);
  const compile = { source: LADDER_SOURCE, output: asBuilt.outputNode, spanRadS: spanRadS(mask.bands) };
  const polys = circuitPolynomials(circuit, compile, radius);
  if (polys === null) {
    throw new UnrealisableError({ fn: LC_FN, path: "options.inductorQ", received: plan.inductorQ, message: "the as-built ladder's nodal equations are singular; give the inductors a lower Q" });
  }
  const figures = maskFigures(rationalSource([polys]), mask);
  const marginDb = Math.min(figures.passbandMarginDb, figures.stopbandMarginDb);
  return { candidate, interval, position, placement, level, mask, ladder, asBuilt, circuit, compile, radius, figures, marginDb };
}
