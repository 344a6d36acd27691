/**
 * The three-amplifier state-variable (KHN) stages as usually drawn: the
 * summing amplifier, then the two integrators along the signal line, the
 * integrating capacitors over each integrator, the two feedback resistors
 * over the summing amplifier (from its own output and from the last
 * integrator's, along the top), and the damping divider from the first
 * integrator's output into the non-inverting input, along the bottom. The
 * output is whichever of the three amplifiers' outputs the topology taps.
 * The four-amplifier notch and allpass forms are left to the generic layout.
 *
 * @module
 */
import type { Element } from "../../../circuit/types.ts";
import { sheetBuilder, type Point, type Sheet } from "../sheet.ts";
import { between, opampsOf } from "./pick.ts";

/**
 * The state-variable template, or null when the elements are not of that shape.
 *
 * @param elements - the stage's elements (nodes as in the topology: in, n1, p1, n2, n3 and two of hp, bp, lp besides out)
 * @returns the sheet
 */
export function stateVariableSheet(elements: readonly Element[]): Sheet | null {
  const amps = opampsOf(elements);
  if (amps.length !== 3) return null;
  const [u1, u2, u3] = amps as [(typeof amps)[number], (typeof amps)[number], (typeof amps)[number]];
  if (u1.inN !== "n1" || u1.inP !== "p1" || u2.inN !== "n2" || u2.inP !== "0" || u3.inN !== "n3" || u3.inP !== "0") return null;
  const [hp, bp, lp] = [u1.out, u2.out, u3.out];
  const r1 = between(elements, "in", "n1");
  const r2 = between(elements, hp, "n1");
  const r3 = between(elements, lp, "n1");
  const r4 = between(elements, bp, "p1");
  const r5 = between(elements, "p1", "0");
  const r6 = between(elements, hp, "n2");
  const c1 = between(elements, "n2", bp);
  const r7 = between(elements, bp, "n3");
  const c2 = between(elements, "n3", lp);
  if (r1 === null || r2 === null || r3 === null || r4 === null || r5 === null || r6 === null || c1 === null || r7 === null || c2 === null) return null;
  const s = sheetBuilder();
  const put = (e: NonNullable<typeof r1>, a: Point, b: Point, label?: "above" | "below" | "left" | "right"): void => s.part(e.kind, e.name, e.value, a, b, label);
  s.terminal("in", [0, 12], "left");
  put(r1, [0, 12], [8, 12]);
  // summing amplifier and its two feedback resistors
  const p1 = s.opamp(u1.name, [12, 14], false);
  s.wire([8, 12], p1.minus);
  s.wire([8, 12], [8, 2], [10, 2]);
  put(r3, [10, 2], [18, 2]);
  s.wire([18, 2], [66, 2], [66, 18]);
  s.wire([8, 6], [10, 6]);
  put(r2, [10, 6], [18, 6]);
  s.wire([18, 6], [21, 6], [21, 14]);
  s.wire(p1.out, [21, 14]);
  // first integrator
  put(r6, [21, 14], [29, 14]);
  const p2 = s.opamp(u2.name, [34, 16], false);
  s.wire([29, 14], p2.minus);
  s.wire(p2.plus, [32, 18]);
  s.ground([32, 18]);
  s.wire([30, 14], [30, 8], [32, 8]);
  put(c1, [32, 8], [40, 8]);
  s.wire([40, 8], [43, 8], [43, 16]);
  s.wire(p2.out, [44, 16]);
  // second integrator
  put(r7, [44, 16], [52, 16], "below");
  const p3 = s.opamp(u3.name, [56, 18], false);
  s.wire([52, 16], p3.minus);
  s.wire(p3.plus, [54, 20]);
  s.ground([54, 20]);
  s.wire([52, 16], [52, 10], [54, 10]);
  put(c2, [54, 10], [62, 10]);
  s.wire([62, 10], [65, 10], [65, 18]);
  s.wire(p3.out, [lp === "out" ? 68 : 66, 18]);
  // damping divider into the non-inverting input, along the bottom
  s.wire(p1.plus, [10, 16], [10, 26], [18, 26]);
  put(r4, [18, 26], [26, 26], "below");
  s.wire([26, 26], [42, 26], [42, 16]);
  put(r5, [2, 21], [10, 21], "above");
  s.ground([2, 21]);
  // the output terminal on whichever amplifier output the topology taps
  if (lp === "out") s.terminal("out", [68, 18], "right");
  else if (bp === "out") {
    s.wire([42, 26], [42, 30], [70, 30]);
    s.terminal("out", [70, 30], "right");
  } else if (hp === "out") {
    s.wire([20, 14], [20, 30], [70, 30]);
    s.terminal("out", [70, 30], "right");
  } else return null;
  return s.done();
}
