/**
 * The layout for any stage: one horizontal line per node (the input at the
 * top, the internal nodes in the order the element list first names them,
 * the output, then the ground rail at the bottom), and each element in a
 * column of its own in element-list order: a part hangs from the upper of its
 * two nodes with its body in the gap below that line and a wire on down to
 * the other (or a ground symbol); an op-amp sits in the gap below the upper of its inputs, that
 * input wired up, the other input and the output wired to their lines. A
 * vertical wire that crosses a line without a dot does not connect to it.
 * Every connection is therefore explicit and the drawing reads the same for
 * every topology; the per-topology templates draw the common ones the way
 * they are usually drawn. A part or op-amp input to ground ends in a ground
 * symbol of its own rather than a wire to a ground line.
 *
 * @module
 */
import type { Element } from "../../circuit/types.ts";
import { textWidth } from "../plot/text.ts";
import { formatValue } from "../../units/index.ts";
import { GRID, sheetBuilder, type Sheet } from "./sheet.ts";

/** Distance between node lines, grid units. */
const ROW = 10;
/** Where the first column starts, grid units. */
const LEFT = 6;

/** A part's label width in grid units (designator over value, to its right). */
function labelUnits(e: Element): number {
  if (e.kind !== "R" && e.kind !== "C" && e.kind !== "L") return 0;
  const v = formatValue(e.value, { digits: 3, unit: e.kind === "R" ? "\u03a9" : e.kind === "C" ? "F" : "H" });
  return Math.ceil(Math.max(textWidth(e.name, 12), textWidth(v, 12)) / GRID);
}

/**
 * Lay out a stage's elements (see the module header).
 *
 * @param elements - the stage's elements, nodes named as in its topology
 * @returns the sheet
 */
export function genericSheet(elements: readonly Element[]): Sheet {
  const s = sheetBuilder();
  const order: string[] = ["in"];
  const see = (n: string): void => {
    if (n !== "0" && n !== "out" && !order.includes(n)) order.push(n);
  };
  for (const e of elements) {
    if (e.kind === "OA") [e.inP, e.inN, e.out].forEach(see);
    else if (e.kind === "R" || e.kind === "C" || e.kind === "L") [e.a, e.b].forEach(see);
  }
  order.push("out");
  const y = (node: string): number => ROW * (1 + order.indexOf(node));
  const first = new Map<string, number>([["in", LEFT]]);
  const last = new Map<string, number>();
  const touch = (node: string, at: number): void => {
    first.set(node, Math.min(first.get(node) ?? at, at));
    last.set(node, Math.max(last.get(node) ?? at, at));
  };
  let x = LEFT + 2;
  for (const e of elements) {
    if (e.kind === "R" || e.kind === "C" || e.kind === "L") {
      if (e.a === "0" || e.b === "0") {
        const node = e.a === "0" ? e.b : e.a;
        s.part(e.kind, e.name, e.value, [x, y(node)], [x, y(node) + ROW - 4], "right");
        s.ground([x, y(node) + ROW - 4]);
        touch(node, x);
      } else {
        const [upper, lower] = y(e.a) <= y(e.b) ? [e.a, e.b] : [e.b, e.a];
        const top = y(upper);
        s.part(e.kind, e.name, e.value, [x, top], [x, top + ROW - 2], "right");
        s.wire([x, top + ROW - 2], [x, y(lower)]);
        touch(upper, x);
        touch(lower, x);
      }
      x += 3 + labelUnits(e);
    } else if (e.kind === "OA") {
      // a grounded input takes the lower pin and a ground symbol of its own
      const plusUp = e.inP === "0" ? false : e.inN === "0" ? true : y(e.inP) <= y(e.inN);
      const [upper, lower] = plusUp ? [e.inP, e.inN] : [e.inN, e.inP];
      const yc = y(upper) + ROW / 2;
      const at = x + 2;
      const pins = s.opamp(e.name, [at, yc], plusUp);
      const topPin = plusUp ? pins.plus : pins.minus;
      const bottomPin = plusUp ? pins.minus : pins.plus;
      s.wire(topPin, [topPin[0], y(upper)]);
      if (lower === "0") {
        s.wire(bottomPin, [bottomPin[0] - 1, bottomPin[1]]);
        s.ground([bottomPin[0] - 1, bottomPin[1]]);
      } else s.wire(bottomPin, [bottomPin[0] - 1, bottomPin[1]], [bottomPin[0] - 1, y(lower)]);
      s.wire(pins.out, [pins.out[0], y(e.out)]);
      touch(upper, topPin[0]);
      if (lower !== "0") touch(lower, bottomPin[0] - 1);
      touch(e.out, pins.out[0]);
      x = pins.out[0] + 3;
    }
  }
  const right = x;
  for (const node of order) {
    const yy = y(node);
    const from = first.get(node) ?? LEFT;
    const to = node === "out" ? right : (last.get(node) ?? from);
    if (to > from) s.wire([from, yy], [to, yy]);
    if (node === "in") s.terminal("in", [LEFT, yy], "left");
    else if (node === "out") s.terminal("out", [right, yy], "right");
    else s.nodeLabel(node, [from, yy]);
  }
  return s.done();
}
