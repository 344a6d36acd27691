// Nodal analysis throughput: the AC response of a 4-stage cascade (an 8th-order
// Butterworth lowpass at 10 kHz from unity-gain Sallen-Key stages with
// single-pole op-amps, 18 unknowns) at 1000 log-spaced frequencies.
// The python reference solves the same G + j w C systems with numpy, batched:
// np.linalg.solve over a (1000, n, n) complex stack (LAPACK zgesv per matrix).
import { acAnalysis, assembleMna } from "../dist/circuit/index.js";
import { sallenKeyLowpassUnity, towThomasLowpassNotch } from "../dist/topologies/index.js";

const opamp = { kind: "single-pole", a0: 2e5, gbwHz: 10e6 };
const qs = [0.5097955791041592, 0.6013448869350453, 0.8999762231364156, 2.5629154477415055];
const elements = [{ kind: "V", name: "Vin", a: "in", b: "0", ac: 1 }];
qs.forEach((q, i) => {
  const v = sallenKeyLowpassUnity.design({ order: 2, kind: "lowpass", f0Hz: 10000, q, gain: 1 }, { capacitor: 4.7e-9 });
  elements.push(
    ...sallenKeyLowpassUnity.elements(v, {
      input: i === 0 ? "in" : `n${i}`,
      output: i === qs.length - 1 ? "out" : `n${i + 1}`,
      nodePrefix: `s${i}_`,
      rename: (n) => `${n}_${i}`,
      opamp,
    }),
  );
});
const circuit = { title: "8th-order Butterworth cascade", elements };
const freqHz = new Float64Array(1000);
for (let i = 0; i < freqHz.length; i++) freqHz[i] = 10 ** (2 + (4 * i) / (freqHz.length - 1));

const sys = assembleMna(circuit);
const outIndex = sys.nodeIndex.get("out");
const srcRow = sys.sourceRow.get("Vin");

const stageValues = sallenKeyLowpassUnity.design({ order: 2, kind: "lowpass", f0Hz: 10000, q: 2.5629154477415055, gain: 1 }, {});
const notchTarget = { order: 2, kind: "lowpass-notch", f0Hz: 10000, q: 8, fzHz: 14000, gain: -1 };

let demandCalls = 0;

export const benchmarks = [
  {
    name: "Topology.response (closed form, single-pole op-amp): one Sallen-Key stage, 1000 frequencies",
    fn: () => sallenKeyLowpassUnity.response(stageValues, freqHz, opamp),
    note: "no reference",
  },
  {
    // a new f0 on every call (the topology keeps the demands it has found per target, so a repeated target would time a look-up)
    name: "Topology.gbwDemandHz: Tow-Thomas lowpass-notch, a new target each call (bisection on GBW, Muller on the stage's characteristic polynomial)",
    fn: () => towThomasLowpassNotch.gbwDemandHz({ ...notchTarget, f0Hz: notchTarget.f0Hz * (1 + 1e-9 * ++demandCalls) }),
    note: "no reference",
  },
  {
    name: `acAnalysis: 4-stage Sallen-Key cascade (${sys.n} unknowns), 1000 frequencies`,
    fn: () => acAnalysis(circuit, { source: "Vin", outputs: ["out"], freqHz }),
    referenceName: "numpy batched solve",
    python: `
import numpy as np
n = ${sys.n}
G = np.array(${JSON.stringify(Array.from(sys.g))}).reshape(n, n)
C = np.array(${JSON.stringify(Array.from(sys.c))}).reshape(n, n)
w = 2*np.pi*np.logspace(2, 6, 1000)
b = np.zeros(n, dtype=complex); b[${srcRow}] = 1
B = np.broadcast_to(b, (1000, n))[..., None]
def run():
    A = G[None, :, :] + 1j * w[:, None, None] * C[None, :, :]
    x = np.linalg.solve(A, B)
    return x[:, ${outIndex}, 0]
`,
  },
];
