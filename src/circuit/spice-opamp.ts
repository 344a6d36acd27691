/**
 * An op-amp subcircuit of the user's own (a vendor macromodel, a model with
 * supply pins and output limits) in place of the built-in models of an
 * exported netlist: its name, the order of its pins, its text or the file that
 * holds it, and the supply rails it needs.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requireOptions } from "../validate.ts";

/** A pin of an op-amp subcircuit. */
export type OpampPin = "in+" | "in-" | "out" | "v+" | "v-";

/** Every op-amp pin name, in a stable order. */
export const OPAMP_PINS: readonly OpampPin[] = Object.freeze(["in+", "in-", "out", "v+", "v-"] as const);

/** Supply rails of an op-amp subcircuit with supply pins. */
export interface OpampSupply {
  /** Positive rail, volts (> 0). */
  readonly positive: number;
  /** Negative rail, volts (< 0; the filter's signals sit at 0 V). */
  readonly negative: number;
}

/** An op-amp subcircuit every op-amp of the netlist instantiates. */
export interface OpampSubcircuit {
  /** The subcircuit's name, as in its `.subckt` line. */
  readonly name: string;
  /** Its pins in the order of its `.subckt` line, e.g. `["in+", "in-", "v+", "v-", "out"]`. */
  readonly pins: readonly OpampPin[];
  /** The `.subckt ... .ends` text, written into the netlist as it is. Give this or `include`. */
  readonly text?: string;
  /** A model file, written as `.include "path"`. Give this or `text`. */
  readonly include?: string;
  /** The rails, required when `pins` has `v+` and `v-`; sources `Vpos`/`Vneg` drive nodes `vpos`/`vneg`. */
  readonly supplyV?: OpampSupply;
}

/** Node names the supply pins connect to. */
export const SUPPLY_NODES: Readonly<Record<"v+" | "v-", string>> = Object.freeze({ "v+": "vpos", "v-": "vneg" });

const NAME = /^[A-Za-z][A-Za-z0-9_.$-]*$/;

function bad(fn: string, path: string, received: unknown, message: string): never {
  throw new InvalidArgumentError({ fn, path, received, message });
}

/**
 * Check an op-amp subcircuit option (the public boundary of the netlist writers).
 *
 * @param fn - the public function's name, for the error
 * @param path - the option's path, e.g. `"options.opampSubcircuit"`
 * @param value - what the caller gave
 * @returns the subcircuit, checked
 * @throws {@link InvalidArgumentError} naming the field: a name SPICE cannot
 *   read, pins missing or repeated, one supply pin without the other, rails
 *   missing or of the wrong sign, neither or both of `text` and `include`, or
 *   a `text` that does not define the named subcircuit
 */
