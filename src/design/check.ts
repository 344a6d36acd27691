/**
 * Checking that a value is a design result before using it: the structure and
 * numbers of every field a consumer reads (spec, stages, verification). A
 * result returned by `designFilter` or `fromJson` in this process is known good
 * and passes at once; anything else (a hand-built or edited object) is checked
 * field by field, and the first bad field is reported with its path.
 *
 * @module
 */
import { FilterwrightError, InvalidArgumentError, type ErrorDetails } from "../errors.ts";
import { getTopology } from "../topologies/index.ts";
import { specToInput, validateSpec } from "./spec.ts";
import type { DesignResult } from "./types.ts";

const known = new WeakSet<object>();

/**
 * Freeze a plain-data value and everything inside it.
 *
 * @param x - plain data (objects, arrays, numbers, strings)
 * @returns the same value, deeply frozen
 */
export function deepFreeze<T>(x: T): T {
  if (x !== null && typeof x === "object" && !Object.isFrozen(x)) {
    Object.freeze(x);
    for (const v of Object.values(x as object)) deepFreeze(v);
  }
  return x;
}

/**
 * Mark a result as produced by this library (called by `designFilter` and
 * `fromJson`), so later checks pass without walking it again.
 *
 * @param result - a result built and checked by this library
 * @returns the same result
 */
export function registerDesignResult<T extends DesignResult>(result: T): T {
  known.add(result);
  return result;
}

type Raw = Record<string, unknown>;

/** Builds the error thrown for a bad field: `ParseError` when reading JSON, `InvalidArgumentError` for an argument. */
export type ResultErrorFactory = (details: ErrorDetails) => FilterwrightError;

class Checker {
  constructor(
    private readonly fn: string,
    private readonly make: ResultErrorFactory,
  ) {}

  fail(path: string, message: string, received?: unknown): never {
    throw this.make({ fn: this.fn, path, message, ...(arguments.length >= 3 ? { received } : {}) });
  }

  obj(path: string, v: unknown): Raw {
    if (typeof v !== "object" || v === null || Array.isArray(v)) this.fail(path, "expected an object", v);
    return v as Raw;
  }

  arr(path: string, v: unknown): unknown[] {
    if (!Array.isArray(v)) this.fail(path, "expected an array", v);
    return v as unknown[];
  }

  num(path: string, v: unknown, positive = false): number {
    if (typeof v !== "number" || !Number.isFinite(v) || (positive && !(v > 0))) {
      this.fail(path, positive ? "expected a finite number greater than zero" : "expected a finite number", v);
    }
    return v as number;
  }

  str(path: string, v: unknown): string {
    if (typeof v !== "string") this.fail(path, "expected a string", v);
    return v as string;
  }

  bool(path: string, v: unknown): boolean {
    if (typeof v !== "boolean") this.fail(path, "expected true or false", v);
    return v as boolean;
  }

  figures(path: string, v: unknown): void {
    const f = this.obj(path, v);
    this.num(`${path}.f0Hz`, f["f0Hz"], true);
    this.num(`${path}.gain`, f["gain"]);
    if (f["q"] !== undefined) this.num(`${path}.q`, f["q"], true);
    if (f["fzHz"] !== undefined) this.num(`${path}.fzHz`, f["fzHz"], true);
  }

  errors(path: string, v: unknown): void {
    const e = this.obj(path, v);
    for (const k of ["f0", "q", "fz", "gain"]) this.num(`${path}.${k}`, e[k]);
  }
}

function topologyOrFail(c: Checker, path: string, id: string): ReturnType<typeof getTopology> {
  try {
    return getTopology(id);
  } catch {
    return c.fail(path, "unknown topology id", id);
  }
}

/** A stage's `opampPeaks`: one entry per op-amp, in the order of its `opamps`. */
function checkOpampPeaks(c: Checker, p: string, s: Raw): void {
  const opamps = s["opamps"] as unknown[];
  const peaks = c.arr(`${p}.opampPeaks`, s["opampPeaks"]);
  if (peaks.length !== opamps.length) c.fail(`${p}.opampPeaks`, `expected one entry per op-amp (${opamps.length})`, peaks.length);
  peaks.forEach((x, k) => {
    const q = `${p}.opampPeaks.${k}`;
    const e = c.obj(q, x);
    if (c.str(`${q}.opamp`, e["opamp"]) !== opamps[k]) c.fail(`${q}.opamp`, `expected the stage's op-amp ${String(opamps[k])}`, e["opamp"]);
    c.num(`${q}.gain`, e["gain"], true);
    c.num(`${q}.hz`, e["hz"]);
    c.str(`${q}.node`, e["node"]);
  });
}

