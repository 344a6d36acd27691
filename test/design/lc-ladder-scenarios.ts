/**
 * Scenarios of our own for the passive LC ladder tests: a 50 ohm anti-alias
 * lowpass ahead of a fast ADC and a wideband 10.7 MHz IF bandpass, with the
 * tight parts both are built from.
 */
import type { FilterSpec } from "../../src/design/spec.ts";

/** Ahead of a 125 MS/s ADC: pass 30 MHz within 1 dB, 45 dB down from 60 MHz (the first alias band). */
export const ADC_SPEC: FilterSpec = {
  response: "lowpass",
  passband: { edgeHz: 30e6, maxLossDb: 1 },
  stopband: { edgeHz: 60e6, minAttenuationDb: 45 },
  parts: { capacitorSeries: "E24" },
};

/** A wideband 10.7 MHz IF stage: 9.8-11.7 MHz within 1.5 dB, 40 dB down below 7.5 MHz and above 15 MHz. */
export const IF_SPEC: FilterSpec = {
  response: "bandpass",
  passband: { edgeHz: [9.8e6, 11.7e6], maxLossDb: 1.5 },
  stopband: { edgeHz: [7.5e6, 15e6], minAttenuationDb: 40 },
  parts: { capacitorSeries: "E24" },
};

/** Tight parts: E24 inductors of 2 % and Q 80, 1 % capacitors; 512 seeded boards. */
export const TIGHT = { inductorSeries: "E24", inductorTolerance: 0.02, capacitorTolerance: 0.01, inductorQ: 80, seed: 11, boards: 512 } as const;
