/**
 * Output noise of a circuit by the adjoint network: the noise density at one
 * node from the thermal noise of every resistor and the input noise of every
 * op-amp, each source's power density, and their integral over a log grid.
 *
 * Method: nodal noise analysis with the adjoint (transposed) network
 * (J. Vlach & K. Singhal, "Computer Methods for Circuit Analysis and Design",
 * 2nd ed., Van Nostrand Reinhold, 1994, chapter on noise analysis, from
 * memory). The circuit is assembled as the modified nodal equations
 * `A(s) x = b` (mna.ts) and `A^T y = e_out` solved once per frequency, which
 * gives the transfer from every possible excitation to the output at once: a
 * current `i` injected into node `j` reaches the output as `y_j i`, and a
 * voltage `e` added to an op-amp's non-inverting input enters that op-amp's
 * constraint row, reaching the output as `y_k e`.
 *
 * Sources, all uncorrelated (powers add): each resistor R, a current of
 * density `sqrt(4 k T / R)` across it (H. Nyquist, "Thermal agitation of
 * electric charge in conductors", Phys. Rev. 32:110-113, 1928, eq. 7;
 * k = 1.380649e-23 J/K, exact since the 2019 SI); each op-amp, the input
 * voltage noise `en` in series with its non-inverting input and the current
 * noise `in` from each input to ground, all white.
 *
 * Accuracy: the densities are exact for the linear model up to the rounding
 * of a backward-stable dense LU solve (relative error near 1e-13 for these
 * small, well-scaled systems); {@link integrateLogGrid} is the trapezoidal
 * rule in ln f, O(h^2) in the grid step (below 1e-3 for 200 points over a few
 * decades unless a pole's Q is above about 20).
 *
 * @module
 */
import { SingularCircuitError } from "../errors.ts";
import type { ComplexResponse } from "../tf/response.ts";
import { assembleMna, checkStructure, solveMna } from "./mna.ts";
import type { Circuit } from "./types.ts";

/** Boltzmann's constant in J/K (exact since the 2019 SI redefinition). */
export const BOLTZMANN_J_PER_K = 1.380649e-23;

/** What {@link circuitNoise} computes the noise of. */
export interface CircuitNoiseOptions {
  /** The output node. */
  readonly output: string;
  /** Analysis frequencies, Hz (ascending, log-spaced for {@link integrateLogGrid}). */
  readonly freqHz: Float64Array;
  /** Absolute temperature of the resistors, kelvin. */
  readonly temperatureK: number;
  /** Input voltage noise density of every op-amp, V/sqrt(Hz) (0: left out). */
  readonly opampVoltageNoise: number;
  /** Input current noise density of every op-amp at each input, A/sqrt(Hz) (0: left out). */
  readonly opampCurrentNoise: number;
}

/** The noise of a circuit at its output: each source's power density and the total, (V^2/Hz) per frequency. */
export interface CircuitNoise {
  /** Source names: resistor designators and op-amp sources (`"U2.en"`, `"U2.in+"`, `"U2.in-"`). */
  readonly names: readonly string[];
  /** Each source's output power density, by the order of `names`. */
  readonly power: readonly Float64Array[];
  /** The total output power density. */
  readonly total: Float64Array;
}

interface Source {
  readonly name: string;
  /** Density of the excitation (A or V per sqrt(Hz)). */
  readonly density: number;
  /** Unknown indices excited with +1 and -1 (-1 index = ground, skipped). */
  readonly plus: number;
  readonly minus: number;
}

/**
 * The output noise of a circuit (internal: the caller checks the options).
 *
 * @param fn - the public function, for errors
 * @param circuit - the circuit
 * @param options - output node, frequencies, temperature, op-amp noise densities
 * @returns each source's power density and the total
 * @throws {@link SingularCircuitError} when the nodal equations are singular at a frequency (path `result`)
 */
