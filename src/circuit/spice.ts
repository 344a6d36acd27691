/**
 * SPICE netlist text for a circuit, written so that ngspice runs it unchanged.
 *
 * Values are written in plain exponent notation with every significant digit
 * (`1.5915494309189535e-8`), never with SPICE scale suffixes, so there is no
 * milli/mega (`M`/`MEG`) ambiguity and the simulator sees the exact value.
 * Op-amps become one `.subckt` per distinct model, or instances of a
 * subcircuit of the caller's own (`opampSubcircuit`, with supply rails when it
 * has supply pins):
 * - ideal: a VCVS of gain 1e9 (the nullor's limit; the error it adds is of
 *   order noise gain / 1e9);
 * - single-pole: a transconductance `G` of 1 S into `R = a0` ohms in parallel
 *   with `C = 1/(2 pi GBW)` farads (pole at `GBW / a0`), then a unity-gain
 *   `E` buffer, plus a series output resistor for the `single-pole-rout` model.
 *
 * @module
 */
import { requireFinite } from "../validate.ts";
import { TWO_PI } from "../units/constants.ts";
import { InvalidArgumentError } from "../errors.ts";
import type { Circuit, Element, OpAmpModel } from "./types.ts";
import { checkCircuit } from "./validate.ts";
import { checkOpampSubcircuit, opampDefinition, opampInstance, SUPPLY_NODES, type OpampSubcircuit } from "./spice-opamp.ts";

/** The `.ac` sweep card: logarithmic, N points per decade. */
export interface SpiceAcSweep {
  /** Points per decade (integer >= 1). */
  readonly pointsPerDecade: number;
  /** Start frequency in Hz (> 0). */
  readonly startHz: number;
  /** Stop frequency in Hz (> startHz). */
  readonly stopHz: number;
}

/** Options of {@link circuitToSpice}. */
export interface CircuitToSpiceOptions {
  /**
   * The `.ac` card, or `false` to leave it out (for a netlist that will be
   * included in a larger deck).
   * @defaultValue `{ pointsPerDecade: 20, startHz: 1, stopHz: 1e6 }`
   */
  readonly ac?: SpiceAcSweep | false;
  /**
   * Comment lines written after the title (each prefixed with `* `).
   * @defaultValue `[]`
   */
  readonly comments?: readonly string[];
  /**
   * An op-amp subcircuit of your own that every op-amp instantiates, in place
   * of the built-in models (see {@link OpampSubcircuit}).
   * @defaultValue each op-amp's own model, written as a built-in subcircuit
   */
  readonly opampSubcircuit?: OpampSubcircuit;
  /**
   * Lines written after the `.ac` card and before `.end`: `.print`, `.meas`
   * or a `.control` block.
   * @defaultValue `[]`
   */
  readonly cards?: readonly string[];
}

/** Gain of the VCVS that stands in for an ideal op-amp in the netlist. */
export const SPICE_IDEAL_OPAMP_GAIN = 1e9;

/**
 * Format a number for SPICE: shortest round-trip exponent form, no `+` in the exponent.
 *
 * @param v - a finite number
 * @returns e.g. `"1.5e-9"`, `"4.7e3"`, `"0"`
 * @throws never
 * @example
 * ```ts
 * spiceNumber(4700); //=> "4.7e3"
 * ```
 */
export function spiceNumber(v: number): string {
  requireFinite("spiceNumber", "v", v);
  if (v === 0) return "0";
  return v.toExponential().replace("e+", "e").replace(/e0$/, "");
}

function designator(e: Element): string {
  const letter = e.kind === "OA" ? "X" : e.kind;
  return e.name[0]?.toUpperCase() === letter ? e.name : `${letter}${e.name}`;
}

function modelKey(m: OpAmpModel): string {
  if (m.kind === "ideal") return "ideal";
  if (m.kind === "single-pole") return `sp:${m.a0}:${m.gbwHz}`;
  return `spr:${m.a0}:${m.gbwHz}:${m.routOhm}`;
}

