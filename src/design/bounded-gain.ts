/**
 * The largest gain a one-op-amp topology with a bounded gain can give a
 * stage, for the stage planner (stages.ts): the single-amplifier
 * highpass-notch's high-frequency gain is below unity and the lowpass-notch's
 * DC gain below about (fz/f0)^2 (topologies/boctor.ts), so a cascade that
 * needs more from such a stage would otherwise take a four-op-amp stage.
 * The planner lets such a stage take {@link BOUNDED_GAIN_FRACTION} of its
 * bound when the signal then stays within {@link BOUNDED_LEVEL_FLOOR} of the
 * level the equal-peak rule gives it, and moves the difference to the other
 * stages.
 *
 * Method: bisection on the log of the gain over the topology's own
 * realisability check (`Topology.check`), which is monotone in the gain for
 * the topologies with a gain ceiling; 40 halvings put the bound within
 * 1e-10 of the bracket's log span, far below the fraction taken off it.
 *
 * @module
 */
import type { StageTarget, Topology } from "../topologies/types.ts";

/**
 * Fraction of its largest realisable gain a topology with a bounded gain
 * takes (common practice, no source: a stage designed at its bound has a
 * part at its limit, e.g. R2 of the single-amplifier notch sections open, so
 * preferred values and tolerances would push it past; at 90 % the
 * single-amplifier highpass-notch keeps its capacitor ratio near 1, see
 * topologies/boctor.ts `ratioOf`).
 */
export const BOUNDED_GAIN_FRACTION = 0.9;

/**
 * How far, as a ratio, a stage at a bounded gain may move the signal from the
 * level the equal-peak rule gives it: a stage before the last at least 0.85
 * of its wish (its output then peaks at most 1.4 dB below the filter's output
 * level, and the later stages' make-up gain multiplies the noise before them
 * by at most 1.4 dB), a last stage at least 0.85 of the remainder (the stages
 * before it then peak at most 1.4 dB above the output level, the headroom it
 * costs). Common practice, no source: a small fraction of the usual 3-6 dB
 * headroom allowance, traded for three op-amps a stage.
 */
export const BOUNDED_LEVEL_FLOOR = 0.85;

/** Whether the topology realises the target at gain magnitude g (signed by its polarity). */
function realises(t: Topology, targetAt: (gain: number) => StageTarget, g: number): boolean {
  try {
    return t.check(targetAt((t.inverting ? -1 : 1) * g), {}) === null;
  } catch {
    return false;
  }
}

/**
 * The largest gain magnitude below the wish a topology realises for a stage,
 * times {@link BOUNDED_GAIN_FRACTION}, or null when it realises none between
 * a twentieth of min(wish, 1) and the wish.
 *
 * @param t - the topology
 * @param targetAt - the stage's target at a signed gain
 * @param wish - the gain magnitude the stage is asked for (above what t realises)
 * @returns the gain magnitude to take, or null
 */
export function boundedGain(t: Topology, targetAt: (gain: number) => StageTarget, wish: number): number | null {
  let lo = Math.min(wish, 1) / 20;
  let hi = wish;
  if (!(lo < hi) || !realises(t, targetAt, lo)) return null;
  for (let k = 0; k < 40; k++) {
    const mid = Math.sqrt(lo * hi);
    if (realises(t, targetAt, mid)) lo = mid;
    else hi = mid;
  }
  const g = BOUNDED_GAIN_FRACTION * lo;
  return realises(t, targetAt, g) ? g : null;
}
