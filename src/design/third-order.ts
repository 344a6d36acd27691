/**
 * One op-amp for a real pole and a pole pair: the section list with an odd
 * lowpass or highpass cascade's first-order section joined to its
 * lowest-Q pole pair of the same kind, for the third-order single-amplifier
 * stages (topologies/sallen-key-third.ts). The stage planner builds both
 * lists and keeps this one only when it needs fewer op-amps (attempt.ts
 * `chooseSplit`); the yield ladder's sturdier rung leaves the third-order
 * stages out again (attempt.ts `sturdierStagesOf`), so a joined stage whose
 * boards miss the yield target is built as the two stages it replaced.
 *
 * Why the lowest Q: the stage's capacitor spread and its sensitivity to the
 * parts grow with the pair's Q as in the second-order unity-gain stage (its
 * smallest capacitor ratio C1/C3 is about 8 for a Butterworth pair at Q 1,
 * 33 at Q 2; topologies/sallen-key-third.ts); the pair nearest the real pole
 * in a Butterworth, Bessel or Chebyshev cascade is the lowest-Q one (common
 * practice, no source).
 *
 * @module
 */
import type { SectionInfo } from "./stages.ts";

/** Ids of the third-order stages (the planner's `avoid` set leaves them out to split them again). */
export const THIRD_ORDER_IDS: readonly string[] = Object.freeze(["sallen-key-lowpass-third-order", "sallen-key-highpass-third-order"]);

/**
 * The sections with the first-order lowpass (highpass) section joined to the
 * lowest-Q lowpass (highpass) pair, at the pair's place in the cascade, or
 * null when the cascade has no such two sections (no first-order section,
 * or only finite-zero, bandpass or allpass pairs beside it).
 *
 * @param infos - sections in cascade order
 * @returns the joined list, or null
 * @throws never
 * @example
 * ```ts
 * joinRealPole(describeSections(cascadeOf3rdOrderButterworth, grid))?.length; //=> 1
 * ```
 */
export function joinRealPole(infos: readonly SectionInfo[]): SectionInfo[] | null {
  const firstAt = infos.findIndex((i) => i.order === 1 && (i.kind === "lowpass" || i.kind === "highpass"));
  if (firstAt < 0) return null;
  const real = infos[firstAt] as SectionInfo;
  let pairAt = -1;
  for (const [k, info] of infos.entries()) {
    if (info.order !== 2 || info.kind !== real.kind || !((info.q ?? 0) > 0.5)) continue;
    if (pairAt < 0 || (info.q as number) < ((infos[pairAt] as SectionInfo).q as number)) pairAt = k;
  }
  if (pairAt < 0) return null;
  const pair = infos[pairAt] as SectionInfo;
  const unitMag = new Float64Array(pair.unitMag.length);
  for (let i = 0; i < unitMag.length; i++) unitMag[i] = (pair.unitMag[i] as number) * (real.unitMag[i] as number);
  const joined: SectionInfo = {
    section: pair.section,
    realSection: real.section,
    kind: pair.kind,
    order: 3,
    f0Hz: pair.f0Hz,
    q: pair.q as number,
    realPoleHz: real.f0Hz,
    refGain: pair.refGain * real.refGain,
    unitMag,
  };
  const out: SectionInfo[] = [];
  for (const [k, info] of infos.entries()) {
    if (k === firstAt) continue;
    out.push(k === pairAt ? joined : info);
  }
  return out;
}
