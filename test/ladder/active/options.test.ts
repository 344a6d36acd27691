import { describe, expect, it } from "vitest";
import { FilterwrightError, InvalidArgumentError, UnrealisableError } from "../../../src/errors.ts";
import { fdnrLowpassLadder, gicHighpassLadder, leapfrogLowpassLadder } from "../../../src/ladder/active/index.ts";
import type { LadderPrototype } from "../../../src/ladder/types.ts";
import { butterworthLadder } from "../../helpers/ladder-prototypes.ts";
import { thrownBy } from "../../helpers/throws.ts";

const METHODS = [
  ["leapfrogLowpassLadder", leapfrogLowpassLadder],
  ["fdnrLowpassLadder", fdnrLowpassLadder],
  ["gicHighpassLadder", gicHighpassLadder],
] as const;

const third = butterworthLadder(3, "series-first");
const [L1, L2, L3] = third.elements;

describe.each(METHODS)("%s: bad options", (fn, make) => {
  const call = (options: unknown, p: unknown = third): unknown => make(p as LadderPrototype, options as never);

  it.each([
    ["no options", undefined, "options"],
    ["options not an object", 5, "options"],
    ["edge missing", {}, "options.edgeHz"],
    ["edge negative", { edgeHz: -1 }, "options.edgeHz"],
    ["edge NaN", { edgeHz: Number.NaN }, "options.edgeHz"],
    ["edge too high", { edgeHz: 2e9 }, "options.edgeHz"],
    ["capacitor not in its series", { edgeHz: 1000, capacitorF: 1.3e-9 }, "options.capacitorF"],
    ["capacitor too small", { edgeHz: 1000, capacitorF: 1e-13 }, "options.capacitorF"],
    ["capacitor Infinity", { edgeHz: 1000, capacitorF: Number.POSITIVE_INFINITY }, "options.capacitorF"],
    ["unknown resistor series", { edgeHz: 1000, resistorSeries: "E100" }, "options.resistorSeries"],
    ["unknown capacitor series", { edgeHz: 1000, capacitorSeries: 12 }, "options.capacitorSeries"],
    ["unknown values mode", { edgeHz: 1000, values: "rounded" }, "options.values"],
    ["bad op-amp kind", { edgeHz: 1000, opamp: { kind: "two-pole" } }, "options.opamp.kind"],
    ["op-amp GBW zero", { edgeHz: 1000, opamp: { kind: "single-pole", a0: 1e5, gbwHz: 0 } }, "options.opamp.gbwHz"],
    ["gain zero", { edgeHz: 1000, gain: 0 }, "options.gain"],
    ["gain huge", { edgeHz: 1000, gain: 1e4 }, "options.gain"],
  ])("%s", (_, options, path) => {
    const e = thrownBy(() => call(options), InvalidArgumentError);
    expect(e.fn).toBe(fn);
    expect(e.path).toBe(path);
  });

  it.each([
    ["not an object", null, "prototype"],
    ["no arms", { ...third, elements: [] }, "prototype.elements"],
    ["an unknown arm", { ...third, elements: [{ kind: "shunt-L", value: 1 }, L2, L3] }, "prototype.elements[0].kind"],
    ["a zero value", { ...third, elements: [{ kind: "series-L", value: 0 }, L2, L3] }, "prototype.elements[0].value"],
    ["a NaN value", { ...third, elements: [L1, { kind: "shunt-C", value: Number.NaN }, L3] }, "prototype.elements[1].value"],
    ["two series arms in a row", { ...third, elements: [L1, { kind: "series-L", value: 1 }, L3] }, "prototype.elements[1].kind"],
    ["a shunt arm with a parallel capacitor", { ...third, elements: [L1, { kind: "shunt-C", value: 2, parallelC: 1 }, L3] }, "prototype.elements[1].parallelC"],
    ["a negative resonator inductor", { ...third, elements: [L1, { kind: "shunt-C", value: 2, seriesL: -1 }, L3] }, "prototype.elements[1].seriesL"],
    ["arms fewer than its order", { ...third, elements: [L1, L2] }, "prototype.elements"],
    ["an order its transfer does not have", { ...third, order: 2, elements: [L1, L2] }, "prototype.transfer.poles"],
    ["a zero load", { ...third, loadOhms: 0 }, "prototype.loadOhms"],
    ["a huge source", { ...third, sourceOhms: 1e9 }, "prototype.sourceOhms"],
    ["no transfer", { ...third, transfer: undefined }, "prototype.transfer"],
  ])("a prototype with %s", (_, p, path) => {
    const e = thrownBy(() => call({ edgeHz: 1000 }, p), InvalidArgumentError);
    expect(e.path).toBe(path);
  });

  it("a dcPathRatio out of range (the FDNR and GIC methods)", () => {
    if (fn === "leapfrogLowpassLadder") {
      // leapfrog adds no DC path resistors and has no such option: the field is ignored
      expect(() => call({ edgeHz: 1000, dcPathRatio: 1 })).not.toThrow();
    } else {
      expect(thrownBy(() => call({ edgeHz: 1000, dcPathRatio: 1 }), InvalidArgumentError).path).toBe("options.dcPathRatio");
    }
  });

  it("a capacitor that puts a part outside the hard window says which way to move it", () => {
    // a tiny capacitor at a low edge asks for resistors far above 10 Mohm
    const e = thrownBy(() => call({ edgeHz: 1, capacitorF: 10e-12 }), UnrealisableError);
    expect(e.path).toBe("options.capacitorF");
    expect(e.message).toMatch(/choose a larger capacitor/);
    const f = thrownBy(() => call({ edgeHz: 1e6, capacitorF: 10e-6 }), UnrealisableError);
    expect(f.message).toMatch(/choose a smaller capacitor/);
  });

  it("never returns a non-finite or non-positive part for in-range options", () => {
    for (const edgeHz of [0.01, 1, 1e3, 1e6]) {
      try {
        const r = call({ edgeHz }) as { parts: { value: number }[] };
        for (const part of r.parts) expect(Number.isFinite(part.value) && part.value > 0).toBe(true);
      } catch (e) {
        expect(e).toBeInstanceOf(FilterwrightError);
      }
    }
  });
});
