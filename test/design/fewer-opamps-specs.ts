/**
 * Notch, bandstop and wide-band specs of our own invention, used to count the
 * op-amps the library builds (test/design/fewer-opamps.test.ts) and to check
 * that every design built with fewer op-amps still meets its mask in ngspice
 * and its yield target.
 */
import type { FilterSpec } from "../../src/design/index.ts";

/** One spec with the scenario it stands for. */
export interface CountedSpec {
  readonly id: string;
  readonly scenario: string;
  readonly spec: FilterSpec;
}

export const fewerOpampSpecs: readonly CountedSpec[] = [
  { id: "hum50-narrow", scenario: "50 Hz mains hum out of a strain-gauge bridge amplifier", spec: { response: "bandstop", passband: { edgeHz: [40, 62], maxLossDb: 1 }, stopband: { edgeHz: [49, 51], minAttenuationDb: 30 } } },
  { id: "hum60-narrow", scenario: "60 Hz hum out of a seismometer channel", spec: { response: "bandstop", passband: { edgeHz: [48, 75], maxLossDb: 1 }, stopband: { edgeHz: [58.5, 61.5], minAttenuationDb: 35 } } },
  { id: "hum50-elliptic", scenario: "deep 50 Hz reject ahead of a 24-bit weigh-scale ADC", spec: { response: "bandstop", passband: { edgeHz: [42, 60], maxLossDb: 0.5 }, stopband: { edgeHz: [48, 52], minAttenuationDb: 40 }, family: "elliptic" } },
  { id: "tone400", scenario: "400 Hz aircraft-supply tone out of an intercom line", spec: { response: "bandstop", passband: { edgeHz: [300, 530], maxLossDb: 1, topHz: "20k" }, stopband: { edgeHz: [385, 415], minAttenuationDb: 30 } } },
  { id: "tone400-cheb2", scenario: "400 Hz tone, flat passband (inverse Chebyshev)", spec: { response: "bandstop", passband: { edgeHz: [280, 570], maxLossDb: 0.5, topHz: "20k" }, stopband: { edgeHz: [380, 420], minAttenuationDb: 35 }, family: "chebyshev2" } },
  { id: "pilot19k", scenario: "19 kHz stereo pilot out of a recording front end", spec: { response: "bandstop", passband: { edgeHz: ["15k", "24k"], maxLossDb: 1, topHz: "60k" }, stopband: { edgeHz: ["18.5k", "19.5k"], minAttenuationDb: 30 } } },
  { id: "ultra40k", scenario: "40 kHz transducer drive leaking into a receive channel", spec: { response: "bandstop", passband: { edgeHz: ["30k", "53k"], maxLossDb: 1, topHz: "200k" }, stopband: { edgeHz: ["39k", "41k"], minAttenuationDb: 25 } } },
  { id: "ecg-hum", scenario: "mains hum out of an ECG research front end (not for patient-connected use without the usual isolation)", spec: { response: "bandstop", passband: { edgeHz: [35, 70], maxLossDb: 1 }, stopband: { edgeHz: [48, 52], minAttenuationDb: 25 } } },
  { id: "pwm-carrier", scenario: "20 kHz PWM carrier out of a motor current sense", spec: { response: "bandstop", passband: { edgeHz: ["12k", "33k"], maxLossDb: 1, topHz: "100k" }, stopband: { edgeHz: ["19k", "21k"], minAttenuationDb: 30 }, family: "elliptic" } },
  { id: "cal-tone1k", scenario: "1 kHz calibration tone removed from a distortion analyser input", spec: { response: "bandstop", passband: { edgeHz: [700, 1430], maxLossDb: 0.5, topHz: "50k" }, stopband: { edgeHz: [960, 1040], minAttenuationDb: 40 }, family: "elliptic" } },
  { id: "wide-stop-vib", scenario: "a broad resonance band 200-800 Hz out of an accelerometer", spec: { response: "bandstop", passband: { edgeHz: [100, 1600], maxLossDb: 1, topHz: "10k" }, stopband: { edgeHz: [200, 800], minAttenuationDb: 30 } } },
  { id: "lp-elliptic-adc", scenario: "elliptic anti-alias lowpass ahead of a 48 kHz audio ADC", spec: { response: "lowpass", passband: { edgeHz: "20k", maxLossDb: 0.1 }, stopband: { edgeHz: "28k", minAttenuationDb: 60 }, family: "elliptic" } },
  { id: "lp-cheb2-sensor", scenario: "inverse-Chebyshev lowpass for a 1 kHz pressure sensor", spec: { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "2.5k", minAttenuationDb: 50 }, family: "chebyshev2" } },
  { id: "hp-elliptic-rumble", scenario: "elliptic rumble highpass for a turntable preamp", spec: { response: "highpass", passband: { edgeHz: 30, maxLossDb: 0.5, topHz: "20k" }, stopband: { edgeHz: 15, minAttenuationDb: 40 }, family: "elliptic" } },
  { id: "hp-cheb2-subsonic", scenario: "inverse-Chebyshev subsonic highpass for a PA amplifier", spec: { response: "highpass", passband: { edgeHz: 25, maxLossDb: 1, topHz: "20k" }, stopband: { edgeHz: 10, minAttenuationDb: 40 }, family: "chebyshev2" } },
  { id: "bp-eeg", scenario: "0.5-40 Hz EEG research band (not for patient-connected use without the usual isolation)", spec: { response: "bandpass", passband: { edgeHz: [0.5, 40], maxLossDb: 1 }, stopband: { edgeHz: [0.1, 200], minAttenuationDb: 25 }, gain: { db: 20 } } },
  { id: "bp-voice", scenario: "300-3400 Hz voice band for a radio intercom", spec: { response: "bandpass", passband: { edgeHz: [300, 3400], maxLossDb: 1 }, stopband: { edgeHz: [100, "10k"], minAttenuationDb: 30 } } },
  { id: "bp-audio", scenario: "20 Hz-20 kHz band limit for a measurement microphone preamp", spec: { response: "bandpass", passband: { edgeHz: [20, "20k"], maxLossDb: 0.5 }, stopband: { edgeHz: [5, "80k"], minAttenuationDb: 24 }, gain: { db: 10 } } },
  { id: "bp-ultrasonic", scenario: "20-100 kHz band for a partial-discharge acoustic sensor", spec: { response: "bandpass", passband: { edgeHz: ["20k", "100k"], maxLossDb: 1, }, stopband: { edgeHz: ["5k", "400k"], minAttenuationDb: 30 }, opamp: { a0: 2e5, gbwHz: "50M" } } },
  { id: "bp-pulse", scenario: "0.3-8 Hz photoplethysmograph band", spec: { response: "bandpass", passband: { edgeHz: [0.3, 8], maxLossDb: 1 }, stopband: { edgeHz: [0.05, 40], minAttenuationDb: 30 }, gain: { db: 26 } } },
  { id: "bp-elliptic-wide", scenario: "elliptic 1-10 kHz band for an ultrasonic leak detector's envelope channel", spec: { response: "bandpass", passband: { edgeHz: ["1k", "10k"], maxLossDb: 0.5 }, stopband: { edgeHz: [500, "20k"], minAttenuationDb: 40 }, family: "elliptic" } },
  { id: "bp-gyro", scenario: "narrow 2 kHz band around a vibrating gyroscope's drive", spec: { response: "bandpass", passband: { edgeHz: [1900, 2100], maxLossDb: 1 }, stopband: { edgeHz: [1500, 2700], minAttenuationDb: 30 } } },
  { id: "bs-cheb2-interferer", scenario: "inverse-Chebyshev reject of a 5 kHz interferer in a sonar receiver", spec: { response: "bandstop", passband: { edgeHz: ["3.5k", "7k"], maxLossDb: 0.5, topHz: "40k" }, stopband: { edgeHz: ["4.7k", "5.3k"], minAttenuationDb: 35 }, family: "chebyshev2" } },
  { id: "hum-real-opamp", scenario: "60 Hz reject with a micropower op-amp", spec: { response: "bandstop", passband: { edgeHz: [45, 80], maxLossDb: 1 }, stopband: { edgeHz: [58, 62], minAttenuationDb: 30 }, opamp: { a0: 1e5, gbwHz: "100k" } } },
];
