import { describe, expect, it } from "vitest";
import { InvalidArgumentError } from "../../src/errors.ts";
import { circuitToSpice, ladderCircuit, LADDER_SOURCE, validateCircuit } from "../../src/circuit/index.ts";
import { asBuiltLadder, scaleLadder } from "../../src/ladder/index.ts";
import { thrownBy } from "../helpers/throws.ts";
import { butterworthLadder, ellipticLadder } from "../ladder/prototypes.ts";

describe("ladderCircuit", () => {
  const scaled = scaleLadder(butterworthLadder(3, "shunt-first"), { edgeHz: 1e6, sourceOhms: 50 });

  it("drives the ladder from VS through RS and loads it with RL, every part on its own nodes", () => {
    const c = ladderCircuit(scaled);
    expect(validateCircuit(c)).toBe(c);
    expect(c.title).toBe("LC ladder: butterworth lowpass, order 3");
    expect(c.elements.map((e) => e.name)).toEqual([LADDER_SOURCE, "RS", "C1", "L1", "C2", "RL"]);
    expect(c.elements).toContainEqual({ kind: "V", name: "VS", a: "src", b: "0", ac: 1 });
    expect(c.elements).toContainEqual({ kind: "R", name: "RS", a: "src", b: "in", value: 50 });
    expect(c.elements).toContainEqual({ kind: "R", name: "RL", a: "out", b: "0", value: 50 });
    expect(c.elements).toContainEqual({ kind: "L", name: "L1", a: "in", b: "out", value: scaled.components[1]?.value });
  });

  it("puts each as-built part's loss resistance in series with it", () => {
    const built = asBuiltLadder(scaled, { inductorQ: 40, capacitorEsrOhms: 0.3 });
    const c = ladderCircuit(built, { title: "front-end lowpass" });
    expect(c.title).toBe("front-end lowpass");
    const l1 = built.components.find((x) => x.designator === "L1");
    expect(c.elements).toContainEqual({ kind: "L", name: "L1", a: "in", b: "L1_r", value: l1?.value });
    expect(c.elements).toContainEqual({ kind: "R", name: "R_L1", a: "L1_r", b: "out", value: l1?.seriesOhms });
    expect(c.elements).toContainEqual({ kind: "R", name: "R_C1", a: "C1_r", b: "0", value: 0.3 });
    expect(circuitToSpice(c, { ac: false })).toContain("R_L1 L1_r out ");
  });

  it("names the arms' inner nodes after their arm", () => {
    const band = scaleLadder(ellipticLadder("shunt-first"), { response: "bandpass", centreHz: 1e6, bandwidthHz: 1e5, sourceOhms: 50 });
    const c = ladderCircuit(band);
    const nodes = new Set(c.elements.flatMap((e) => ("a" in e ? [e.a, e.b] : [])));
    expect([...nodes].sort()).toEqual(["0", "a2_1", "in", "out", "src"]);
  });

  it("rejects what is not a ladder, naming the field", () => {
    expect(thrownBy(() => ladderCircuit(null as never), InvalidArgumentError).path).toBe("ladder");
    const bad = { ...scaled, components: scaled.components.map((x, i) => (i === 1 ? { ...x, value: -1 } : x)) };
    expect(thrownBy(() => ladderCircuit(bad), InvalidArgumentError).path).toBe("ladder.components[1].value");
    const src = { ...scaled, components: scaled.components.map((x, i) => (i === 0 ? { ...x, a: "src" } : x)) };
    expect(thrownBy(() => ladderCircuit(src), InvalidArgumentError).path).toBe("ladder.components[0].a");
    const loss = { ...scaled, components: scaled.components.map((x) => ({ ...x, seriesOhms: Number.NaN })) };
    expect(thrownBy(() => ladderCircuit(loss), InvalidArgumentError).path).toBe("ladder.components[0].seriesOhms");
    expect(thrownBy(() => ladderCircuit(scaled, { title: 3 } as never), InvalidArgumentError).path).toBe("options.title");
    expect(thrownBy(() => ladderCircuit({ ...scaled, outputNode: "0" }), InvalidArgumentError).path).toBe("ladder.outputNode");
  });
});
