import type { FilterSpec } from "../../src/index.ts";

/**
 * The anti-alias lowpass ahead of a converter sampling at 52 kHz (our own
 * scenario): flat to 18 kHz within 0.25 dB, 33 dB down from 26 kHz, a 7th-order
 * Chebyshev I on 1 % resistors and 2 % capacitors. Its biquad cascade's boards
 * mostly miss the mask, its active ladders' mostly meet it
 * (test/analysis/ladder-yield.test.ts); the yield target is set at 50 %.
 */
export const SHARP_LOWPASS: FilterSpec = {
  response: "lowpass",
  passband: { edgeHz: 18_000, maxLossDb: 0.25 },
  stopband: { edgeHz: 26_000, minAttenuationDb: 33 },
  family: "chebyshev1",
  order: 7,
  parts: { resistorSeries: "E96", capacitorSeries: "E12", resistorTolerance: 0.01, capacitorTolerance: 0.02 },
  yieldTarget: 0.5,
};