function subckt(name: string, m: OpAmpModel): string[] {
  const lines = [`.subckt ${name} inp inn out`];
  if (m.kind === "ideal") {
    lines.push(`* ideal op-amp: VCVS of gain ${spiceNumber(SPICE_IDEAL_OPAMP_GAIN)}`);
    lines.push(`E1 out 0 inp inn ${spiceNumber(SPICE_IDEAL_OPAMP_GAIN)}`);
  } else {
    lines.push(`* single-pole op-amp: a0 = ${spiceNumber(m.a0)}, GBW = ${spiceNumber(m.gbwHz)} Hz`);
    lines.push("G1 0 n1 inp inn 1");
    lines.push(`R1 n1 0 ${spiceNumber(m.a0)}`);
    lines.push(`C1 n1 0 ${spiceNumber(1 / (TWO_PI * m.gbwHz))}`);
    if (m.kind === "single-pole-rout" && m.routOhm > 0) {
      lines.push("E1 n2 0 n1 0 1");
      lines.push(`R2 n2 out ${spiceNumber(m.routOhm)}`);
    } else {
      lines.push("E1 out 0 n1 0 1");
    }
  }
  lines.push(`.ends ${name}`);
  return lines;
}

function checkSweep(fn: string, ac: unknown): SpiceAcSweep {
  if (ac === null || typeof ac !== "object") {
    throw new InvalidArgumentError({ fn, path: "options.ac", received: ac, message: "expected { pointsPerDecade, startHz, stopHz } or false" });
  }
  const a = ac as Record<string, unknown>;
  const n = a["pointsPerDecade"];
  if (typeof n !== "number" || !Number.isInteger(n) || n < 1 || n > 10000) {
    throw new InvalidArgumentError({ fn, path: "options.ac.pointsPerDecade", received: n, message: "expected an integer from 1 to 10000" });
  }
  const f1 = a["startHz"];
  if (typeof f1 !== "number" || !Number.isFinite(f1) || f1 <= 0) {
    throw new InvalidArgumentError({ fn, path: "options.ac.startHz", received: f1, message: "expected a finite frequency greater than zero" });
  }
  const f2 = a["stopHz"];
  if (typeof f2 !== "number" || !Number.isFinite(f2) || f2 <= f1) {
    throw new InvalidArgumentError({ fn, path: "options.ac.stopHz", received: f2, message: `expected a finite frequency above startHz (${f1})` });
  }
  return { pointsPerDecade: n, startHz: f1, stopHz: f2 };
}

/** The supply rails' nodes and sources must not collide with the circuit's own. */
function requireFreeSupplyNodes(fn: string, circuit: Circuit): void {
  const taken = new Set<string>();
  for (const e of circuit.elements) {
    taken.add(e.name.toLowerCase());
    if (e.kind === "OA") [e.inP, e.inN, e.out].forEach((n) => taken.add(n.toLowerCase()));
    else [e.a, e.b, ...(e.kind === "E" ? [e.cp, e.cn] : [])].forEach((n) => taken.add(n.toLowerCase()));
  }
  for (const n of [...Object.values(SUPPLY_NODES), "vpos", "vneg"]) {
    if (taken.has(n)) {
      throw new InvalidArgumentError({ fn, path: "options.opampSubcircuit.supplyV", received: n, message: `the circuit already uses the name "${n}" that the supply rails need; rename that node or element` });
    }
  }
}

