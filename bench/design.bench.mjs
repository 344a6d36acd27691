// The whole design pipeline for an 8th-order lowpass: family sizing, prototype,
// placement in the slack, sections, gain distribution, topology choice,
// preferred values with joint re-tuning, and the as-built check against the
// mask (dense mask grids plus the 256-point response curve stored in the result).
// No python reference: scipy has no part-level design, so a ratio against its
// order/prototype/sos steps alone would compare different work.
import { designFilter, designLcLadder } from "../dist/design/index.js";

const spec = {
  response: "lowpass",
  passband: { edgeHz: 10000, maxLossDb: 0.5 },
  stopband: { edgeHz: 19000, minAttenuationDb: 70 },
  family: "chebyshev1",
  order: 8,
};

// A 9th-order elliptic bandstop, 45/48/62/70 Hz: nine notch stages of nine or
// ten resistors each (state-variable and Tow-Thomas), the component search's
// heaviest case. 60 dB makes order 9 the minimum order (at 40 dB the minimum is
// 5, and a forced order 9 misses the mask, which times the recovery instead).
const bandstop9 = {
  response: "bandstop",
  passband: { edgeHz: [45, 70], maxLossDb: 0.5 },
  stopband: { edgeHz: [48, 62], minAttenuationDb: 60 },
  family: "elliptic",
  order: 9,
};

// A 10 kHz bandstop on a single-pole op-amp of 1 MHz GBW (a0 1e5): every stage
// is pre-distorted and its finalists re-scored by their pole with the op-amp.
const bandstop10k = {
  response: "bandstop",
  passband: { edgeHz: [8000, 12500], maxLossDb: 0.5 },
  stopband: { edgeHz: [9500, 10500], minAttenuationDb: 40 },
  opamp: { a0: 1e5, gbwHz: 1e6 },
};

// The yield-targeted pipeline: an 8th-order Butterworth lowpass for a 1 kHz
// data-logger channel whose boards reach the 95 % target after the parts'
// classes are tightened (nominal design, the first-order tolerance screen,
// the Monte Carlo confirmations and the per-part allocation).
const yieldLowpass = {
  response: "lowpass",
  passband: { edgeHz: 1000, maxLossDb: 1 },
  stopband: { edgeHz: 2500, minAttenuationDb: 55 },
  family: "butterworth",
};

// Passive LC ladders from a spec (designLcLadder): the candidate ladders at
// 11 placements each, the nominal check and 1000 seeded boards with every
// inductor and capacitor drawn. A 30 MHz anti-alias lowpass ahead of an ADC
// and a wideband 10.7 MHz IF bandpass, 50 ohm, E24 parts of 2 % and 1 %.
const lcLowpass = {
  response: "lowpass",
  passband: { edgeHz: 30e6, maxLossDb: 1 },
  stopband: { edgeHz: 60e6, minAttenuationDb: 45 },
  parts: { capacitorSeries: "E24" },
};
const lcBandpass = {
  response: "bandpass",
  passband: { edgeHz: [9.8e6, 11.7e6], maxLossDb: 1.5 },
  stopband: { edgeHz: [7.5e6, 15e6], minAttenuationDb: 40 },
  parts: { capacitorSeries: "E24" },
};
const lcParts = { inductorSeries: "E24", inductorTolerance: 0.02, capacitorTolerance: 0.01, inductorQ: 100, seed: 11, boards: 1000 };

// The spec's realisation compared inside the design: a sharp 7th-order
// Chebyshev I anti-alias lowpass on 1 % resistors and 2 % capacitors, its
// cascade alone and with realisation "auto" (the leapfrog and FDNR ladders
// built, pre-distortion-free with ideal op-amps, re-tuned after rounding, and
// every realisation on the spec's 2048 seeded boards).
const sharp = {
  response: "lowpass",
  passband: { edgeHz: 18000, maxLossDb: 0.25 },
  stopband: { edgeHz: 26000, minAttenuationDb: 33 },
  family: "chebyshev1",
  order: 7,
  parts: { resistorTolerance: 0.01, capacitorTolerance: 0.02 },
  yieldTarget: 0.5,
};

export const benchmarks = [
  {
    name: "designFilter: sharp 7th-order Chebyshev I lowpass, the cascade alone (realisation cascade)",
    fn: () => designFilter(sharp),
    note: "no scipy equivalent; the baseline of the next row",
  },
  {
    name: "designFilter: the same lowpass with realisation auto (cascade, leapfrog and FDNR, each on boards until its interval decides, at most 2048)",
    fn: () => designFilter({ ...sharp, realisation: "auto" }),
    note: "no scipy equivalent; the comparison of realisations inside the design",
  },
  {
    name: "designFilter with the yield target: 8th-order Butterworth lowpass, boards confirmed at 95 %",
    fn: () => designFilter(yieldLowpass),
    note: "no scipy equivalent; the boards' yield by seeded Monte Carlo inside the design",
  },
  {
    name: "designFilter: 8th-order Chebyshev I lowpass, full pipeline incl. verification (256-point curve)",
    fn: () => designFilter(spec),
    note: "no scipy equivalent (scipy stops at the transfer function)",
  },
  {
    name: "designFilter: 9th-order elliptic bandstop 45/48/62/70 Hz (60 dB), nine 9-10-resistor notch stages",
    fn: () => designFilter(bandstop9),
    note: "no scipy equivalent; the component search's heaviest stages",
  },
  {
    name: "designFilter: 10 kHz bandstop, single-pole op-amp (GBW 1 MHz, a0 1e5)",
    fn: () => designFilter(bandstop10k),
    note: "no scipy equivalent; pre-distorted stages, finalists re-scored with the op-amp",
  },
  {
    name: "designLcLadder: 30 MHz anti-alias LC lowpass, 5 candidates x 11 placements, 1000 boards",
    fn: () => designLcLadder(lcLowpass, lcParts),
    note: "no scipy equivalent; passive ladder chosen, built from E24 parts and its boards run",
  },
  {
    name: "designLcLadder: 10.7 MHz IF LC bandpass, 10 candidates x 11 placements, 1000 boards",
    fn: () => designLcLadder(lcBandpass, lcParts),
    note: "no scipy equivalent; the order-up round when no minimum-order ladder meets the mask",
  },
];
