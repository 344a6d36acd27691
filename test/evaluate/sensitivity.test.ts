import { describe, expect, it } from "vitest";
import { partSensitivities } from "../../src/analysis/sensitivity.ts";
import { designFilter } from "../../src/design/index.ts";
import { builtStages } from "../../src/design/response.ts";
import { figureSensitivities } from "../../src/evaluate/sensitivity.ts";

// A band-limited pickup conditioner (our own scenario): a bandpass, so the stages have a Q, a gain and poles to move.
const design = designFilter({
  response: "bandpass",
  passband: { edgeHz: [400, 900], maxLossDb: 1 },
  stopband: { edgeHz: [150, 2400], minAttenuationDb: 30 },
  gain: { db: 10 },
});

describe("figureSensitivities", () => {
  it("meets the scaling invariants: f0 sums to -1 over the resistors and over the capacitors, Q and gain to 0", () => {
    for (const b of builtStages(design)) {
      const s = figureSensitivities(b.topology, b.values);
      expect(s.map((x) => x.name)).toEqual(b.topology.componentNames);
      const sum = (kind: string, key: "f0" | "q" | "gain") => s.filter((x) => x.name.startsWith(kind)).reduce((a, x) => a + x[key], 0);
      expect(sum("R", "f0")).toBeCloseTo(-1, 5);
      expect(sum("C", "f0")).toBeCloseTo(-1, 5);
      for (const key of ["q", "gain"] as const) {
        expect(sum("R", key)).toBeCloseTo(0, 5);
        expect(sum("C", key)).toBeCloseTo(0, 5);
      }
    }
  });

  it("is what partSensitivities reports under the design's designators", () => {
    const byPart = new Map(partSensitivities(design).map((x) => [`${x.stage}:${x.part}`, x]));
    design.stages.forEach((st, k) => {
      const b = builtStages(design)[k]!;
      const s = figureSensitivities(b.topology, b.values);
      for (const [global, local] of Object.entries(st.localNames)) {
        const x = s.find((y) => y.name === local)!;
        const p = byPart.get(`${st.index}:${global}`)!;
        expect([p.value, p.f0, p.q, p.fz, p.gain]).toEqual([x.value, x.f0, x.q, x.fz, x.gain]);
      }
    });
  });
});
