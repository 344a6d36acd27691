/**
 * Pre-distortion of a second-order stage's design target for a finite
 * gain-bandwidth op-amp ("GBW compensation").
 *
 * An op-amp with finite gain-bandwidth moves the pole of an active stage: f0
 * usually drops and Q usually rises, by an amount that grows with f0 * Q /
 * GBW. Instead of accepting the shift, the stage is designed for a target
 * chosen so that the stage as built WITH that op-amp lands on the wanted f0
 * and Q (R. Schaumann and M. E. Van Valkenburg, "Design of Analog Filters",
 * Oxford University Press, 2001, the sections on the effects of the op-amp's
 * finite gain-bandwidth and their pre-distortion; cited from memory).
 *
 * Method: fixed-point iteration on the design target. Start from the wanted
 * (f0, Q); design exact values; find the pole those values really have with
 * the op-amp model (`asBuiltPole`: modified nodal analysis and Muller's
 * method, about 1e-13 relative); multiply the target's f0 by f0_want /
 * f0_built and its Q by Q_want / Q_built; repeat. The shift varies slowly
 * with the target, so each step shrinks the error by roughly the relative
 * shift itself (a few per cent for a modest op-amp): 1e-6 is reached in three
 * to six steps. A bandpass stage whose gain is free also has its gain
 * corrected: finite loop gain lowers the response at f0 below the ideal
 * figure (once the pole is right, nothing else makes up for it), so the
 * target gain is scaled by |H_want(f0)| / |H_built(f0)| in the same loop.
 * When the error grows, the pole cannot be found, or the
 * corrected target is not realisable, the iteration stops and the caller
 * keeps the uncorrected design.
 *
 * @module
 */
import type { OpAmpModel } from "../circuit/types.ts";
import { asBuiltPole } from "../topologies/index.ts";
import type { StageChoices, StageTarget, Topology } from "../topologies/types.ts";

/** Relative pole error (f0 and Q) at which the iteration stops. */
export const PREDISTORTION_TOLERANCE = 1e-6;
/** Largest number of correction steps. */
export const PREDISTORTION_MAX_STEPS = 8;
/** After the last step, an error below this is still accepted (the snapping that follows is coarser). */
const ACCEPT_AFTER_LAST_STEP = 1e-4;

/** A successful pre-distortion. */
export interface PredistortedTarget {
  /** Whether a corrected target was found. */
  readonly ok: true;
  /** The target to design for (ideal op-amp figures). */
  readonly target: StageTarget;
  /** Design f0 / wanted f0. */
  readonly f0Factor: number;
  /** Design Q / wanted Q. */
  readonly qFactor: number;
  /** Design gain / wanted gain (1 unless the gain is corrected: bandpass stages with a free gain). */
  readonly gainFactor: number;
  /** Correction steps taken. */
  readonly steps: number;
}

/** A pre-distortion that failed, and why. */
export interface PredistortionFailure {
  /** Whether a corrected target was found. */
  readonly ok: false;
  /** Why not, in words. */
  readonly reason: string;
}

/** The outcome of {@link predistortTarget}. */
export type PredistortionOutcome = PredistortedTarget | PredistortionFailure;

function withFigures(t: Topology, base: StageTarget, f0Hz: number, q: number, gain: number): StageTarget {
  const next = { ...base, f0Hz, q, gain };
  if (t.fixedGain === undefined) return next;
  return { ...next, gain: t.fixedGain(next) };
}

/**
 * Find the design target whose exact design, built with the given op-amp,
 * has the wanted pole f0 and Q.
 *
 * @param t - the stage's topology (second order)
 * @param wanted - the stage target the cascade needs
 * @param opamp - the op-amp model of the spec (not ideal)
 * @param choices - the design choices the stage is built with (e.g. a state-variable notch's internal level)
 * @returns the corrected target with its f0 and Q factors, or why none was found
 */
export function predistortTarget(t: Topology, wanted: StageTarget, opamp: OpAmpModel, choices: StageChoices = {}): PredistortionOutcome {
  const qWant = wanted.q;
  if (wanted.order !== 2 || qWant === undefined || opamp.kind === "ideal") {
    return { ok: false, reason: "only second-order stages with a non-ideal op-amp are pre-distorted" };
  }
  let cur = wanted;
  let last = Infinity;
  // The gain at f0 is corrected too where it is free and defined at f0 (bandpass).
  const fixGain = wanted.kind === "bandpass" && t.fixedGain === undefined;
  const atF0 = new Float64Array([wanted.f0Hz]);
  for (let step = 0; step <= PREDISTORTION_MAX_STEPS; step++) {
    const why = t.check(cur, {});
    if (why !== null) return { ok: false, reason: `the corrected target (f0 ${cur.f0Hz.toPrecision(5)} Hz, Q ${(cur.q ?? NaN).toPrecision(4)}) is not realisable: ${why}` };
    let f0Built: number;
    let qBuilt: number;
    let kg = 1;
    try {
      const values = t.design(cur, choices);
      const pole = asBuiltPole(t, values, opamp);
      f0Built = pole.f0Hz;
      qBuilt = pole.q ?? NaN;
      if (fixGain) {
        const h = t.response(values, atF0, opamp);
        kg = Math.abs(wanted.gain) / Math.hypot(h.re[0] as number, h.im[0] as number);
        if (!(kg > 0) || !Number.isFinite(kg)) return { ok: false, reason: "the gain at f0 with this op-amp is not finite" };
      }
    } catch (e) {
      return { ok: false, reason: `the pole with this op-amp could not be found (${e instanceof Error ? e.message : String(e)})` };
    }
    if (!(qBuilt > 0) || !(f0Built > 0)) {
      return { ok: false, reason: `with this op-amp the stage is unstable or has no complex pole (Q ${qBuilt.toPrecision(3)})` };
    }
    const kf = wanted.f0Hz / f0Built;
    const kq = qWant / qBuilt;
    const err = Math.max(Math.abs(kf - 1), Math.abs(kq - 1), Math.abs(kg - 1));
    const done = {
      ok: true as const,
      target: cur,
      f0Factor: cur.f0Hz / wanted.f0Hz,
      qFactor: (cur.q as number) / qWant,
      gainFactor: cur.gain / wanted.gain,
      steps: step,
    };
    if (err <= PREDISTORTION_TOLERANCE) return done;
    if (step > 0 && !(err < last)) {
      return { ok: false, reason: `the correction diverges (pole error ${(100 * err).toPrecision(3)} % after step ${step}, ${(100 * last).toPrecision(3)} % before)` };
    }
    if (step === PREDISTORTION_MAX_STEPS) {
      return err <= ACCEPT_AFTER_LAST_STEP
        ? done
        : { ok: false, reason: `the correction did not converge in ${PREDISTORTION_MAX_STEPS} steps (pole error still ${(100 * err).toPrecision(3)} %)` };
    }
    last = err;
    cur = withFigures(t, cur, cur.f0Hz * kf, (cur.q as number) * kq, cur.gain * kg);
  }
  return { ok: false, reason: "the correction did not converge" };
}
