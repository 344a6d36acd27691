/**
 * Strict reading of option values. A number is a plain decimal (`12`, `-0.5`,
 * `2.2e-9`); where the option takes a quantity (frequencies, resistances,
 * capacitances, volts, noise densities, the V/V gains) engineering notation
 * and RKM codes are accepted as {@link parseQuantity} reads them (`20k`,
 * `4k7`, `10 MHz`). Nothing else: no hexadecimal, no `Infinity`, no empty
 * text, no trailing words.
 *
 * @module
 */
import { parseQuantity } from "../units/index.ts";
import type { OptionDef } from "./options.ts";

/** A value read, or the line that says what is wrong with it. */
export type ValueRead = { readonly value: unknown } | { readonly problem: string };

const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const INTEGER = /^[+-]?\d+$/;

/** A plain decimal number, or undefined when the text is anything else (or overflows). */
export function strictDecimal(text: string): number | undefined {
  const t = text.trim();
  if (!DECIMAL.test(t)) return undefined;
  const v = Number(t);
  return Number.isFinite(v) ? v : undefined;
}

/** A whole number written as digits with an optional sign (a safe integer), else undefined. */
export function strictInteger(text: string): number | undefined {
  const t = text.trim();
  if (!INTEGER.test(t)) return undefined;
  const v = Number(t);
  return Number.isSafeInteger(v) ? v : undefined;
}

/** How a value is shown in a message: quoted, as typed. */
export function quoted(text: string): string {
  return JSON.stringify(text);
}

/** The usual "expected ..." line of an option. */
export function expectedLine(def: OptionDef, text: string): string {
  return `--${def.name} ${quoted(text)}: expected ${def.what}, e.g. --${def.name} ${def.example}`;
}

const UNIT_OF: Partial<Record<OptionDef["kind"], { unit: string | null; noun: string; zero: boolean; negative: boolean }>> = {
  frequency: { unit: "Hz", noun: "a frequency", zero: false, negative: false },
  "frequency-or-ideal": { unit: "Hz", noun: "a gain-bandwidth", zero: false, negative: false },
  edges: { unit: "Hz", noun: "a frequency", zero: false, negative: false },
  ohms: { unit: "Ω", noun: "a resistance", zero: false, negative: false },
  farads: { unit: "F", noun: "a capacitance", zero: false, negative: false },
  volts: { unit: "V", noun: "a level in volts peak", zero: false, negative: false },
  "density-v": { unit: "V", noun: "a noise density", zero: true, negative: false },
  "density-a": { unit: "A", noun: "a noise density", zero: true, negative: false },
  "plain-quantity": { unit: null, noun: "a gain", zero: true, negative: true },
};

/** A quantity in engineering notation with the option's unit (or none), signs checked with a message that says what to type. */
function quantity(def: OptionDef, text: string): ValueRead {
  const u = UNIT_OF[def.kind] as { unit: string | null; noun: string; zero: boolean; negative: boolean };
  let q: { value: number; unit: string | undefined };
  try {
    q = parseQuantity(text, { ...(u.unit === null ? {} : { unit: u.unit }), allowNegative: true, allowZero: true });
  } catch {
    return { problem: expectedLine(def, text) };
  }
  if (u.unit === null && q.unit !== undefined) return { problem: `--${def.name} ${quoted(text)}: ${def.what} has no unit; write the number alone, e.g. --${def.name} ${def.example}` };
  if (q.value < 0 && !u.negative) {
    const positive = text.trim().replace(/^-\s*/, "");
    return { problem: `--${def.name} ${quoted(text)}: ${u.noun} must be above zero; type it without the minus sign, e.g. --${def.name} ${positive}` };
  }
  if (q.value === 0 && !u.zero) return { problem: `--${def.name} ${quoted(text)}: ${u.noun} must be above zero, e.g. --${def.name} ${def.example}` };
  return { value: q.value };
}

/** One or two band edges separated by a comma. */
function edges(def: OptionDef, text: string): ValueRead {
  const parts = text.split(",").map((p) => p.trim());
  if (parts.length > 2 || parts.some((p) => p === "")) {
    return { problem: `--${def.name} ${quoted(text)}: expected one edge frequency in Hz, or two separated by a comma, e.g. --${def.name} ${def.example} or --${def.name} 300,3.4k` };
  }
  const read = parts.map((p) => quantity(def, p));
  for (const r of read) if ("problem" in r) return r;
  const values = read.map((r) => (r as { value: number }).value);
  return { value: values.length === 1 ? values[0] : values };
}

/** A decibel figure: a plain decimal with an optional `dB` after it. */
function decibels(def: OptionDef, text: string): ValueRead {
  const v = strictDecimal(text.trim().replace(/\s*dB$/i, ""));
  return v === undefined ? { problem: expectedLine(def, text) } : { value: v };
}

/** A fraction written as a percentage (`2%`) or a plain decimal (`0.02`). */
function fraction(def: OptionDef, text: string): ValueRead {
  const t = text.trim();
  const v = t.endsWith("%") ? strictDecimal(t.slice(0, -1)) : strictDecimal(t);
  if (v === undefined) return { problem: expectedLine(def, text) };
  return { value: t.endsWith("%") ? v / 100 : v };
}

/** A comma-separated list of names, or one name. */
function nameList(def: OptionDef, text: string): ValueRead {
  const parts = text.split(",").map((p) => p.trim());
  if (parts.some((p) => p === "")) return { problem: `--${def.name} ${quoted(text)}: an entry of the list is empty; expected ${def.what}, e.g. --${def.name} ${def.example}` };
  return { value: parts.length === 1 ? parts[0] : parts };
}

/**
 * Read the value of an option as written on the command line.
 *
 * @param def - the option
 * @param text - the value as typed
 * @returns the value for the spec (or the command), or the problem line
 */
export function readValue(def: OptionDef, text: string): ValueRead {
  if (text.trim() === "") return { problem: `--${def.name} needs a value: ${def.what}, e.g. --${def.name} ${def.example}` };
  switch (def.kind) {
    case "none":
      return { problem: `--${def.name} takes no value (got ${quoted(text)}); write --${def.name} alone` };
    case "enum":
      return { value: def.name === "caps" || def.name === "res" ? text.trim().toUpperCase() : text.trim() };
    case "enum-list":
      return nameList(def, text);
    case "edges":
      return edges(def, text);
    case "frequency-or-ideal":
      return text.trim() === "ideal" ? { value: "ideal" } : quantity(def, text);
    case "frequency":
    case "ohms":
    case "farads":
    case "volts":
    case "density-v":
    case "density-a":
    case "plain-quantity":
      return quantity(def, text);
    case "db":
      return decibels(def, text);
    case "fraction":
      return fraction(def, text);
    case "count": {
      const n = strictInteger(text);
      return n === undefined || n < 1 || n > 100000 ? { problem: expectedLine(def, text) } : { value: n };
    }
    case "integer":
    case "order": {
      const n = strictInteger(text);
      return n === undefined ? { problem: expectedLine(def, text) } : { value: n };
    }
    case "path":
      return { value: text };
  }
}
