/**
 * The Sallen-Key stages as usually drawn: the two series parts along the
 * signal line into the non-inverting input, the feedback part from their
 * junction up and over to the output, the shunt part to ground below the
 * input, and (gain forms) the divider from the output to the inverting input.
 * Lowpass and highpass differ only in which parts are resistors.
 *
 * @module
 */
import type { Element } from "../../../circuit/types.ts";
import { sheetBuilder, type Sheet } from "../sheet.ts";
import { between, opampsOf } from "./pick.ts";

/**
 * The Sallen-Key template, or null when the elements are not of that shape.
 *
 * @param elements - the stage's elements (nodes as in the topology: in, a, b, out, fb)
 * @returns the sheet
 */
export function sallenKeySheet(elements: readonly Element[]): Sheet | null {
  const series1 = between(elements, "in", "a");
  const series2 = between(elements, "a", "b");
  const feedback = between(elements, "a", "out");
  const shunt = between(elements, "b", "0");
  const [u] = opampsOf(elements);
  if (series1 === null || series2 === null || feedback === null || shunt === null || u === undefined) return null;
  const s = sheetBuilder();
  s.terminal("in", [0, 10], "left");
  s.part(series1.kind, series1.name, series1.value, [0, 10], [10, 10], "above");
  s.part(series2.kind, series2.name, series2.value, [10, 10], [20, 10], "above");
  s.wire([10, 10], [10, 4], [16, 4]);
  s.part(feedback.kind, feedback.name, feedback.value, [16, 4], [24, 4], "above");
  s.wire([24, 4], [34, 4], [34, 12]);
  s.part(shunt.kind, shunt.name, shunt.value, [20, 10], [20, 16], "left");
  s.ground([20, 16]);
  const pins = s.opamp(u.name, [26, 12], true);
  s.wire([20, 10], pins.plus);
  s.wire(pins.out, [38, 12]);
  s.terminal("out", [38, 12], "right");
  const top = between(elements, "out", "fb");
  const bottom = between(elements, "fb", "0");
  if (top !== null && bottom !== null) {
    s.wire(pins.minus, [24, 14], [24, 18]);
    s.part(bottom.kind, bottom.name, bottom.value, [24, 18], [24, 24], "left");
    s.ground([24, 24]);
    s.part(top.kind, top.name, top.value, [24, 18], [32, 18], "below");
    s.wire([32, 18], [36, 18], [36, 12]);
  } else s.wire(pins.minus, [24, 14], [24, 18], [36, 18], [36, 12]);
  return s.done();
}
