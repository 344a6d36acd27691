/**
 * The three-amplifier Tow-Thomas stages as usually drawn: the damped
 * integrator (its capacitor and damping resistor over it), the integrator,
 * and the inverter, along the signal line, with the loop closed from the
 * inverter's output back to the first summing node along the top. The
 * output is the first (bandpass) or second (lowpass) amplifier's. The
 * four-amplifier forms with an output summer are left to the generic layout.
 *
 * @module
 */
import type { Element } from "../../../circuit/types.ts";
import { sheetBuilder, type Point, type Sheet } from "../sheet.ts";
import { between, opampsOf } from "./pick.ts";

/**
 * The Tow-Thomas template, or null when the elements are not of that shape.
 *
 * @param elements - the stage's elements (nodes as in the topology: in, n1, n2, n3, v3 and out besides v1 or v2)
 * @returns the sheet
 */
export function towThomasSheet(elements: readonly Element[]): Sheet | null {
  const amps = opampsOf(elements);
  if (amps.length !== 3) return null;
  const [u1, u2, u3] = amps as [(typeof amps)[number], (typeof amps)[number], (typeof amps)[number]];
  if (u1.inN !== "n1" || u1.inP !== "0" || u2.inN !== "n2" || u2.inP !== "0" || u3.inN !== "n3" || u3.inP !== "0") return null;
  const [v1, v2, v3] = [u1.out, u2.out, u3.out];
  const r1 = between(elements, "in", "n1");
  const c1 = elements.find((e) => e.kind === "C" && ((e.a === "n1" && e.b === v1) || (e.a === v1 && e.b === "n1"))) as Extract<Element, { kind: "C" }> | undefined;
  const r3 = between(elements, v3, "n1");
  const r4 = between(elements, v1, "n2");
  const c2 = between(elements, "n2", v2);
  const r5 = between(elements, v2, "n3");
  const r6 = between(elements, "n3", v3);
  const damping = elements.find((e) => e.kind === "R" && ((e.a === "n1" && e.b === v1) || (e.a === v1 && e.b === "n1")));
  if (r1 === null || damping === undefined || c1 === undefined || r3 === null || r4 === null || c2 === null || r5 === null || r6 === null) return null;
  const s = sheetBuilder();
  const put = (e: { kind: "R" | "C" | "L"; name: string; value: number }, a: Point, b: Point, label?: "above" | "below" | "left" | "right"): void => s.part(e.kind, e.name, e.value, a, b, label);
  s.terminal("in", [0, 12], "left");
  put(r1, [0, 12], [8, 12]);
  // damped integrator: capacitor and damping resistor over the first amplifier, the loop resistor along the top
  const p1 = s.opamp(u1.name, [12, 14], false);
  s.wire([8, 12], p1.minus);
  s.wire(p1.plus, [10, 16]);
  s.ground([10, 16]);
  s.wire([8, 12], [8, 0], [10, 0]);
  put(r3, [10, 0], [18, 0]);
  s.wire([18, 0], [66, 0], [66, 18]);
  s.wire([8, 4], [10, 4]);
  put(c1, [10, 4], [18, 4]);
  s.wire([8, 8], [10, 8]);
  put(damping as { kind: "R"; name: string; value: number }, [10, 8], [18, 8]);
  s.wire([18, 4], [21, 4], [21, 14]);
  s.wire([18, 8], [21, 8]);
  s.wire(p1.out, [22, 14]);
  // integrator
  put(r4, [22, 14], [30, 14]);
  const p2 = s.opamp(u2.name, [34, 16], false);
  s.wire([30, 14], p2.minus);
  s.wire(p2.plus, [32, 18]);
  s.ground([32, 18]);
  s.wire([30, 14], [30, 8], [32, 8]);
  put(c2, [32, 8], [40, 8]);
  s.wire([40, 8], [43, 8], [43, 16]);
  s.wire(p2.out, [44, 16]);
  // inverter
  put(r5, [44, 16], [52, 16], "below");
  const p3 = s.opamp(u3.name, [56, 18], false);
  s.wire([52, 16], p3.minus);
  s.wire(p3.plus, [54, 20]);
  s.ground([54, 20]);
  s.wire([52, 16], [52, 10], [54, 10]);
  put(r6, [54, 10], [62, 10]);
  s.wire([62, 10], [65, 10], [65, 18]);
  s.wire(p3.out, [66, 18]);
  if (v1 === "out") {
    s.wire([20, 14], [20, 30], [70, 30]);
    s.terminal("out", [70, 30], "right");
  } else if (v2 === "out") {
    s.wire([42, 16], [42, 30], [70, 30]);
    s.terminal("out", [70, 30], "right");
  } else return null;
  return s.done();
}
