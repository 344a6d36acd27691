/**
 * From options to a spec and back: the spec options merged over a base spec
 * (a file, a scenario, or nothing), and the spec's issues told in the terms
 * the user typed: the flag and its value when a flag set the field, the file
 * and the field's path when the file did, "--flag is required" when neither.
 *
 * @module
 */
import { describeValue, type Issue } from "../errors.ts";
import type { GivenOption } from "./args.ts";
import { OPTIONS, type OptionDef } from "./options.ts";
import { didYouMean } from "./suggest.ts";
import { quoted } from "./values.ts";

/** A plain object (not null, not an array). */
export function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

/** A copy of `obj` with `value` at the dotted `path` (objects along the way copied, never mutated; `undefined` deletes). */
function withPath(obj: Record<string, unknown>, path: readonly string[], value: unknown): Record<string, unknown> {
  const [head, ...rest] = path as [string, ...string[]];
  const out = { ...obj };
  if (rest.length === 0) {
    if (value === undefined) delete out[head];
    else out[head] = value;
    return out;
  }
  const inner = out[head];
  out[head] = withPath(isPlainObject(inner) ? inner : {}, rest, value);
  return out;
}

/** The value at a dotted path, or undefined. */
export function valueAt(obj: unknown, path: string): unknown {
  let cur = obj;
  for (const k of path.split(".")) {
    if (Array.isArray(cur) && /^\d+$/.test(k)) cur = cur[Number(k)];
    else if (isPlainObject(cur)) cur = cur[k];
    else return undefined;
  }
  return cur;
}

/** Default open-loop gain of a real op-amp given by --gbw alone (V/V; a typical general-purpose op-amp, common practice, no source). */
const DEFAULT_A0 = 1e5;

/**
 * Merge the spec options over a base spec.
 *
 * @param base - the spec from a file or a scenario (`{}` for none); not mutated
 * @param options - the options given
 * @returns the merged spec and any problem of combination (`--a0` without an op-amp to apply to)
 */
export function specFromOptions(base: Record<string, unknown>, options: ReadonlyMap<string, GivenOption>): { spec: Record<string, unknown>; problems: string[] } {
  let spec = base;
  const problems: string[] = [];
  for (const [name, o] of options) {
    const path = o.def.paths?.[0];
    if (path === undefined) continue;
    if (name === "gbw" && o.value === "ideal") {
      spec = withPath(spec, ["opamp"], "ideal");
      continue;
    }
    spec = withPath(spec, path.split("."), o.value);
    if (name === "gain") spec = withPath(spec, ["gain", "vPerV"], undefined);
    if (name === "gain-vv") spec = withPath(spec, ["gain", "db"], undefined);
  }
  const gbw = options.get("gbw");
  if (gbw !== undefined && gbw.value !== "ideal" && valueAt(spec, "opamp.a0") === undefined) spec = withPath(spec, ["opamp", "a0"], DEFAULT_A0);
  if (options.has("a0") && gbw === undefined && !isPlainObject(base["opamp"])) {
    problems.push("--a0 needs --gbw as well (the op-amp's gain-bandwidth, e.g. --gbw 10M)");
  }
  return { spec, problems };
}

/** Where the base spec came from, for messages. */
export interface SpecSource {
  /** The file name (or scenario name) of the base spec; undefined when the options are the whole spec. */
  readonly name: string | undefined;
  /** The base spec. */
  readonly base: Record<string, unknown>;
  /** The options given. */
  readonly options: ReadonlyMap<string, GivenOption>;
}

const SPEC_OPTIONS = OPTIONS.filter((o) => o.paths !== undefined);

/** The option that sets the field at `path` or a field above it (the longest such), if any. */
function ownerOf(path: string): OptionDef | undefined {
  let best: OptionDef | undefined;
  let bestLength = -1;
  for (const o of SPEC_OPTIONS) {
    for (const q of o.paths ?? []) {
      if ((path === q || path.startsWith(`${q}.`)) && q.length > bestLength) {
        best = o;
        bestLength = q.length;
      }
    }
  }
  return best;
}

/** The required options whose fields lie at or under `path` (a missing `passband` needs --pass and --pass-loss). */
function requiredUnder(path: string): OptionDef[] {
  return SPEC_OPTIONS.filter((o) => o.required === true && (o.paths ?? []).some((q) => q === path || q.startsWith(`${path}.`) || path.startsWith(`${q}.`)));
}

