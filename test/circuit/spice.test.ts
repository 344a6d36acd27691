import { describe, expect, it } from "vitest";
import { circuitToSpice, spiceNumber } from "../../src/circuit/spice.ts";
import { acAnalysis } from "../../src/circuit/mna.ts";
import type { Circuit, OpAmpModel } from "../../src/circuit/types.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { loadFixture } from "../helpers/fixtures.ts";
import { requireNgspice, runAc } from "../helpers/ngspice.ts";

const ladder = loadFixture<{ circuit: Circuit }>("circuit-ladder.json");
const haveNgspice = requireNgspice();

/** Worst dB and degree difference where the reference is above floorDb. */
function compare(
  a: { re: Float64Array; im: Float64Array },
  b: { re: Float64Array; im: Float64Array },
  floorDb = -80,
): { db: number; deg: number } {
  let db = 0;
  let deg = 0;
  for (let i = 0; i < a.re.length; i++) {
    const ma = Math.hypot(a.re[i]!, a.im[i]!);
    const mb = Math.hypot(b.re[i]!, b.im[i]!);
    if (20 * Math.log10(mb) < floorDb) continue;
    db = Math.max(db, Math.abs(20 * Math.log10(ma / mb)));
    // phase difference of a / b
    const r = a.re[i]! * b.re[i]! + a.im[i]! * b.im[i]!;
    const m = a.im[i]! * b.re[i]! - a.re[i]! * b.im[i]!;
    deg = Math.max(deg, Math.abs((Math.atan2(m, r) * 180) / Math.PI));
  }
  return { db, deg };
}

function amplifier(model: OpAmpModel): Circuit {
  return {
    title: "two-stage amplifier with a passive pole",
    elements: [
      { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 },
      { kind: "OA", name: "U1", inP: "in", inN: "fb", out: "a", model },
      { kind: "R", name: "R1", a: "a", b: "fb", value: 22000 },
      { kind: "R", name: "R2", a: "fb", b: "0", value: 4700 },
      { kind: "R", name: "R3", a: "a", b: "x", value: 10000 },
      { kind: "C", name: "C1", a: "x", b: "0", value: 3.3e-9 },
      { kind: "L", name: "L1", a: "x", b: "y", value: 0.01 },
      { kind: "R", name: "R4", a: "y", b: "m", value: 15000 },
      { kind: "OA", name: "U2", inP: "0", inN: "m", out: "out", model },
      { kind: "R", name: "R5", a: "out", b: "m", value: 33000 },
      { kind: "E", name: "E1", a: "e", b: "0", cp: "out", cn: "x", gain: 0.5 },
      { kind: "R", name: "R6", a: "e", b: "0", value: 1000 },
    ],
  };
}

describe("circuitToSpice", () => {
  it("writes the documented text for an RC circuit", () => {
    const text = circuitToSpice(
      {
        title: "rc",
        elements: [
          { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 },
          { kind: "R", name: "R1", a: "in", b: "out", value: 4700 },
          { kind: "C", name: "C1", a: "out", b: "0", value: 1e-8 },
        ],
      },
      { ac: { pointsPerDecade: 10, startHz: 10, stopHz: 1e5 } },
    );
    expect(text).toBe("rc\nVin in 0 DC 0 AC 1\nR1 in out 4.7e3\nC1 out 0 1e-8\n.ac dec 10 1e1 1e5\n.end\n");
  });

  it("writes one subcircuit per distinct op-amp model and X instances", () => {
    const text = circuitToSpice(amplifier({ kind: "single-pole", a0: 1e5, gbwHz: 1e6 }), { ac: false });
    expect(text.match(/^\.subckt/gm)).toHaveLength(1);
    expect(text).toMatch(/^XU1 in fb a fw_opamp_1$/m);
    expect(text).not.toMatch(/^\.ac/m);
  });

  it("formats numbers without SPICE scale suffixes", () => {
    expect(spiceNumber(1e6)).toBe("1e6");
    expect(spiceNumber(1.5e-9)).toBe("1.5e-9");
    expect(spiceNumber(1)).toBe("1");
    expect(Number(spiceNumber(1 / 3))).toBe(1 / 3);
  });

  it("rejects a bad sweep with its path", () => {
    expect(() => circuitToSpice(ladder.circuit, { ac: { pointsPerDecade: 0, startHz: 1, stopHz: 2 } })).toThrow(InvalidArgumentError);
    expect(() => circuitToSpice(ladder.circuit, { ac: { pointsPerDecade: 5, startHz: 10, stopHz: 2 } })).toThrow(/options\.ac\.stopHz/);
  });

  it.skipIf(!haveNgspice)("runs in ngspice and agrees with acAnalysis: RLC ladder", () => {
    const net = circuitToSpice(ladder.circuit, { ac: { pointsPerDecade: 40, startHz: 100, stopHz: 3e5 } });
    const sim = runAc(net, ["out"]);
    const ours = acAnalysis(ladder.circuit, { source: "Vs", outputs: ["out"], freqHz: sim.freqHz }).outputs["out"]!;
    const d = compare(ours, sim.vectors["out"]!);
    expect(d.db).toBeLessThan(1e-4);
    expect(d.deg).toBeLessThan(1e-3);
  });

  it.skipIf(!haveNgspice).each([
    { kind: "ideal" },
    { kind: "single-pole", a0: 2e5, gbwHz: 1e6 },
    { kind: "single-pole-rout", a0: 1e5, gbwHz: 3e6, routOhm: 150 },
  ] as OpAmpModel[])("runs in ngspice and agrees with acAnalysis: op-amp model %j", (model) => {
    const c = amplifier(model);
    const sim = runAc(circuitToSpice(c, { ac: { pointsPerDecade: 20, startHz: 1, stopHz: 1e7 } }), ["out", "e"]);
    const ours = acAnalysis(c, { source: "Vin", outputs: ["out", "e"], freqHz: sim.freqHz }).outputs;
    for (const node of ["out", "e"]) {
      const d = compare(ours[node]!, sim.vectors[node]!);
      expect(d.db).toBeLessThan(0.001);
      expect(d.deg).toBeLessThan(0.01);
    }
  });
});
