import { describe, expect, it } from "vitest";
import { requireNgspice, runAc } from "../helpers/ngspice.ts";
import { scaleElements, scalingFor } from "../../src/scaling/index.ts";
import type { ScalableElement } from "../../src/scaling/index.ts";

// A hydrophone front end's anti-alias filter: the normalised doubly terminated
// 3rd-order Butterworth LC ladder (1 Ω, 1 F, 2 H, 1 F, 1 Ω; g-values from
// G. Matthaei, L. Young, E. M. T. Jones, "Microwave Filters, Impedance-Matching
// Networks, and Coupling Structures", 1964, eq. (4.05-2)) moved to a 25 kHz
// corner with 4.7 nF capacitors, simulated by ngspice.
const prototype: ScalableElement[] = [
  { name: "Rs", kind: "R", value: 1 },
  { name: "C1", kind: "C", value: 1 },
  { name: "L2", kind: "L", value: 2 },
  { name: "C3", kind: "C", value: 1 },
  { name: "RL", kind: "R", value: 1 },
];

describe.runIf(requireNgspice())("scaleElements (ngspice)", () => {
  it("the scaled ladder has the Butterworth response 0.5 / sqrt(1 + (f / 25 kHz)^6) in ngspice", () => {
    const fc = 25e3;
    const built = scaleElements(prototype, scalingFor({ targetHz: fc, capacitor: { normalised: 1, actual: 4.7e-9 } }));
    const v = Object.fromEntries(built.map((e) => [e.name, (e.value as number).toPrecision(17)]));
    const netlist = [
      "hydrophone anti-alias ladder",
      "Vs in 0 DC 0 AC 1",
      `Rs in n1 ${v["Rs"]}`,
      `C1 n1 0 ${v["C1"]}`,
      `L2 n1 n2 ${v["L2"]}`,
      `C3 n2 0 ${v["C3"]}`,
      `RL n2 0 ${v["RL"]}`,
      ".ac dec 10 100 1e6",
      ".end",
    ].join("\n");
    const r = runAc(netlist, ["n2"]);
    const out = r.vectors["n2"] as { re: Float64Array; im: Float64Array };
    expect(r.freqHz.length).toBeGreaterThan(30);
    let worst = 0;
    for (let i = 0; i < r.freqHz.length; i++) {
      const f = r.freqHz[i] as number;
      const mag = Math.hypot(out.re[i] as number, out.im[i] as number);
      const ideal = 0.5 / Math.sqrt(1 + (f / fc) ** 6);
      worst = Math.max(worst, Math.abs(mag - ideal) / ideal);
    }
    expect(worst).toBeLessThan(1e-9); // observed 4.4e-13
  });
});