/** The verification's `headroom`, when present. */
function checkHeadroom(c: Checker, p: string, v: unknown): void {
  if (v === undefined) return;
  const h = c.obj(p, v);
  c.num(`${p}.inputPeakV`, h["inputPeakV"], true);
  c.num(`${p}.outputSwingV`, h["outputSwingV"], true);
  c.str(`${p}.worstOpamp`, h["worstOpamp"]);
  c.num(`${p}.worstMarginDb`, h["worstMarginDb"]);
  c.bool(`${p}.clips`, h["clips"]);
  c.arr(`${p}.opamps`, h["opamps"]).forEach((x, k) => {
    const o = c.obj(`${p}.opamps.${k}`, x);
    c.str(`${p}.opamps.${k}.opamp`, o["opamp"]);
    c.num(`${p}.opamps.${k}.stage`, o["stage"], true);
    c.num(`${p}.opamps.${k}.peakV`, o["peakV"], true);
    c.num(`${p}.opamps.${k}.hz`, o["hz"]);
    c.num(`${p}.opamps.${k}.marginDb`, o["marginDb"]);
  });
}




/**
 * Check the shape and numbers of a design result, throwing the first problem.
 *
 * @param fn - public function name, for the error
 * @param value - the value to check
 * @param options - `prefix` of every error path (e.g. `"result"`), and the error factory
 * @returns the value as a result, with its spec re-validated (not frozen)
 * @throws whatever `options.make` builds, naming the first bad field
 */
