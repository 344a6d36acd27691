import { describe, expect, it } from "vitest";
import { FilterwrightError, InvalidArgumentError } from "../../src/errors.ts";
import { asBuiltLadder, ladderParts, scaleLadder, type LadderPrototype, type ScaleLadderOptions } from "../../src/ladder/index.ts";
import { thrownBy } from "../helpers/throws.ts";
import { butterworthLadder, chebyshevLadder, ellipticLadder } from "./prototypes.ts";

const good = butterworthLadder(3, "shunt-first");
const lp: ScaleLadderOptions = { edgeHz: 1e3, sourceOhms: 50 };

function pathOf(f: () => unknown): string {
  const e = thrownBy(f, InvalidArgumentError);
  expect(e.reason.length).toBeGreaterThan(10);
  return e.path;
}

describe("scaleLadder rejects a malformed prototype, naming the field", () => {
  const cases: [string, unknown, string][] = [
    ["not an object", null, "prototype"],
    ["unknown family", { ...good, family: "gaussian" }, "prototype.family"],
    ["order not an integer", { ...good, order: 2.5 }, "prototype.order"],
    ["unknown form", { ...good, form: "pi" }, "prototype.form"],
    ["elements not an array", { ...good, elements: "C" }, "prototype.elements"],
    ["fewer arms than the order", { ...good, elements: good.elements.slice(0, 2) }, "prototype.elements"],
    ["arms that do not alternate", { ...good, elements: [good.elements[0], good.elements[0], good.elements[2]] }, "prototype.elements[1].kind"],
    ["a negative value", { ...good, elements: [good.elements[0], { kind: "series-L", value: -2 }, good.elements[2]] }, "prototype.elements[1].value"],
    ["a NaN tank capacitor", { ...good, elements: [good.elements[0], { kind: "series-L", value: 2, parallelC: Number.NaN }, good.elements[2]] }, "prototype.elements[1].parallelC"],
    ["a series inductor on a series arm", { ...good, elements: [good.elements[0], { kind: "series-L", value: 2, seriesL: 1 }, good.elements[2]] }, "prototype.elements[1].seriesL"],
    ["zero source resistance", { ...good, sourceOhms: 0 }, "prototype.sourceOhms"],
    ["infinite load", { ...good, loadOhms: Number.POSITIVE_INFINITY }, "prototype.loadOhms"],
    ["no transfer", { ...good, transfer: undefined }, "prototype.transfer"],
    ["too few poles", { ...good, transfer: { ...good.transfer, poles: good.transfer.poles.filter((p) => p.im === 0) } }, "prototype.transfer.poles"],
    ["an unstable pole", { ...good, transfer: { ...good.transfer, poles: good.transfer.poles.map((p) => (p.im === 0 ? { re: 1, im: 0 } : p)) } }, `prototype.transfer.poles[${good.transfer.poles.findIndex((p) => p.im === 0)}]`],
    ["a zero at the origin", { ...good, transfer: { ...good.transfer, zeros: [{ re: 0, im: 0 }] } }, "prototype.transfer.zeros[0]"],
    ["zero gain", { ...good, transfer: { ...good.transfer, gain: 0 } }, "prototype.transfer.gain"],
  ];
  it.each(cases)("%s", (_name, prototype, path) => {
    expect(pathOf(() => scaleLadder(prototype as LadderPrototype, lp))).toBe(path);
  });
});

