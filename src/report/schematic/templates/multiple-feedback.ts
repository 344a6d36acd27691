/**
 * The multiple-feedback stages as usually drawn: the input part into the
 * summing node, its optional part to ground, the series part to the
 * inverting input, and the two feedback parts from the summing node and from
 * the inverting input over the top to the output; the non-inverting input
 * grounded. Lowpass, highpass and the bandpass forms differ in which parts
 * are resistors and whether the part to ground is there.
 *
 * @module
 */
import type { Element } from "../../../circuit/types.ts";
import { sheetBuilder, type Sheet } from "../sheet.ts";
import { between, opampsOf } from "./pick.ts";

/**
 * The multiple-feedback template, or null when the elements are not of that shape.
 *
 * @param elements - the stage's elements (nodes as in the topology: in, a, n, out)
 * @returns the sheet
 */
export function multipleFeedbackSheet(elements: readonly Element[]): Sheet | null {
  const input = between(elements, "in", "a");
  const shunt = between(elements, "a", "0");
  const series = between(elements, "a", "n");
  const outer = between(elements, "a", "out");
  const inner = between(elements, "n", "out");
  const [u] = opampsOf(elements);
  if (input === null || series === null || outer === null || inner === null || u === undefined || u.inP !== "0" || u.inN !== "n") return null;
  const s = sheetBuilder();
  s.terminal("in", [0, 12], "left");
  s.part(input.kind, input.name, input.value, [0, 12], [10, 12], "above");
  if (shunt !== null) {
    s.part(shunt.kind, shunt.name, shunt.value, [10, 12], [10, 18], "left");
    s.ground([10, 18]);
  }
  s.part(series.kind, series.name, series.value, [10, 12], [20, 12], "above");
  const pins = s.opamp(u.name, [26, 14], false);
  s.wire([20, 12], pins.minus);
  s.wire(pins.plus, [24, 16]);
  s.ground([24, 16]);
  s.wire([10, 12], [10, 2], [20, 2]);
  s.part(outer.kind, outer.name, outer.value, [20, 2], [28, 2], "above");
  s.wire([28, 2], [37, 2], [37, 14]);
  s.wire([20, 12], [20, 6], [22, 6]);
  s.part(inner.kind, inner.name, inner.value, [22, 6], [30, 6], "above");
  s.wire([30, 6], [35, 6], [35, 14]);
  s.wire(pins.out, [40, 14]);
  s.terminal("out", [40, 14], "right");
  return s.done();
}
