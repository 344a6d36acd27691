/**
 * The filter specification: what an engineer asks for, in hertz and decibels,
 * and its validation into one canonical internal form.
 *
 * Validation collects every problem it finds (with the dotted path of each
 * field) and throws them together as one {@link SpecError}, so a user fixes a
 * spec in one pass instead of one error at a time.
 *
 * Defaults that are rules of thumb rather than published values are marked
 * "common practice, no source".
 *
 * @module
 */
import { InvalidArgumentError, SpecError, type Issue } from "../errors.ts";
import type { OpAmpModel } from "../circuit/types.ts";
import type { ActiveRealisation, DesignSpec, EdgeInput, FilterSpec, GainSpec, Realisation, ResponseType } from "./spec-types.ts";
import { isObject, readBands, readFamily, readGain, readOpamp, readParts, readTopology, readYield, Reader } from "./spec-readers.ts";
import { readLevels } from "./spec-levels.ts";

export type {
  ResponseType,
  FamilyPriority,
  Polarity,
  Quantity,
  EdgeInput,
  PassbandSpec,
  StopbandSpec,
  GainSpec,
  PartsSpec,
  OpAmpSpec,
  FilterSpec,
  ValueWindow,
  DesignSpec,
  LevelsSpec,
  SignalLevels,
  YieldCheckSpec,
  PartDistribution,
  Realisation,
  ActiveRealisation,
  LcLadderFilterSpec,
} from "./spec-types.ts";
export { MAX_SPEC_ORDER } from "./spec-readers.ts";

const TOP_KEYS = [
  "response",
  "passband",
  "stopband",
  "gain",
  "family",
  "priority",
  "order",
  "topology",
  "parts",
  "opamp",
  "yieldTarget",
  "yieldCheck",
  "levels",
  "realisation",
  "lcLadder",
] as const;

/** The realisation names, in the order error messages list them. */
export const REALISATIONS: readonly Realisation[] = ["cascade", "active-ladder", "auto", "lc-ladder"];

/** The spec's realisation (default `"cascade"`); `lcLadder` options only go with `"lc-ladder"`. */
function readRealisation(r: Reader, spec: Record<string, unknown>): Realisation {
  const realisation = spec["realisation"] === undefined ? "cascade" : r.oneOf("realisation", spec["realisation"], REALISATIONS) ?? "cascade";
  if (spec["lcLadder"] !== undefined && spec["realisation"] !== "lc-ladder") {
    r.add("lcLadder", 'the LC ladder options apply only with realisation "lc-ladder": add realisation: "lc-ladder" or remove lcLadder', spec["lcLadder"]);
  }
  return realisation;
}

/** How deep {@link ownData} copies (a spec nests three levels; deeper data is only ever shown in an issue). */
const OWN_COPY_DEPTH = 8;
/** Arrays longer than this are kept as they are by {@link ownData} (no spec list is that long; its reader refuses it). */
const OWN_COPY_MAX_ITEMS = 1024;

/**
 * A copy of plain data with only its own enumerable properties, in objects
 * without a prototype, walked with an explicit stack to `maxDepth` levels
 * (deeper values, and arrays over 1,024 items, are kept as they are). Reading the copy reads own
 * properties only (`Object.hasOwn`): a field inherited from a prototype
 * is absent, at every level.
 */
function ownData(value: unknown, maxDepth: number): unknown {
  const copyOf = (v: unknown): unknown => {
    if (Array.isArray(v)) return v.length > OWN_COPY_MAX_ITEMS ? v : new Array<unknown>(v.length);
    if (typeof v === "object" && v !== null) return Object.create(null) as Record<string, unknown>;
    return v;
  };
  const root = copyOf(value);
  const stack: [unknown, unknown, number][] = [[value, root, 0]];
  while (stack.length > 0) {
    const [from, to, depth] = stack.pop() as [Record<string, unknown>, Record<string, unknown>, number];
    if (to === from || typeof to !== "object" || to === null) continue;
    const keys = Array.isArray(from) ? Array.from(from.keys(), String) : Object.keys(from);
    for (const k of keys) {
      const v = Object.hasOwn(from, k) ? from[k] : undefined;
      const c = depth + 1 >= maxDepth ? v : copyOf(v);
      to[k] = c;
      if (c !== v) stack.push([v, c, depth + 1]);
    }
  }
  return root;
}

/**
 * The op-amp must still have gain across the passband the filter passes: its
 * gain-bandwidth product (where a single-pole op-amp's open-loop gain falls
 * to 1) above the highest passband frequency (its edges and
 * `passband.topHz`). Below that no stage built with it can pass the band,
 * so such a spec is refused rather than designed; between that and the
 * stopband the design is made and reports, with its margins, that it fails.
 */