/** Field names (whole dotted paths, and their distinctive last parts) in a message, and the flags that set them. */
const FIELD_WORDS: readonly [RegExp, string][] = (() => {
  const words: [string, string][] = [];
  const last = new Map<string, string[]>();
  for (const o of SPEC_OPTIONS) {
    for (const q of o.paths ?? []) {
      if (!q.includes(".")) continue;
      words.push([q, `--${o.name}`]);
      const tail = q.slice(q.lastIndexOf(".") + 1);
      last.set(tail, [...(last.get(tail) ?? []), o.name]);
    }
  }
  for (const [tail, names] of last) if (names.length === 1 && /[A-Z]/.test(tail)) words.push([tail, `--${names[0] as string}`]);
  words.sort((a, b) => b[0].length - a[0].length);
  return words.map(([w, f]) => [new RegExp(`(?<![\\w.-])${w.replace(/\./g, "\\.")}(?![\\w])`, "g"), f] as [RegExp, string]);
})();

/** A library message without the hints meant for callers of the library (`pass allowNegative`), which neither a flag nor a spec file can follow. */
function withoutLibraryHints(message: string): string {
  return message.replace(/\s*\(pass allowNegative to accept [^)]*\)/g, "; write it without the minus sign").replace(/\s*\(pass allow\w+ to accept [^)]*\)/g, "");
}

/**
 * A library message said for the command line: spec field names become the
 * flags that set them, and hints meant for library callers (`pass
 * allowNegative`) are dropped.
 *
 * @param message - the library's message
 * @returns the message in command-line terms
 */
export function inFlagTerms(message: string): string {
  let m = withoutLibraryHints(message).replace("two edge frequencies [low, high]", "two edge frequencies separated by a comma, low first (e.g. 300,3.4k)");
  for (const [re, flag] of FIELD_WORDS) m = m.replace(re, flag);
  return m;
}

/** The "did you mean" of an unknown field of a spec file, from the accepted fields its message lists. */
function fieldSuggestion(issue: Issue): string {
  if (!issue.message.startsWith("unknown field")) return "";
  const accepted = [...issue.message.matchAll(/"([^"]+)"/g)].map((m) => m[1] as string);
  return didYouMean(issue.path.slice(issue.path.lastIndexOf(".") + 1), accepted);
}

/** The example of a flag, after a message from the spec check that gives none. */
function exampleAfter(def: OptionDef, message: string): string {
  return def.values !== undefined || message.includes("e.g.") ? "" : `, e.g. --${def.name} ${def.example}`;
}

/** "Did you mean" for a name the spec rejected, when the field takes names. */
function suggestion(def: OptionDef | undefined, received: unknown): string {
  if (def?.values === undefined || typeof received !== "string") return "";
  const values = def.values();
  return values.includes(received) ? "" : didYouMean(received, values);
}

/**
 * One line per spec issue, in the terms the user typed.
 *
 * @param issues - the spec's issues (from `checkSpec` or a `SpecError`)
 * @param source - the base spec and the options
 * @param skip - options already reported (their fields' issues are not repeated)
 * @returns the lines
 */
export function issueLines(issues: readonly Issue[], source: SpecSource, skip: ReadonlySet<string> = new Set()): string[] {
  const lines: string[] = [];
  const required = new Set<string>();
  for (const issue of issues) {
    const def = ownerOf(issue.path);
    if (def !== undefined && skip.has(def.name)) continue;
    const given = def === undefined ? undefined : source.options.get(def.name);
    if (given !== undefined) {
      const stage = /^topology\.(\d+)$/.exec(issue.path);
      const which = stage === null ? "" : ` (entry ${Number(stage[1]) + 1})`;
      const received = stage === null ? issue.received : valueAt(source.options.get("topology")?.value, stage[1] as string);
      const message = inFlagTerms(issue.message);
      lines.push(`--${given.def.name} ${quoted(given.text)}${which}: ${message}${exampleAfter(given.def, message)}${suggestion(def, received)}`);
      continue;
    }
    const fromBase = valueAt(source.base, issue.path) !== undefined || issue.path === "";
    if (!fromBase) {
      const needed = requiredUnder(issue.path).filter((o) => !skip.has(o.name) && !source.options.has(o.name));
      if (needed.length > 0) {
        for (const o of needed) {
          if (required.has(o.name)) continue;
          required.add(o.name);
          const alt = source.name === undefined ? "" : ` (or ${o.paths?.[0]} in ${source.name})`;
          lines.push(`--${o.name} is required${alt}: ${o.what}, e.g. --${o.name} ${o.example}`);
        }
        continue;
      }
    }
    const got = "received" in issue && issue.received !== undefined ? ` (received ${describeValue(issue.received)})` : "";
    const where = issue.path === "" ? "" : `${issue.path}: `;
    if (source.name !== undefined && fromBase) {
      const override = def === undefined ? "" : ` (correct it in ${source.name} or override it with --${def.name})`;
      lines.push(`${source.name}: ${where}${withoutLibraryHints(issue.message)}${got}${suggestion(def, issue.received)}${fieldSuggestion(issue)}${override}`);
    } else {
      lines.push(`${def === undefined ? where : `--${def.name}: `}${inFlagTerms(issue.message)}${got}${suggestion(def, issue.received)}`);
    }
  }
  return lines;
}
