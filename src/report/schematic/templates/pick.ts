/**
 * Finding a template's parts in a stage's element list by the nodes they
 * join, so that a template names the circuit's shape (the part from `in` to
 * `a`), not its designators.
 *
 * @module
 */
import type { Element, OpAmp } from "../../../circuit/types.ts";

/** A two-terminal element. */
export type TwoTerminal = Extract<Element, { kind: "R" | "C" | "L" }>;

/**
 * The two-terminal element between two nodes, or null.
 *
 * @param elements - the stage's elements
 * @param p - one node
 * @param q - the other
 * @returns the element
 */
export function between(elements: readonly Element[], p: string, q: string): TwoTerminal | null {
  for (const e of elements) {
    if ((e.kind === "R" || e.kind === "C" || e.kind === "L") && ((e.a === p && e.b === q) || (e.a === q && e.b === p))) return e;
  }
  return null;
}

/**
 * The op-amps, in element order.
 *
 * @param elements - the stage's elements
 * @returns the op-amps
 */
export function opampsOf(elements: readonly Element[]): OpAmp[] {
  return elements.filter((e): e is OpAmp => e.kind === "OA");
}
