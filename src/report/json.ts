/**
 * Versioned JSON for design results, and reading it back with validation.
 *
 * The file is `{ "formatVersion": 3, "generator": "filterwright", "checksum":
 * "fnv1a64:...", "result": ... }` with the result exactly as `designFilter`
 * returns it (plain numbers, strings, arrays and objects). Reading a file
 * trusts nothing in it:
 *
 * - the text is at most {@link JSON_MAX_CHARS} characters and nests at most
 *   {@link JSON_MAX_DEPTH} arrays and objects deep (checked by one scan of the
 *   text before parsing, so neither a huge nor a deeply nested file costs
 *   more than a linear pass);
 * - every object has its list of accepted fields, and an unknown or misspelt
 *   field is refused with its path (`result.spec.maxLossdb`);
 * - the stored spec is re-validated and must already be canonical;
 * - each stage's parts are exactly its topology's components, each value a
 *   member of the spec's series (IEC 60063, `isInSeries`);
 * - the nominal verification (mask figures and margins, polarity, stability,
 *   `meetsSpec`, the clipping check, the response curve) and each stage's
 *   as-built figures are recomputed from the parts with the design layer's
 *   own checks and compared with the stored ones to a relative 1e-9 (plus
 *   1e-9 absolute; src/design/recheck.ts); a difference names the field, its
 *   stored value and the recomputed one;
 * - the yield record must agree with itself and the spec (passed / boards,
 *   the interval, the target, the seed);
 * - finally the checksum (64-bit FNV-1a of the result's compact JSON) must
 *   match, which catches an edit of a field that cannot be recomputed (a
 *   message, the Monte Carlo counts). It is a guard against accidental edits,
 *   not a signature: whoever edits a file on purpose can recompute it, and
 *   the re-verification above is what still holds then.
 *
 * Files of format version 2 (no checksum) are read with every check but the
 * checksum. Every walk over the data is iterative (explicit stacks), so no
 * input can exhaust the call stack.
 *
 * FNV-1a: G. Fowler, L. C. Noll, K.-P. Vo, D. Eastlake, "The FNV
 * Non-Cryptographic Hash Algorithm", IETF draft-eastlake-fnv-17, 2019,
 * section 2 (64-bit offset basis 0xcbf29ce484222325, prime 2^40 + 0x1b3).
 *
 * @module
 */
import { ParseError, type InvalidArgumentError } from "../errors.ts";
import type { DesignResult } from "../design/index.ts";
import { checkDesignResult, deepFreeze, registerDesignResult, requireDesignResult } from "../design/check.ts";
import { designBundle } from "../design/display.ts";
import { withDisplay } from "../display.ts";
import { recheckDesign } from "../design/recheck.ts";

/** The format version written by {@link toJson}; {@link fromJson} also reads version 2 (without the checksum). */
export const DESIGN_FORMAT_VERSION = 3;

/** Longest JSON text {@link fromJson} reads, in characters (a 16-stage design with signal levels is about 150,000). */
export const JSON_MAX_CHARS = 4_000_000;

/** Deepest nesting of arrays and objects {@link fromJson} reads (a design result nests 6 deep). */
export const JSON_MAX_DEPTH = 32;

const TOP_KEYS = ["formatVersion", "generator", "checksum", "result"];

/**
 * 64-bit FNV-1a of a string's UTF-8 bytes, as 16 hex digits (four 16-bit
 * limbs, so the multiplication by 2^40 + 0x1b3 stays exact in doubles).
 */
function fnv1a64(text: string): string {
  const bytes = new TextEncoder().encode(text);
  let h0 = 0x2325;
  let h1 = 0x8422;
  let h2 = 0x9ce4;
  let h3 = 0xcbf2;
  for (let i = 0; i < bytes.length; i++) {
    h0 ^= bytes[i] as number;
    const t0 = h0 * 0x1b3;
    const t1 = h1 * 0x1b3 + (t0 >>> 16);
    const t2 = h2 * 0x1b3 + (h0 << 8) + (t1 >>> 16);
    const t3 = h3 * 0x1b3 + (h1 << 8) + (t2 >>> 16);
    h0 = t0 & 0xffff;
    h1 = t1 & 0xffff;
    h2 = t2 & 0xffff;
    h3 = t3 & 0xffff;
  }
  return [h3, h2, h1, h0].map((x) => x.toString(16).padStart(4, "0")).join("");
}

/** The checksum field of a result: `"fnv1a64:"` and the hash of its compact JSON. */
function checksumOf(result: unknown): string {
  return `fnv1a64:${fnv1a64(JSON.stringify(result))}`;
}

/**
 * The deepest nesting of `[` and `{` outside strings, stopping once it passes `limit` (one linear scan).
 *
 * @param text - JSON text
 * @param limit - depth beyond which the scan stops
 * @returns the depth found (at most `limit + 1`)
 * @internal
 */