export function circuitNoise(fn: string, circuit: Circuit, options: CircuitNoiseOptions): CircuitNoise {
  const { freqHz } = options;
  const m = freqHz.length;
  checkStructure(fn, circuit, false);
  const sys = assembleMna(circuit);
  const { n } = sys;
  const idx = (node: string): number => (node === "0" ? -1 : (sys.nodeIndex.get(node) ?? -1));
  const kT4 = 4 * BOLTZMANN_J_PER_K * options.temperatureK;
  const en = options.opampVoltageNoise;
  const inoise = options.opampCurrentNoise;
  const sources: Source[] = [];
  for (const e of circuit.elements) {
    if (e.kind === "R") {
      sources.push({ name: e.name, density: Math.sqrt(kT4 / e.value), plus: idx(e.a), minus: idx(e.b) });
    } else if (e.kind === "OA") {
      // The op-amp's constraint row is the row of its branch-current unknown.
      if (en > 0) sources.push({ name: `${e.name}.en`, density: en, plus: sys.unknowns.indexOf(`i(${e.name})`), minus: -1 });
      if (inoise > 0) {
        if (e.inP !== "0") sources.push({ name: `${e.name}.in+`, density: inoise, plus: idx(e.inP), minus: -1 });
        if (e.inN !== "0") sources.push({ name: `${e.name}.in-`, density: inoise, plus: idx(e.inN), minus: -1 });
      }
    }
  }
  const power = sources.map(() => new Float64Array(m));
  const total = new Float64Array(m);
  // One solve of the transposed system A^T y = e_out per frequency gives every source's transfer.
  const all = Array.from({ length: n }, (_, j) => j);
  const y = solveMna(fn, sys, {
    sourceRow: idx(options.output),
    outputs: all,
    freqHz,
    transpose: true,
    singular: (bad, fHz) => {
      const culprit = sys.unknowns[bad] ?? "?";
      return new SingularCircuitError(
        {
          fn,
          path: "result",
          received: fHz,
          message: `the design's circuit has singular nodal equations at ${fHz} Hz (unknown ${culprit}), so its noise is undefined`,
        },
        [culprit.slice(2, -1)],
      );
    },
  });
  for (let f = 0; f < m; f++) {
    let sum = 0;
    sources.forEach((s, k) => {
      const plus = s.plus >= 0 ? (y[s.plus] as ComplexResponse) : null;
      let tr = plus === null ? 0 : (plus.re[f] as number);
      let ti = plus === null ? 0 : (plus.im[f] as number);
      if (s.minus >= 0) {
        const minus = y[s.minus] as ComplexResponse;
        tr -= minus.re[f] as number;
        ti -= minus.im[f] as number;
      }
      const p = (tr * tr + ti * ti) * s.density * s.density;
      (power[k] as Float64Array)[f] = p;
      sum += p;
    });
    total[f] = sum;
  }
  return { names: sources.map((s) => s.name), power, total };
}

/**
 * `m` log-spaced frequencies from `lo` to `hi`, Hz (the last exactly `hi`).
 *
 * @param lo - lowest frequency, Hz
 * @param hi - highest frequency, Hz
 * @param m - number of points (at least 2)
 * @returns the grid
 */
export function logGridHz(lo: number, hi: number, m: number): Float64Array {
  const freqHz = new Float64Array(m);
  const step = Math.log(hi / lo) / (m - 1);
  for (let i = 0; i < m; i++) freqHz[i] = i === m - 1 ? hi : lo * Math.exp(step * i);
  return freqHz;
}

/**
 * The integral of a power density over a log-spaced grid, by the trapezoidal
 * rule in ln f (`int S df = int S f d(ln f)`).
 *
 * @param p - power density at each frequency
 * @param freqHz - the log-spaced grid ({@link logGridHz})
 * @returns the power over the grid's band
 */
export function integrateLogGrid(p: Float64Array, freqHz: Float64Array): number {
  const m = freqHz.length;
  const step = Math.log((freqHz[m - 1] as number) / (freqHz[0] as number)) / (m - 1);
  let acc = 0;
  for (let i = 1; i < m; i++) acc += 0.5 * step * ((p[i - 1] as number) * (freqHz[i - 1] as number) + (p[i] as number) * (freqHz[i] as number));
  return acc;
}
