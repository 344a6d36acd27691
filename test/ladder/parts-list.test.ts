import { describe, expect, it } from "vitest";
import { asBuiltLadder, ladderParts, scaleLadder } from "../../src/ladder/index.ts";
import { butterworthLadder, chebyshevLadder } from "./prototypes.ts";

describe("ladderParts", () => {
  // a 7th-order Butterworth lowpass at 10 MHz between 50-ohm ends: symmetric, so parts repeat
  const scaled = scaleLadder(butterworthLadder(7, "shunt-first"), { edgeHz: 10e6, sourceOhms: 50 });
  const built = asBuiltLadder(scaled, { inductorSeries: "E24", capacitorSeries: "E24", inductorQ: 60 });
  const lines = ladderParts(built);

  it("lists every part once, grouped by value, inductors first, quantities adding up", () => {
    expect(lines.reduce((a, l) => a + l.quantity, 0)).toBe(built.components.length);
    expect(lines.flatMap((l) => l.designators).sort()).toEqual(built.components.map((c) => c.designator).sort());
    const kinds = lines.map((l) => l.part);
    expect(kinds.indexOf("capacitor")).toBeGreaterThan(kinds.lastIndexOf("inductor"));
    for (const l of lines) {
      expect(l.quantity).toBe(l.designators.length);
      const parts = built.components.filter((c) => l.designators.includes(c.designator));
      expect(parts.every((c) => c.value === l.value && c.kind === (l.part === "inductor" ? "L" : "C"))).toBe(true);
    }
    // symmetric ladder: C1 = C4, L1 = L3, C2 = C3
    expect(lines.find((l) => l.designators.includes("C1"))?.designators).toEqual(["C1", "C4"]);
    expect(lines.find((l) => l.designators.includes("L1"))?.designators).toEqual(["L1", "L3"]);
  });

  it("writes the value, code, series, tolerance and the Q the model assumed", () => {
    const l1 = lines.find((l) => l.designators.includes("L1"));
    const c1 = lines.find((l) => l.designators.includes("C1"));
    // L1 = g2 * 50 / (2 pi 10 MHz) = 1.2470 * 50 / 6.2832e7 = 0.992 uH -> E24 1.0 uH; C1 = 0.445 / (50 * 6.2832e7) = 141.7 pF -> 150 pF
    expect(l1).toMatchObject({ part: "inductor", value: 1e-6, valueText: "1 µH", rkm: "1µ0", series: "E24", tolerance: 0.05, toleranceText: "5%", requirement: "Q >= 60 at 10 MHz" });
    expect(c1).toMatchObject({ part: "capacitor", value: 1.5e-10, valueText: "150 pF", rkm: "150p", series: "E24", tolerance: 0.05, requirement: "" });
  });

  it("states a capacitor ESR when the model has one, and writes henries of 1 H and more with H", () => {
    const audio = scaleLadder(chebyshevLadder(3, 0.5, "series-first"), { edgeHz: 300, sourceOhms: 2000 });
    const parts = ladderParts(asBuiltLadder(audio, { capacitorEsrOhms: 0.2 }));
    const inductor = parts.find((l) => l.part === "inductor");
    expect(inductor?.value).toBeGreaterThanOrEqual(1);
    expect(inductor?.rkm).toMatch(/^\d+H\d+$/);
    expect(parts.find((l) => l.part === "capacitor")?.requirement).toBe("ESR <= 200 mΩ");
  });
});
