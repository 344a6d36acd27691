/**
 * A passive LC ladder design as versioned JSON, and back: what was asked
 * (the spec as a user writes it, the options with every default filled in)
 * and what was built (family, order, form, every part's value, the nominal
 * figures and the boards' yield).
 *
 * Reading re-verifies the design by making it again: `designLcLadder` is
 * deterministic for a spec, its options and its seed, so the stored parts
 * and figures must be the ones the same spec and options give now. Text over
 * {@link JSON_MAX_CHARS} characters or {@link JSON_MAX_DEPTH} levels is
 * refused before it is parsed, every object's fields are checked (an
 * unknown field is refused with its path), and a part or figure that differs
 * from the re-made design is a `ParseError` naming it: the file was edited,
 * or written by a version of the library that designs differently.
 *
 * @module
 */
import { designLcLadder } from "../design/lc-ladder.ts";
import type { LcLadderDesign } from "../design/lc-ladder-types.ts";
import { specToInput } from "../design/spec.ts";
import { FilterwrightError, InvalidArgumentError, ParseError } from "../errors.ts";
import { JSON_MAX_CHARS, JSON_MAX_DEPTH, nestingDepth } from "./json.ts";

/** The `format` field of the files {@link lcLadderToJson} writes. */
export const LC_LADDER_FORMAT = "filterwright-lc-ladder";
/** Their `formatVersion`. */
export const LC_LADDER_FORMAT_VERSION = 1;

const TOP = ["format", "formatVersion", "spec", "options", "family", "order", "form", "parts", "verification"];
const VERIFICATION = ["passbandLossDb", "stopbandAttenuationDb", "marginDb", "meetsSpec", "yield"];
const YIELD = ["fraction", "lower95", "upper95", "boards", "passed", "met"];

/** The figures a file records of a design (the part of it that is compared on reading). */
function recordOf(d: LcLadderDesign): Record<string, unknown> {
  const v = d.verification;
  const y = v.yield;
  return {
    format: LC_LADDER_FORMAT,
    formatVersion: LC_LADDER_FORMAT_VERSION,
    spec: specToInput(d.spec),
    options: d.options,
    family: d.family,
    order: d.order,
    form: d.form,
    parts: Object.fromEntries(d.asBuilt.components.map((c) => [c.designator, c.value])),
    verification: {
      passbandLossDb: v.passbandLossDb,
      stopbandAttenuationDb: v.stopbandAttenuationDb,
      marginDb: v.marginDb,
      meetsSpec: v.meetsSpec,
      yield: { fraction: y.fraction, lower95: y.lower95, upper95: y.upper95, boards: y.boards, passed: y.passed, met: y.met },
    },
  };
}

/**
 * Serialise a passive LC ladder design to versioned JSON text.
 *
 * @param design - a design from `designLcLadder`
 * @returns pretty-printed JSON (2-space indent) ending in a newline
 * @throws {@link InvalidArgumentError} when `design` is not a ladder design
 * @example
 * ```ts
 * JSON.parse(lcLadderToJson(designLcLadder(spec))).format; //=> "filterwright-lc-ladder"
 * ```
 */
export function lcLadderToJson(design: LcLadderDesign): string {
  const d = design as Partial<LcLadderDesign> | null;
  if (d === null || typeof d !== "object" || typeof d.options !== "object" || !Array.isArray(d.asBuilt?.components) || typeof d.verification?.yield !== "object" || typeof d.spec !== "object") {
    throw new InvalidArgumentError({ fn: "lcLadderToJson", path: "design", received: design, message: "expected a design from designLcLadder" });
  }
  return `${JSON.stringify(recordOf(design), null, 2)}\n`;
}

const fail = (path: string, message: string, ...received: unknown[]): never => {
  throw new ParseError({ fn: "lcLadderFromJson", path, message, ...(received.length > 0 ? { received: received[0] } : {}) });
};

/** An object's own fields: exactly those of `allowed` (all required). */
function fields(value: unknown, path: string, allowed: readonly string[]): Record<string, unknown> {
  if (value === null || typeof value !== "object" || Array.isArray(value)) fail(path, "expected an object", value);
  const o = value as Record<string, unknown>;
  for (const k of Object.keys(o)) if (!allowed.includes(k)) fail(path === "" ? k : `${path}.${k}`, `unknown field; expected ${allowed.join(", ")}`, o[k]);
  for (const k of allowed) if (!Object.hasOwn(o, k)) fail(path === "" ? k : `${path}.${k}`, "missing field");
  return o;
}