export function nestingDepth(text: string, limit: number): number {
  let depth = 0;
  let deepest = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text.charCodeAt(i);
    if (inString) {
      if (ch === 0x5c) i++;
      else if (ch === 0x22) inString = false;
    } else if (ch === 0x22) inString = true;
    else if (ch === 0x5b || ch === 0x7b) {
      depth++;
      if (depth > deepest) {
        deepest = depth;
        if (deepest > limit) return deepest;
      }
    } else if (ch === 0x5d || ch === 0x7d) depth--;
  }
  return deepest;
}

/**
 * Serialise a design result to versioned JSON text.
 *
 * @param result - a design
 * @returns pretty-printed JSON (2-space indent) ending in a newline
 * @throws {@link InvalidArgumentError} when `result` is not a design result (the path names the first bad field)
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * JSON.parse(toJson(designFilter(spec))).formatVersion; //=> 3
 * ```
 */
export function toJson(result: DesignResult): string {
  requireDesignResult("toJson", result);
  const file = { formatVersion: DESIGN_FORMAT_VERSION, generator: "filterwright", checksum: checksumOf(result), result };
  return `${JSON.stringify(file, null, 2)}\n`;
}

/**
 * Read a design result from JSON written by {@link toJson}, re-verifying it
 * (see the module header: accepted fields, parts in their series, the
 * nominal verification recomputed from the parts, the checksum).
 *
 * @param text - JSON text, at most {@link JSON_MAX_CHARS} characters and {@link JSON_MAX_DEPTH} levels deep
 * @returns the design result (deeply frozen)
 * @throws {@link ParseError} for text over the size or depth limit, invalid
 *   JSON, an unknown `formatVersion`, a missing, unknown or malformed field,
 *   a part not in its series, a stored figure that differs from the one
 *   recomputed from the parts, or a checksum that does not match (the
 *   error's `path` names the field)
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * const r = designFilter(spec);
 * fromJson(toJson(r)).stages.length === r.stages.length; //=> true
 * ```
 */
export function fromJson(text: string): DesignResult {
  const fail = (path: string, message: string, ...received: unknown[]): never => {
    throw new ParseError({ fn: "fromJson", path, message, ...(received.length > 0 ? { received: received[0] } : {}) });
  };
  if (typeof text !== "string") fail("", "expected JSON text", text);
  if (text.length > JSON_MAX_CHARS) fail("", `the text is ${text.length} characters, over the limit of ${JSON_MAX_CHARS} (JSON_MAX_CHARS)`);
  const depth = nestingDepth(text, JSON_MAX_DEPTH);
  if (depth > JSON_MAX_DEPTH) fail("", `the data nests deeper than the limit of ${JSON_MAX_DEPTH} levels (JSON_MAX_DEPTH)`);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    fail("", `not valid JSON (${e instanceof Error ? e.message : String(e)})`);
  }
  if (typeof data !== "object" || data === null || Array.isArray(data)) fail("", "expected an object", data);
  const top = data as Record<string, unknown>;
  const version = top["formatVersion"];
  if (version !== DESIGN_FORMAT_VERSION && version !== 2) {
    fail("formatVersion", `expected format version ${DESIGN_FORMAT_VERSION} (or 2)`, version);
  }
  for (const k of Object.keys(top)) {
    if (!TOP_KEYS.includes(k) || (k === "checksum" && version === 2)) fail(k, `unknown field; accepted fields here are ${(version === 2 ? TOP_KEYS.filter((x) => x !== "checksum") : TOP_KEYS).map((x) => JSON.stringify(x)).join(", ")}`);
  }
  if (top["generator"] !== "filterwright") fail("generator", 'expected "filterwright"', top["generator"]);
  if (version === DESIGN_FORMAT_VERSION && typeof top["checksum"] !== "string") fail("checksum", 'expected the checksum string ("fnv1a64:" and 16 hex digits)', top["checksum"]);
  const make = (d: ConstructorParameters<typeof ParseError>[0]): ParseError => new ParseError(d);
  const result = checkDesignResult("fromJson", top["result"], { prefix: "result", make, strict: true });
  recheckDesign("fromJson", result, result.spec, { prefix: "result", make });
  if (version === DESIGN_FORMAT_VERSION) {
    const expected = checksumOf(top["result"]);
    if (top["checksum"] !== expected) {
      fail("checksum", `the result was changed after it was written (its checksum is ${expected}); every figure that can be recomputed from the parts agrees, so the change is in a field that cannot be (a message, a reason, the yield counts): write the file again with toJson`, top["checksum"]);
    }
  }
  return registerDesignResult(deepFreeze(withDisplay(result, designBundle)));
}
