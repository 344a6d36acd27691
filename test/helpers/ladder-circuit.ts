/**
 * A ladder's element list as a circuit of the circuit layer (R, L, C and a
 * voltage source), for the ladder tests: the response then comes from the
 * circuit's own modified nodal analysis, independent of the ladder's
 * `transfer` field and of the synthesis code.
 */
import type { Circuit, Element } from "../../src/circuit/types.ts";
import type { LadderPrototype } from "../../src/ladder/types.ts";

/** Source "Vs" (1 V AC) into "in", source resistor to "n0", arms along "n0", "n1", ..., load to ground; output node returned. */
export function ladderCircuit(ladder: LadderPrototype): { circuit: Circuit; output: string } {
  const els: Element[] = [
    { kind: "V", name: "Vs", a: "in", b: "0", ac: 1 },
    { kind: "R", name: "Rs", a: "in", b: "n0", value: ladder.sourceOhms },
  ];
  let node = 0;
  ladder.elements.forEach((e, i) => {
    const here = `n${node}`;
    if (e.kind === "series-L") {
      const next = `n${node + 1}`;
      els.push({ kind: "L", name: `L${i + 1}`, a: here, b: next, value: e.value });
      if (e.parallelC !== undefined) els.push({ kind: "C", name: `C${i + 1}`, a: here, b: next, value: e.parallelC });
      node++;
    } else if (e.seriesL === undefined) {
      els.push({ kind: "C", name: `C${i + 1}`, a: here, b: "0", value: e.value });
    } else {
      els.push({ kind: "C", name: `C${i + 1}`, a: here, b: `m${i + 1}`, value: e.value });
      els.push({ kind: "L", name: `L${i + 1}`, a: `m${i + 1}`, b: "0", value: e.seriesL });
    }
  });
  const output = `n${node}`;
  els.push({ kind: "R", name: "RL", a: output, b: "0", value: ladder.loadOhms });
  return { circuit: { title: `${ladder.family} ladder, order ${ladder.order}`, elements: els }, output };
}
