/**
 * Relative sensitivities of a stage's pole frequency, Q, zero frequency and
 * gain to each of its parts: S_x^y = (x / y) dy/dx.
 *
 * Method: central differences of the topology's own (ideal op-amp) figures
 * with a relative step of {@link SENSITIVITY_STEP}, so the truncation error is
 * O(1e-10) and the rounding error about 1e-11 / 1e-5 = 1e-6 relative.
 * Classical invariants follow from impedance and frequency scaling and serve
 * as checks: for an active-RC stage the f0 sensitivities to its resistors sum
 * to -1, those to its capacitors sum to -1, and the Q and gain sensitivities
 * each sum to 0 over the resistors and over the capacitors (G. S. Moschytz,
 * "Linear Integrated Networks: Design", 1975, ch. 2; R. Schaumann, M. S.
 * Ghausi and K. R. Laker, "Design of Analog Filters: Passive, Active RC and
 * Switched Capacitor", 1990, sec. 3.3).
 *
 * @module
 */
import type { ComponentValues, Topology } from "../topologies/types.ts";

/** Relative step of the central differences. */
export const SENSITIVITY_STEP = 1e-5;

/** Sensitivities of one stage's figures to one of its parts. */
export interface FigureSensitivity {
  /** The part's component name in the topology. */
  readonly name: string;
  /** The part's value, SI units. */
  readonly value: number;
  /** S_part^f0. */
  readonly f0: number;
  /** S_part^Q (0 for a first-order stage). */
  readonly q: number;
  /** S_part^fz (0 when the stage has no zero frequency). */
  readonly fz: number;
  /** S_part^gain. */
  readonly gain: number;
}

/** The relative derivative from the figure at +step, -step and nominal (0 where the figure is absent or zero). */
function rel(hi: number | undefined, lo: number | undefined, mid: number | undefined): number {
  if (hi === undefined || lo === undefined || mid === undefined || mid === 0) return 0;
  return (hi - lo) / (2 * SENSITIVITY_STEP * mid);
}

/**
 * Relative sensitivities of a stage's ideal-op-amp f0, Q, fz and gain to
 * each of its parts (internal: no checks; the values are the topology's).
 *
 * @param topology - the stage's topology
 * @param values - its component values
 * @returns one entry per component, in `topology.componentNames` order
 * @example
 * ```ts
 * figureSensitivities(topology, values).filter((s) => s.name.startsWith("C")).reduce((a, s) => a + s.f0, 0); //=> -1 (within 1e-6)
 * ```
 */
export function figureSensitivities(topology: Topology, values: ComponentValues): FigureSensitivity[] {
  const mid = topology.figures(values);
  return topology.componentNames.map((name) => {
    const x = values[name] as number;
    const up = topology.figures({ ...values, [name]: x * (1 + SENSITIVITY_STEP) });
    const down = topology.figures({ ...values, [name]: x * (1 - SENSITIVITY_STEP) });
    return {
      name,
      value: x,
      f0: rel(up.f0Hz, down.f0Hz, mid.f0Hz),
      q: rel(up.q, down.q, mid.q),
      fz: rel(up.fzHz, down.fzHz, mid.fzHz),
      gain: rel(up.gain, down.gain, mid.gain),
    };
  });
}
