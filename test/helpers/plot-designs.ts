/**
 * Three designs of our own for the plot tests: a lowpass with a finite
 * stopband zero (an elliptic or inverse-Chebyshev notch in the stopband), a
 * bandstop with a deep notch on a real op-amp (so its depth is finite), and
 * a bandpass with signal levels (so the op-amp plot shows volts).
 */
import { designFilter, type DesignResult, type FilterSpec } from "../../src/design/index.ts";

export const PLOT_SPECS: Readonly<Record<"lowpass" | "bandstop" | "bandpass", FilterSpec>> = {
  lowpass: { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } },
  bandstop: {
    response: "bandstop",
    passband: { edgeHz: ["800", "1.25k"], maxLossDb: 1 },
    stopband: { edgeHz: ["950", "1.05k"], minAttenuationDb: 30 },
    opamp: { a0: 2e5, gbwHz: "1M" },
  },
  bandpass: {
    response: "bandpass",
    passband: { edgeHz: ["9k", "11k"], maxLossDb: 1 },
    stopband: { edgeHz: ["5k", "20k"], minAttenuationDb: 30 },
    levels: { inputPeakV: 1, outputSwingV: 10 },
  },
};

const cache = new Map<string, DesignResult>();

/** The design of one of {@link PLOT_SPECS}, made once per test file. */
export function plotDesign(name: keyof typeof PLOT_SPECS): DesignResult {
  let r = cache.get(name);
  if (r === undefined) {
    r = designFilter(PLOT_SPECS[name]);
    cache.set(name, r);
  }
  return r;
}
