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
import { ParseError, type InvalidArgumentError } from "../errors.ts";
import type { DesignResult } from "../design/index.ts";
import { checkDesignResult, deepFreeze, registerDesignResult, requireDesignResult } from "../design/check.ts";

/** The format version written by {@link toJson} and accepted by {@link fromJson}. */
export const DESIGN_FORMAT_VERSION = 2;

/**
 * Serialise a design result to versioned JSON text.
 *
 * @param result - a design
 * @returns pretty-printed JSON (2-space indent) ending in a newline
 * @throws {@link InvalidArgumentError} when `result` is not a design result (the path names the first bad field)
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * JSON.parse(toJson(designFilter(spec))).formatVersion; //=> 2
 * ```
 */
export function toJson(result: DesignResult): string {
  requireDesignResult("toJson", result);
  return `${JSON.stringify({ formatVersion: DESIGN_FORMAT_VERSION, generator: "filterwright", result }, null, 2)}\n`;
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
  const fail = (path: string, message: string, ...received: unknown[]): never => {
    throw new ParseError({ fn: "fromJson", path, message, ...(received.length > 0 ? { received: received[0] } : {}) });
  };
  if (typeof text !== "string") fail("", "expected JSON text", text);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    fail("", `not valid JSON (${e instanceof Error ? e.message : String(e)})`);
  }
  if (typeof data !== "object" || data === null || Array.isArray(data)) fail("", "expected an object", data);
  const top = data as Record<string, unknown>;
  if (top["formatVersion"] !== DESIGN_FORMAT_VERSION) {
    fail("formatVersion", `expected format version ${DESIGN_FORMAT_VERSION}`, top["formatVersion"]);
  }
  const result = checkDesignResult("fromJson", top["result"], { prefix: "result", make: (d) => new ParseError(d) });
  return registerDesignResult(deepFreeze(result));
}
