// A seeded corpus of random valid filter specs (our own generator, no outside
// source): every response, family, op-amp and series, with edges, losses and
// attenuations in the ranges engineers ask for. Used by the design snapshot
// (scripts/design-snapshot.mjs) and the corpus benchmark (bench/).
//
// The same seed always gives the same specs (the library's own Mulberry32
// generator, src/math/random.ts, from the built package: run `npm run build` first).
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const { mulberry32 } = await import(join(root, "dist", "math", "index.js"));

const RESPONSES = ["lowpass", "highpass", "bandpass", "bandstop"];
const FAMILIES = ["auto", "butterworth", "chebyshev1", "chebyshev2", "elliptic", "bessel", "legendre"];
const SERIES = ["E12", "E24", "E48", "E96"];
const CAP_SERIES = ["E6", "E12", "E24"];

/**
 * `n` random valid specs from `seed`. Each entry is `{ id, spec }`.
 * @param {number} seed
 * @param {number} n
 */
export function randomSpecs(seed, n) {
  const rnd = mulberry32(seed);
  const pick = (xs) => xs[Math.floor(rnd() * xs.length)];
  const logUniform = (lo, hi) => lo * Math.pow(hi / lo, rnd());
  const round3 = (x) => Number(x.toPrecision(3));
  const out = [];
  for (let i = 0; i < n; i++) {
    const response = pick(RESPONSES);
    const family = pick(FAMILIES);
    const maxLossDb = round3(pick([0.1, 0.25, 0.5, 1, 1, 2, 3]) * (family === "bessel" ? 3 : 1));
    const minAttenuationDb = Math.round(logUniform(20, family === "bessel" || family === "legendre" ? 50 : 90));
    const ratio = logUniform(family === "bessel" ? 4 : 1.4, family === "bessel" ? 12 : 6);
    const f = logUniform(5, 200_000);
    let passband;
    let stopband;
    if (response === "lowpass") {
      passband = { edgeHz: round3(f), maxLossDb };
      stopband = { edgeHz: round3(f * ratio), minAttenuationDb };
    } else if (response === "highpass") {
      passband = { edgeHz: round3(f * ratio), maxLossDb };
      stopband = { edgeHz: round3(f), minAttenuationDb };
    } else {
      const width = logUniform(0.1, 3); // passband (bandpass) or stopband (bandstop) width over centre
      const lo = f / Math.sqrt(1 + width);
      const hi = lo * (1 + width);
      const outer = [round3(lo / ratio), round3(hi * ratio)];
      const inner = [round3(lo), round3(hi)];
      if (response === "bandpass") {
        passband = { edgeHz: inner, maxLossDb };
        stopband = { edgeHz: outer, minAttenuationDb };
      } else {
        // a bandstop's stopband is the inner pair, its passband the outer pair
        passband = { edgeHz: outer, maxLossDb };
        stopband = { edgeHz: inner, minAttenuationDb };
      }
    }
    const spec = { response, passband, stopband };
    if (family !== "auto") spec.family = family;
    const g = rnd();
    if (g < 0.35) spec.gain = { db: round3(logUniform(1, 40)) };
    else if (g < 0.5) spec.gain = { vPerV: -round3(logUniform(1, 20)) };
    spec.parts = { resistorSeries: pick(SERIES), capacitorSeries: pick(CAP_SERIES) };
    const o = rnd();
    if (o < 0.4) {
      const top = Math.max(f * ratio, response === "highpass" ? f * ratio : f) * 1.5;
      spec.opamp = { a0: Math.round(logUniform(2e4, 2e6)), gbwHz: round3(Math.max(top * logUniform(30, 3000), 1e5)) };
    }
    out.push({ id: `random-${seed}-${i}`, spec });
  }
  return out;
}
