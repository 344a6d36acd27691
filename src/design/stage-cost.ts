/**
 * How close a stage's values come to their target: the relative errors of
 * f0, Q, fz and gain (a third-order stage's f0 error is the larger of its
 * pole pair's and its real pole's), and the one ranking cost the component search and the
 * re-tuning use (the largest error plus a tenth of their sum, with the gain
 * error at half weight; common practice, no source). Where a topology reports
 * how far its zeros sit off the jw axis (`zeroDamping`, about 1/(2 Qz); a
 * balance condition among unequal parts, as in the one-op-amp notch
 * sections), it is added to the zero-frequency error, so the search keeps
 * the notch deep as well as in place.
 *
 * @module
 */
import type { AsBuiltPole } from "../topologies/as-built.ts";
import { topologyCore } from "../topologies/define.ts";
import type { ComponentValues, StageFigures, StageTarget, Topology } from "../topologies/types.ts";
import type { StageErrors } from "./types.ts";

/** A complete set of stage values with its errors. */
export interface ValueSet {
  /** Component values by local designator. */
  readonly values: ComponentValues;
  /** Ideal-op-amp figures of these values. */
  readonly figures: StageFigures;
  /** Relative errors against the target (with op-amp scoring: the pole with the op-amp against the wanted target). */
  readonly errors: StageErrors;
  /** Scalar error used for ranking. */
  readonly cost: number;
  /** The pole these values have with the op-amp (set only under op-amp scoring). */
  readonly withOpamp?: AsBuiltPole;
}

/** Whether a designator names a capacitor. */
export const isCap = (name: string): boolean => name.startsWith("C");
/** Whether a designator names a resistor. */
export const isRes = (name: string): boolean => name.startsWith("R");

/** Relative error of `a` against `b` (0 when either is absent; absolute when `b` is 0). */
export function rel(a: number | undefined, b: number | undefined): number {
  if (a === undefined || b === undefined) return 0;
  if (b === 0) return Math.abs(a);
  return Math.abs(a / b - 1);
}

/** The f0 error: the pole pair's, and for a third-order stage the larger of it and the real pole's. */
function poleError(fig: StageFigures, target: StageTarget): number {
  const e = rel(fig.f0Hz, target.f0Hz);
  return target.realPoleHz === undefined ? e : Math.max(e, rel(fig.realPoleHz ?? NaN, target.realPoleHz));
}

/** Relative errors of figures against a target. */
export function stageErrors(fig: StageFigures, target: StageTarget): StageErrors {
  return {
    f0: poleError(fig, target),
    q: target.order >= 2 ? rel(fig.q, target.q) : 0,
    fz: rel(fig.fzHz, target.fzHz) + (fig.zeroDamping ?? 0),
    gain: rel(fig.gain, target.gain),
  };
}

/** The ranking cost of four relative errors (f0, Q, fz, gain). */
export function cost4(f0: number, q: number, fz: number, gain: number): number {
  const g = 0.5 * gain;
  return Math.max(f0, q, fz, g) + 0.1 * (f0 + q + fz + g);
}

/** The ranking cost of a set's relative errors. */
export function costOf(e: StageErrors): number {
  return cost4(e.f0, e.q, e.fz, e.gain);
}

/** The cost of a set's figures against a target (the same arithmetic as `costOf(stageErrors(...))`), NaN when the figures are unusable. */
export function figuresCost(fig: StageFigures, target: StageTarget): number {
  if (!Number.isFinite(fig.f0Hz) || !Number.isFinite(fig.gain)) return NaN;
  const q = target.order >= 2 ? rel(fig.q, target.q) : 0;
  return cost4(poleError(fig, target), q, rel(fig.fzHz, target.fzHz) + (fig.zeroDamping ?? 0), rel(fig.gain, target.gain));
}

/** The ideal figures of a topology's values: its unchecked core where it has one (values in the search are always positive). */
export function figuresOf(t: Topology): (v: ComponentValues) => StageFigures {
  return topologyCore(t)?.figures ?? t.figures;
}

/** A value set with its figures and cost against a target, or null where the figures are unusable. */
export function evaluate(t: Topology, values: ComponentValues, target: StageTarget): ValueSet | null {
  let fig: StageFigures;
  try {
    fig = figuresOf(t)(values);
  } catch {
    return null;
  }
  const cost = figuresCost(fig, target);
  return Number.isFinite(cost) ? { values, figures: fig, errors: stageErrors(fig, target), cost } : null;
}