/** Whether two stored numbers agree: the same bits, or within `rel` (the figures printed with 17 digits round-trip exactly). */
function same(a: unknown, b: number, rel: number): boolean {
  return typeof a === "number" && (Object.is(a, b) || Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b)));
}

/**
 * Read a passive LC ladder design from JSON written by {@link lcLadderToJson},
 * re-verifying it by designing it again from its spec and options (see the
 * module header).
 *
 * @param text - JSON text, at most {@link JSON_MAX_CHARS} characters and {@link JSON_MAX_DEPTH} levels deep
 * @returns the design, made again (frozen, with its notebook display)
 * @throws {@link ParseError} for text over the size or depth limit, invalid
 *   JSON, another format or version, a missing or unknown field, a spec or
 *   options the designer refuses, or a stored part or figure that differs
 *   from the re-made design (the `path` names it)
 * @example
 * ```ts
 * const d = designLcLadder(spec);
 * lcLadderFromJson(lcLadderToJson(d)).verification.marginDb === d.verification.marginDb; //=> true
 * ```
 */
export function lcLadderFromJson(text: string): LcLadderDesign {
  if (typeof text !== "string") fail("", "expected JSON text", text);
  if (text.length > JSON_MAX_CHARS) fail("", `the text is ${text.length} characters, over the limit of ${JSON_MAX_CHARS} (JSON_MAX_CHARS)`);
  if (nestingDepth(text, JSON_MAX_DEPTH) > JSON_MAX_DEPTH) fail("", `the data nests deeper than the limit of ${JSON_MAX_DEPTH} levels (JSON_MAX_DEPTH)`);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    fail("", `not valid JSON (${e instanceof Error ? e.message : String(e)})`);
  }
  const top = fields(data, "", TOP);
  if (top["format"] !== LC_LADDER_FORMAT) fail("format", `expected "${LC_LADDER_FORMAT}" (a file from lcLadderToJson; a cascade design is read by fromJson)`, top["format"]);
  if (top["formatVersion"] !== LC_LADDER_FORMAT_VERSION) fail("formatVersion", `expected ${LC_LADDER_FORMAT_VERSION}`, top["formatVersion"]);
  const parts = top["parts"];
  if (parts === null || typeof parts !== "object" || Array.isArray(parts)) fail("parts", "expected an object of part values by designator", parts);
  const ver = fields(top["verification"], "verification", VERIFICATION);
  const yieldRecord = fields(ver["yield"], "verification.yield", YIELD);
  let d: LcLadderDesign;
  try {
    d = designLcLadder(top["spec"] as never, top["options"] as never);
  } catch (e) {
    if (!(e instanceof FilterwrightError)) throw e;
    const where = e.path.startsWith("options") ? e.path : e.path === "" ? "spec" : `spec.${e.path.replace(/^spec\.?/, "")}`;
    return fail(where.replace(/\.$/, ""), `the stored spec or options cannot be designed: ${e.message}`);
  }
  const redo = recordOf(d);
  for (const k of ["family", "order", "form"] as const) {
    if (top[k] !== redo[k]) fail(k, `the stored ${k} differs from the design these spec and options give (${String(redo[k])}): an edited file, or one from a version that designs differently`, top[k]);
  }
  const p = parts as Record<string, unknown>;
  const built = redo["parts"] as Record<string, number>;
  for (const k of Object.keys(p)) if (!Object.hasOwn(built, k)) fail(`parts.${k}`, `no such part in the design these spec and options give (its parts: ${Object.keys(built).join(", ")})`, p[k]);
  for (const [k, v] of Object.entries(built)) {
    if (!same(p[k], v, 0)) fail(`parts.${k}`, `the stored value differs from the design these spec and options give (${v}): an edited file, or one from a version that designs differently`, p[k]);
  }
  const rv = redo["verification"] as Record<string, unknown>;
  for (const k of ["passbandLossDb", "stopbandAttenuationDb", "marginDb"]) {
    if (!same(ver[k], rv[k] as number, 1e-12)) fail(`verification.${k}`, `the stored figure differs from the one the parts give (${String(rv[k])})`, ver[k]);
  }
  if (ver["meetsSpec"] !== rv["meetsSpec"]) fail("verification.meetsSpec", `the stored verdict differs from the one the parts give (${String(rv["meetsSpec"])})`, ver["meetsSpec"]);
  const ry = rv["yield"] as Record<string, unknown>;
  for (const k of YIELD) {
    const ok = typeof ry[k] === "number" ? same(yieldRecord[k], ry[k] as number, 1e-12) : yieldRecord[k] === ry[k];
    if (!ok) fail(`verification.yield.${k}`, `the stored figure differs from the one the boards give (${String(ry[k])})`, yieldRecord[k]);
  }
  return d;
}
