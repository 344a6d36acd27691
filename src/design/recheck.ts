/**
 * Re-verifying a stored design from its parts: the nominal verification a
 * design result records (the mask figures and margins, polarity, stability,
 * `meetsSpec`, `boardsMeetSpec` from it and the stored yield verdict, the
 * clipping check, the response curve) and each stage's
 * as-built figures are computed again from the stored part values with the
 * design layer's own checks ({@link checkMask}, {@link responseCurve},
 * {@link headroomOf}, each topology's `figures`, {@link asBuiltPole}) and
 * compared with the stored ones.
 *
 * Tolerance: two numbers agree when |stored - recomputed| <= 1e-9 *
 * max(|stored|, |recomputed|) + 1e-9 (the recomputation runs the same
 * deterministic code on the same doubles, and JSON round-trips doubles
 * exactly, so an unedited file agrees bit for bit; the slack only absorbs a
 * different floating-point evaluation order on another engine). Strings and
 * booleans must be equal. The Monte Carlo yield, the ideal-design margin, the
 * op-amp output peaks and the relative stage errors are not recomputed (they
 * need the design's search); the yield is checked for consistency with itself
 * and the spec instead (src/design/check.ts).
 *
 * @module
 */
import { chooseRealisation } from "./realisation.ts";
import { asBuiltPole } from "../topologies/index.ts";
import type { ComponentValues } from "../topologies/types.ts";
import type { FilterwrightError, ErrorDetails } from "../errors.ts";
import { getTopology } from "../topologies/index.ts";
import type { DesignSpec } from "./spec.ts";
import type { DesignResult } from "./types.ts";
import { checkMask, maskVerification, responseCurve, type BuiltStage } from "./verify.ts";
import { headroomOf } from "./headroom.ts";

/** Relative tolerance of the comparison of a stored figure with its recomputed value. */
export const RECHECK_RELATIVE_TOLERANCE = 1e-9;
/** Absolute tolerance of the comparison (in the figure's unit: dB, Hz, V/V, s, degrees). */
export const RECHECK_ABSOLUTE_TOLERANCE = 1e-9;

/** Whether two numbers agree within the recheck tolerance. */
function close(a: number, b: number): boolean {
  return Math.abs(a - b) <= RECHECK_RELATIVE_TOLERANCE * Math.max(Math.abs(a), Math.abs(b)) + RECHECK_ABSOLUTE_TOLERANCE;
}

function show(v: unknown): string {
  if (v === undefined) return "absent";
  const s = JSON.stringify(v);
  return s.length > 60 ? `${s.slice(0, 57)}...` : s;
}

/**
 * Compare a stored value with its recomputed one, walking both with an
 * explicit stack, and throw at the first difference (numbers within the
 * recheck tolerance; strings, booleans and null exactly).
 *
 * @param make - builds the error
 * @param fn - public function name, for the error
 * @param path - path of the stored value
 * @param stored - the stored value
 * @param recomputed - the value it should be
 * @param what - what the recomputed value is, for the message
 * @throws whatever `make` builds, naming the first differing field with both values
 */
export function compare(
  make: (d: ErrorDetails) => FilterwrightError,
  fn: string,
  path: string,
  stored: unknown,
  recomputed: unknown,
  what = "the value recomputed from the parts",
): void {
  const stack: [string, unknown, unknown][] = [[path, stored, recomputed]];
  while (stack.length > 0) {
    const [p, a, b] = stack.pop() as [string, unknown, unknown];
    const differ = (): never => {
      throw make({ fn, path: p, received: a, message: `the stored value ${show(a)} differs from ${what}, ${show(b)}` });
    };
    if (typeof a === "number" && typeof b === "number") {
      if (!close(a, b)) differ();
    } else if (Array.isArray(a) && Array.isArray(b)) {
      if (a.length !== b.length) differ();
      for (let i = a.length - 1; i >= 0; i--) stack.push([`${p}.${i}`, a[i], b[i]]);
    } else if (a !== null && b !== null && typeof a === "object" && typeof b === "object" && !Array.isArray(a) && !Array.isArray(b)) {
      const ka = Object.keys(a);
      const kb = Object.keys(b);
      for (const k of kb) if (!ka.includes(k)) stack.push([`${p}.${k}`, undefined, (b as Record<string, unknown>)[k]]);
      for (const k of ka) stack.push([`${p}.${k}`, (a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]]);
    } else if (a !== b) differ();
  }
}

