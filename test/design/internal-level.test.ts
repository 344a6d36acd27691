/**
 * Internal levels for the signal levels (design/internal-level.ts): a sharp
 * 400 Hz tone-reject bandstop of our own built from state-variable notch
 * stages, whose loop nodes run well above the output at the default level.
 * With `levels`, the stages whose loop would clip are built at a lower
 * internal level: no op-amp clips, the design still meets the mask and its
 * yield target, and ngspice's own node voltages of the netlist show the
 * loop peaks where the headroom figures put them; with room to spare the
 * design is the one without levels, part for part.
 */
import { describe, expect, it } from "vitest";
import { designFilter, type DesignResult, type FilterSpec } from "../../src/design/index.ts";
import { toSpiceNetlist } from "../../src/report/index.ts";
import { requireNgspice, runAc } from "../helpers/ngspice.ts";

const haveSpice = requireNgspice();

// A test-tone reject filter ahead of a distortion analyser: notch 395-405 Hz by 30 dB, flat within 1 dB outside 340-470 Hz.
const SPEC: FilterSpec = {
  response: "bandstop",
  passband: { edgeHz: [340, 470], maxLossDb: 1 },
  stopband: { edgeHz: [395, 405], minAttenuationDb: 30 },
  topology: "state-variable-notch",
  parts: { capacitorTolerance: 0.01, resistorTolerance: 0.001 },
};
const LEVELS = { inputPeakV: 1, outputSwingV: 4 };

/** A stage's value by its topology's own designator. */
function local(st: DesignResult["stages"][number], name: string): number {
  const g = Object.keys(st.localNames).find((k) => st.localNames[k] === name);
  return st.components[g as string] as number;
}

describe("internal levels of state-variable notch stages for the signal levels", () => {
  const plain = designFilter(SPEC);
  const levelled = designFilter({ ...SPEC, levels: LEVELS });
  const roomy = designFilter({ ...SPEC, levels: { inputPeakV: 1, outputSwingV: 15 } });

  it("without levels, the loop nodes run above what a 4 V swing allows at a 1 V input", () => {
    const loop = Math.max(...plain.stages.flatMap((st) => st.opampPeaks.filter((p) => p.node !== "out").map((p) => p.gain)));
    expect(loop).toBeGreaterThan(LEVELS.outputSwingV);
    // the default level, H0 = R2/R1 = 1 up to the rounding of the two resistors
    expect(plain.stages.every((st) => Math.abs(local(st, "R2") / local(st, "R1") - 1) < 0.05)).toBe(true);
  });

  it("with levels, the clipping stages are built at a lower internal level: nothing clips, the mask and the yield target are met", () => {
    const h = levelled.verification.headroom;
    expect(h).toBeDefined();
    expect(h?.clips).toBe(false);
    for (const o of h?.opamps ?? []) expect(o.marginDb, o.opamp).toBeGreaterThanOrEqual(0);
    expect(levelled.stages.some((st) => local(st, "R2") / local(st, "R1") < 0.8)).toBe(true);
    expect(levelled.verification.meetsSpec).toBe(true);
    expect(levelled.verification.boardsMeetSpec).toBe(true);
  });

  it("with room to spare, the design is the one without levels, part for part", () => {
    expect(roomy.verification.headroom?.clips).toBe(false);
    expect(roomy.stages.map((st) => st.components)).toEqual(plain.stages.map((st) => st.components));
  });

  it.skipIf(!haveSpice)("ngspice's node voltages of the netlist put the loop peaks where the headroom figures do (0.05 dB), inside the swing", () => {
    const r = levelled;
    const nodes = r.stages.flatMap((st) => ["hp", "bp", "lp"].map((n) => `s${st.index}_${n}`));
    const sim = runAc(toSpiceNetlist(r, { pointsPerDecade: 4000, startHz: 250, stopHz: 650 }), nodes);
    const peakOf = (node: string): number => {
      const v = sim.vectors[node] as { re: Float64Array; im: Float64Array };
      let m = 0;
      for (let i = 0; i < sim.freqHz.length; i++) m = Math.max(m, Math.hypot(v.re[i] as number, v.im[i] as number));
      return m;
    };
    const opamps = r.verification.headroom?.opamps ?? [];
    for (const st of r.stages) {
      for (const p of st.opampPeaks.filter((x) => x.node !== "out")) {
        const spice = peakOf(`s${st.index}_${p.node}`);
        expect(Math.abs(20 * Math.log10(spice / p.gain)), `stage ${st.index} ${p.node}`).toBeLessThan(0.05);
        expect(spice * LEVELS.inputPeakV).toBeLessThan(LEVELS.outputSwingV);
      }
    }
    expect(opamps.length).toBe(r.stages.length * 4);
  });
});