export function checkDesignResult(
  fn: string,
  value: unknown,
  options: { readonly prefix: string; readonly make: ResultErrorFactory },
): DesignResult {
  const c = new Checker(fn, options.make);
  const prefix = options.prefix;
  const r = c.obj(prefix, value);
  // The spec must still be a valid spec and already canonical.
  const specRaw = c.obj(`${prefix}.spec`, r["spec"]);
  let spec;
  try {
    spec = validateSpec(specToInput(specRaw as never));
  } catch (e) {
    c.fail(`${prefix}.spec`, `the stored spec is not valid (${e instanceof Error ? e.message : String(e)})`);
  }
  c.str(`${prefix}.family`, r["family"]);
  c.num(`${prefix}.order`, r["order"], true);
  c.num(`${prefix}.filterOrder`, r["filterOrder"], true);
  c.num(`${prefix}.minimumOrder`, r["minimumOrder"], true);
  c.obj(`${prefix}.familyChoice`, r["familyChoice"]);
  const pl = c.obj(`${prefix}.placement`, r["placement"]);
  for (const k of ["lowHz", "highHz", "chosenHz", "position"]) c.num(`${prefix}.placement.${k}`, pl[k]);
  const stages = c.arr(`${prefix}.stages`, r["stages"]);
  if (stages.length === 0) c.fail(`${prefix}.stages`, "expected at least one stage", stages);
  stages.forEach((sv, i) => {
    const p = `${prefix}.stages.${i}`;
    const s = c.obj(p, sv);
    const id = c.str(`${p}.topology`, s["topology"]);
    const topology = topologyOrFail(c, `${p}.topology`, id);
    c.num(`${p}.index`, s["index"], true);
    const comps = c.obj(`${p}.components`, s["components"]);
    const local = c.obj(`${p}.localNames`, s["localNames"]);
    const tols = c.obj(`${p}.tolerances`, s["tolerances"]);
    for (const [k, v] of Object.entries(comps)) {
      c.num(`${p}.components.${k}`, v, true);
      const t = c.num(`${p}.tolerances.${k}`, tols[k], true);
      if (t > 0.5) c.fail(`${p}.tolerances.${k}`, "expected a tolerance as a fraction, at most 0.5", t);
      const ln = c.str(`${p}.localNames.${k}`, local[k]);
      if (!topology.componentNames.includes(ln)) c.fail(`${p}.localNames.${k}`, `not a component of ${id}`, ln);
    }
    c.arr(`${p}.opamps`, s["opamps"]).forEach((u, k) => c.str(`${p}.opamps.${k}`, u));
    c.figures(`${p}.target`, s["target"]);
    c.figures(`${p}.asBuilt`, s["asBuilt"]);
    c.errors(`${p}.errors`, s["errors"]);
    c.errors(`${p}.plainSnapErrors`, s["plainSnapErrors"]);
    c.num(`${p}.peakGain`, s["peakGain"]);
    c.num(`${p}.peakHz`, s["peakHz"]);
    c.num(`${p}.gbwDemandHz`, s["gbwDemandHz"]);
    checkOpampPeaks(c, p, s);
    if (s["asBuiltWithOpamp"] !== undefined) {
      const w = c.obj(`${p}.asBuiltWithOpamp`, s["asBuiltWithOpamp"]);
      c.num(`${p}.asBuiltWithOpamp.f0Hz`, w["f0Hz"], true);
      if (w["q"] !== undefined) c.num(`${p}.asBuiltWithOpamp.q`, w["q"]);
    }
    if (s["predistortion"] !== undefined) {
      const d = c.obj(`${p}.predistortion`, s["predistortion"]);
      c.num(`${p}.predistortion.f0Factor`, d["f0Factor"], true);
      c.num(`${p}.predistortion.qFactor`, d["qFactor"], true);
      c.num(`${p}.predistortion.gainFactor`, d["gainFactor"], true);
    }
  });
  const v = c.obj(`${prefix}.verification`, r["verification"]);
  c.bool(`${prefix}.verification.meetsSpec`, v["meetsSpec"]);
  c.bool(`${prefix}.verification.boardsMeetSpec`, v["boardsMeetSpec"]);
  c.bool(`${prefix}.verification.stable`, v["stable"]);
  c.arr(`${prefix}.verification.unstableStages`, v["unstableStages"]).forEach((x, j) => c.num(`${prefix}.verification.unstableStages.${j}`, x, true));
  const y = c.obj(`${prefix}.verification.yield`, v["yield"]);
  for (const k of ["fraction", "lower95", "upper95", "target"]) {
    const x = c.num(`${prefix}.verification.yield.${k}`, y[k]);
    if (x < 0 || x > 1) c.fail(`${prefix}.verification.yield.${k}`, "expected a fraction from 0 to 1", x);
  }
  for (const k of ["boards", "passed", "unstableBoards", "seed"]) c.num(`${prefix}.verification.yield.${k}`, y[k]);
  c.bool(`${prefix}.verification.yield.met`, y["met"]);
  for (const k of ["resistorTolerances", "capacitorTolerances"]) {
    c.arr(`${prefix}.verification.yield.${k}`, y[k]).forEach((x, j) => c.num(`${prefix}.verification.yield.${k}.${j}`, x, true));
  }
  for (const k of [
    "passbandLossDb",
    "passbandMarginDb",
    "stopbandAttenuationDb",
    "stopbandMarginDb",
    "gainDb",
    "gainErrorDb",
    "gainMarginDb",
    "marginDb",
    "idealMarginDb",
  ]) {
    c.num(`${prefix}.verification.${k}`, v[k]);
  }
  const curve = c.obj(`${prefix}.verification.curve`, v["curve"]);
  const n = c.arr(`${prefix}.verification.curve.freqHz`, curve["freqHz"]).length;
  for (const k of ["freqHz", "magnitudeDb", "phaseDeg", "groupDelayS"]) {
    const a = c.arr(`${prefix}.verification.curve.${k}`, curve[k]);
    if (a.length !== n) c.fail(`${prefix}.verification.curve.${k}`, `expected ${n} values like freqHz`, a.length);
    a.forEach((x, j) => c.num(`${prefix}.verification.curve.${k}.${j}`, x));
  }
  checkHeadroom(c, `${prefix}.verification.headroom`, v["headroom"]);
  c.arr(`${prefix}.warnings`, r["warnings"]);
  c.arr(`${prefix}.actions`, r["actions"]);
  c.arr(`${prefix}.yieldAlternatives`, r["yieldAlternatives"]).forEach((av, i) => {
    const a = c.obj(`${prefix}.yieldAlternatives.${i}`, av);
    for (const k of ["order", "opamps", "resistorTolerance", "capacitorTolerance", "fraction", "lower95", "upper95", "boards"]) c.num(`${prefix}.yieldAlternatives.${i}.${k}`, a[k]);
    c.bool(`${prefix}.yieldAlternatives.${i}.met`, a["met"]);
    c.bool(`${prefix}.yieldAlternatives.${i}.chosen`, a["chosen"]);
  });
  return { ...(r as unknown as DesignResult), spec: spec as DesignResult["spec"] };
}

/**
 * The check every public function that takes a design result runs first.
 *
 * @param fn - public function name, for the error
 * @param value - the argument received
 * @returns the argument as a result
 * @throws {@link InvalidArgumentError} naming the first bad field (path starting `result`)
 */
export function requireDesignResult(fn: string, value: unknown): DesignResult {
  if (typeof value === "object" && value !== null && known.has(value)) return value as DesignResult;
  checkDesignResult(fn, value, { prefix: "result", make: (d) => new InvalidArgumentError(d) });
  return value as DesignResult;
}
