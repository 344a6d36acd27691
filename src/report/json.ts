/**
 * Versioned JSON for design results, and reading it back with validation.
 *
 * The file is `{ "formatVersion": 1, "generator": "filterwright", "result": ... }`
 * with the result exactly as `designFilter` returns it (plain numbers,
 * strings, arrays and objects). Reading checks the version, re-validates the
 * embedded spec, and checks the shape and the numbers of every stage and of
 * the verification, so a hand-edited or truncated file is refused with the
 * path of the first bad field rather than half-loaded.
 *
 * @module
 */
import { ParseError } from "../errors.ts";
import { specToInput, validateSpec, type DesignResult } from "../design/index.ts";
import { getTopology } from "../topologies/index.ts";

/** The format version written by {@link toJson} and accepted by {@link fromJson}. */
export const DESIGN_FORMAT_VERSION = 1;

/**
 * Serialise a design result to versioned JSON text.
 *
 * @param result - a design
 * @returns pretty-printed JSON (2-space indent) ending in a newline
 * @throws never
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * JSON.parse(toJson(designFilter(spec))).formatVersion; //=> 1
 * ```
 */
export function toJson(result: DesignResult): string {
  return `${JSON.stringify({ formatVersion: DESIGN_FORMAT_VERSION, generator: "filterwright", result }, null, 2)}\n`;
}

type Raw = Record<string, unknown>;

class Checker {
  constructor(private readonly fn: string) {}

  fail(path: string, message: string, received?: unknown): never {
    throw new ParseError({ fn: this.fn, path, message, ...(arguments.length >= 3 ? { received } : {}) });
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

function deepFreeze<T>(x: T): T {
  if (x !== null && typeof x === "object" && !Object.isFrozen(x)) {
    Object.freeze(x);
    for (const v of Object.values(x as object)) deepFreeze(v);
  }
  return x;
}

/**
 * Read a design result from JSON written by {@link toJson}.
 *
 * @param text - JSON text
 * @returns the design result (deeply frozen)
 * @throws {@link ParseError} for invalid JSON, an unknown `formatVersion`, or a
 *   missing or malformed field (the error's `path` names it)
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const r = designFilter(spec);
 * fromJson(toJson(r)).stages.length === r.stages.length; //=> true
 * ```
 */
export function fromJson(text: string): DesignResult {
  const c = new Checker("fromJson");
  if (typeof text !== "string") c.fail("", "expected JSON text", text);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    c.fail("", `not valid JSON (${e instanceof Error ? e.message : String(e)})`);
  }
  const top = c.obj("", data);
  if (top["formatVersion"] !== DESIGN_FORMAT_VERSION) {
    c.fail("formatVersion", `expected format version ${DESIGN_FORMAT_VERSION}`, top["formatVersion"]);
  }
  const r = c.obj("result", top["result"]);
  // The spec must still be a valid spec and already canonical.
  const specRaw = c.obj("result.spec", r["spec"]);
  let spec;
  try {
    spec = validateSpec(specToInput(specRaw as never));
  } catch (e) {
    c.fail("result.spec", `the stored spec is not valid (${e instanceof Error ? e.message : String(e)})`);
  }
  c.str("result.family", r["family"]);
  c.num("result.order", r["order"], true);
  c.num("result.filterOrder", r["filterOrder"], true);
  c.num("result.minimumOrder", r["minimumOrder"], true);
  c.obj("result.familyChoice", r["familyChoice"]);
  const pl = c.obj("result.placement", r["placement"]);
  for (const k of ["lowHz", "highHz", "chosenHz", "position"]) c.num(`result.placement.${k}`, pl[k]);
  const stages = c.arr("result.stages", r["stages"]);
  if (stages.length === 0) c.fail("result.stages", "expected at least one stage", stages);
  stages.forEach((sv, i) => {
    const p = `result.stages.${i}`;
    const s = c.obj(p, sv);
    const id = c.str(`${p}.topology`, s["topology"]);
    const topology = topologyOrFail(c, `${p}.topology`, id);
    c.num(`${p}.index`, s["index"], true);
    const comps = c.obj(`${p}.components`, s["components"]);
    const local = c.obj(`${p}.localNames`, s["localNames"]);
    for (const [k, v] of Object.entries(comps)) {
      c.num(`${p}.components.${k}`, v, true);
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
  });
  const v = c.obj("result.verification", r["verification"]);
  c.bool("result.verification.meetsSpec", v["meetsSpec"]);
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
    c.num(`result.verification.${k}`, v[k]);
  }
  const curve = c.obj("result.verification.curve", v["curve"]);
  const n = c.arr("result.verification.curve.freqHz", curve["freqHz"]).length;
  for (const k of ["freqHz", "magnitudeDb", "phaseDeg", "groupDelayS"]) {
    const a = c.arr(`result.verification.curve.${k}`, curve[k]);
    if (a.length !== n) c.fail(`result.verification.curve.${k}`, `expected ${n} values like freqHz`, a.length);
    a.forEach((x, j) => c.num(`result.verification.curve.${k}.${j}`, x));
  }
  c.arr("result.warnings", r["warnings"]);
  c.arr("result.actions", r["actions"]);
  return deepFreeze({ ...(r as unknown as DesignResult), spec: spec as DesignResult["spec"] });
}
