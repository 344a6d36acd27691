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
import { FilterwrightError, InvalidArgumentError, SpecError, type Issue } from "../errors.ts";
import type { OpAmpModel } from "../circuit/types.ts";
import { FAMILY_NAMES, type FamilyName } from "../approx/index.ts";
import { SERIES_NAMES, seriesTolerance, type SeriesName } from "../parts/index.ts";
import { parseValue } from "../units/index.ts";
import { getTopology, topologies } from "../topologies/index.ts";

/** The four responses a filter can have. */
export type ResponseType = "lowpass" | "highpass" | "bandpass" | "bandstop";

/**
 * How the family is chosen when the spec does not name one:
 * - `fewest-op-amps`: the family whose circuit needs the fewest op-amps, then
 *   the fewest stages (ties go to the candidate with the most room for part
 *   rounding). Op-amps are what a board pays for in parts, power and noise,
 *   so this is the default;
 * - `fewest-stages`: the family that meets the mask with the fewest stages
 *   (second-order sections), then the fewest op-amps; a notch section built
 *   as a multi-amplifier stage still counts as one stage;
 * - `flattest-delay`: the family whose passband group delay varies least;
 * - `monotonic`: the fewest stages among families with a monotonic passband
 *   (Butterworth, Legendre, Bessel, Chebyshev II).
 */
export type FamilyPriority = "fewest-op-amps" | "fewest-stages" | "flattest-delay" | "monotonic";

/** Sign requirement on the passband gain. */
export type Polarity = "non-inverting" | "inverting" | "either";

/** A frequency, resistance or capacitance: a number in SI units, or a string in engineering notation (`"20k"`, `"4k7"`, `"100n"`). */
export type Quantity = number | string;

/** One band edge (lowpass, highpass) or a pair of edges (bandpass, bandstop), low edge first. */
export type EdgeInput = Quantity | readonly [Quantity, Quantity];

/** The passband of the spec. */
export interface PassbandSpec {
  /** Passband edge in Hz (lowpass, highpass) or the two edges `[low, high]` (bandpass, bandstop). */
  readonly edgeHz: EdgeInput;
  /** Largest loss allowed anywhere in the passband, in dB, relative to the passband's highest level (> 0). */
  readonly maxLossDb: number;
  /**
   * Highpass and bandstop only: the highest frequency, Hz, up to which the
   * upper passband is checked (every real op-amp ends a passband somewhere).
   * @defaultValue 100 times the upper passband edge
   */
  readonly topHz?: Quantity;
}

/** The stopband of the spec. */
export interface StopbandSpec {
  /** Stopband edge in Hz (lowpass, highpass) or the two edges `[low, high]` (bandpass, bandstop). */
  readonly edgeHz: EdgeInput;
  /** Smallest attenuation allowed anywhere in the stopband, in dB, relative to the passband's highest level. */
  readonly minAttenuationDb: number;
}

/** The passband gain: give `db` or `vPerV` (not both). */
export interface GainSpec {
  /** Passband gain in dB (the magnitude; use `polarity` for the sign). */
  readonly db?: number;
  /** Passband gain in V/V; a negative value asks for an inverting filter. */
  readonly vPerV?: number;
  /**
   * Sign requirement.
   * @defaultValue `"inverting"` when `vPerV` is negative, otherwise `"either"`
   */
  readonly polarity?: Polarity;
  /**
   * How far the as-built passband level may sit from the requested gain, in dB
   * (common practice, no source).
   * @defaultValue 0.25
   */
  readonly toleranceDb?: number;
}

/** Preferred-value series and value windows for the parts. */
export interface PartsSpec {
  /**
   * Series for capacitors.
   * @defaultValue `"E12"`
   */
  readonly capacitorSeries?: SeriesName;
  /**
   * Series for resistors.
   * @defaultValue `"E96"`
   */
  readonly resistorSeries?: SeriesName;
  /**
   * Capacitor tolerance as a fraction (0.02 for 2 %): what the BOM asks for
   * and what tolerance analysis assumes. Stock C0G/NP0 capacitors come in
   * E12 values at 1 %, 2 % and 5 %, so a tight filter need not accept the
   * series' usual 10 %.
   * @defaultValue the usual tolerance of `capacitorSeries` (E12: 0.1)
   */
  readonly capacitorTolerance?: number;
  /**
   * Resistor tolerance as a fraction (0.001 for 0.1 %).
   * @defaultValue the usual tolerance of `resistorSeries` (E96: 0.01)
   */
  readonly resistorTolerance?: number;
  /**
   * Smallest resistor wanted, ohms (common practice, no source: below about 1 kΩ
   * op-amp output current and distortion grow).
   * @defaultValue 1000
   */
  readonly resistorMinOhm?: Quantity;
  /**
   * Largest resistor wanted, ohms (common practice, no source: above about
   * 100 kΩ resistor noise and bias-current offsets grow).
   * @defaultValue 100000
   */
  readonly resistorMaxOhm?: Quantity;
  /**
   * Smallest capacitor considered, farads (common practice, no source: below
   * about 100 pF board and op-amp input capacitance matter).
   * @defaultValue 1e-10
   */
  readonly capacitorMinF?: Quantity;
  /**
   * Largest capacitor considered, farads (common practice, no source: film
   * capacitors above about 10 µF are large and costly).
   * @defaultValue 1e-5
   */
  readonly capacitorMaxF?: Quantity;
}

