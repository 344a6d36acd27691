/**
 * A whole circuit as one stage: its transfer function as real polynomials
 * (so its poles, for stability), and its Monte Carlo board stage, for
 * circuits that are not a cascade of topologies (an active ladder, whose
 * sections are not separate).
 *
 * Method: the generic path of ./stage-polynomials.ts on the circuit's own
 * nodal equations (`H = N / D`, `D = det(G + s C)`, sampled on circles and
 * recovered by the inverse DFT); every resistor and capacitor is a part of
 * the board, drawn within its tolerance by ./boards.ts.
 *
 * Accuracy: as the generic path, a few ulps of the largest scaled
 * coefficient per coefficient; against the circuit's nodal analysis, over
 * three decades either side of the edge of the active ladders (orders 5 and
 * 7, up to 17 poles), below 1e-9 dB with ideal op-amps and 1e-7 dB with
 * single-pole ones, whose own poles form a tight cluster near GBW / 2
 * (test/evaluate/circuit-boards.test.ts).
 *
 * @module
 */
import type { Circuit } from "../circuit/types.ts";
import type { BoardStage } from "./boards.ts";
import { compileElements, genericStagePolynomialsInto, type CompiledStage } from "./stage-polynomials.ts";
import type { ScaledRational } from "./types.ts";

/** Options of {@link compileCircuit}. */
export interface CircuitCompileOptions {
  /** The driving voltage source. */
  readonly source: string;
  /** The output node. */
  readonly output: string;
  /** Angular frequencies (rad/s) where the result will be evaluated: the sample circles cover them. */
  readonly spanRadS: readonly [number, number];
}

/**
 * Compile a whole circuit as one stage (the generic path; no closed form).
 * No checks: the circuit is valid and names its source and output.
 *
 * @param circuit - a valid circuit
 * @param componentNames - the elements (by name) whose values a board's values replace, in board order
 * @param options - driving source, output node, where the result will be evaluated
 * @returns the compiled circuit
 */
export function compileCircuit(circuit: Circuit, componentNames: readonly string[], options: CircuitCompileOptions): CompiledStage {
  let bandwidthRadS = 0;
  for (const e of circuit.elements) if (e.kind === "OA" && e.model.kind !== "ideal") bandwidthRadS = Math.max(bandwidthRadS, 2 * Math.PI * e.model.gbwHz);
  return compileElements(circuit, componentNames, { ...options, bandwidthRadS, closedForm: null });
}

/**
 * How far beyond the highest sample circle a root may lie and still be told
 * from the transform's rounding noise (common practice, no source).
 */
export const RESOLVED_BEYOND_TOP = 1e3;

/**
 * Zero the leading coefficients (of both polynomials) whose root lies more
 * than {@link RESOLVED_BEYOND_TOP} times beyond the highest circle sampled:
 * a whole circuit's degree bound exceeds its degree by many powers, and the
 * spare powers' noise can then stand above the noise test of the generic
 * path (a root at 1e20 rad/s for a ladder whose circles end at 1e8).
 */
function dropUnresolved(cs: CompiledStage, radius: number, num: Float64Array, den: Float64Array): void {
  const top = Math.max(4 * cs.bandwidthRadS, cs.spanRadS[1], 10 * radius) / radius;
  for (let i = 0; i < den.length - 1; i++) {
    const a = den[i] as number;
    if (a === 0) continue;
    if (Math.abs((den[i + 1] as number) / a) <= RESOLVED_BEYOND_TOP * top) return;
    den[i] = 0;
    num[i] = 0;
  }
}

/** The resistors and capacitors of a circuit, by name, in circuit order. */
export function circuitParts(circuit: Circuit): string[] {
  return circuit.elements.filter((e) => e.kind === "R" || e.kind === "C").map((e) => e.name);
}

