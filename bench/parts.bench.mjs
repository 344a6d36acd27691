// Preferred-value snapping throughput: one call snaps one million values to E96.
// The python reference does the same with numpy, vectorised: np.searchsorted on
// log10 mantissas against the log-midpoints of the series (E96 equals the
// rounded geometric formula, so numpy builds the table from it).
import { bestCombination, snapValues } from "../dist/parts/index.js";

const N = 1_000_000;

/** Deterministic log-uniform values over 1e-12 .. 1e6 (xorshift32). */
function randomValues(n, seed) {
  const out = new Float64Array(n);
  let s = seed >>> 0;
  for (let i = 0; i < n; i++) {
    s ^= s << 13;
    s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5;
    s >>>= 0;
    out[i] = 10 ** (-12 + (18 * s) / 4294967296);
  }
  return out;
}

const values = randomValues(N, 60063);

export const benchmarks = [
  {
    name: "snapValues: 1,000,000 log-uniform values (1e-12..1e6) to E96, nearest",
    fn: () => snapValues(values, { series: "E96" }),
    referenceName: "numpy searchsorted",
    python: `
import numpy as np
rng = np.random.default_rng(60063)
x = 10.0 ** rng.uniform(-12, 6, ${N})
m = np.round(10.0 ** (np.arange(96) / 96), 2)
m_ext = np.append(m, 10.0)
mid = (np.log10(m_ext[:-1]) + np.log10(m_ext[1:])) / 2
def run():
    l = np.log10(x)
    e = np.floor(l)
    idx = np.searchsorted(mid, l - e)
    return m_ext[idx] * 10.0 ** e
`,
  },
  {
    name: "bestCombination: 12.74 k from two E96 parts (series or parallel)",
    fn: () => bestCombination(12_740, { series: "E96" }),
  },
];