/** A real op-amp described by its open-loop DC gain and gain-bandwidth product (single-pole model). */
export interface OpAmpSpec {
  /** Open-loop DC gain in V/V (e.g. 1e5 for 100 dB). */
  readonly a0: number;
  /** Gain-bandwidth product in Hz. */
  readonly gbwHz: Quantity;
}

/**
 * A filter specification as the engineer writes it.
 *
 * @example
 * ```ts
 * const spec: FilterSpec = {
 *   response: "lowpass",
 *   passband: { edgeHz: "2k", maxLossDb: 0.5 },
 *   stopband: { edgeHz: "12k", minAttenuationDb: 60 },
 * };
 * ```
 */
export interface FilterSpec {
  /** What the filter passes. */
  readonly response: ResponseType;
  /** Passband edge(s) and largest loss. */
  readonly passband: PassbandSpec;
  /** Stopband edge(s) and smallest attenuation. */
  readonly stopband: StopbandSpec;
  /**
   * Passband gain.
   * @defaultValue 0 dB (unity), either polarity
   */
  readonly gain?: GainSpec;
  /**
   * Approximation family, or `"auto"` to choose one by `priority`.
   * @defaultValue `"auto"`
   */
  readonly family?: FamilyName | "auto";
  /**
   * What the automatic family choice optimises (ignored when a family is named).
   * @defaultValue `"fewest-op-amps"`
   */
  readonly priority?: FamilyPriority;
  /**
   * Fixed prototype order (for bandpass and bandstop the circuit has twice as
   * many poles). When absent, the minimum order that meets the mask is used.
   */
  readonly order?: number;
  /**
   * Topology: `"auto"`; one topology id, used for every stage it can build
   * (the others are chosen automatically); or one entry per stage (each an id
   * or `"auto"`), which must fit its stage.
   * @defaultValue `"auto"`
   */
  readonly topology?: string | readonly string[];
  /**
   * Part series and value windows.
   * @defaultValue capacitors E12, resistors E96 within 1 kΩ-100 kΩ
   */
  readonly parts?: PartsSpec;
  /**
   * The op-amp used in every stage: `"ideal"`, or a single-pole model.
   * @defaultValue `"ideal"`
   */
  readonly opamp?: "ideal" | OpAmpSpec;
}

/** An inclusive window of part values in SI units. */
export interface ValueWindow {
  /** Smallest value. */
  readonly min: number;
  /** Largest value. */
  readonly max: number;
}

/** The canonical, validated form of a {@link FilterSpec}: every default filled in, every value a number in SI units. */
export interface DesignSpec {
  /** What the filter passes. */
  readonly response: ResponseType;
  /** Passband edge(s) in Hz, ascending (one for lowpass/highpass, two for bandpass/bandstop). */
  readonly passbandHz: readonly number[];
  /** Stopband edge(s) in Hz, ascending. */
  readonly stopbandHz: readonly number[];
  /** Highest frequency of the upper passband that is checked (highpass, bandstop), Hz. */
  readonly passbandTopHz: number | null;
  /** Largest passband loss, dB. */
  readonly maxLossDb: number;
  /** Smallest stopband attenuation, dB. */
  readonly minAttenuationDb: number;
  /** Passband gain magnitude, V/V (> 0). */
  readonly gain: number;
  /** Sign requirement on the passband gain. */
  readonly polarity: Polarity;
  /** Allowed distance of the as-built passband level from `gain`, dB. */
  readonly gainToleranceDb: number;
  /** Named family or `"auto"`. */
  readonly family: FamilyName | "auto";
  /** Priority of the automatic family choice. */
  readonly priority: FamilyPriority;
  /** Fixed prototype order, or `null` for the minimum order. */
  readonly order: number | null;
  /** Topology for every stage (`"auto"` or an id), used where `stageTopologies` has no entry. */
  readonly topology: string;
  /** Per-stage topology choices (`"auto"` or an id); empty when one choice applies to all. */
  readonly stageTopologies: readonly string[];
  /** Capacitor series. */
  readonly capacitorSeries: SeriesName;
  /** Resistor series. */
  readonly resistorSeries: SeriesName;
  /** Capacitor tolerance as a fraction. */
  readonly capacitorTolerance: number;
  /** Resistor tolerance as a fraction. */
  readonly resistorTolerance: number;
  /** Resistor window, ohms. */
  readonly resistorRange: ValueWindow;
  /** Capacitor window, farads. */
  readonly capacitorRange: ValueWindow;
  /** Op-amp model for analysis. */
  readonly opamp: OpAmpModel;
}

