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
import { isInSeries } from "../parts/index.ts";
import { specToInput, validateSpec, type DesignSpec } from "./spec.ts";
import { compare } from "./recheck.ts";
import type { DesignAction, DesignResult, DesignWarning } from "./types.ts";

const known = new WeakSet<object>();

/**
 * Freeze a plain-data value and everything inside it, walking with an
 * explicit stack (no recursion, so data nested to any depth cannot exhaust
 * the call stack).
 *
 * @param x - plain data (objects, arrays, numbers, strings)
 * @returns the same value, deeply frozen
 */
export function deepFreeze<T>(x: T): T {
  const stack: unknown[] = [x];
  while (stack.length > 0) {
    const v = stack.pop();
    if (v === null || typeof v !== "object" || Object.isFrozen(v)) continue;
    Object.freeze(v);
    for (const k of Object.keys(v)) stack.push((v as Record<string, unknown>)[k]);
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

/** How strictly {@link checkDesignResult} reads a value. */
export interface ResultCheckOptions {
  /** Prefix of every error path (e.g. `"result"`). */
  readonly prefix: string;
  /** Builds the error for a bad field. */
  readonly make: ResultErrorFactory;
  /**
   * Refuse unknown fields (every object has its list of accepted keys), and
   * require each stage's parts to be exactly its topology's components, each
   * value in the spec's series (what `fromJson` asks of a file).
   * @defaultValue false
   */
  readonly strict?: boolean;
}

function listOf(keys: readonly string[]): string {
  return keys.map((k) => JSON.stringify(k)).join(", ");
}

class Checker {
  constructor(
    readonly fn: string,
    readonly make: ResultErrorFactory,
    readonly strict: boolean,
  ) {}

  fail(path: string, message: string, received?: unknown): never {
    throw this.make({ fn: this.fn, path, message, ...(arguments.length >= 3 ? { received } : {}) });
  }

  obj(path: string, v: unknown, allowed?: readonly string[]): Raw {
    if (typeof v !== "object" || v === null || Array.isArray(v)) this.fail(path, "expected an object", v);
    if (this.strict && allowed !== undefined) this.keys(path, v as Raw, allowed);
    return v as Raw;
  }

  /** Refuse (in strict mode) a key not in `allowed`, naming its path. */
  keys(path: string, o: Raw, allowed: readonly string[]): void {
    if (!this.strict) return;
    for (const k of Object.keys(o)) {
      if (!allowed.includes(k)) this.fail(`${path}.${k}`, `unknown field; accepted fields here are ${listOf(allowed)}`);
    }
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

  /** A number that may be absent (not checked then). */
  optNum(path: string, v: unknown, positive = false): void {
    if (v !== undefined) this.num(path, v, positive);
  }

  /** A whole number from `min` up. */
  int(path: string, v: unknown, min: number): number {
    if (typeof v !== "number" || !Number.isInteger(v) || v < min) this.fail(path, `expected a whole number of at least ${min}`, v);
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

  oneOf(path: string, v: unknown, allowed: readonly string[]): string {
    if (typeof v !== "string" || !allowed.includes(v)) this.fail(path, `expected one of ${listOf(allowed)}`, v);
    return v as string;
  }

  figures(path: string, v: unknown): void {
    const f = this.obj(path, v, ["f0Hz", "q", "fzHz", "realPoleHz", "gain"]);
    this.num(`${path}.f0Hz`, f["f0Hz"], true);
    this.num(`${path}.gain`, f["gain"]);
    this.optNum(`${path}.q`, f["q"], true);
    this.optNum(`${path}.fzHz`, f["fzHz"], true);
    this.optNum(`${path}.realPoleHz`, f["realPoleHz"], true);
  }

  errors(path: string, v: unknown): void {
    const e = this.obj(path, v, ["f0", "q", "fz", "gain"]);
    for (const k of ["f0", "q", "fz", "gain"]) this.num(`${path}.${k}`, e[k]);
  }

  /** A fraction from 0 to 1. */
  fraction(path: string, v: unknown): number {
    const x = this.num(path, v);
    if (x < 0 || x > 1) this.fail(path, "expected a fraction from 0 to 1", x);
    return x;
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
    const e = c.obj(q, x, ["opamp", "gain", "hz", "node"]);
    if (c.str(`${q}.opamp`, e["opamp"]) !== opamps[k]) c.fail(`${q}.opamp`, `expected the stage's op-amp ${String(opamps[k])}`, e["opamp"]);
    c.num(`${q}.gain`, e["gain"], true);
    c.num(`${q}.hz`, e["hz"]);
    c.str(`${q}.node`, e["node"]);
  });
}

/** The verification's `headroom`, when present. */
function checkHeadroom(c: Checker, p: string, v: unknown): void {
  if (v === undefined) return;
  const h = c.obj(p, v, ["inputPeakV", "outputSwingV", "worstOpamp", "worstMarginDb", "clips", "opamps", "dynamicRange"]);
  const d = c.obj(`${p}.dynamicRange`, h["dynamicRange"], ["maxInputPeakV", "noiseRmsV", "rangeDb", "bandHz", "opampNoise"]);
  c.num(`${p}.dynamicRange.maxInputPeakV`, d["maxInputPeakV"], true);
  c.num(`${p}.dynamicRange.noiseRmsV`, d["noiseRmsV"], true);
  c.num(`${p}.dynamicRange.rangeDb`, d["rangeDb"]);
  c.bool(`${p}.dynamicRange.opampNoise`, d["opampNoise"]);
  c.num(`${p}.inputPeakV`, h["inputPeakV"], true);
  c.num(`${p}.outputSwingV`, h["outputSwingV"], true);
  c.str(`${p}.worstOpamp`, h["worstOpamp"]);
  c.num(`${p}.worstMarginDb`, h["worstMarginDb"]);
  c.bool(`${p}.clips`, h["clips"]);
  c.arr(`${p}.opamps`, h["opamps"]).forEach((x, k) => {
    const o = c.obj(`${p}.opamps.${k}`, x, ["opamp", "stage", "peakV", "hz", "marginDb"]);
    c.str(`${p}.opamps.${k}.opamp`, o["opamp"]);
    c.num(`${p}.opamps.${k}.stage`, o["stage"], true);
    c.num(`${p}.opamps.${k}.peakV`, o["peakV"], true);
    c.num(`${p}.opamps.${k}.hz`, o["hz"]);
    c.num(`${p}.opamps.${k}.marginDb`, o["marginDb"]);
  });
}

const STAGE_KEYS = [
  "index", "topology", "topologyName", "topologyReason", "kind", "order", "components", "localNames", "opamps", "tolerances",
  "target", "asBuilt", "errors", "plainSnapErrors", "asBuiltWithOpamp", "predistortion", "peakGain", "peakHz", "gbwDemandHz", "opampPeaks",
] as const;

/** A stage's parts: designators, local names, values (in the spec's series in strict mode) and tolerances. */
function checkParts(c: Checker, p: string, s: Raw, spec: DesignSpec, topology: ReturnType<typeof getTopology>): void {
  const comps = c.obj(`${p}.components`, s["components"]);
  const local = c.obj(`${p}.localNames`, s["localNames"]);
  const tols = c.obj(`${p}.tolerances`, s["tolerances"]);
  const seen = new Set<string>();
  for (const [k, v] of Object.entries(comps)) {
    if (c.strict && !Object.hasOwn(local, k)) {
      c.fail(`${p}.components.${k}`, `not a part of this stage (its parts are ${listOf(Object.keys(local))}, ${topology.id}'s components ${listOf(topology.componentNames)})`, v);
    }
    const value = c.num(`${p}.components.${k}`, v, true);
    const t = c.num(`${p}.tolerances.${k}`, tols[k], true);
    if (t > 0.5) c.fail(`${p}.tolerances.${k}`, "expected a tolerance as a fraction, at most 0.5", t);
    const ln = c.str(`${p}.localNames.${k}`, local[k]);
    if (!topology.componentNames.includes(ln)) c.fail(`${p}.localNames.${k}`, `not a component of ${topology.id} (its components are ${listOf(topology.componentNames)})`, ln);
    if (!c.strict) continue;
    if (seen.has(ln)) c.fail(`${p}.localNames.${k}`, `${topology.id}'s component ${ln} appears twice`, ln);
    seen.add(ln);
    if (k[0] !== ln[0]) c.fail(`${p}.components.${k}`, `designator ${k} does not name the same kind of part as ${ln}`, k);
    const series = ln.startsWith("R") ? spec.resistorSeries : ln.startsWith("C") ? spec.capacitorSeries : null;
    if (series !== null && !isInSeries(value, series)) c.fail(`${p}.components.${k}`, `not a value of the spec's ${series} series`, value);
  }
  if (!c.strict) return;
  const comp = Object.keys(comps);
  c.keys(`${p}.localNames`, local, comp);
  c.keys(`${p}.tolerances`, tols, comp);
  for (const n of topology.componentNames) {
    if (!seen.has(n)) c.fail(`${p}.components`, `missing ${topology.id}'s component ${n} (every one of ${listOf(topology.componentNames)} needs a value)`);
  }
}

/** One stage's shape and numbers. */
function checkStage(c: Checker, p: string, sv: unknown, spec: DesignSpec, position: { next: number }): void {
  const s = c.obj(p, sv, STAGE_KEYS);
  const id = c.str(`${p}.topology`, s["topology"]);
  const topology = topologyOrFail(c, `${p}.topology`, id);
  c.num(`${p}.index`, s["index"], true);
  checkParts(c, p, s, spec, topology);
  const opamps = c.arr(`${p}.opamps`, s["opamps"]);
  opamps.forEach((u, k) => c.str(`${p}.opamps.${k}`, u));
  c.figures(`${p}.target`, s["target"]);
  c.figures(`${p}.asBuilt`, s["asBuilt"]);
  c.errors(`${p}.errors`, s["errors"]);
  c.errors(`${p}.plainSnapErrors`, s["plainSnapErrors"]);
  c.num(`${p}.peakGain`, s["peakGain"]);
  c.num(`${p}.peakHz`, s["peakHz"]);
  c.num(`${p}.gbwDemandHz`, s["gbwDemandHz"]);
  checkOpampPeaks(c, p, s);
  if (s["asBuiltWithOpamp"] !== undefined) {
    const w = c.obj(`${p}.asBuiltWithOpamp`, s["asBuiltWithOpamp"], ["f0Hz", "q"]);
    c.num(`${p}.asBuiltWithOpamp.f0Hz`, w["f0Hz"], true);
    c.optNum(`${p}.asBuiltWithOpamp.q`, w["q"]);
  }
  if (s["predistortion"] !== undefined) {
    const d = c.obj(`${p}.predistortion`, s["predistortion"], ["f0Factor", "qFactor", "gainFactor"]);
    c.num(`${p}.predistortion.f0Factor`, d["f0Factor"], true);
    c.num(`${p}.predistortion.qFactor`, d["qFactor"], true);
    c.num(`${p}.predistortion.gainFactor`, d["gainFactor"], true);
  }
  if (!c.strict) return;
  if (s["index"] !== position.next) c.fail(`${p}.index`, `expected the stage's position ${position.next}`, s["index"]);
  position.next++;
  c.str(`${p}.topologyName`, s["topologyName"]);
  if (s["topologyName"] !== topology.name) c.fail(`${p}.topologyName`, `expected ${JSON.stringify(topology.name)}, the name of ${id}`, s["topologyName"]);
  c.str(`${p}.topologyReason`, s["topologyReason"]);
  c.oneOf(`${p}.kind`, s["kind"], topology.kinds);
  if (s["order"] !== topology.order) c.fail(`${p}.order`, `expected ${topology.order}, the order of ${id}`, s["order"]);
  if (opamps.length !== topology.opampCount) c.fail(`${p}.opamps`, `expected ${topology.opampCount} op-amps, as ${id} has`, opamps.length);
}

const SPEC_ERROR = "the stored spec is not valid";

/**
 * The canonical spec as a file written before its newer fields would hold
 * it: without `realisation` when the file has none (a cascade's), and
 * levels without the op-amp noise densities when the file's levels have
 * none (both zero).
 */
function asWrittenBefore(specRaw: Raw, spec: DesignSpec): Partial<DesignSpec> {
  const { realisation, levels, ...rest } = spec;
  const raw = specRaw["levels"] as Raw | null | undefined;
  const oldLevels = levels !== null && raw !== null && typeof raw === "object" && !("opampVoltageNoise" in raw) && !("opampCurrentNoise" in raw) && levels.opampVoltageNoise === 0 && levels.opampCurrentNoise === 0;
  return {
    ...rest,
    ...("realisation" in specRaw || realisation !== "cascade" ? { realisation } : {}),
    levels: oldLevels ? ({ inputPeakV: levels.inputPeakV, outputSwingV: levels.outputSwingV } as DesignSpec["levels"]) : levels,
  };
}

/** The stored spec, re-validated (strict: it must already be canonical, with no extra field). */
function checkSpecField(c: Checker, prefix: string, specRaw: Raw): DesignSpec {
  let spec: DesignSpec;
  try {
    spec = validateSpec(specToInput(specRaw as never));
  } catch (e) {
    return c.fail(`${prefix}.spec`, `${SPEC_ERROR} (${e instanceof Error ? e.message : String(e)})`);
  }
  if (c.strict) {
    const canonical = asWrittenBefore(specRaw, spec);
    c.keys(`${prefix}.spec`, specRaw, Object.keys(canonical));
    // Already canonical: what validation makes of it is what is stored.
    compare(c.make, c.fn, `${prefix}.spec`, specRaw, canonical, "the canonical value validateSpec makes of the stored spec");
    for (const k of ["resistorRange", "capacitorRange"] as const) c.obj(`${prefix}.spec.${k}`, specRaw[k], ["min", "max"]);
    c.obj(`${prefix}.spec.opamp`, specRaw["opamp"], spec.opamp.kind === "ideal" ? ["kind"] : ["kind", "a0", "gbwHz"]);
    if (specRaw["levels"] !== null) c.obj(`${prefix}.spec.levels`, specRaw["levels"], ["inputPeakV", "outputSwingV", "opampVoltageNoise", "opampCurrentNoise"]);
  }
  return spec;
}

/** How the family was chosen, and where the design sits in its slack. */
function checkChoiceAndPlacement(c: Checker, prefix: string, r: Raw): void {
  const fc = c.obj(`${prefix}.familyChoice`, r["familyChoice"], ["automatic", "priority", "candidates", "reason", "feasibility"]);
  if (c.strict) {
    c.bool(`${prefix}.familyChoice.automatic`, fc["automatic"]);
    if (fc["priority"] !== null) c.str(`${prefix}.familyChoice.priority`, fc["priority"]);
    c.str(`${prefix}.familyChoice.reason`, fc["reason"]);
    c.arr(`${prefix}.familyChoice.candidates`, fc["candidates"]).forEach((x, i) => {
      const q = `${prefix}.familyChoice.candidates.${i}`;
      const k = c.obj(q, x, ["family", "order", "stages", "opamps", "delayVariation", "monotonic", "built"]);
      c.str(`${q}.family`, k["family"]);
      for (const f of ["order", "stages", "opamps"]) if (k[f] !== null) c.num(`${q}.${f}`, k[f], true);
      c.optNum(`${q}.delayVariation`, k["delayVariation"]);
      c.bool(`${q}.monotonic`, k["monotonic"]);
      if (k["built"] !== undefined) {
        const b = c.obj(`${q}.built`, k["built"], ["opamps", "order", "meetsSpec"]);
        c.int(`${q}.built.opamps`, b["opamps"], 0);
        c.int(`${q}.built.order`, b["order"], 1);
        c.bool(`${q}.built.meetsSpec`, b["meetsSpec"]);
      }
    });
  }
  if (fc["feasibility"] !== undefined) {
    const q = `${prefix}.familyChoice.feasibility`;
    const f = c.obj(q, fc["feasibility"], ["family", "order", "neededOrders", "relaxations"]);
    if (c.strict) {
      c.str(`${q}.family`, f["family"]);
      c.num(`${q}.order`, f["order"], true);
      c.arr(`${q}.neededOrders`, f["neededOrders"]).forEach((x, i) => {
        const n = c.obj(`${q}.neededOrders.${i}`, x, ["family", "order"]);
        c.str(`${q}.neededOrders.${i}.family`, n["family"]);
        if (n["order"] !== null) c.num(`${q}.neededOrders.${i}.order`, n["order"], true);
      });
      c.arr(`${q}.relaxations`, f["relaxations"]).forEach((x, i) => {
        const p = `${q}.relaxations.${i}`;
        const x2 = c.obj(p, x, ["field", "value", "text"]);
        c.oneOf(`${p}.field`, x2["field"], ["stopband.minAttenuationDb", "passband.maxLossDb", "stopband.edgeHz", "passband.edgeHz"]);
        const v = x2["value"];
        if (Array.isArray(v)) v.forEach((y, j) => c.num(`${p}.value.${j}`, y, true));
        else c.num(`${p}.value`, v, true);
        c.str(`${p}.text`, x2["text"]);
      });
    }
  }
  const pl = c.obj(`${prefix}.placement`, r["placement"], ["parameter", "lowHz", "highHz", "chosenHz", "position", "centreHz", "designRippleDb", "designAttenuationDb"]);
  for (const k of ["lowHz", "highHz", "chosenHz", "position"]) c.num(`${prefix}.placement.${k}`, pl[k]);
  if (c.strict) {
    c.oneOf(`${prefix}.placement.parameter`, pl["parameter"], ["natural-frequency", "bandwidth"]);
    for (const k of ["centreHz", "designRippleDb", "designAttenuationDb"]) c.optNum(`${prefix}.placement.${k}`, pl[k], true);
  }
}

const VERIFICATION_KEYS = [
  "meetsSpec", "opamp", "passbandLossDb", "passbandWorstHz", "passbandMarginDb", "stopbandAttenuationDb", "stopbandWorstHz", "stopbandMarginDb",
  "gainDb", "targetGainDb", "gainErrorDb", "gainMarginDb", "polarity", "polarityOk", "marginDb", "stable", "unstableStages", "boardsMeetSpec",
  "yield", "idealMarginDb", "curve", "headroom",
] as const;
const YIELD_KEYS = [
  "fraction", "lower95", "upper95", "boards", "met", "target", "passed", "unstableBoards", "distribution", "seed", "resistorTolerances", "capacitorTolerances",
] as const;

/** The board yield: shape, and (strict) its consistency with itself and the spec. */
function checkYield(c: Checker, p: string, v: unknown, spec: DesignSpec): void {
  const y = c.obj(p, v, YIELD_KEYS);
  for (const k of ["fraction", "lower95", "upper95", "target"]) c.fraction(`${p}.${k}`, y[k]);
  for (const k of ["boards", "passed", "unstableBoards", "seed"]) c.num(`${p}.${k}`, y[k]);
  c.bool(`${p}.met`, y["met"]);
  for (const k of ["resistorTolerances", "capacitorTolerances"]) {
    c.arr(`${p}.${k}`, y[k]).forEach((x, j) => c.num(`${p}.${k}.${j}`, x, true));
  }
  if (!c.strict) return;
  const boards = c.int(`${p}.boards`, y["boards"], 1);
  const passed = c.int(`${p}.passed`, y["passed"], 0);
  const unstable = c.int(`${p}.unstableBoards`, y["unstableBoards"], 0);
  if (passed > boards) c.fail(`${p}.passed`, `expected at most the ${boards} boards built`, passed);
  if (unstable > boards - passed) c.fail(`${p}.unstableBoards`, `expected at most the ${boards - passed} boards that failed`, unstable);
  const fraction = y["fraction"] as number;
  if (Math.abs(fraction - passed / boards) > 1e-12) c.fail(`${p}.fraction`, `expected passed / boards = ${passed / boards}`, fraction);
  // The Wilson interval holds its fraction; 1e-12 absorbs rounding at a fraction of 0 or 1.
  if (!((y["lower95"] as number) <= fraction + 1e-12 && fraction <= (y["upper95"] as number) + 1e-12)) c.fail(`${p}.fraction`, "expected a fraction inside its 95 % interval [lower95, upper95]", fraction);
  if (y["target"] !== spec.yieldTarget) c.fail(`${p}.target`, `expected the spec's yield target ${spec.yieldTarget}`, y["target"]);
  if (y["met"] !== (y["lower95"] as number) >= spec.yieldTarget) c.fail(`${p}.met`, `expected ${String(!y["met"])}: met is whether lower95 reaches the target`, y["met"]);
  if (y["distribution"] !== spec.partDistribution) c.fail(`${p}.distribution`, `expected the spec's part distribution ${JSON.stringify(spec.partDistribution)}`, y["distribution"]);
  if (y["seed"] !== spec.yieldSeed) c.fail(`${p}.seed`, `expected the spec's seed ${spec.yieldSeed}`, y["seed"]);
}

/** The verification's shape and numbers. */
function checkVerification(c: Checker, p: string, v0: unknown, spec: DesignSpec, stageCount: number): void {
  const v = c.obj(p, v0, VERIFICATION_KEYS);
  c.bool(`${p}.meetsSpec`, v["meetsSpec"]);
  c.bool(`${p}.boardsMeetSpec`, v["boardsMeetSpec"]);
  c.bool(`${p}.stable`, v["stable"]);
  c.arr(`${p}.unstableStages`, v["unstableStages"]).forEach((x, j) => c.num(`${p}.unstableStages.${j}`, x, true));
  checkYield(c, `${p}.yield`, v["yield"], spec);
  for (const k of ["passbandLossDb", "passbandMarginDb", "stopbandAttenuationDb", "stopbandMarginDb", "gainDb", "gainErrorDb", "gainMarginDb", "marginDb", "idealMarginDb"]) {
    c.num(`${p}.${k}`, v[k]);
  }
  const curve = c.obj(`${p}.curve`, v["curve"], ["freqHz", "magnitudeDb", "phaseDeg", "groupDelayS"]);
  const n = c.arr(`${p}.curve.freqHz`, curve["freqHz"]).length;
  for (const k of ["freqHz", "magnitudeDb", "phaseDeg", "groupDelayS"]) {
    const a = c.arr(`${p}.curve.${k}`, curve[k]);
    if (a.length !== n) c.fail(`${p}.curve.${k}`, `expected ${n} values like freqHz`, a.length);
    a.forEach((x, j) => c.num(`${p}.curve.${k}.${j}`, x));
  }
  checkHeadroom(c, `${p}.headroom`, v["headroom"]);
  if (!c.strict) return;
  for (const k of ["passbandWorstHz", "stopbandWorstHz"]) c.num(`${p}.${k}`, v[k], true);
  c.num(`${p}.targetGainDb`, v["targetGainDb"]);
  c.oneOf(`${p}.polarity`, v["polarity"], ["inverting", "non-inverting"]);
  c.bool(`${p}.polarityOk`, v["polarityOk"]);
  (v["unstableStages"] as unknown[]).forEach((x, j) => {
    if (!Number.isInteger(x) || (x as number) > stageCount) c.fail(`${p}.unstableStages.${j}`, `expected a stage number from 1 to ${stageCount}`, x);
  });
  if ((v["headroom"] === undefined) !== (spec.levels === null || spec.levels === undefined)) {
    c.fail(`${p}.headroom`, "expected a clipping check exactly when the spec gives signal levels", v["headroom"]);
  }
  c.obj(`${p}.opamp`, v["opamp"], spec.opamp.kind === "ideal" ? ["kind"] : ["kind", "a0", "gbwHz"]);
}

const WARNING_CODES = [
  "resistor-out-of-range", "capacitor-out-of-range", "large-capacitor-ratio", "insufficient-gbw", "polarity", "gain-not-distributed",
  "predistortion-failed", "spec-not-met", "unstable", "yield-not-met", "clips",
] as const;
const ACTION_CODES = [
  "placed-in-slack", "re-tuned-to-mask", "moved-placement", "raised-order", "tightened-prototype", "sturdier-stages", "kept-best-attempt", "predistorted-for-gbw",
  "centred-for-yield", "tightened-tolerances", "changed-family-for-yield", "changed-family-for-op-amps", "confirmed-yield",
] as const;
// Compile-time: the lists name every code the result types allow (a new code must be added here).
const everyWarningCode: Exclude<DesignWarning["code"], (typeof WARNING_CODES)[number]> extends never ? true : false = true;
const everyActionCode: Exclude<DesignAction["code"], (typeof ACTION_CODES)[number]> extends never ? true : false = true;
void everyWarningCode;
void everyActionCode;
const ALTERNATIVE_KEYS = [
  "change", "family", "order", "opamps", "resistorTolerance", "capacitorTolerance", "fraction", "lower95", "upper95", "boards", "met", "chosen",
] as const;

/** Warnings, actions and the yield search's alternatives. */
function checkNotes(c: Checker, prefix: string, r: Raw): void {
  const warnings = c.arr(`${prefix}.warnings`, r["warnings"]);
  const actions = c.arr(`${prefix}.actions`, r["actions"]);
  if (c.strict) {
    warnings.forEach((x, i) => {
      const w = c.obj(`${prefix}.warnings.${i}`, x, ["code", "stage", "message"]);
      c.oneOf(`${prefix}.warnings.${i}.code`, w["code"], WARNING_CODES);
      c.optNum(`${prefix}.warnings.${i}.stage`, w["stage"], true);
      c.str(`${prefix}.warnings.${i}.message`, w["message"]);
    });
    actions.forEach((x, i) => {
      const a = c.obj(`${prefix}.actions.${i}`, x, ["code", "message"]);
      c.oneOf(`${prefix}.actions.${i}.code`, a["code"], ACTION_CODES);
      c.str(`${prefix}.actions.${i}.message`, a["message"]);
    });
  }
  c.arr(`${prefix}.yieldAlternatives`, r["yieldAlternatives"]).forEach((av, i) => {
    const q = `${prefix}.yieldAlternatives.${i}`;
    const a = c.obj(q, av, ALTERNATIVE_KEYS);
    for (const k of ["order", "opamps", "resistorTolerance", "capacitorTolerance", "fraction", "lower95", "upper95", "boards"]) c.num(`${q}.${k}`, a[k]);
    c.bool(`${q}.met`, a["met"]);
    c.bool(`${q}.chosen`, a["chosen"]);
    if (c.strict) {
      c.str(`${q}.change`, a["change"]);
      c.str(`${q}.family`, a["family"]);
    }
  });
}

const RESULT_KEYS = [
  "spec", "family", "familyChoice", "order", "filterOrder", "minimumOrder", "placement", "stages", "verification", "warnings", "actions", "yieldAlternatives", "realisation",
] as const;

const REALISATION_KEYS = ["requested", "candidates", "skipped", "chosen", "reason", "tolerances", "seed", "boardsMeetSpec"] as const;

/**
 * The realisation record's shape: present exactly when the spec asked for
 * `"auto"` or `"active-ladder"`, its choice one of its candidates (each an
 * active ladder with its circuit, or the cascade). Its figures are
 * recomputed by `recheckDesign` when a file is read.
 */
function checkRealisation(c: Checker, p: string, value: unknown, spec: DesignSpec): void {
  const asked = spec.realisation === "auto" || spec.realisation === "active-ladder";
  if (value === undefined) {
    if (asked && c.strict) c.fail(p, `expected the realisations compared, as the spec asks for realisation ${JSON.stringify(spec.realisation)}`);
    return;
  }
  if (!asked) c.fail(p, `unexpected: the spec's realisation is ${JSON.stringify(spec.realisation)}, and only "auto" and "active-ladder" record one`, value);
  const r = c.obj(p, value, REALISATION_KEYS);
  if (r["requested"] !== spec.realisation) c.fail(`${p}.requested`, `expected the spec's realisation ${JSON.stringify(spec.realisation)}`, r["requested"]);
  const candidates = c.arr(`${p}.candidates`, r["candidates"]);
  if (candidates.length === 0) c.fail(`${p}.candidates`, "expected at least the cascade", candidates);
  const chosen = c.int(`${p}.chosen`, r["chosen"], 0);
  if (chosen >= candidates.length) c.fail(`${p}.chosen`, `expected an index into the ${candidates.length} candidates`, chosen);
  candidates.forEach((kv, i) => {
    const q = `${p}.candidates.${i}`;
    const k = c.obj(q, kv);
    const kind = c.oneOf(`${q}.realisation`, k["realisation"], ["cascade", "active-ladder"]);
    c.str(`${q}.method`, k["method"]);
    for (const f of ["opamps", "parts", "yield", "lower95", "upper95", "boards", "medianMarginDb", "nominalMarginDb"]) c.num(`${q}.${f}`, k[f]);
    c.bool(`${q}.meetsTarget`, k["meetsTarget"]);
    if (kind === "active-ladder") {
      const l = c.obj(`${q}.ladder`, k["ladder"]);
      c.str(`${q}.ladder.output`, l["output"]);
      c.arr(`${q}.ladder.parts`, l["parts"]);
      c.obj(`${q}.ladder.circuit`, l["circuit"]);
    }
  });
  c.str(`${p}.reason`, r["reason"]);
  c.bool(`${p}.boardsMeetSpec`, r["boardsMeetSpec"]);
}

/**
 * Check the shape and numbers of a design result, throwing the first problem.
 *
 * @param fn - public function name, for the error
 * @param value - the value to check
 * @param options - `prefix` of every error path (e.g. `"result"`), the error factory, and strictness
 * @returns the value as a result, with its spec re-validated (not frozen)
 * @throws whatever `options.make` builds, naming the first bad field
 */
export function checkDesignResult(fn: string, value: unknown, options: ResultCheckOptions): DesignResult {
  const c = new Checker(fn, options.make, options.strict === true);
  const prefix = options.prefix;
  const r = c.obj(prefix, value, RESULT_KEYS);
  const spec = checkSpecField(c, prefix, c.obj(`${prefix}.spec`, r["spec"]));
  c.str(`${prefix}.family`, r["family"]);
  c.num(`${prefix}.order`, r["order"], true);
  c.num(`${prefix}.filterOrder`, r["filterOrder"], true);
  c.num(`${prefix}.minimumOrder`, r["minimumOrder"], true);
  if (c.strict) {
    const order = c.int(`${prefix}.order`, r["order"], 1);
    const filterOrder = spec.response === "lowpass" || spec.response === "highpass" ? order : 2 * order;
    if (r["filterOrder"] !== filterOrder) c.fail(`${prefix}.filterOrder`, `expected ${filterOrder} for a ${spec.response} of prototype order ${order}`, r["filterOrder"]);
  }
  checkChoiceAndPlacement(c, prefix, r);
  const stages = c.arr(`${prefix}.stages`, r["stages"]);
  if (stages.length === 0) c.fail(`${prefix}.stages`, "expected at least one stage", stages);
  const position = { next: 1 };
  stages.forEach((sv, i) => checkStage(c, `${prefix}.stages.${i}`, sv, spec, position));
  checkVerification(c, `${prefix}.verification`, r["verification"], spec, stages.length);
  checkNotes(c, prefix, r);
  checkRealisation(c, `${prefix}.realisation`, r["realisation"], spec);
  return { ...(r as unknown as DesignResult), spec };
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