/** The figures as a result stores them (only the fields that are set). */
function stored(f: { f0Hz: number; q?: number; fzHz?: number; realPoleHz?: number; gain: number }): Record<string, number> {
  return {
    f0Hz: f.f0Hz,
    ...(f.q === undefined ? {} : { q: f.q }),
    ...(f.fzHz === undefined ? {} : { fzHz: f.fzHz }),
    ...(f.realPoleHz === undefined ? {} : { realPoleHz: f.realPoleHz }),
    gain: f.gain,
  };
}

/**
 * Recompute a checked result's nominal verification and stage figures from
 * its parts and throw at the first stored figure that differs.
 *
 * @param fn - public function name, for the error
 * @param result - a result whose shape has been checked (strictly: each stage's parts are its topology's components)
 * @param spec - its canonical spec
 * @param options - `prefix` of every error path and the error factory
 * @throws whatever `options.make` builds: path of the figure, its stored value, the recomputed one
 */
export function recheckDesign(
  fn: string,
  result: DesignResult,
  spec: DesignSpec,
  options: { readonly prefix: string; readonly make: (d: ErrorDetails) => FilterwrightError },
): void {
  const { prefix, make } = options;
  const same = (path: string, a: unknown, b: unknown): void => compare(make, fn, `${prefix}.${path}`, a, b);
  const boards: BuiltStage[] = result.stages.map((s) => {
    const values: Record<string, number> = {};
    for (const [global, local] of Object.entries(s.localNames)) values[local] = s.components[global] as number;
    return { topology: getTopology(s.topology), values: values as ComponentValues };
  });
  result.stages.forEach((s, i) => {
    const b = boards[i] as BuiltStage;
    same(`stages.${i}.asBuilt`, s.asBuilt, stored(b.topology.figures(b.values)));
    if (spec.opamp.kind === "ideal") {
      same(`stages.${i}.asBuiltWithOpamp`, s.asBuiltWithOpamp, undefined);
    } else if (s.asBuiltWithOpamp !== undefined) {
      const pole = asBuiltPole(b.topology, b.values, spec.opamp);
      same(`stages.${i}.asBuiltWithOpamp`, s.asBuiltWithOpamp, { f0Hz: pole.f0Hz, ...(pole.q === undefined ? {} : { q: pole.q }) });
    }
  });
  const m = checkMask(spec, boards, spec.opamp);
  const v = result.verification;
  const headroom = headroomOf(spec, result.stages);
  const figures = maskVerification(spec, m);
  const recomputed = {
    ...figures,
    meetsSpec: m.marginDb >= 0 && figures.polarityOk && m.unstableStages.length === 0 && headroom?.clips !== true,
    opamp: spec.opamp,
  };
  const boardsMeetSpec = recomputed.meetsSpec && v.yield.met;
  for (const [k, x] of Object.entries({ ...recomputed, boardsMeetSpec })) same(`verification.${k}`, (v as unknown as Record<string, unknown>)[k], x);
  same("verification.headroom", v.headroom, headroom);
  same("verification.curve", v.curve, responseCurve(spec, boards, spec.opamp, v.curve.freqHz.length));
  // The realisations compared again on the same boards (deterministic for the spec, the parts and the seed).
  if (spec.realisation === "auto" || spec.realisation === "active-ladder") same("realisation", result.realisation, chooseRealisation(result, spec.realisation));
}
