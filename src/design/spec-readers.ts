/**
 * The readers of a raw filter specification, one per part of it (bands, gain,
 * family, topology, parts, op-amp): each checks its fields, collects every
 * problem as an issue with the dotted path of its field, and returns the
 * canonical values (with `undefined` where a field had an issue).
 *
 * Defaults that are rules of thumb rather than published values are marked
 * "common practice, no source".
 *
 * @module
 */
import { FilterwrightError, type Issue } from "../errors.ts";
import type { OpAmpModel } from "../circuit/types.ts";
import { FAMILY_NAMES, type FamilyName } from "../approx/index.ts";
import { SERIES_NAMES, seriesTolerance, type SeriesName } from "../parts/index.ts";
import { parseValue } from "../units/index.ts";
import { getTopology, topologies } from "../topologies/index.ts";
import type { DesignSpec, FamilyPriority, PartDistribution, Polarity, ResponseType } from "./spec-types.ts";
import { CAPACITOR_LIMITS, RESISTOR_LIMITS, characteristicFrequencyHz, defaultResistorWindow } from "./impedance-level.ts";

const RESPONSES: readonly ResponseType[] = ["lowpass", "highpass", "bandpass", "bandstop"];
const PRIORITIES: readonly FamilyPriority[] = ["fewest-op-amps", "fewest-stages", "flattest-delay", "monotonic"];
const POLARITIES: readonly Polarity[] = ["non-inverting", "inverting", "either"];
/** Largest prototype order accepted. */
export const MAX_SPEC_ORDER = 16;

/** A raw (unvalidated) object read from a spec. */
export type Raw = Record<string, unknown>;