function readOpampAboveBands(r: Reader, opamp: OpAmpModel, bands: ReturnType<typeof readBands>): void {
  if (opamp.kind !== "single-pole" || bands.passbandHz === undefined) return;
  const top = Math.max(...bands.passbandHz, bands.passbandTopHz ?? 0);
  if (!(opamp.gbwHz > top)) {
    r.add("opamp.gbwHz", `expected a gain-bandwidth product above the highest passband frequency (${top} Hz); the op-amp's gain falls to 1 there`, opamp.gbwHz);
  }
}

/** Read a whole spec: every issue, and the canonical spec when there is none. */
function readSpec(input: unknown): { readonly issues: readonly Issue[]; readonly spec: DesignSpec | null } {
  const spec = ownData(input, OWN_COPY_DEPTH);
  if (!isObject(spec)) return { issues: [{ path: "", message: "expected a specification object", received: spec }], spec: null };
  const r = new Reader();
  r.unknownKeys(spec, TOP_KEYS, "");
  const bands = readBands(r, spec);
  const gain = readGain(r, spec["gain"]);
  const family = readFamily(r, spec);
  const topology = readTopology(r, spec["topology"]);
  const parts = readParts(r, spec["parts"], [...(bands.passbandHz ?? []), ...(bands.stopbandHz ?? [])]);
  const opamp = readOpamp(r, spec["opamp"]);
  const yieldPart = readYield(r, spec);
  const levels = readLevels(r, spec["levels"]);
  const realisation = readRealisation(r, spec);
  readOpampAboveBands(r, opamp, bands);
  if (r.issues.length > 0) return { issues: r.issues, spec: null };
  return {
    issues: [],
    spec: rememberSpec(Object.freeze({
      response: bands.response as ResponseType,
      passbandHz: Object.freeze([...(bands.passbandHz as number[])]),
      stopbandHz: Object.freeze([...(bands.stopbandHz as number[])]),
      passbandTopHz: bands.passbandTopHz ?? null,
      maxLossDb: bands.maxLossDb as number,
      minAttenuationDb: bands.minAttenuationDb as number,
      ...gain,
      ...family,
      topology: topology.topology,
      stageTopologies: Object.freeze(topology.stageTopologies),
      ...parts,
      opamp: Object.freeze({ ...opamp }),
      ...yieldPart,
      levels,
      realisation,
    })),
  };
}

/** How deep {@link jsonSafe} copies a received value before cutting it off. */
const JSON_SAFE_DEPTH = 16;

/**
 * A copy of a received value that is plain JSON-safe data: non-finite numbers
 * become their text (`"NaN"`, `"Infinity"`), a cycle `"[circular]"`, and data
 * nested deeper than 16 levels `"[nested too deeply]"` (so the recursion is
 * bounded whatever the input).
 */
function jsonSafe(value: unknown, seen = new Set<unknown>(), depth = 0): unknown {
  if (typeof value === "number") return Number.isFinite(value) ? value : String(value);
  if (typeof value !== "object" || value === null) return value;
  if (seen.has(value)) return "[circular]";
  if (depth >= JSON_SAFE_DEPTH) return "[nested too deeply]";
  seen.add(value);
  if (Array.isArray(value)) return value.map((v) => jsonSafe(v, seen, depth + 1));
  return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, jsonSafe(v, seen, depth + 1)]));
}

/**
 * Check a filter specification without throwing: every problem
 * {@link validateSpec} would report, as data. The issues are those of the
 * {@link SpecError} `validateSpec` throws, with the same paths and messages;
 * a received value is copied as JSON-safe data (a non-finite number as its
 * text, `"NaN"`), so no NaN leaves the library in a returned value.
 *
 * @param spec - the specification as written (from code or parsed JSON)
 * @returns the issues, each with the dotted path of its field, a message and the value received; empty when the spec is valid
 * @example
 * ```ts
 * checkSpec({
 *   response: "lowpass",
 *   passband: { edgeHz: "1k", maxLossDb: 1 },
 *   stopband: { edgeHz: 500, minAttenuationDb: 40 },
 * });
 * //=> [{ path: "stopband.edgeHz", message: "a lowpass stopband edge must lie above the passband edge (1000 Hz)", received: 500 }]
 * ```
 */
export function checkSpec(spec: unknown): readonly Issue[] {
  return readSpec(spec).issues.map((i) => ("received" in i ? { ...i, received: jsonSafe(i.received) } : i));
}