describe("scaleLadder rejects bad options, naming the field", () => {
  const cases: [string, unknown, string][] = [
    ["no options", undefined, "options"],
    ["not an object", 5, "options"],
    ["an unknown option", { ...lp, edge: 1 }, "options.edge"],
    ["an unknown response", { ...lp, response: "allpass" }, "options.response"],
    ["a lowpass without its edge", { sourceOhms: 50 }, "options.edgeHz"],
    ["a lowpass given two edges", { edgeHz: [1, 2], sourceOhms: 50 }, "options.edgeHz"],
    ["a highpass given a centre", { response: "highpass", edgeHz: 1e3, centreHz: 1e3, sourceOhms: 50 }, "options.centreHz"],
    ["a negative edge", { edgeHz: -1e3, sourceOhms: 50 }, "options.edgeHz"],
    ["a bandpass without a band", { response: "bandpass", sourceOhms: 50 }, "options.edgeHz"],
    ["a bandpass with edges and a centre", { response: "bandpass", edgeHz: [1, 2], centreHz: 1.5, sourceOhms: 50 }, "options.edgeHz"],
    ["a bandpass with one edge", { response: "bandpass", edgeHz: 1e3, sourceOhms: 50 }, "options.edgeHz"],
    ["a bandpass with reversed edges", { response: "bandpass", edgeHz: [2e3, 1e3], sourceOhms: 50 }, "options.edgeHz[1]"],
    ["a bandstop without its width", { response: "bandstop", centreHz: 1e3, sourceOhms: 50 }, "options.bandwidthHz"],
    ["a bandstop with a NaN centre", { response: "bandstop", centreHz: Number.NaN, bandwidthHz: 1, sourceOhms: 50 }, "options.centreHz"],
    ["no termination", { edgeHz: 1e3 }, "options.sourceOhms"],
    ["a negative termination", { edgeHz: 1e3, loadOhms: -50 }, "options.loadOhms"],
    ["values beyond any part", { edgeHz: 1e-300, sourceOhms: 1e-300 }, "options.edgeHz"],
  ];
  it.each(cases)("%s", (_name, options, path) => {
    expect(pathOf(() => scaleLadder(good, options as ScaleLadderOptions))).toBe(path);
  });

  it("terminations whose ratio is not the prototype's", () => {
    const p = chebyshevLadder(4, 0.5, "shunt-first");
    const e = thrownBy(() => scaleLadder(p, { edgeHz: 1e3, sourceOhms: 50, loadOhms: 50 }), InvalidArgumentError);
    expect(e.path).toBe("options.loadOhms");
    expect(e.reason).toContain(`${p.loadOhms / p.sourceOhms} times the source`);
  });
});

describe("asBuiltLadder and ladderParts reject bad input, naming the field", () => {
  const scaled = scaleLadder(ellipticLadder("shunt-first"), { response: "bandpass", centreHz: 1e6, bandwidthHz: 2e5, sourceOhms: 50 });
  const cases: [string, () => unknown, string][] = [
    ["not a ladder", () => asBuiltLadder(7 as never), "ladder"],
    ["no components", () => asBuiltLadder({ ...scaled, components: [] }), "ladder.components"],
    ["a duplicate designator", () => asBuiltLadder({ ...scaled, components: [scaled.components[0], scaled.components[0]] } as never), "ladder.components[1].designator"],
    ["an unknown kind", () => asBuiltLadder({ ...scaled, components: [{ ...scaled.components[0], kind: "R" }] } as never), "ladder.components[0].kind"],
    ["a shorted part", () => asBuiltLadder({ ...scaled, components: [{ ...scaled.components[0], b: "in" }] } as never), "ladder.components[0].b"],
    ["no transfer", () => asBuiltLadder({ ...scaled, transfer: null } as never), "ladder.transfer"],
    ["no placement for the default Q frequency", () => asBuiltLadder({ ...scaled, placement: {} } as never), "ladder.placement"],
    ["an unknown option", () => asBuiltLadder(scaled, { q: 50 } as never), "options.q"],
    ["a resistor series for inductors", () => asBuiltLadder(scaled, { inductorSeries: "E96" } as never), "options.inductorSeries"],
    ["an unknown capacitor series", () => asBuiltLadder(scaled, { capacitorSeries: "E7" } as never), "options.capacitorSeries"],
    ["a tolerance above 50 %", () => asBuiltLadder(scaled, { inductorTolerance: 0.7 }), "options.inductorTolerance"],
    ["a zero tolerance", () => asBuiltLadder(scaled, { capacitorTolerance: 0 }), "options.capacitorTolerance"],
    ["a Q below 1", () => asBuiltLadder(scaled, { inductorQ: 0.5 }), "options.inductorQ"],
    ["an infinite Q", () => asBuiltLadder(scaled, { inductorQ: Number.POSITIVE_INFINITY }), "options.inductorQ"],
    ["a negative Q frequency", () => asBuiltLadder(scaled, { qFrequencyHz: -1 }), "options.qFrequencyHz"],
    ["a negative ESR", () => asBuiltLadder(scaled, { capacitorEsrOhms: -0.1 }), "options.capacitorEsrOhms"],
    ["a scaled ladder given to ladderParts", () => ladderParts(scaled as never), "ladder.losses"],
    ["a part without its series", () => ladderParts({ ...asBuiltLadder(scaled), components: scaled.components } as never), "ladder.components[0]"],
  ];
  it.each(cases)("%s", (_name, f, path) => {
    expect(pathOf(f)).toBe(path);
  });

  it("every failure is a FilterwrightError naming its function", () => {
    const e = thrownBy(() => asBuiltLadder(scaled, { inductorQ: -1 }), FilterwrightError);
    expect(e.fn).toBe("asBuiltLadder");
    expect(thrownBy(() => scaleLadder(null as never, lp), FilterwrightError).fn).toBe("scaleLadder");
    expect(thrownBy(() => ladderParts(null as never), FilterwrightError).fn).toBe("ladderParts");
  });
});