/** Whether a value is a plain object (not null, not an array). */
export function isObject(v: unknown): v is Raw {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function listOf(values: readonly string[]): string {
  return values.map((v) => JSON.stringify(v)).join(", ");
}

/** Collects issues while reading a raw spec. */
export class Reader {
  readonly issues: Issue[] = [];

  add(path: string, message: string, received?: unknown): void {
    this.issues.push(arguments.length >= 3 ? { path, message, received } : { path, message });
  }

  unknownKeys(obj: Raw, allowed: readonly string[], prefix: string): void {
    for (const k of Object.keys(obj)) {
      if (!allowed.includes(k)) {
        this.add(`${prefix}${k}`, `unknown field; accepted fields here are ${listOf(allowed)}`, obj[k]);
      }
    }
  }

  /** A positive quantity given as a number or an engineering-notation string; `undefined` on error. */
  quantity(path: string, value: unknown, unit: string): number | undefined {
    if (typeof value === "number") {
      if (!Number.isFinite(value) || value <= 0) {
        this.add(path, `expected a finite number of ${unit} greater than zero`, value);
        return undefined;
      }
      return value;
    }
    if (typeof value === "string") {
      try {
        // zero and negative values are refused here, in the spec's terms (the parser's own message names its options)
        const v = parseValue(value, { unit, allowZero: true, allowNegative: true });
        if (!(v > 0)) {
          this.add(path, `expected a number of ${unit} greater than zero${v < 0 ? "; write it without the minus sign" : ""}`, value);
          return undefined;
        }
        return v;
      } catch (e) {
        const why = e instanceof FilterwrightError ? e.reason : e instanceof Error ? e.message : String(e);
        this.add(path, `could not read ${JSON.stringify(value)} as ${unit} (${why})`, value);
        return undefined;
      }
    }
    this.add(path, `expected a number of ${unit} or a string such as "4k7"`, value);
    return undefined;
  }

  /** One band edge in Hz, within {@link EDGE_RANGE_HZ}. */
  edge(path: string, value: unknown): number | undefined {
    const f = this.quantity(path, value, "Hz");
    if (f === undefined) return undefined;
    if (f < EDGE_RANGE_HZ.min || f > EDGE_RANGE_HZ.max) {
      this.add(path, `expected an edge frequency from ${EDGE_RANGE_HZ.min} Hz to ${EDGE_RANGE_HZ.max} Hz (1 mHz to 1 GHz, the reach of an op-amp filter)`, value);
      return undefined;
    }
    return f;
  }

  number(
    path: string,
    value: unknown,
    range: { min: number; max: number; exclusiveMin?: boolean; exclusiveMax?: boolean },
    what: string,
  ): number | undefined {
    if (typeof value !== "number" || !Number.isFinite(value)) {
      this.add(path, `expected ${what} as a finite number`, value);
      return undefined;
    }
    const lowOk = range.exclusiveMin === true ? value > range.min : value >= range.min;
    const highOk = range.exclusiveMax === true ? value < range.max : value <= range.max;
    if (!lowOk || !highOk) {
      const lo = range.exclusiveMin === true ? `greater than ${range.min}` : `at least ${range.min}`;
      const hi = range.exclusiveMax === true ? `less than ${range.max}` : `at most ${range.max}`;
      this.add(path, `expected ${what} ${lo} and ${hi}`, value);
      return undefined;
    }
    return value;
  }

  oneOf<T extends string>(path: string, value: unknown, allowed: readonly T[]): T | undefined {
    if (typeof value !== "string" || !(allowed as readonly string[]).includes(value)) {
      this.add(path, `expected one of ${listOf(allowed)}`, value);
      return undefined;
    }
    return value as T;
  }

  edges(path: string, value: unknown, count: 1 | 2 | undefined): number[] | undefined {
    if (count === undefined) {
      // Response unknown: check the edges for what they are, one or two.
      if (value === undefined) {
        this.add(path, "expected an edge frequency in Hz (or two for bandpass and bandstop)", value);
        return undefined;
      }
      return this.edges(path, value, Array.isArray(value) ? 2 : 1);
    }
    if (count === 1) {
      if (Array.isArray(value)) {
        this.add(path, "expected one edge frequency for this response, not a list", value);
        return undefined;
      }
      const f = this.edge(path, value);
      return f === undefined ? undefined : [f];
    }
    if (!Array.isArray(value) || value.length !== 2) {
      this.add(path, "expected two edge frequencies [low, high] for this response", value);
      return undefined;
    }
    const lo = this.edge(`${path}.0`, value[0]);
    const hi = this.edge(`${path}.1`, value[1]);
    if (lo === undefined || hi === undefined) return undefined;
    if (!(lo < hi)) {
      this.add(path, "the low edge must be below the high edge", value);
      return undefined;
    }
    return [lo, hi];
  }
}

/**
 * Band edges a spec may give, Hz: 1 mHz to 1 GHz. Below, even 10 MOhm and
 * 10 uF parts cannot reach; above, no op-amp stage works (common practice,
 * no source); the default part limits reach about 2 mHz to 150 MHz.
 */
export const EDGE_RANGE_HZ = Object.freeze({ min: 1e-3, max: 1e9 });

/**
 * Passband loss a spec may allow, dB: 0.001 dB (a flatness no toleranced
 * board holds more closely; the prototypes take ripples down to 1e-6 dB, which
 * leaves room for the margin the design holds back) to 20 dB.
 */
export const MAX_LOSS_RANGE_DB = Object.freeze({ min: 0.001, max: 20 });

export type Bands = Pick<DesignSpec, "response" | "passbandHz" | "stopbandHz" | "passbandTopHz" | "maxLossDb" | "minAttenuationDb">;
export type GainPart = Pick<DesignSpec, "gain" | "polarity" | "gainToleranceDb">;
export type FamilyPart = Pick<DesignSpec, "family" | "priority" | "order">;
export type TopologyPart = Pick<DesignSpec, "topology" | "stageTopologies">;
export type PartsPart = Pick<
  DesignSpec,
  | "capacitorSeries"
  | "resistorSeries"
  | "capacitorTolerance"
  | "resistorTolerance"
  | "capacitorToleranceFixed"
  | "resistorToleranceFixed"
  | "partDistribution"
  | "resistorRange"
  | "capacitorRange"
>;
/** A part of the spec as read, with `undefined` where a field had an issue. */
export type AsRead<T> = { -readonly [K in keyof T]: T[K] | undefined };

/** The edge ordering each response needs, as an issue on `stopband.edgeHz` when it is broken. */
function readEdgeOrder(r: Reader, response: ResponseType, passbandHz: readonly number[], stopbandHz: readonly number[]): void {
  const [p1, p2] = [passbandHz[0] as number, passbandHz[1] as number];
  const [s1, s2] = [stopbandHz[0] as number, stopbandHz[1] as number];
  if (response === "lowpass" && !(p1 < s1)) {
    r.add("stopband.edgeHz", `a lowpass stopband edge must lie above the passband edge (${p1} Hz)`, s1);
  } else if (response === "highpass" && !(s1 < p1)) {
    r.add("stopband.edgeHz", `a highpass stopband edge must lie below the passband edge (${p1} Hz)`, s1);
  } else if (response === "bandpass" && !(s1 < p1 && p2 < s2)) {
    r.add("stopband.edgeHz", `bandpass stopband edges must lie outside the passband edges (${p1} Hz, ${p2} Hz)`, [s1, s2]);
  } else if (response === "bandstop" && !(p1 < s1 && s2 < p2)) {
    r.add("stopband.edgeHz", `bandstop stopband edges must lie inside the passband edges (${p1} Hz, ${p2} Hz)`, [s1, s2]);
  }
}

/**
 * The top of the checked passband (`passband.topHz`): only a highpass or
 * bandstop passband has one. When the response itself is invalid, only the
 * value is checked (the response's own issue is the one to report).
 */
function readPassbandTop(r: Reader, response: ResponseType | undefined, pb: Raw, passbandHz: readonly number[] | undefined): number | null {
  if (pb["topHz"] === undefined) return null;
  if (response !== undefined && response !== "highpass" && response !== "bandstop") {
    r.add("passband.topHz", "only a highpass or bandstop passband has a top frequency", pb["topHz"]);
    return null;
  }
  const top = r.quantity("passband.topHz", pb["topHz"], "Hz");
  if (top !== undefined && top > 100 * EDGE_RANGE_HZ.max) {
    r.add("passband.topHz", `expected a top frequency of at most ${100 * EDGE_RANGE_HZ.max} Hz (100 times the highest edge a spec may give)`, pb["topHz"]);
    return null;
  }
  const upper = passbandHz?.[passbandHz.length - 1];
  if (top !== undefined && upper !== undefined && !(top > upper)) {
    r.add("passband.topHz", `must lie above the upper passband edge (${upper} Hz)`, pb["topHz"]);
    return null;
  }
  return top ?? null;
}

/** The response, the two bands and their limits. */
export function readBands(r: Reader, spec: Raw): AsRead<Bands> {
  const response = r.oneOf("response", spec["response"], RESPONSES);
  const edgeCount: 1 | 2 | undefined =
    response === undefined ? undefined : response === "lowpass" || response === "highpass" ? 1 : 2;
  let passbandHz: number[] | undefined;
  let stopbandHz: number[] | undefined;
  let maxLossDb: number | undefined;
  let minAttenuationDb: number | undefined;
  const pb = spec["passband"];
  if (!isObject(pb)) {
    r.add("passband", "expected an object { edgeHz, maxLossDb }", pb);
  } else {
    r.unknownKeys(pb, ["edgeHz", "maxLossDb", "topHz"], "passband.");
    passbandHz = r.edges("passband.edgeHz", pb["edgeHz"], edgeCount);
    maxLossDb = r.number("passband.maxLossDb", pb["maxLossDb"], MAX_LOSS_RANGE_DB, "a loss in dB");
  }
  const sb = spec["stopband"];
  if (!isObject(sb)) {
    r.add("stopband", "expected an object { edgeHz, minAttenuationDb }", sb);
  } else {
    r.unknownKeys(sb, ["edgeHz", "minAttenuationDb"], "stopband.");
    stopbandHz = r.edges("stopband.edgeHz", sb["edgeHz"], edgeCount);
    minAttenuationDb = r.number("stopband.minAttenuationDb", sb["minAttenuationDb"], { min: 0, max: 200, exclusiveMin: true }, "an attenuation in dB");
  }
  if (maxLossDb !== undefined && minAttenuationDb !== undefined && !(minAttenuationDb > maxLossDb)) {
    r.add("stopband.minAttenuationDb", `the stopband attenuation must exceed the passband loss (${maxLossDb} dB)`, minAttenuationDb);
  }
  if (response !== undefined && passbandHz !== undefined && stopbandHz !== undefined) readEdgeOrder(r, response, passbandHz, stopbandHz);
  const passbandTopHz = isObject(pb) ? readPassbandTop(r, response, pb, passbandHz) : null;
  return { response, passbandHz, stopbandHz, passbandTopHz, maxLossDb, minAttenuationDb };
}

/** The passband gain (`gain`: dB or V/V), its polarity and tolerance. */
export function readGain(r: Reader, g: unknown): GainPart {
  const out = { gain: 1, polarity: "either" as Polarity, gainToleranceDb: 0.25 };
  if (g === undefined) return out;
  if (!isObject(g)) {
    r.add("gain", "expected an object { db } or { vPerV }", g);
    return out;
  }
  r.unknownKeys(g, ["db", "vPerV", "polarity", "toleranceDb"], "gain.");
  const hasDb = g["db"] !== undefined;
  const hasVv = g["vPerV"] !== undefined;
  if (hasDb && hasVv) r.add("gain", "give the gain as db or as vPerV, not both", g);
  if (hasDb) {
    const db = r.number("gain.db", g["db"], { min: -60, max: 80 }, "a gain in dB");
    if (db !== undefined) out.gain = 10 ** (db / 20);
  }
  if (hasVv) {
    const v = g["vPerV"];
    if (typeof v !== "number" || !Number.isFinite(v) || v === 0) {
      r.add("gain.vPerV", "expected a finite, non-zero gain in V/V (negative for inverting)", v);
    } else if (Math.abs(v) < 1e-3 || Math.abs(v) > 1e4) {
      r.add("gain.vPerV", "expected a gain magnitude from 0.001 to 10000 V/V", v);
    } else {
      out.gain = Math.abs(v);
      if (v < 0) out.polarity = "inverting";
    }
  }
  if (g["polarity"] !== undefined) {
    const p = r.oneOf("gain.polarity", g["polarity"], POLARITIES);
    if (p !== undefined) {
      if (hasVv && typeof g["vPerV"] === "number" && g["vPerV"] < 0 && p === "non-inverting") {
        r.add("gain.polarity", "a negative vPerV asks for an inverting filter", p);
      } else out.polarity = p;
    }
  }
  if (g["toleranceDb"] !== undefined) {
    const t = r.number("gain.toleranceDb", g["toleranceDb"], { min: 0, max: 20, exclusiveMin: true }, "a tolerance in dB");
    if (t !== undefined) out.gainToleranceDb = t;
  }
  return out;
}

/** The family, the priority of the automatic choice and a fixed order. */
export function readFamily(r: Reader, spec: Raw): FamilyPart {
  let family: FamilyName | "auto" = "auto";
  if (spec["family"] !== undefined) family = r.oneOf("family", spec["family"], [...FAMILY_NAMES, "auto"] as const) ?? family;
  let priority: FamilyPriority = "fewest-op-amps";
  if (spec["priority"] !== undefined) priority = r.oneOf("priority", spec["priority"], PRIORITIES) ?? priority;
  let order: number | null = null;
  const o = spec["order"];
  if (o !== undefined) {
    if (typeof o !== "number" || !Number.isInteger(o) || o < 1 || o > MAX_SPEC_ORDER) {
      r.add("order", `expected an integer from 1 to ${MAX_SPEC_ORDER}`, o);
    } else order = o;
  }
  return { family, priority, order };
}

/** The topology: `"auto"`, one id for every stage, or one entry per stage. */
export function readTopology(r: Reader, t: unknown): TopologyPart {
  const ids = topologies.map((x) => x.id);
  const checkId = (path: string, id: unknown): string | undefined => {
    if (id === "auto") return "auto";
    if (typeof id !== "string" || getTopologySafe(id) === undefined) {
      r.add(path, `expected "auto" or a topology id: ${listOf(ids)}`, id);
      return undefined;
    }
    return id;
  };
  if (t === undefined) return { topology: "auto", stageTopologies: [] };
  if (!Array.isArray(t)) return { topology: checkId("topology", t) ?? "auto", stageTopologies: [] };
  if (t.length === 0) r.add("topology", "expected at least one entry (or a single id, or \"auto\")", t);
  const stageTopologies: string[] = [];
  t.forEach((id, i) => {
    const v = checkId(`topology.${i}`, id);
    if (v !== undefined) stageTopologies.push(v);
  });
  return { topology: "auto", stageTopologies };
}

const PARTS_KEYS = [
  "capacitorSeries",
  "resistorSeries",
  "capacitorTolerance",
  "resistorTolerance",
  "resistorMinOhm",
  "resistorMaxOhm",
  "capacitorMinF",
  "capacitorMaxF",
  "distribution",
] as const;

/** Default capacitor tolerance: C0G/NP0 ceramic or film at 5 % (common practice, no source), unless the series' own is tighter. */
export const DEFAULT_CAPACITOR_TOLERANCE = 0.05;

/**
 * The part series, their tolerances and the value windows (`parts`). A
 * resistor window the spec leaves out follows the filter's frequency
 * (impedance-level.ts `defaultResistorWindow`, from the band edges); a bound
 * given alone keeps the default other bound when the pair still spans a
 * factor of 2, else the library's limit on that side.
 */
export function readParts(r: Reader, parts: unknown, edgesHz: readonly number[] = []): PartsPart {
  let capacitorSeries: SeriesName = "E12";
  let resistorSeries: SeriesName = "E96";
  const level = defaultResistorWindow(characteristicFrequencyHz(edgesHz));
  const window = { rMin: level.min, rMax: level.max, cMin: CAPACITOR_LIMITS.min, cMax: CAPACITOR_LIMITS.max };
  let capacitorTolerance: number | undefined;
  let resistorTolerance: number | undefined;
  let partDistribution: PartDistribution = "uniform";
  if (parts !== undefined && !isObject(parts)) r.add("parts", "expected an object", parts);
  if (isObject(parts)) {
    r.unknownKeys(parts, PARTS_KEYS, "parts.");
    if (parts["capacitorSeries"] !== undefined) capacitorSeries = r.oneOf("parts.capacitorSeries", parts["capacitorSeries"], SERIES_NAMES) ?? capacitorSeries;
    if (parts["resistorSeries"] !== undefined) resistorSeries = r.oneOf("parts.resistorSeries", parts["resistorSeries"], SERIES_NAMES) ?? resistorSeries;
    const tolerance = (key: "capacitorTolerance" | "resistorTolerance"): number | undefined =>
      parts[key] === undefined
        ? undefined
        : r.number(`parts.${key}`, parts[key], { min: 0, max: 0.5, exclusiveMin: true }, "a tolerance as a fraction (0.01 for 1 %)");
    capacitorTolerance = tolerance("capacitorTolerance");
    resistorTolerance = tolerance("resistorTolerance");
    if (parts["distribution"] !== undefined) {
      partDistribution = r.oneOf("parts.distribution", parts["distribution"], ["uniform", "normal"] as const) ?? partDistribution;
    }
    const q = (key: string, unit: string, fallback: number): number =>
      parts[key] === undefined ? fallback : (r.quantity(`parts.${key}`, parts[key], unit) ?? fallback);
    window.rMin = q("resistorMinOhm", "Ω", window.rMin);
    window.rMax = q("resistorMaxOhm", "Ω", window.rMax);
    // One bound given: the default other bound unless it leaves less than a factor of 2.
    if (parts["resistorMinOhm"] !== undefined && parts["resistorMaxOhm"] === undefined && !(window.rMin * 2 <= window.rMax)) {
      window.rMax = Math.max(RESISTOR_LIMITS.max, window.rMin * 2);
    }
    if (parts["resistorMaxOhm"] !== undefined && parts["resistorMinOhm"] === undefined && !(window.rMin * 2 <= window.rMax)) {
      window.rMin = Math.min(RESISTOR_LIMITS.min, window.rMax / 2);
    }
    window.cMin = q("capacitorMinF", "F", window.cMin);
    window.cMax = q("capacitorMaxF", "F", window.cMax);
    if (!(window.rMin * 2 <= window.rMax)) {
      r.add("parts.resistorMaxOhm", `the resistor window must span at least a factor of 2 (minimum is ${window.rMin} Ω)`, window.rMax);
    }
    if (!(window.cMin * 2 <= window.cMax)) {
      r.add("parts.capacitorMaxF", `the capacitor window must span at least a factor of 2 (minimum is ${window.cMin} F)`, window.cMax);
    }
  }
  return {
    capacitorSeries,
    resistorSeries,
    capacitorTolerance: capacitorTolerance ?? Math.min(DEFAULT_CAPACITOR_TOLERANCE, seriesTolerance(capacitorSeries)),
    resistorTolerance: resistorTolerance ?? seriesTolerance(resistorSeries),
    capacitorToleranceFixed: capacitorTolerance !== undefined,
    resistorToleranceFixed: resistorTolerance !== undefined,
    partDistribution,
    resistorRange: Object.freeze({ min: window.rMin, max: window.rMax }),
    capacitorRange: Object.freeze({ min: window.cMin, max: window.cMax }),
  };
}

/** Accepted open-loop DC gain of a single-pole op-amp, V/V (20 dB to 180 dB: every real op-amp lies inside; common practice, no source). */
export const OPAMP_A0_RANGE = Object.freeze({ min: 10, max: 1e9 });
/** Accepted gain-bandwidth product, Hz (1 Hz to 100 GHz: every real op-amp lies inside; common practice, no source). */
export const OPAMP_GBW_RANGE_HZ = Object.freeze({ min: 1, max: 1e11 });

/** The op-amp: `"ideal"` or a single-pole model `{ a0, gbwHz }`. */
export function readOpamp(r: Reader, oa: unknown): OpAmpModel {
  if (oa === undefined || oa === "ideal") return { kind: "ideal" };
  if (!isObject(oa)) {
    r.add("opamp", 'expected "ideal" or an object { a0, gbwHz }', oa);
    return { kind: "ideal" };
  }
  r.unknownKeys(oa, ["a0", "gbwHz"], "opamp.");
  const a0 = r.number("opamp.a0", oa["a0"], OPAMP_A0_RANGE, "an open-loop gain in V/V");
  let gbw = r.quantity("opamp.gbwHz", oa["gbwHz"], "Hz");
  if (gbw !== undefined && !(gbw >= OPAMP_GBW_RANGE_HZ.min && gbw <= OPAMP_GBW_RANGE_HZ.max)) {
    r.add("opamp.gbwHz", `expected a gain-bandwidth product from ${OPAMP_GBW_RANGE_HZ.min} Hz to ${OPAMP_GBW_RANGE_HZ.max} Hz`, oa["gbwHz"]);
    gbw = undefined;
  }
  return a0 !== undefined && gbw !== undefined ? { kind: "single-pole", a0, gbwHz: gbw } : { kind: "ideal" };
}

function getTopologySafe(id: string): unknown {
  try {
    return getTopology(id);
  } catch {
    return undefined;
  }
}

/** What the yield part of a spec reads to. */
export type YieldPart = Pick<DesignSpec, "yieldTarget" | "yieldMaxBoards" | "yieldSeed">;

/** The yield target and the board limits of its check (`yieldTarget`, `yieldCheck`). */
export function readYield(r: Reader, spec: Raw): YieldPart {
  const out = { yieldTarget: 0.95, yieldMaxBoards: 2048, yieldSeed: 1 };
  if (spec["yieldTarget"] !== undefined) {
    const t = r.number("yieldTarget", spec["yieldTarget"], { min: 0, max: 1, exclusiveMin: true, exclusiveMax: true }, "a fraction of boards (0.95 for 95 %)");
    if (t !== undefined) out.yieldTarget = t;
  }
  const c = spec["yieldCheck"];
  if (c === undefined) return out;
  if (!isObject(c)) {
    r.add("yieldCheck", "expected an object { maxBoards, seed }", c);
    return out;
  }
  r.unknownKeys(c, ["maxBoards", "seed"], "yieldCheck.");
  if (c["maxBoards"] !== undefined) {
    const m = c["maxBoards"];
    if (typeof m !== "number" || !Number.isInteger(m) || m < 256 || m > 100000) r.add("yieldCheck.maxBoards", "expected an integer from 256 to 100000", m);
    else out.yieldMaxBoards = m;
  }
  if (c["seed"] !== undefined) {
    const s = c["seed"];
    if (typeof s !== "number" || !Number.isInteger(s) || s < -(2 ** 31) || s > 2 ** 32 - 1) r.add("yieldCheck.seed", "expected an integer from -2147483648 to 4294967295", s);
    else out.yieldSeed = s;
  }
  return out;
}