/**
 * Validate a filter specification and bring it to canonical form.
 *
 * Every problem is collected; if there is at least one, a single
 * {@link SpecError} lists them all with their dotted paths.
 *
 * @param spec - the specification as written (from code or parsed JSON)
 * @returns the canonical {@link DesignSpec} with every default filled in
 * @throws {@link SpecError} listing every problem found
 * @example
 * ```ts
 * const s = validateSpec({
 *   response: "lowpass",
 *   passband: { edgeHz: "2k", maxLossDb: 0.5 },
 *   stopband: { edgeHz: 12000, minAttenuationDb: 60 },
 * });
 * s.passbandHz; //=> [2000]
 * s.resistorSeries; //=> "E96"
 * ```
 */
export function validateSpec(spec: unknown): DesignSpec {
  const read = readSpec(spec);
  if (read.spec === null) throw new SpecError("validateSpec", read.issues);
  return read.spec;
}

const canonical = new WeakSet<object>();

function rememberSpec(spec: DesignSpec): DesignSpec {
  canonical.add(spec);
  return spec;
}

/**
 * Check that a value has the shape of a canonical {@link DesignSpec} (as
 * {@link validateSpec} returns it) before a function reads it. Specs made by
 * `validateSpec` in this process pass at once; anything else is checked field
 * by field (types and finiteness; the values themselves are re-checked by
 * `validateSpec` where a result is read back).
 *
 * @param fn - public function name, for the error
 * @param value - the argument received
 * @param path - path of the argument (e.g. `"spec"` or `"result.spec"`)
 * @returns the value as a spec
 * @throws {@link InvalidArgumentError} naming the first bad field
 */
export function requireDesignSpec(fn: string, value: unknown, path = "spec"): DesignSpec {
  if (typeof value === "object" && value !== null && canonical.has(value)) return value as DesignSpec;
  const fail = (field: string, message: string, received: unknown): never => {
    throw new InvalidArgumentError({ fn, path: field === "" ? path : `${path}.${field}`, received, message });
  };
  if (!isObject(value)) return fail("", "expected a canonical spec object (from validateSpec)", value);
  // Own properties only: a field inherited from a prototype counts as missing.
  const v = ownData(value, 2) as Record<string, unknown>;
  const num = (k: string, positive: boolean): void => {
    const x = v[k];
    if (typeof x !== "number" || !Number.isFinite(x) || (positive && !(x > 0))) {
      fail(k, positive ? "expected a finite number greater than zero" : "expected a finite number", x);
    }
  };
  const str = (k: string): void => {
    if (typeof v[k] !== "string") fail(k, "expected a string", v[k]);
  };
  const edges = (k: string): void => {
    const a = v[k];
    if (!Array.isArray(a) || a.length < 1 || a.length > 2 || a.some((x) => typeof x !== "number" || !(x > 0) || !Number.isFinite(x))) {
      fail(k, "expected one or two band edges in Hz, each a finite number greater than zero", a);
    }
  };
  const window = (k: string): void => {
    const w = v[k];
    if (!isObject(w) || typeof w["min"] !== "number" || typeof w["max"] !== "number" || !(w["min"] > 0) || !(w["max"] > w["min"]) || !Number.isFinite(w["max"])) {
      fail(k, "expected { min, max } with 0 < min < max", w);
    }
  };
  str("response");
  edges("passbandHz");
  edges("stopbandHz");
  if (v["passbandTopHz"] !== null) num("passbandTopHz", true);
  num("maxLossDb", true);
  num("minAttenuationDb", true);
  num("gain", true);
  num("gainToleranceDb", true);
  num("capacitorTolerance", true);
  num("resistorTolerance", true);
  num("yieldTarget", true);
  num("yieldMaxBoards", true);
  num("yieldSeed", false);
  for (const k of ["capacitorToleranceFixed", "resistorToleranceFixed"]) {
    if (typeof v[k] !== "boolean") fail(k, "expected true or false", v[k]);
  }
  if (v["realisation"] !== undefined && !(REALISATIONS as readonly unknown[]).includes(v["realisation"])) fail("realisation", `expected one of ${REALISATIONS.map((x) => JSON.stringify(x)).join(", ")}`, v["realisation"]);
  if (v["partDistribution"] !== "uniform" && v["partDistribution"] !== "normal") fail("partDistribution", 'expected "uniform" or "normal"', v["partDistribution"]);
  for (const k of ["polarity", "family", "priority", "topology", "capacitorSeries", "resistorSeries"]) str(k);
  if (v["order"] !== null) num("order", true);
  if (!Array.isArray(v["stageTopologies"]) || v["stageTopologies"].some((x) => typeof x !== "string")) {
    fail("stageTopologies", "expected an array of topology ids", v["stageTopologies"]);
  }
  window("resistorRange");
  window("capacitorRange");
  const oa = v["opamp"];
  if (!isObject(oa) || (oa["kind"] !== "ideal" && (typeof oa["a0"] !== "number" || typeof oa["gbwHz"] !== "number"))) {
    fail("opamp", 'expected { kind: "ideal" } or a single-pole model { kind, a0, gbwHz }', oa);
  }
  const lv = v["levels"];
  if (lv !== undefined && lv !== null && (!isObject(lv) || [lv["inputPeakV"], lv["outputSwingV"]].some((x) => typeof x !== "number" || !(x > 0) || !Number.isFinite(x)))) {
    fail("levels", "expected null or { inputPeakV, outputSwingV }, each a finite number of volts greater than zero", lv);
  }
  return value as unknown as DesignSpec;
}

