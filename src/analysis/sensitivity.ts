/**
 * Relative sensitivities of each stage's pole frequency, Q, zero frequency
 * and gain to each of its parts, S_x^y = (x / y) dy/dx, by the design's
 * part designators.
 *
 * Method: the central differences of src/evaluate/sensitivity.ts (relative
 * step 1e-5, about 1e-6 relative accuracy; its header gives the invariants
 * and references), mapped from each stage's component names to the
 * design's designators.
 *
 * @module
 */
import type { DesignResult } from "../design/index.ts";
import { builtStages } from "../design/response.ts";
import { requireDesignResult } from "../design/check.ts";
import { figureSensitivities, type FigureSensitivity } from "../evaluate/sensitivity.ts";

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
    const byName = new Map(figureSensitivities(b.topology, b.values).map((x) => [x.name, x]));
    for (const [global, local] of Object.entries(st.localNames)) {
      const x = byName.get(local) as FigureSensitivity;
      out.push({ stage: st.index, part: global, value: x.value, f0: x.f0, q: x.q, fz: x.fz, gain: x.gain });
    }
  });
  return out;
}