/**
 * Write a circuit as a SPICE netlist (title line, elements, op-amp
 * subcircuits, optional `.ac` card, `.end`) that ngspice runs unchanged.
 *
 * Element names are kept, with the SPICE type letter prepended when missing
 * (an op-amp `U1` becomes the subcircuit instance `XU1`). Voltage sources get
 * `DC 0 AC <ac>`.
 *
 * @param circuit - the circuit (validated here)
 * @param options - `.ac` sweep and comments
 * @returns the netlist text, ending in `.end` and a newline
 * @throws {@link InvalidArgumentError} for an invalid circuit or sweep
 * @example
 * ```ts
 * circuitToSpice({ title: "rc", elements: [
 *   { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 },
 *   { kind: "R", name: "R1", a: "in", b: "out", value: 4700 },
 *   { kind: "C", name: "C1", a: "out", b: "0", value: 1e-8 },
 * ] }, { ac: { pointsPerDecade: 10, startHz: 10, stopHz: 1e5 } });
 * //=> "rc\nVin in 0 DC 0 AC 1\nR1 in out 4.7e3\nC1 out 0 1e-8\n.ac dec 10 1e1 1e5\n.end\n"
 * ```
 */
export function circuitToSpice(circuit: Circuit, options: CircuitToSpiceOptions = {}): string {
  const fn = "circuitToSpice";
  checkCircuit(fn, circuit);
  if (options === null || typeof options !== "object") {
    throw new InvalidArgumentError({ fn, path: "options", received: options, message: "expected an options object (or nothing)" });
  }
  const ac = options.ac === undefined ? { pointsPerDecade: 20, startHz: 1, stopHz: 1e6 } : options.ac;
  const sweep = ac === false ? false : checkSweep(fn, ac);
  const comments = options.comments ?? [];
  if (!Array.isArray(comments) || comments.some((c) => typeof c !== "string")) {
    throw new InvalidArgumentError({ fn, path: "options.comments", received: comments, message: "expected an array of strings" });
  }
  const sub = options.opampSubcircuit === undefined ? undefined : checkOpampSubcircuit(fn, "options.opampSubcircuit", options.opampSubcircuit);
  if (sub?.supplyV !== undefined) requireFreeSupplyNodes(fn, circuit);
  const cards = options.cards ?? [];
  if (!Array.isArray(cards) || cards.some((c) => typeof c !== "string" || /[\r\n]/.test(c) || /^\s*\.end\s*$/i.test(c))) {
    throw new InvalidArgumentError({ fn, path: "options.cards", received: cards, message: "expected an array of single lines (no .end: it is written last)" });
  }
  const title = circuit.title.replace(/[\r\n]+/g, " ").trim();
  const lines: string[] = [title === "" ? "filterwright circuit" : title];
  for (const c of comments) for (const l of c.split(/\r?\n/)) lines.push(`* ${l}`);
  const models = new Map<string, { name: string; model: OpAmpModel }>();
  for (const e of circuit.elements) {
    const d = designator(e);
    switch (e.kind) {
      case "R":
      case "C":
      case "L":
        lines.push(`${d} ${e.a} ${e.b} ${spiceNumber(e.value)}`);
        break;
      case "V":
        lines.push(`${d} ${e.a} ${e.b} DC 0 AC ${spiceNumber(e.ac)}`);
        break;
      case "E":
        lines.push(`${d} ${e.a} ${e.b} ${e.cp} ${e.cn} ${spiceNumber(e.gain)}`);
        break;
      case "OA": {
        if (sub !== undefined) {
          lines.push(opampInstance(d, e, sub));
          break;
        }
        const key = modelKey(e.model);
        let entry = models.get(key);
        if (entry === undefined) {
          entry = { name: e.model.kind === "ideal" ? "fw_opamp_ideal" : `fw_opamp_${models.size + 1}`, model: e.model };
          models.set(key, entry);
        }
        lines.push(`${d} ${e.inP} ${e.inN} ${e.out} ${entry.name}`);
        break;
      }
      default:
        break;
    }
  }
  for (const { name, model } of models.values()) lines.push(...subckt(name, model));
  if (sub !== undefined && circuit.elements.some((e) => e.kind === "OA")) lines.push(...opampDefinition(sub, spiceNumber));
  if (sweep !== false) {
    lines.push(`.ac dec ${sweep.pointsPerDecade} ${spiceNumber(sweep.startHz)} ${spiceNumber(sweep.stopHz)}`);
  }
  lines.push(...cards);
  lines.push(".end", "");
  return lines.join("\n");
}