const RESPONSES: readonly ResponseType[] = ["lowpass", "highpass", "bandpass", "bandstop"];
const PRIORITIES: readonly FamilyPriority[] = ["fewest-op-amps", "fewest-stages", "flattest-delay", "monotonic"];
const POLARITIES: readonly Polarity[] = ["non-inverting", "inverting", "either"];
/** Largest prototype order accepted. */
export const MAX_SPEC_ORDER = 16;

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
] as const;

type Raw = Record<string, unknown>;

function isObject(v: unknown): v is Raw {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function listOf(values: readonly string[]): string {
  return values.map((v) => JSON.stringify(v)).join(", ");
}

/** Collects issues while reading a raw spec. */
class Reader {
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
        return parseValue(value, { unit });
      } catch (e) {
        const why = e instanceof FilterwrightError ? e.reason : e instanceof Error ? e.message : String(e);
        this.add(path, `could not read ${JSON.stringify(value)} as ${unit} (${why})`, value);
        return undefined;
      }
    }
    this.add(path, `expected a number of ${unit} or a string such as "4k7"`, value);
    return undefined;
  }

  number(
    path: string,
    value: unknown,
    range: { min: number; max: number; exclusiveMin?: boolean },
    what: string,
  ): number | undefined {
    if (typeof value !== "number" || !Number.isFinite(value)) {
      this.add(path, `expected ${what} as a finite number`, value);
      return undefined;
    }
    const lowOk = range.exclusiveMin === true ? value > range.min : value >= range.min;
    if (!lowOk || value > range.max) {
      const lo = range.exclusiveMin === true ? `greater than ${range.min}` : `at least ${range.min}`;
      this.add(path, `expected ${what} ${lo} and at most ${range.max}`, value);
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
      const f = this.quantity(path, value, "Hz");
      return f === undefined ? undefined : [f];
    }
    if (!Array.isArray(value) || value.length !== 2) {
      this.add(path, "expected two edge frequencies [low, high] for this response", value);
      return undefined;
    }
    const lo = this.quantity(`${path}.0`, value[0], "Hz");
    const hi = this.quantity(`${path}.1`, value[1], "Hz");
    if (lo === undefined || hi === undefined) return undefined;
    if (!(lo < hi)) {
      this.add(path, "the low edge must be below the high edge", value);
      return undefined;
    }
    return [lo, hi];
  }
}

type Bands = Pick<DesignSpec, "response" | "passbandHz" | "stopbandHz" | "passbandTopHz" | "maxLossDb" | "minAttenuationDb">;
type GainPart = Pick<DesignSpec, "gain" | "polarity" | "gainToleranceDb">;
type FamilyPart = Pick<DesignSpec, "family" | "priority" | "order">;
type TopologyPart = Pick<DesignSpec, "topology" | "stageTopologies">;
type PartsPart = Pick<
  DesignSpec,
  "capacitorSeries" | "resistorSeries" | "capacitorTolerance" | "resistorTolerance" | "resistorRange" | "capacitorRange"
>;
/** A part of the spec as read, with `undefined` where a field had an issue. */
type AsRead<T> = { -readonly [K in keyof T]: T[K] | undefined };

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
  const upper = passbandHz?.[passbandHz.length - 1];
  if (top !== undefined && upper !== undefined && !(top > upper)) {
    r.add("passband.topHz", `must lie above the upper passband edge (${upper} Hz)`, pb["topHz"]);
    return null;
  }
  return top ?? null;
}