/** The nominal value of each named part. */
function nominalValues(circuit: Circuit, names: readonly string[]): Float64Array {
  const byName = new Map(circuit.elements.map((e) => [e.name, e]));
  return Float64Array.from(names, (n) => {
    const e = byName.get(n);
    return e !== undefined && (e.kind === "R" || e.kind === "C" || e.kind === "L") ? e.value : NaN;
  });
}

/**
 * A circuit's transfer function from `source` to `output` as polynomials in
 * `z = s / radiusRadS`, with its nominal values, leading coefficients whose
 * roots lie beyond every circle's reach dropped (internal: no checks).
 *
 * @param circuit - a valid circuit
 * @param options - source, output and span (see {@link compileCircuit})
 * @param radiusRadS - the scale, about the circuit's natural frequencies
 * @returns numerator and denominator (leading zeros trimmed), or null when the equations are singular
 */
export function circuitPolynomials(circuit: Circuit, options: CircuitCompileOptions, radiusRadS: number): ScaledRational | null {
  const names = circuitParts(circuit);
  const cs = compileCircuit(circuit, names, options);
  const num = new Float64Array(cs.points);
  const den = new Float64Array(cs.points);
  const r = genericStagePolynomialsInto(cs, nominalValues(circuit, names), radiusRadS, num, den);
  if (r === 0) return null;
  dropUnresolved(cs, r, num, den);
  const trim = (a: Float64Array): Float64Array => {
    let i = 0;
    while (i < a.length - 1 && a[i] === 0) i++;
    return a.slice(i);
  };
  return { num: trim(num), den: trim(den), scale: r };
}

/** Options of {@link circuitBoardStage}. */
export interface CircuitBoardOptions extends CircuitCompileOptions {
  /** Tolerance of every resistor, as a fraction. */
  readonly resistorTolerance: number;
  /** Tolerance of every capacitor, as a fraction. */
  readonly capacitorTolerance: number;
  /** The scale of the polynomials, rad/s, about the circuit's natural frequencies. */
  readonly radiusRadS: number;
  /**
   * Tolerance of every inductor, as a fraction. Given, the inductors are
   * parts of the board too, after the resistors and capacitors (a passive
   * LC ladder); absent, they keep their values (and a circuit's board is
   * the same, bit for bit, as before inductors could be drawn).
   */
  readonly inductorTolerance?: number;
  /** Parts (by name) held at their nominal value: a ladder's terminations and loss resistances. */
  readonly heldParts?: readonly string[];
}

/**
 * A whole circuit as the one stage of a Monte Carlo board: every resistor
 * and capacitor a part, drawn within its tolerance, and with
 * `inductorTolerance` every inductor after them; `heldParts` at tolerance 0
 * (internal: no checks).
 *
 * @param circuit - a valid circuit
 * @param options - source, output, span, tolerances, scale
 * @returns the board stage, for `runBoards`
 */
export function circuitBoardStage(circuit: Circuit, options: CircuitBoardOptions): BoardStage {
  const lt = options.inductorTolerance;
  const names = lt === undefined ? circuitParts(circuit) : [...circuitParts(circuit), ...circuit.elements.filter((e) => e.kind === "L").map((e) => e.name)];
  const kinds = new Map(circuit.elements.map((e) => [e.name, e.kind]));
  const held = new Set(options.heldParts ?? []);
  const toleranceOf = (n: string): number => {
    if (held.has(n)) return 0;
    const k = kinds.get(n);
    return k === "R" ? options.resistorTolerance : k === "C" ? options.capacitorTolerance : (lt as number);
  };
  const tolerance = Float64Array.from(names, toleranceOf);
  const { source, output, spanRadS } = options;
  const passive = circuit.elements.every((e) => e.kind === "R" || e.kind === "L" || e.kind === "C" || e.kind === "V");
  return {
    compiled: compileCircuit(circuit, names, { source, output, spanRadS }),
    nominal: nominalValues(circuit, names),
    tolerance,
    radius: options.radiusRadS,
    ...(passive ? { passive: true as const } : {}),
  };
}
