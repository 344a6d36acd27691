/**
 * The shape check of a scaled (or as-built) ladder that every public function
 * taking one runs first: finite positive terminations, port nodes, and
 * components with designators, kinds, finite positive values, nodes and
 * (as built) finite non-negative loss resistances.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requirePositive } from "../validate.ts";
import type { LadderComponent } from "./scaled-types.ts";

/** Node names a ladder's components may not use: the circuit's source node. */
export const RESERVED_LADDER_NODES: readonly string[] = Object.freeze(["src"]);

/** What every function that takes a ladder reads from it. */
export interface LadderNetworkShape {
  /** Source resistance (ohms). */
  readonly sourceOhms: number;
  /** Load resistance (ohms). */
  readonly loadOhms: number;
  /** Node where the source resistance connects. */
  readonly inputNode: string;
  /** Node across the load. */
  readonly outputNode: string;
  /** Components, with an optional series loss resistance (ohms). */
  readonly components: readonly (LadderComponent & { readonly seriesOhms?: number })[];
}

function fail(fn: string, path: string, received: unknown, message: string): never {
  throw new InvalidArgumentError({ fn, path, received, message });
}

function requireNode(fn: string, path: string, value: unknown): string {
  if (typeof value !== "string" || !/^[A-Za-z0-9_]+$/.test(value)) {
    fail(fn, path, value, "expected a node name made of letters, digits and underscores (\"0\" is ground)");
  }
  if (RESERVED_LADDER_NODES.includes(value)) fail(fn, path, value, `"${value}" is the source node of the ladder's circuit; rename it`);
  return value;
}

function checkComponent(fn: string, path: string, raw: unknown, seen: Set<string>): void {
  if (raw === null || typeof raw !== "object" || Array.isArray(raw)) fail(fn, path, raw, "expected a component { designator, kind, value, a, b, arm }");
  const c = raw as Record<string, unknown>;
  const d = c["designator"];
  if (typeof d !== "string" || !/^[A-Za-z0-9_]+$/.test(d)) fail(fn, `${path}.designator`, d, "expected a designator made of letters, digits and underscores");
  if (seen.has(d.toLowerCase())) fail(fn, `${path}.designator`, d, "duplicates another component's designator");
  seen.add(d.toLowerCase());
  if (c["kind"] !== "L" && c["kind"] !== "C") fail(fn, `${path}.kind`, c["kind"], 'expected "L" or "C"');
  requirePositive(fn, `${path}.value`, c["value"]);
  const a = requireNode(fn, `${path}.a`, c["a"]);
  const b = requireNode(fn, `${path}.b`, c["b"]);
  if (a === b) fail(fn, `${path}.b`, b, "expected a node other than the first one (a component between one node is shorted)");
  const r = c["seriesOhms"];
  if (r !== undefined && (typeof r !== "number" || !Number.isFinite(r) || r < 0)) {
    fail(fn, `${path}.seriesOhms`, r, "expected a finite loss resistance of zero or more ohms");
  }
}

/**
 * Check a scaled or as-built ladder (internal form that names the calling function).
 *
 * @param fn - public function name for messages
 * @param path - dotted path of the argument, e.g. `"ladder"`
 * @param value - the value to check
 * @returns the value, typed
 * @throws {@link InvalidArgumentError} at the first problem, with its path
 * @example
 * ```ts
 * requireLadderNetwork("ladderCircuit", "ladder", { sourceOhms: 50, loadOhms: 50, inputNode: "in", outputNode: "out",
 *   components: [{ designator: "L1", kind: "L", value: 1e-6, a: "in", b: "out", arm: 1 }] }).loadOhms; //=> 50
 * ```
 */
export function requireLadderNetwork(fn: string, path: string, value: unknown): LadderNetworkShape {
  if (value === null || typeof value !== "object" || Array.isArray(value)) {
    fail(fn, path, value, "expected a ladder from scaleLadder or asBuiltLadder");
  }
  const l = value as Record<string, unknown>;
  requirePositive(fn, `${path}.sourceOhms`, l["sourceOhms"]);
  requirePositive(fn, `${path}.loadOhms`, l["loadOhms"]);
  requireNode(fn, `${path}.inputNode`, l["inputNode"]);
  const out = requireNode(fn, `${path}.outputNode`, l["outputNode"]);
  if (out === "0") fail(fn, `${path}.outputNode`, out, "the output node cannot be ground");
  if (l["inputNode"] === "0") fail(fn, `${path}.inputNode`, "0", "the input node cannot be ground");
  const components = l["components"];
  if (!Array.isArray(components) || components.length === 0) fail(fn, `${path}.components`, components, "expected a non-empty array of components");
  const seen = new Set<string>();
  components.forEach((c, i) => checkComponent(fn, `${path}.components[${i}]`, c, seen));
  return value as LadderNetworkShape;
}
