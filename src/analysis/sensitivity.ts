/**
 * Relative sensitivities of each stage's pole frequency, Q, zero frequency
 * and gain to each of its parts: S_x^y = (x / y) dy/dx.
 *
 * Method: central differences of the topology's own (ideal op-amp) figures
 * with a relative step of 1e-5, so the truncation error is O(1e-10) and the
 * rounding error about 1e-11 / 1e-5 = 1e-6 relative. Classical invariants
 * follow from impedance and frequency scaling and serve as checks: for an
 * active-RC stage the f0 sensitivities to its resistors sum to -1, those to its
 * capacitors sum to -1, and the Q and gain sensitivities each sum to 0 over the
 * resistors and over the capacitors (G. S. Moschytz, "Linear Integrated
 * Networks: Design", 1975, ch. 2; R. Schaumann, M. S. Ghausi and K. R. Laker,
 * "Design of Analog Filters: Passive, Active RC and Switched Capacitor", 1990,
 * sec. 3.3).
 *
 * @module
 */
import type { DesignResult } from "../design/index.ts";
import { builtStages } from "../design/response.ts";
import { requireDesignResult } from "../design/check.ts";

/** Sensitivities of one stage's figures to one part. */
export interface PartSensitivity {
  /** Stage index (from 1). */
  readonly stage: number;
  /** Reference designator. */
  readonly part: string;
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

const STEP = 1e-5;

function rel(hi: number | undefined, lo: number | undefined, mid: number | undefined): number {
  if (hi === undefined || lo === undefined || mid === undefined || mid === 0) return 0;
  return (hi - lo) / (2 * STEP * mid);
}

/**
 * Relative sensitivities of every stage's f0, Q, fz and gain to each of its
 * parts, from the topology's ideal-op-amp figures.
 *
 * @param result - a design
 * @returns one entry per part, in cascade order
 * @throws {@link InvalidArgumentError} when `result` is not a design result (the path names the first bad field)
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const s = partSensitivities(designFilter(spec));
 * s.filter((x) => x.stage === 1 && x.part.startsWith("C")).reduce((a, x) => a + x.f0, 0); //=> -1 (within 1e-6)
 * ```
 */
export function partSensitivities(result: DesignResult): PartSensitivity[] {
  requireDesignResult("partSensitivities", result);
  const out: PartSensitivity[] = [];
  builtStages(result).forEach((b, k) => {
    const st = result.stages[k] as DesignResult["stages"][number];
    const mid = b.topology.figures(b.values);
    for (const [global, local] of Object.entries(st.localNames)) {
      const x = b.values[local] as number;
      const up = b.topology.figures({ ...b.values, [local]: x * (1 + STEP) });
      const down = b.topology.figures({ ...b.values, [local]: x * (1 - STEP) });
      out.push({
        stage: st.index,
        part: global,
        value: x,
        f0: rel(up.f0Hz, down.f0Hz, mid.f0Hz),
        q: rel(up.q, down.q, mid.q),
        fz: rel(up.fzHz, down.fzHz, mid.fzHz),
        gain: rel(up.gain, down.gain, mid.gain),
      });
    }
  });
  return out;
}
