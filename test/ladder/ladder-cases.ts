/**
 * The family settings the ladder tests run at every order 2-12: a few
 * ripple and attenuation values per family (realisable as ladders of
 * positive elements at every order 2-12; Chebyshev II at low attenuation and
 * high odd order is not, see the refusal tests).
 */
import type { LadderPrototypeSpec } from "../../src/ladder/index.ts";

export type FamilySettings = Omit<LadderPrototypeSpec, "order" | "form" | "sourceOhms" | "loadOhms">;

export const FAMILY_SETTINGS: readonly FamilySettings[] = [
  { family: "butterworth" },
  { family: "butterworth", method: "synthesis" },
  { family: "chebyshev1", rippleDb: 0.01 },
  { family: "chebyshev1", rippleDb: 0.5 },
  { family: "chebyshev1", rippleDb: 3 },
  { family: "chebyshev1", rippleDb: 0.01, method: "synthesis" },
  { family: "chebyshev1", rippleDb: 0.5, method: "synthesis" },
  { family: "chebyshev1", rippleDb: 3, method: "synthesis" },
  { family: "bessel" },
  { family: "bessel", normalization: "delay" },
  { family: "bessel", normalization: "magnitude" },
  { family: "legendre" },
  { family: "chebyshev2", attenuationDb: 80 },
  { family: "chebyshev2", attenuationDb: 120 },
  { family: "elliptic", rippleDb: 0.1, attenuationDb: 40 },
  { family: "elliptic", rippleDb: 0.5, attenuationDb: 60 },
  { family: "elliptic", rippleDb: 1, attenuationDb: 80 },
  { family: "elliptic", rippleDb: 3, attenuationDb: 100 },
];

export const ORDERS: readonly number[] = [2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];

export function label(s: FamilySettings): string {
  const parts: string[] = [s.family];
  if (s.rippleDb !== undefined) parts.push(`${s.rippleDb} dB ripple`);
  if (s.attenuationDb !== undefined) parts.push(`${s.attenuationDb} dB attenuation`);
  if (s.normalization !== undefined) parts.push(s.normalization);
  if (s.method !== undefined) parts.push(s.method);
  return parts.join(", ");
}