export function checkOpampSubcircuit(fn: string, path: string, value: unknown): OpampSubcircuit {
  const o = requireOptions(fn, path, value);
  const name = o["name"];
  if (typeof name !== "string" || !NAME.test(name)) bad(fn, `${path}.name`, name, "expected a subcircuit name: a letter, then letters, digits, _ . $ or -");
  const pins = o["pins"];
  if (!Array.isArray(pins) || pins.some((p) => !(OPAMP_PINS as readonly unknown[]).includes(p))) {
    bad(fn, `${path}.pins`, pins, `expected the subcircuit's pins in order, each one of ${OPAMP_PINS.map((p) => `"${p}"`).join(", ")}`);
  }
  const list = pins as OpampPin[];
  for (const p of OPAMP_PINS) {
    const n = list.filter((q) => q === p).length;
    if (n > 1) bad(fn, `${path}.pins`, pins, `pin "${p}" is listed ${n} times; list each pin once`);
    if (n === 0 && (p === "in+" || p === "in-" || p === "out")) bad(fn, `${path}.pins`, pins, `pin "${p}" is missing; in+, in- and out are required`);
  }
  const hasPos = list.includes("v+");
  if (hasPos !== list.includes("v-")) bad(fn, `${path}.pins`, pins, "give both supply pins v+ and v-, or neither");
  let supplyV: OpampSupply | undefined;
  if (hasPos) {
    const s = o["supplyV"];
    if (s === undefined) bad(fn, `${path}.supplyV`, s, "the pins have v+ and v-: give the rails, e.g. { positive: 5, negative: -5 }");
    const r = requireOptions(fn, `${path}.supplyV`, s);
    const pos = r["positive"];
    const neg = r["negative"];
    if (typeof pos !== "number" || !Number.isFinite(pos) || pos <= 0 || pos > 1000) bad(fn, `${path}.supplyV.positive`, pos, "expected the positive rail in volts, above 0 and at most 1000");
    if (typeof neg !== "number" || !Number.isFinite(neg) || neg >= 0 || neg < -1000) bad(fn, `${path}.supplyV.negative`, neg, "expected the negative rail in volts, below 0 and at least -1000 (the filter's signals sit at 0 V)");
    supplyV = { positive: pos, negative: neg };
  } else if (o["supplyV"] !== undefined) {
    bad(fn, `${path}.supplyV`, o["supplyV"], "the pins have no v+ and v-: leave supplyV out, or add the supply pins");
  }
  const text = o["text"];
  const include = o["include"];
  if ((text === undefined) === (include === undefined)) bad(fn, `${path}.text`, text, "give exactly one of text (the .subckt ... .ends lines) and include (a model file)");
  if (text !== undefined) {
    if (typeof text !== "string") bad(fn, `${path}.text`, text, "expected the subcircuit's text as a string");
    const head = new RegExp(`^\\s*\\.subckt\\s+${name.replace(/[.$]/g, "\\$&")}(\\s|$)`, "im");
    if (!head.test(text) || !/^\s*\.ends\b/im.test(text)) bad(fn, `${path}.text`, `${text.slice(0, 40)}...`, `expected a ".subckt ${name} ..." line and an ".ends" line`);
  }
  if (include !== undefined && (typeof include !== "string" || include === "" || /[\r\n"]/.test(include))) {
    bad(fn, `${path}.include`, include, "expected a file path on one line, without double quotes");
  }
  return Object.freeze({
    name,
    pins: Object.freeze([...list]),
    ...(text === undefined ? {} : { text: text as string }),
    ...(include === undefined ? {} : { include: include as string }),
    ...(supplyV === undefined ? {} : { supplyV: Object.freeze(supplyV) }),
  });
}

/**
 * The instance line of one op-amp with the user's subcircuit.
 *
 * @param designator - e.g. `"XU1"`
 * @param nodes - the op-amp's input and output nodes
 * @param sub - the checked subcircuit
 * @returns e.g. `"XU1 s1_p s1_n vpos vneg out MYAMP"`
 */
export function opampInstance(designator: string, nodes: { readonly inP: string; readonly inN: string; readonly out: string }, sub: OpampSubcircuit): string {
  const at = (p: OpampPin): string => (p === "in+" ? nodes.inP : p === "in-" ? nodes.inN : p === "out" ? nodes.out : SUPPLY_NODES[p]);
  return `${designator} ${sub.pins.map(at).join(" ")} ${sub.name}`;
}

/**
 * The lines that define the subcircuit and its rails: the `.include` or the
 * text, and the supply sources.
 *
 * @param sub - the checked subcircuit
 * @param num - the netlist's number format
 * @returns the lines
 */
export function opampDefinition(sub: OpampSubcircuit, num: (v: number) => string): string[] {
  const lines = sub.include !== undefined ? [`.include "${sub.include}"`] : (sub.text as string).replace(/\r\n/g, "\n").replace(/\n+$/, "").split("\n");
  if (sub.supplyV !== undefined) {
    lines.push(`Vpos ${SUPPLY_NODES["v+"]} 0 DC ${num(sub.supplyV.positive)}`);
    lines.push(`Vneg ${SUPPLY_NODES["v-"]} 0 DC ${num(sub.supplyV.negative)}`);
  }
  return lines;
}
