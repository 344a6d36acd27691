/** Shared loaders for the prototype fixtures written by scripts/reference/approx_prototypes.py. */
import { complexList, loadFixture } from "../helpers/fixtures.ts";
import type { Complex } from "../../src/math/complex.ts";
import { sortComplex } from "../helpers/tolerance.ts";

/** One prototype as stored in the fixtures. */
export interface PrototypeCase {
  readonly family: string;
  readonly order: number;
  readonly rippleDb?: number;
  readonly attenuationDb?: number;
  readonly normalization?: "delay" | "magnitude" | "phase";
  readonly zeros: [number, number][];
  readonly poles: [number, number][];
  readonly gain: number;
  readonly lCoefficients?: string[];
}

interface PrototypeFile {
  readonly cases: PrototypeCase[];
}

/** scipy.signal prototypes (buttap, cheb1ap, cheb2ap, ellipap, besselap). */
export function scipyCases(family: string): PrototypeCase[] {
  return loadFixture<PrototypeFile>("approx-prototypes-scipy.json").cases.filter((c) => c.family === family);
}

/** mpmath 50-digit references (Bessel, Legendre). */
export function mpmathCases(family: string): PrototypeCase[] {
  return loadFixture<PrototypeFile>("approx-prototypes-mpmath.json").cases.filter((c) => c.family === family);
}

/** Decode stored complex pairs. */
export function roots(pairs: [number, number][]): Complex[] {
  return complexList(pairs);
}

/** |H(jw)| of a zpk, evaluated factor by factor (independent of src/approx/internal.ts). */
export function magnitude(zpk: { zeros: readonly Complex[]; poles: readonly Complex[]; gain: number }, w: number): number {
  let m = Math.abs(zpk.gain);
  for (const z of zpk.zeros) m *= Math.hypot(z.re, w - z.im);
  for (const p of zpk.poles) m /= Math.hypot(p.re, w - p.im);
  return m;
}

/** |H(jw)| in dB. */
export function magnitudeDb(zpk: { zeros: readonly Complex[]; poles: readonly Complex[]; gain: number }, w: number): number {
  return 20 * Math.log10(magnitude(zpk, w));
}

/** Largest relative distance between two conjugate-symmetric root sets after canonical sorting. */
export function setError(actual: readonly Complex[], expected: readonly Complex[]): number {
  const a = sortComplex(actual);
  const e = sortComplex(expected);
  let worst = 0;
  for (let i = 0; i < e.length; i++) {
    const x = a[i] as Complex;
    const y = e[i] as Complex;
    worst = Math.max(worst, Math.hypot(x.re - y.re, x.im - y.im) / Math.hypot(y.re, y.im));
  }
  return worst;
}
