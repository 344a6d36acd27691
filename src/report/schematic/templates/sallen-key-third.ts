/**
 * The third-order Sallen-Key stages as usually drawn: three series parts
 * along the signal line into the follower's non-inverting input, a shunt
 * part to ground after the first and after the third, and the feedback part
 * from the junction of the second and third up and over to the output.
 * Lowpass and highpass differ only in which parts are resistors.
 *
 * @module
 */
import type { Element } from "../../../circuit/types.ts";
import { sheetBuilder, type Sheet } from "../sheet.ts";
import { between, opampsOf } from "./pick.ts";

/**
 * The third-order Sallen-Key template, or null when the elements are not of that shape.
 *
 * @param elements - the stage's elements (nodes as in the topology: in, a, b, c, out)
 * @returns the sheet
 */
export function sallenKeyThirdSheet(elements: readonly Element[]): Sheet | null {
  const series1 = between(elements, "in", "a");
  const series2 = between(elements, "a", "b");
  const series3 = between(elements, "b", "c");
  const shunt1 = between(elements, "a", "0");
  const shunt2 = between(elements, "c", "0");
  const feedback = between(elements, "b", "out");
  const [u] = opampsOf(elements);
  if (series1 === null || series2 === null || series3 === null || shunt1 === null || shunt2 === null || feedback === null || u === undefined) return null;
  const s = sheetBuilder();
  s.terminal("in", [0, 10], "left");
  s.part(series1.kind, series1.name, series1.value, [0, 10], [8, 10], "above");
  s.part(shunt1.kind, shunt1.name, shunt1.value, [8, 10], [8, 16], "left");
  s.ground([8, 16]);
  s.part(series2.kind, series2.name, series2.value, [8, 10], [16, 10], "below");
  s.wire([16, 10], [16, 4], [20, 4]);
  s.part(feedback.kind, feedback.name, feedback.value, [20, 4], [28, 4], "above");
  s.wire([28, 4], [38, 4], [38, 12]);
  s.part(series3.kind, series3.name, series3.value, [16, 10], [24, 10], "above");
  s.part(shunt2.kind, shunt2.name, shunt2.value, [24, 10], [24, 16], "left");
  s.ground([24, 16]);
  const pins = s.opamp(u.name, [30, 12], true);
  s.wire([24, 10], pins.plus);
  s.wire(pins.out, [42, 12]);
  s.terminal("out", [42, 12], "right");
  s.wire(pins.minus, [28, 14], [28, 18], [40, 18], [40, 12]);
  return s.done();
}
