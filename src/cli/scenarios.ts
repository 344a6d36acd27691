/**
 * Example scenarios for `filterwright demo` (our own invented situations; the
 * same specs are in `examples/*.json`).
 *
 * @module
 */
import type { FilterSpec } from "../design/index.ts";

/** A demo scenario. */
export interface Scenario {
  /** One-line title. */
  readonly title: string;
  /** What the filter is for. */
  readonly story: string;
  /** The spec. */
  readonly spec: FilterSpec;
}

/** The demo scenarios by name; `vibration` is the default. */
export const SCENARIOS: Readonly<Record<string, Scenario>> = {
  vibration: {
    title: "anti-alias lowpass for a vibration sensor ahead of a 24-bit ADC sampling at 48 kS/s",
    story:
      "A piezo accelerometer on a pump bearing carries useful content up to 2 kHz. The ADC samples at 48 kS/s, so\n" +
      "everything from 24 kHz up must be at least 100 dB down, while the band up to 2 kHz may droop by at most 0.1 dB.\n" +
      "The stage also adds 6 dB of gain and must not invert (the phase of the bearing signal is compared with a tacho).",
    spec: {
      response: "lowpass",
      passband: { edgeHz: "2k", maxLossDb: 0.1 },
      stopband: { edgeHz: "24k", minAttenuationDb: 100 },
      gain: { db: 6, polarity: "non-inverting" },
      priority: "fewest-op-amps",
      parts: { capacitorSeries: "E12", resistorSeries: "E96" },
    },
  },
  hydrophone: {
    title: "bandpass for a hydrophone listening to 10-40 kHz echo-sounder pings",
    story:
      "A hydrophone preamp feeds a detector for pings between 10 kHz and 40 kHz. Shipping noise below 2.5 kHz and\n" +
      "a 200 kHz sounder above 160 kHz must be 40 dB down; 20 dB of gain, a flat Butterworth passband.",
    spec: {
      response: "bandpass",
      passband: { edgeHz: ["10k", "40k"], maxLossDb: 0.5 },
      stopband: { edgeHz: ["2.5k", "160k"], minAttenuationDb: 40 },
      gain: { db: 20 },
      family: "butterworth",
    },
  },
  "hum-notch": {
    title: "50 Hz mains-hum notch for a bench strain-gauge amplifier",
    story:
      "A strain-gauge bridge on a test rig picks up 50 Hz hum. A bandstop removes 48-52 Hz by at least 30 dB while the\n" +
      "band below 35 Hz and above 70 Hz loses at most 1 dB.",
    spec: {
      response: "bandstop",
      passband: { edgeHz: [35, 70], maxLossDb: 1 },
      stopband: { edgeHz: [48, 52], minAttenuationDb: 30 },
      family: "chebyshev1",
    },
  },
};