/**
 * Turn a canonical {@link DesignSpec} back into the {@link FilterSpec} a user
 * would write (numbers only), so a result can be re-designed or stored.
 *
 * @param spec - a validated spec
 * @returns an equivalent {@link FilterSpec} that {@link validateSpec} maps back to `spec` (a spec of
 *   `realisation: "lc-ladder"` keeps that field, so its input is in fact an `LcLadderFilterSpec`)
 * @throws {@link InvalidArgumentError} when `spec` is not a canonical spec (the path names the field)
 * @example
 * ```ts
 * specToInput(validateSpec({ response: "lowpass", passband: { edgeHz: 1000, maxLossDb: 1 },
 *   stopband: { edgeHz: 5000, minAttenuationDb: 40 } })).passband; //=> { edgeHz: 1000, maxLossDb: 1 }
 * ```
 */
export function specToInput(spec: DesignSpec): FilterSpec {
  requireDesignSpec("specToInput", spec);
  const edge = (e: readonly number[]): EdgeInput =>
    e.length === 1 ? (e[0] as number) : ([e[0] as number, e[1] as number] as const);
  const gain: GainSpec = {
    vPerV: spec.polarity === "inverting" ? -spec.gain : spec.gain,
    polarity: spec.polarity,
    toleranceDb: spec.gainToleranceDb,
  };
  const opamp: FilterSpec["opamp"] =
    spec.opamp.kind === "ideal" ? "ideal" : { a0: spec.opamp.a0, gbwHz: spec.opamp.gbwHz };
  return {
    response: spec.response,
    passband: {
      edgeHz: edge(spec.passbandHz),
      maxLossDb: spec.maxLossDb,
      ...(spec.passbandTopHz === null ? {} : { topHz: spec.passbandTopHz }),
    },
    stopband: { edgeHz: edge(spec.stopbandHz), minAttenuationDb: spec.minAttenuationDb },
    gain,
    family: spec.family,
    priority: spec.priority,
    ...(spec.order === null ? {} : { order: spec.order }),
    topology: spec.stageTopologies.length > 0 ? spec.stageTopologies : spec.topology,
    parts: {
      capacitorSeries: spec.capacitorSeries,
      resistorSeries: spec.resistorSeries,
      ...(spec.capacitorToleranceFixed ? { capacitorTolerance: spec.capacitorTolerance } : {}),
      ...(spec.resistorToleranceFixed ? { resistorTolerance: spec.resistorTolerance } : {}),
      distribution: spec.partDistribution,
      resistorMinOhm: spec.resistorRange.min,
      resistorMaxOhm: spec.resistorRange.max,
      capacitorMinF: spec.capacitorRange.min,
      capacitorMaxF: spec.capacitorRange.max,
    },
    opamp,
    yieldTarget: spec.yieldTarget,
    yieldCheck: { maxBoards: spec.yieldMaxBoards, seed: spec.yieldSeed },
    ...(spec.levels === null || spec.levels === undefined ? {} : { levels: { inputPeakV: spec.levels.inputPeakV, outputSwingV: spec.levels.outputSwingV, ...(spec.levels.opampVoltageNoise > 0 ? { opampVoltageNoise: spec.levels.opampVoltageNoise } : {}), ...(spec.levels.opampCurrentNoise > 0 ? { opampCurrentNoise: spec.levels.opampCurrentNoise } : {}) } }),
    ...(spec.realisation === "cascade" || spec.realisation === undefined ? {} : { realisation: spec.realisation as ActiveRealisation }),
  };
}