/** The response, the two bands and their limits. */
function readBands(r: Reader, spec: Raw): AsRead<Bands> {
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
    maxLossDb = r.number("passband.maxLossDb", pb["maxLossDb"], { min: 0, max: 20, exclusiveMin: true }, "a loss in dB");
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
function readGain(r: Reader, g: unknown): GainPart {
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
function readFamily(r: Reader, spec: Raw): FamilyPart {
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
function readTopology(r: Reader, t: unknown): TopologyPart {
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
] as const;

/** The part series, their tolerances and the value windows (`parts`). */
function readParts(r: Reader, parts: unknown): PartsPart {
  let capacitorSeries: SeriesName = "E12";
  let resistorSeries: SeriesName = "E96";
  const window = { rMin: 1e3, rMax: 1e5, cMin: 1e-10, cMax: 1e-5 };
  let capacitorTolerance: number | undefined;
  let resistorTolerance: number | undefined;
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
    const q = (key: string, unit: string, fallback: number): number =>
      parts[key] === undefined ? fallback : (r.quantity(`parts.${key}`, parts[key], unit) ?? fallback);
    window.rMin = q("resistorMinOhm", "Ω", window.rMin);
    window.rMax = q("resistorMaxOhm", "Ω", window.rMax);
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
    capacitorTolerance: capacitorTolerance ?? seriesTolerance(capacitorSeries),
    resistorTolerance: resistorTolerance ?? seriesTolerance(resistorSeries),
    resistorRange: Object.freeze({ min: window.rMin, max: window.rMax }),
    capacitorRange: Object.freeze({ min: window.cMin, max: window.cMax }),
  };
}

/** The op-amp: `"ideal"` or a single-pole model `{ a0, gbwHz }`. */
function readOpamp(r: Reader, oa: unknown): OpAmpModel {
  if (oa === undefined || oa === "ideal") return { kind: "ideal" };
  if (!isObject(oa)) {
    r.add("opamp", 'expected "ideal" or an object { a0, gbwHz }', oa);
    return { kind: "ideal" };
  }
  r.unknownKeys(oa, ["a0", "gbwHz"], "opamp.");
  const a0 = r.number("opamp.a0", oa["a0"], { min: 10, max: 1e9 }, "an open-loop gain in V/V");
  const gbw = r.quantity("opamp.gbwHz", oa["gbwHz"], "Hz");
  return a0 !== undefined && gbw !== undefined ? { kind: "single-pole", a0, gbwHz: gbw } : { kind: "ideal" };
}

/** Read a whole spec: every issue, and the canonical spec when there is none. */
function readSpec(spec: unknown): { readonly issues: readonly Issue[]; readonly spec: DesignSpec | null } {
  if (!isObject(spec)) return { issues: [{ path: "", message: "expected a specification object", received: spec }], spec: null };
  const r = new Reader();
  r.unknownKeys(spec, TOP_KEYS, "");
  const bands = readBands(r, spec);
  const gain = readGain(r, spec["gain"]);
  const family = readFamily(r, spec);
  const topology = readTopology(r, spec["topology"]);
  const parts = readParts(r, spec["parts"]);
  const opamp = readOpamp(r, spec["opamp"]);
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
    })),
  };
}

/** A copy of a received value that is plain JSON-safe data: non-finite numbers become their text (`"NaN"`, `"Infinity"`). */
function jsonSafe(value: unknown, seen = new Set<unknown>()): unknown {
  if (typeof value === "number") return Number.isFinite(value) ? value : String(value);
  if (typeof value !== "object" || value === null) return value;
  if (seen.has(value)) return "[circular]";
  seen.add(value);
  if (Array.isArray(value)) return value.map((v) => jsonSafe(v, seen));
  return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, jsonSafe(v, seen)]));
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

function getTopologySafe(id: string): unknown {
  try {
    return getTopology(id);
  } catch {
    return undefined;
  }
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
  const v = value;
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
  return value as unknown as DesignSpec;
}

/**
 * Turn a canonical {@link DesignSpec} back into the {@link FilterSpec} a user
 * would write (numbers only), so a result can be re-designed or stored.
 *
 * @param spec - a validated spec
 * @returns an equivalent {@link FilterSpec} that {@link validateSpec} maps back to `spec`
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
      capacitorTolerance: spec.capacitorTolerance,
      resistorTolerance: spec.resistorTolerance,
      resistorMinOhm: spec.resistorRange.min,
      resistorMaxOhm: spec.resistorRange.max,
      capacitorMinF: spec.capacitorRange.min,
      capacitorMaxF: spec.capacitorRange.max,
    },
    opamp,
  };
}
