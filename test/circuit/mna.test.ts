import { describe, expect, it } from "vitest";
import { acAnalysis, transfer, assembleMna, mnaDeterminant } from "../../src/circuit/mna.ts";
import type { Circuit, Element, OpAmpModel } from "../../src/circuit/types.ts";
import { InvalidArgumentError, SingularCircuitError } from "../../src/errors.ts";
import { loadFixture } from "../helpers/fixtures.ts";
import { thrownBy } from "../helpers/throws.ts";
import { expectArrayClose } from "../helpers/tolerance.ts";

const ladder = loadFixture<{ circuit: Circuit; freqHz: number[]; re: number[]; im: number[] }>("circuit-ladder.json");

const rc: Circuit = {
  title: "rc",
  elements: [
    { kind: "V", name: "V1", a: "in", b: "0", ac: 1 },
    { kind: "R", name: "R1", a: "in", b: "out", value: 1000 },
    { kind: "C", name: "C1", a: "out", b: "0", value: 1 / (2000 * Math.PI) },
  ],
};

function nonInverting(model: OpAmpModel): Circuit {
  return {
    title: "x",
    elements: [
      { kind: "V", name: "V1", a: "in", b: "0", ac: 1 },
      { kind: "OA", name: "U1", inP: "in", inN: "fb", out: "out", model },
      { kind: "R", name: "R1", a: "out", b: "fb", value: 9000 },
      { kind: "R", name: "R2", a: "fb", b: "0", value: 1000 },
      { kind: "R", name: "RL", a: "out", b: "0", value: 2000 },
    ],
  };
}

