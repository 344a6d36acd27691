import { describe, expect, it } from "vitest";
import { scaleLadder, type ScaledLadder } from "../../src/ladder/index.ts";
import { lowpassToBandpass, lowpassToBandstop, lowpassToHighpass, lowpassToLowpass } from "../../src/tf/index.ts";
import { expectClose } from "../helpers/tolerance.ts";
import { butterworthLadder, chebyshevLadder, ellipticLadder } from "./prototypes.ts";

const W = 2 * Math.PI * 1e6;
const value = (l: ScaledLadder, d: string): number => l.components.find((c) => c.designator === d)?.value as number;
const wiring = (l: ScaledLadder): string[] => l.components.map((c) => `${c.designator} ${c.a}-${c.b} arm ${c.arm}`);

describe("scaleLadder: element-level transforms", () => {
  const proto = butterworthLadder(3, "shunt-first"); // g = 1, 2, 1

  it("lowpass: L' = R0 g / w0, C' = g / (R0 w0)", () => {
    const l = scaleLadder(proto, { edgeHz: 1e6, sourceOhms: 50 });
    expect(wiring(l)).toEqual(["C1 in-0 arm 1", "L1 in-out arm 2", "C2 out-0 arm 3"]);
    expectClose(value(l, "C1"), 1 / (50 * W), { rel: 4e-16 });
    expectClose(value(l, "L1"), (50 * 2) / W, { rel: 4e-16 });
    expect(l.arms.map((a) => [a.position, a.a, a.b, a.designators])).toEqual([
      ["shunt", "in", "0", ["C1"]],
      ["series", "in", "out", ["L1"]],
      ["shunt", "out", "0", ["C2"]],
    ]);
    expect([l.inputNode, l.outputNode, l.sourceOhms, l.loadOhms]).toEqual(["in", "out", 50, 50]);
    expect(l.placement).toEqual({ response: "lowpass", edgeHz: 1e6 });
  });

  it("highpass: each capacitor becomes an inductor R0 / (w0 g), each inductor a capacitor 1 / (R0 w0 g)", () => {
    const l = scaleLadder(proto, { response: "highpass", edgeHz: 1e6, sourceOhms: 50 });
    expect(wiring(l)).toEqual(["L1 in-0 arm 1", "C1 in-out arm 2", "L2 out-0 arm 3"]);
    expectClose(value(l, "L1"), 50 / W, { rel: 4e-16 });
    expectClose(value(l, "C1"), 1 / (50 * W * 2), { rel: 4e-16 });
  });

  it("bandpass: shunt capacitors become parallel resonators, series inductors series resonators, all tuned to the centre", () => {
    const l = scaleLadder(proto, { response: "bandpass", centreHz: 1e6, bandwidthHz: 1e5, sourceOhms: 50 });
    const b = W / 10;
    expect(wiring(l)).toEqual(["L1 in-0 arm 1", "C1 in-0 arm 1", "L2 in-a2_1 arm 2", "C2 a2_1-out arm 2", "L3 out-0 arm 3", "C3 out-0 arm 3"]);
    expectClose(value(l, "C1"), 1 / (b * 50), { rel: 1e-15 });
    expectClose(value(l, "L1"), (50 * b) / (W * W), { rel: 1e-15 });
    expectClose(value(l, "L2"), (50 * 2) / b, { rel: 1e-15 });
    expectClose(value(l, "C2"), b / (W * W * 2 * 50), { rel: 1e-15 });
  });

  it("bandstop: shunt capacitors become series resonators, series inductors parallel resonators", () => {
    const l = scaleLadder(proto, { response: "bandstop", centreHz: 1e6, bandwidthHz: 1e5, sourceOhms: 50 });
    const b = W / 10;
    expect(wiring(l)).toEqual(["L1 in-a1_1 arm 1", "C1 a1_1-0 arm 1", "L2 in-out arm 2", "C2 in-out arm 2", "L3 out-a3_1 arm 3", "C3 a3_1-0 arm 3"]);
    expectClose(value(l, "L1"), 50 / (b * 1), { rel: 1e-15 });
    expectClose(value(l, "C1"), b / (W * W * 50), { rel: 1e-15 });
    expectClose(value(l, "C2"), 1 / (b * 2 * 50), { rel: 1e-15 });
    expectClose(value(l, "L2"), (50 * b * 2) / (W * W), { rel: 1e-15 });
  });

  it("an elliptic tank becomes a series resonator in parallel with a parallel one (bandpass), and its dual's shunt resonator two resonators in series (bandstop)", () => {
    const tank = scaleLadder(ellipticLadder("shunt-first"), { response: "bandpass", centreHz: 1e6, bandwidthHz: 2e5, sourceOhms: 50 });
    expect(tank.arms[1]?.designators).toEqual(["L2", "C2", "L3", "C3"]);
    expect(wiring(tank).slice(2, 6)).toEqual(["L2 in-a2_1 arm 2", "C2 a2_1-out arm 2", "L3 in-out arm 2", "C3 in-out arm 2"]);
    const dual = scaleLadder(ellipticLadder("series-first"), { response: "bandstop", centreHz: 1e6, bandwidthHz: 2e5, sourceOhms: 50 });
    expect(wiring(dual).filter((w) => w.endsWith("arm 2"))).toEqual(["L2 n1-a2_1 arm 2", "C2 n1-a2_1 arm 2", "L3 a2_1-a2_2 arm 2", "C3 a2_2-0 arm 2"]);
  });

  it("every resonator of a band ladder resonates at the centre, tanks included", () => {
    for (const response of ["bandpass", "bandstop"] as const) {
      for (const p of [ellipticLadder("shunt-first"), ellipticLadder("series-first"), chebyshevLadder(6, 0.5, "series-first")]) {
        const l = scaleLadder(p, { response, edgeHz: [0.8e6, 1.25e6], sourceOhms: 75 });
        for (let i = 0; i < l.components.length; i += 2) {
          const [x, y] = [l.components[i], l.components[i + 1]];
          expect([x?.kind, y?.kind]).toEqual(["L", "C"]);
          expectClose((x?.value as number) * (y?.value as number) * W * W, 1, { rel: 1e-14, label: `${x?.designator}, ${y?.designator}` });
        }
      }
    }
  });
});

