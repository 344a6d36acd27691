import { describe, expect, it } from "vitest";
import { validateCircuit } from "../../src/circuit/validate.ts";
import type { Circuit, Element } from "../../src/circuit/types.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { thrownBy } from "../helpers/throws.ts";

const base: Element[] = [
  { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 },
  { kind: "R", name: "R1", a: "in", b: "out", value: 1e3 },
  { kind: "C", name: "C1", a: "out", b: "0", value: 1e-9 },
];
const withEl = (e: unknown): Circuit => ({ title: "t", elements: [...base, e as Element] });

describe("validateCircuit", () => {
  it("accepts a valid circuit and returns it", () => {
    const c = { title: "ok", elements: base };
    expect(validateCircuit(c)).toBe(c);
  });

  it.each([
    [{ kind: "R", name: "R2", a: "out", b: "0", value: 0 }, "elements[3].value"],
    [{ kind: "C", name: "C2", a: "out", b: "0", value: -1e-9 }, "elements[3].value"],
    [{ kind: "L", name: "L1", a: "out", b: "0", value: Infinity }, "elements[3].value"],
    [{ kind: "R", name: "r1", a: "out", b: "0", value: 1 }, "elements[3].name"],
    [{ kind: "R", name: "R 2", a: "out", b: "0", value: 1 }, "elements[3].name"],
    [{ kind: "R", name: "R2", a: "out.x", b: "0", value: 1 }, "elements[3].a"],
    [{ kind: "R", name: "R2", a: "OUT", b: "0", value: 1 }, "elements[3].a"],
    [{ kind: "Q", name: "Q1", a: "out", b: "0", value: 1 }, "elements[3].kind"],
    [{ kind: "V", name: "V2", a: "out", b: "0", ac: Number.NaN }, "elements[3].ac"],
    [{ kind: "E", name: "E1", a: "x", b: "0", cp: "out", cn: "0", gain: Infinity }, "elements[3].gain"],
    [{ kind: "OA", name: "U1", inP: "out", inN: "x", out: "x", model: { kind: "single-pole", a0: 1e5, gbwHz: 0 } }, "elements[3].model.gbwHz"],
    [{ kind: "OA", name: "U1", inP: "out", inN: "x", out: "x", model: { kind: "single-pole-rout", a0: 1e5, gbwHz: 1e6, routOhm: -1 } }, "elements[3].model.routOhm"],
    [{ kind: "OA", name: "U1", inP: "out", inN: "x", out: "x", model: { kind: "perfect" } }, "elements[3].model.kind"],
    [{ kind: "OA", name: "U1", inP: "out", inN: "x", out: "0", model: { kind: "ideal" } }, "elements[3].out"],
  ])("rejects %j at %s", (el, path) => {
    const e = thrownBy(() => validateCircuit(withEl(el)), InvalidArgumentError);
    expect(e.path).toBe(path);
    expect(e.fn).toBe("validateCircuit");
  });

  it("rejects a non-object and a missing element list", () => {
    expect(() => validateCircuit(null as unknown as Circuit)).toThrow(InvalidArgumentError);
    expect(() => validateCircuit({ title: "x" } as unknown as Circuit)).toThrow(/elements/);
  });
});
