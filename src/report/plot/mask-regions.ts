/**
 * The regions of the magnitude plane a spec forbids, as the verification
 * measures them (src/design/verify.ts): below the passband floor (the
 * as-built passband level minus the allowed loss) across each passband, and
 * above the stopband ceiling (that level minus the required attenuation)
 * across each stopband. Levels are taken from the as-built passband level,
 * as the verification takes them, so a curve that stays out of the shading
 * meets the mask.
 *
 * @module
 */
import type { DesignResult } from "../../design/index.ts";

/** A forbidden region: frequencies from `lowHz` to `highHz`, levels from `lowDb` to `highDb` (infinite: to the frame's edge). */
export interface MaskRegion {
  /** Lowest frequency, Hz (0: from the frame's left edge). */
  readonly lowHz: number;
  /** Highest frequency, Hz (Infinity: to the right edge). */
  readonly highHz: number;
  /** Lowest level, dB (-Infinity: from the bottom). */
  readonly lowDb: number;
  /** Highest level, dB (Infinity: to the top). */
  readonly highDb: number;
}

/**
 * The forbidden regions of a design's spec.
 *
 * @param result - a design (checked by the caller)
 * @returns the regions
 */
export function maskRegions(result: DesignResult): MaskRegion[] {
  const s = result.spec;
  const level = result.verification.gainDb;
  const floor = level - s.maxLossDb;
  const ceiling = level - s.minAttenuationDb;
  const [p1, p2] = [s.passbandHz[0] as number, s.passbandHz[1] as number];
  const [s1, s2] = [s.stopbandHz[0] as number, s.stopbandHz[1] as number];
  const below = (lowHz: number, highHz: number): MaskRegion => ({ lowHz, highHz, lowDb: -Infinity, highDb: floor });
  const above = (lowHz: number, highHz: number): MaskRegion => ({ lowHz, highHz, lowDb: ceiling, highDb: Infinity });
  switch (s.response) {
    case "lowpass":
      return [below(0, p1), above(s1, Infinity)];
    case "highpass":
      return [below(p1, s.passbandTopHz ?? Infinity), above(0, s1)];
    case "bandpass":
      return [below(p1, p2), above(0, s1), above(s2, Infinity)];
    case "bandstop":
      return [below(0, p1), below(p2, s.passbandTopHz ?? Infinity), above(s1, s2)];
  }
}
