/**
 * Validation of a {@link Circuit} at the public boundary of the circuit layer:
 * element kinds, unique SPICE-safe names, SPICE-safe node names, and finite,
 * positive part values. Every problem is an {@link InvalidArgumentError} whose
 * path points at the offending field, e.g. `elements[3].value`.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import type { Circuit, Element } from "./types.ts";

/** Node and designator names accepted: letters, digits and underscore (safe in any SPICE dialect). */
const NAME_RE = /^[A-Za-z0-9_]+$/;

const KINDS = ["R", "C", "L", "V", "E", "OA"] as const;

function fail(fn: string, path: string, received: unknown, message: string): never {
  throw new InvalidArgumentError({ fn, path, received, message });
}

function checkNode(fn: string, path: string, value: unknown, seen: Map<string, string>): void {
  if (typeof value !== "string" || !NAME_RE.test(value)) {
    fail(fn, path, value, "expected a node name made of letters, digits and underscores (\"0\" is ground)");
  }
  const key = value.toLowerCase();
  const prior = seen.get(key);
  if (prior !== undefined && prior !== value) {
    fail(
      fn,
      path,
      value,
      `node names differ only in letter case from "${prior}"; SPICE would merge them, so spell them the same or rename one`,
    );
  }
  seen.set(key, value);
}

function checkPositive(fn: string, path: string, value: unknown, what: string): void {
  if (typeof value !== "number" || !Number.isFinite(value) || value <= 0) {
    fail(fn, path, value, `expected a finite ${what} greater than zero`);
  }
}

/**
 * Check an op-amp model (internal form that names the calling function and the path).
 *
 * @param fn - public function name for messages
 * @param path - dotted path of the model, e.g. `"opamp"`
 * @param model - the value to check
 * @returns nothing
 * @throws {@link InvalidArgumentError} at `path`, `path.kind`, `path.a0`, `path.gbwHz` or `path.routOhm`
 * @example
 * ```ts
 * checkOpAmpModel("x.response", "opamp", { kind: "single-pole", a0: 1e5, gbwHz: 0 }); //=> throws at "opamp.gbwHz"
 * ```
 */
export function checkOpAmpModel(fn: string, path: string, model: unknown): void {
  if (model === null || typeof model !== "object") {
    fail(fn, path, model, "expected an op-amp model { kind: \"ideal\" | \"single-pole\" | \"single-pole-rout\", ... }");
  }
  const m = model as Partial<Record<string, unknown>> & { kind?: unknown };
  const kind = m.kind;
  if (kind === "ideal") return;
  if (kind !== "single-pole" && kind !== "single-pole-rout") {
    fail(fn, `${path}.kind`, kind, "expected \"ideal\", \"single-pole\" or \"single-pole-rout\"");
  }
  checkPositive(fn, `${path}.a0`, m["a0"], "DC gain (V/V)");
  checkPositive(fn, `${path}.gbwHz`, m["gbwHz"], "gain-bandwidth product (Hz)");
  if (kind === "single-pole-rout") {
    const r = m["routOhm"];
    if (typeof r !== "number" || !Number.isFinite(r) || r < 0) {
      fail(fn, `${path}.routOhm`, r, "expected a finite output resistance of zero or more ohms");
    }
  }
}

/**
 * Check a circuit and throw at the first problem (internal form that names the calling function).
 *
 * @param fn - public function name for messages
 * @param circuit - value to check
 * @returns the circuit, typed
 * @throws {@link InvalidArgumentError} at the first problem, with its path
 * @example
 * ```ts
 * checkCircuit("acAnalysis", { title: "t", elements: [] }).elements.length; //=> 0
 * ```
 */
export function checkCircuit(fn: string, circuit: unknown): Circuit {
  if (circuit === null || typeof circuit !== "object" || Array.isArray(circuit)) {
    fail(fn, "circuit", circuit, "expected a circuit object { title, elements }");
  }
  const c = circuit as { title?: unknown; elements?: unknown };
  if (typeof c.title !== "string") fail(fn, "title", c.title, "expected a title string");
  if (!Array.isArray(c.elements)) fail(fn, "elements", c.elements, "expected an array of elements");
  const names = new Map<string, number>();
  const nodes = new Map<string, string>();
  (c.elements as unknown[]).forEach((raw, i) => {
    const p = `elements[${i}]`;
    if (raw === null || typeof raw !== "object") fail(fn, p, raw, "expected an element object");
    const e = raw as Partial<Element> & Record<string, unknown>;
    if (!(KINDS as readonly unknown[]).includes(e.kind)) {
      fail(fn, `${p}.kind`, e.kind, `expected one of ${KINDS.map((k) => `"${k}"`).join(", ")}`);
    }
    if (typeof e.name !== "string" || !NAME_RE.test(e.name)) {
      fail(fn, `${p}.name`, e.name, "expected a designator made of letters, digits and underscores");
    }
    const key = e.name.toLowerCase();
    const prior = names.get(key);
    if (prior !== undefined) {
      fail(fn, `${p}.name`, e.name, `duplicates the name of elements[${prior}] (names are compared ignoring case, as SPICE does)`);
    }
    names.set(key, i);
    switch (e.kind) {
      case "R":
      case "C":
      case "L": {
        checkNode(fn, `${p}.a`, e["a"], nodes);
        checkNode(fn, `${p}.b`, e["b"], nodes);
        const what = e.kind === "R" ? "resistance (ohms)" : e.kind === "C" ? "capacitance (farads)" : "inductance (henries)";
        checkPositive(fn, `${p}.value`, e["value"], what);
        break;
      }
      case "V": {
        checkNode(fn, `${p}.a`, e["a"], nodes);
        checkNode(fn, `${p}.b`, e["b"], nodes);
        const ac = e["ac"];
        if (typeof ac !== "number" || !Number.isFinite(ac)) fail(fn, `${p}.ac`, ac, "expected a finite AC magnitude (volts)");
        break;
      }
      case "E": {
        for (const f of ["a", "b", "cp", "cn"]) checkNode(fn, `${p}.${f}`, e[f], nodes);
        const g = e["gain"];
        if (typeof g !== "number" || !Number.isFinite(g)) fail(fn, `${p}.gain`, g, "expected a finite voltage gain");
        break;
      }
      case "OA": {
        for (const f of ["inP", "inN", "out"]) checkNode(fn, `${p}.${f}`, e[f], nodes);
        if (e["out"] === "0") fail(fn, `${p}.out`, "0", "an op-amp output cannot be ground; give it its own node");
        checkOpAmpModel(fn, `${p}.model`, e["model"]);
        break;
      }
      default:
        break;
    }
  });
  return circuit as Circuit;
}

/**
 * Check a circuit at a public boundary: known element kinds, unique names
 * (ignoring case, as SPICE does), SPICE-safe node names (letters, digits,
 * underscore; `"0"` is ground), finite positive R/C/L values, finite source
 * and gain values, and a valid op-amp model.
 *
 * @param circuit - the circuit to check
 * @returns the same circuit, typed
 * @throws {@link InvalidArgumentError} naming the path of the first problem, e.g. `elements[3].value`
 * @example
 * ```ts
 * validateCircuit({ title: "divider", elements: [
 *   { kind: "V", name: "V1", a: "in", b: "0", ac: 1 },
 *   { kind: "R", name: "R1", a: "in", b: "out", value: -5 },
 * ] });
 * //=> throws InvalidArgumentError "validateCircuit: elements[1].value: expected a finite resistance (ohms) greater than zero (received -5)"
 * ```
 */
export function validateCircuit(circuit: Circuit): Circuit {
  return checkCircuit("validateCircuit", circuit);
}
