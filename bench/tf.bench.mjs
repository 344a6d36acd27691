// Frequency response and magnitude in dB of an 8th-order Chebyshev type I
// lowpass (0.5 dB ripple, cut-off 2*pi*20 kHz) at 10,000 log-spaced points
// from 10 Hz to 10 MHz, in zpk form and as a section cascade. The poles are
// built inline from the closed-form Chebyshev pole formula (sinh/cosh of
// asinh(1/eps)/n), so our code and scipy evaluate exactly the same filter.
// The python reference is scipy.signal.freqs_zpk on the same zeros/poles/gain
// and grid (followed by 20*log10(abs(h)) for the magnitude rows).
import { frequencyResponse, logGrid, magnitudeDb, toSections, zpk } from "../dist/tf/index.js";

const N = 8;
const RIPPLE_DB = 0.5;
const WC = 2 * Math.PI * 20e3;
const eps = Math.sqrt(10 ** (RIPPLE_DB / 10) - 1);
const mu = Math.asinh(1 / eps) / N;
const poles = [];
for (let k = 1; k <= N; k++) {
  const th = (Math.PI * (2 * k - 1)) / (2 * N);
  poles.push({ re: -WC * Math.sinh(mu) * Math.sin(th), im: WC * Math.cosh(mu) * Math.cos(th) });
}
// exact conjugate pairs (cos of mirrored angles)
for (let k = 0; k < N / 2; k++) poles[N - 1 - k] = { re: poles[k].re, im: -poles[k].im };
// even order: DC gain 1/sqrt(1 + eps^2); gain = prod(-p) / sqrt(1 + eps^2)
let g = 1;
for (const p of poles) g *= Math.hypot(p.re, p.im);
const system = zpk([], poles, g / Math.sqrt(1 + eps * eps));
const cascade = toSections(system);
const w = logGrid(2 * Math.PI * 10, 2 * Math.PI * 10e6, 10_000);

const pySetup = `
import numpy as np
from scipy import signal
N = ${N}; rp = ${RIPPLE_DB}; wc = 2 * np.pi * 20e3
z, p, k = signal.cheb1ap(N, rp)
z, p, k = signal.lp2lp_zpk(z, p, k, wo=wc)
w = np.logspace(np.log10(2 * np.pi * 10), np.log10(2 * np.pi * 10e6), 10000)
`;

const pyResponse = `${pySetup}
def run():
    signal.freqs_zpk(z, p, k, worN=w)
`;
const pyMagnitudeDb = `${pySetup}
def run():
    _, h = signal.freqs_zpk(z, p, k, worN=w)
    20 * np.log10(abs(h))
`;

export const benchmarks = [
  {
    name: "frequencyResponse: 8th-order Chebyshev I lowpass (zpk), 10,000 log-spaced points",
    fn: () => frequencyResponse(system, w),
    referenceName: "scipy.signal.freqs_zpk",
    python: pyResponse,
  },
  {
    name: "frequencyResponse: same filter as a 4-section cascade, 10,000 points",
    fn: () => frequencyResponse(cascade, w),
    referenceName: "scipy.signal.freqs_zpk",
    python: pyResponse,
  },
  {
    name: "magnitudeDb: same filter (zpk), 10,000 points",
    fn: () => magnitudeDb(system, w),
    referenceName: "scipy freqs_zpk + 20 log10|h|",
    python: pyMagnitudeDb,
  },
  {
    name: "magnitudeDb: same filter as a 4-section cascade, 10,000 points",
    fn: () => magnitudeDb(cascade, w),
    referenceName: "scipy freqs_zpk + 20 log10|h|",
    python: pyMagnitudeDb,
  },
];