describe("acAnalysis", () => {
  it("matches the ABCD-matrix transfer of an RLC ladder (numpy fixture)", () => {
    const freqHz = Float64Array.from(ladder.freqHz);
    const r = acAnalysis(ladder.circuit, { source: "Vs", outputs: ["out"], freqHz });
    const out = r.outputs["out"]!;
    expectArrayClose(out.re, ladder.re, { rel: 1e-9, abs: 1e-12, label: "re" });
    expectArrayClose(out.im, ladder.im, { rel: 1e-9, abs: 1e-12, label: "im" });
  });

  it("gives the RC divider 1/(1 + j f/fc)", () => {
    const r = transfer(rc, { source: "V1", output: "out", freqHz: new Float64Array([0, 1, 3]) });
    expectArrayClose(r.re, [1, 0.5, 0.1], { rel: 1e-12, abs: 1e-15 });
    expectArrayClose(r.im, [0, -0.5, -0.3], { rel: 1e-12, abs: 1e-15 });
  });

  it("realises the nullor and the single-pole models of a non-inverting amplifier", () => {
    const freqHz = new Float64Array([0, 10, 1e3, 1e5, 3e6]);
    const ideal = transfer(nonInverting({ kind: "ideal" }), { source: "V1", output: "out", freqHz });
    expectArrayClose(ideal.re, [10, 10, 10, 10, 10], { rel: 1e-12 });
    const a0 = 2e5;
    const gbwHz = 1e6;
    for (const rout of [0, 75]) {
      const model: OpAmpModel = rout === 0 ? { kind: "single-pole", a0, gbwHz } : { kind: "single-pole-rout", a0, gbwHz, routOhm: rout };
      const h = transfer(nonInverting(model), { source: "V1", output: "out", freqHz });
      for (let i = 0; i < freqHz.length; i++) {
        // A(s) = a0/(1 + s a0/(2 pi GBW)); with rout the output divider is solved by hand:
        // vout = (e*Zl + ...) -> Thevenin: e = A (vin - b vout), vout = e * Zp/(Zp + rout) with Zp = RL || (R1+R2)
        const s = { re: 0, im: 2 * Math.PI * (freqHz[i] as number) };
        const dr = 1 + (s.re * a0) / (2 * Math.PI * gbwHz);
        const di = (s.im * a0) / (2 * Math.PI * gbwHz);
        const dd = dr * dr + di * di;
        const ar = (a0 * dr) / dd;
        const ai = (-a0 * di) / dd;
        const zp = 1 / (1 / 2000 + 1 / 10000);
        const k = zp / (zp + rout);
        const beta = 0.1;
        // H = k A / (1 + k A beta)
        const nr = k * ar;
        const ni = k * ai;
        const er = 1 + beta * nr;
        const ei = beta * ni;
        const ed = er * er + ei * ei;
        const hr = (nr * er + ni * ei) / ed;
        const hi = (ni * er - nr * ei) / ed;
        expect(Math.abs((h.re[i] as number) - hr)).toBeLessThan(1e-11 * Math.hypot(hr, hi));
        expect(Math.abs((h.im[i] as number) - hi)).toBeLessThan(1e-11 * Math.hypot(hr, hi));
      }
    }
  });

  it("returns every requested output and ground as zero", () => {
    const r = acAnalysis(rc, { source: "V1", outputs: ["in", "out", "0"], freqHz: new Float64Array([1]) });
    expect(r.outputs["in"]!.re[0]).toBeCloseTo(1, 14);
    expect(r.outputs["0"]!.re[0]).toBe(0);
  });

  it("names a floating node", () => {
    const c: Circuit = { title: "f", elements: [...rc.elements, { kind: "R", name: "R9", a: "x", b: "y", value: 1 }] };
    const e = thrownBy(() => acAnalysis(c, { source: "V1", outputs: ["out"], freqHz: new Float64Array([1]) }), SingularCircuitError);
    expect(e.culprits).toEqual(["x", "y"]);
  });

  it("names a node reached only through an op-amp input", () => {
    const c: Circuit = {
      title: "f",
      elements: [...rc.elements, { kind: "OA", name: "U1", inP: "dangling", inN: "o", out: "o", model: { kind: "ideal" } }],
    };
    expect(() => acAnalysis(c, { source: "V1", outputs: ["out"], freqHz: new Float64Array([1]) })).toThrow(/dangling/);
  });

  it("names a loop of voltage sources", () => {
    const c: Circuit = { title: "loop", elements: [...rc.elements, { kind: "V", name: "V2", a: "in", b: "0", ac: 0 }] };
    const e = thrownBy(() => acAnalysis(c, { source: "V1", outputs: ["out"], freqHz: new Float64Array([1]) }), SingularCircuitError);
    expect(e.culprits).toContain("V2");
    expect(e.culprits).toContain("in");
  });

  it("accepts a capacitor-only node above 0 Hz and names it at 0 Hz", () => {
    const c: Circuit = {
      title: "cc",
      elements: [
        { kind: "V", name: "V1", a: "in", b: "0", ac: 1 },
        { kind: "C", name: "C1", a: "in", b: "mid", value: 1e-9 },
        { kind: "C", name: "C2", a: "mid", b: "0", value: 1e-9 },
      ],
    };
    const r = transfer(c, { source: "V1", output: "mid", freqHz: new Float64Array([50]) });
    expect(r.re[0]).toBeCloseTo(0.5, 14);
    const e = thrownBy(() => transfer(c, { source: "V1", output: "mid", freqHz: new Float64Array([0, 50]) }), SingularCircuitError);
    expect(e.culprits).toEqual(["mid"]);
  });

  it("reports a pivot failure for an op-amp whose inputs are tied together", () => {
    const c: Circuit = {
      title: "open loop",
      elements: [
        { kind: "V", name: "V1", a: "in", b: "0", ac: 1 },
        { kind: "R", name: "R1", a: "in", b: "0", value: 1e3 },
        { kind: "OA", name: "U1", inP: "in", inN: "in", out: "out", model: { kind: "ideal" } },
        { kind: "R", name: "R2", a: "out", b: "0", value: 1e3 },
      ],
    };
    const e = thrownBy(() => transfer(c, { source: "V1", output: "out", freqHz: new Float64Array([1]) }), SingularCircuitError);
    expect(e.fn).toBe("transfer");
    expect(e.culprits).toEqual(["U1", "out", "in"]);
  });

  it("rejects unknown sources, outputs and bad frequencies with paths", () => {
    const f = new Float64Array([1]);
    expect(() => acAnalysis(rc, { source: "R1", outputs: ["out"], freqHz: f })).toThrow(/options\.source/);
    expect(() => acAnalysis(rc, { source: "V1", outputs: ["nope"], freqHz: f })).toThrow(/options\.outputs\[0\]/);
    expect(() => acAnalysis(rc, { source: "V1", outputs: ["out"], freqHz: new Float64Array([-1]) })).toThrow(InvalidArgumentError);
    const bad = { title: "b", elements: [...rc.elements, { kind: "R", name: "R2", a: "out", b: "0", value: Number.NaN } as Element] };
    expect(() => acAnalysis(bad, { source: "V1", outputs: ["out"], freqHz: f })).toThrow(/elements\[3\]\.value/);
  });
});

describe("mnaDeterminant", () => {
  it("vanishes at the natural frequency of an RC circuit", () => {
    const sys = assembleMna(rc);
    // pole at -1/(RC) = -2 pi rad/s
    const d0 = mnaDeterminant(sys, { re: -2 * Math.PI, im: 0 });
    const d1 = mnaDeterminant(sys, { re: -1, im: 0 });
    expect(Math.hypot(d0.re, d0.im)).toBeLessThan(1e-12 * Math.hypot(d1.re, d1.im));
  });
});