describe("scaleLadder: placement, terminations and transfer", () => {
  it("a band given by its edges has them as its geometric centre and width; by centre and width, edges to match", () => {
    const p = butterworthLadder(4, "series-first");
    const byEdges = scaleLadder(p, { response: "bandpass", edgeHz: [9e3, 16e3], sourceOhms: 600 });
    expect(byEdges.placement).toEqual({ response: "bandpass", centreHz: 12e3, bandwidthHz: 7e3, lowerHz: 9e3, upperHz: 16e3 });
    const byCentre = scaleLadder(p, { response: "bandstop", centreHz: 12e3, bandwidthHz: 7e3, sourceOhms: 600 });
    if (!("lowerHz" in byCentre.placement)) throw new Error("expected a band");
    expectClose(byCentre.placement.lowerHz, 9e3, { rel: 1e-15 });
    expectClose(byCentre.placement.upperHz, 16e3, { rel: 1e-15 });
  });

  it("one termination sets the other by the prototype's ratio; both must keep it", () => {
    const p = chebyshevLadder(4, 0.5, "shunt-first");
    const ratio = p.loadOhms / p.sourceOhms;
    expect(ratio).not.toBeCloseTo(1, 2);
    const byLoad = scaleLadder(p, { edgeHz: 1e3, loadOhms: 100 });
    expectClose(byLoad.sourceOhms, 100 / ratio, { rel: 1e-15 });
    const both = scaleLadder(p, { edgeHz: 1e3, sourceOhms: 50, loadOhms: 50 * ratio });
    expect(both.loadOhms).toBe(50 * ratio);
  });

  it("the transfer is the prototype's under the tf transforms; the prototype is left as it was", () => {
    const p = ellipticLadder("series-first");
    const before = JSON.stringify(p);
    const w0 = 2 * Math.PI * 5e3;
    expect(scaleLadder(p, { edgeHz: 5e3, sourceOhms: 1 }).transfer).toEqual(lowpassToLowpass(p.transfer, { w0 }));
    expect(scaleLadder(p, { response: "highpass", edgeHz: 5e3, sourceOhms: 1 }).transfer).toEqual(lowpassToHighpass(p.transfer, { w0 }));
    const band = { w0, bandwidth: 2 * Math.PI * 1e3 };
    expect(scaleLadder(p, { response: "bandpass", centreHz: 5e3, bandwidthHz: 1e3, sourceOhms: 1 }).transfer).toEqual(lowpassToBandpass(p.transfer, band));
    expect(scaleLadder(p, { response: "bandstop", centreHz: 5e3, bandwidthHz: 1e3, sourceOhms: 1 }).transfer).toEqual(lowpassToBandstop(p.transfer, band));
    expect(JSON.stringify(p)).toBe(before);
  });

  it("a first-order ladder: one shunt capacitor has one port node, one series inductor two", () => {
    const shunt = scaleLadder(butterworthLadder(1, "shunt-first"), { edgeHz: 1e3, sourceOhms: 1e3 });
    expect([shunt.inputNode, shunt.outputNode, wiring(shunt)]).toEqual(["out", "out", ["C1 out-0 arm 1"]]);
    const series = scaleLadder(butterworthLadder(1, "series-first"), { response: "highpass", edgeHz: 1e3, sourceOhms: 1e3 });
    expect([series.inputNode, series.outputNode, wiring(series)]).toEqual(["in", "out", ["C1 in-out arm 1"]]);
  });
});
