import { describe, expect, it } from "vitest";
import { designFilter, type FilterSpec } from "../../src/design/index.ts";
import { fromJson, toJson, toMarkdown } from "../../src/report/index.ts";
import { headroomLines } from "../../src/report/headroom.ts";
import { noiseAnalysis } from "../../src/analysis/index.ts";
import { ParseError, SpecError } from "../../src/errors.ts";
import { thrownBy } from "../helpers/throws.ts";

// a 400 Hz notch ahead of a vibration logger (our own scenario): multi-amplifier stages with internal nodes
const notch: FilterSpec = {
  response: "bandstop",
  passband: { edgeHz: [250, 640], maxLossDb: 1 },
  stopband: { edgeHz: [380, 420], minAttenuationDb: 30 },
  family: "chebyshev1",
  gain: { db: 6 },
};

describe("toMarkdown headroom", () => {
  it("lists every op-amp with its node and peak gain, and no verdict without levels", () => {
    const r = designFilter(notch);
    const md = toMarkdown(r);
    expect(md).toContain("## Headroom (every op-amp output)");
    for (const st of r.stages) {
      for (const p of st.opampPeaks) {
        const row = md.split("\n").find((l) => l.startsWith(`| ${p.opamp} | ${st.index} |`));
        expect(row, p.opamp).toBeDefined();
        expect(row).toContain(`${(20 * Math.log10(p.gain)).toFixed(2)} dB`);
        expect(row).toContain(p.node === "out" ? "stage output" : `| ${p.node} |`);
      }
    }
    expect(md).not.toContain("Dynamic range");
    expect(md).not.toContain("signal levels");
  });

  it("with levels shows each output's peak voltage and margin, marks a clipping one, and fails the verdict", () => {
    const ok = designFilter(notch);
    // a stage output past the swing (a lower internal level lowers only the state-variable loops' nodes)
    const peak = Math.max(...ok.stages.flatMap((st) => st.opampPeaks.filter((p) => p.node === "out").map((p) => p.gain)));
    const r = designFilter({ ...notch, levels: { inputPeakV: 6 / peak, outputSwingV: 5 } });
    const h = r.verification.headroom!;
    expect(h.clips).toBe(true);
    const md = toMarkdown(r);
    expect(md).toContain("**Does NOT meet the spec**");
    expect(md).toContain("| signal levels |");
    expect(md).toContain(`**clips**, worst ${h.worstOpamp}`);
    const rows = md.split("\n").filter((l) => l.includes("(clips)"));
    expect(rows.length).toBe(h.opamps.filter((o) => o.marginDb < 0).length);
    expect(md).toContain("Dynamic range:");
  });
});

describe("verification.headroom.dynamicRange", () => {
  it("is the clip-free input through the passband gain over the resistors' output noise", () => {
    const r = designFilter({ ...notch, levels: { outputSwingV: 4 } });
    const d = r.verification.headroom!.dynamicRange;
    const peak = Math.max(...r.stages.flatMap((st) => st.opampPeaks.map((p) => p.gain)));
    expect(d.maxInputPeakV).toBeCloseTo(4 / peak, 12);
    expect(d.noiseRmsV).toBe(noiseAnalysis(r).totalRmsV);
    expect(d.opampNoise).toBe(false);
    expect(d.rangeDb).toBeCloseTo(20 * Math.log10((d.maxInputPeakV * r.spec.gain) / Math.SQRT2 / d.noiseRmsV), 12);
    expect(designFilter(notch).verification.headroom).toBeUndefined();
    expect(headroomLines(r).at(-1)).toBe("");
    expect(toMarkdown(r)).toContain("op-amp noise not included");
  });

  it("counts the op-amps' noise when the spec's levels give it, as noiseAnalysis does", () => {
    const r = designFilter({ ...notch, levels: { outputSwingV: 4, opampVoltageNoise: "8n", opampCurrentNoise: 1e-12 } });
    const d = r.verification.headroom!.dynamicRange;
    expect(r.spec.levels?.opampVoltageNoise).toBeCloseTo(8e-9, 20);
    expect(d.opampNoise).toBe(true);
    expect(d.noiseRmsV).toBe(noiseAnalysis(r, { opampVoltageNoise: 8e-9, opampCurrentNoise: 1e-12 }).totalRmsV);
    // the op-amps add noise, so the range is smaller than with the resistors alone
    const quiet = designFilter({ ...notch, levels: { outputSwingV: 4 } }).verification.headroom!.dynamicRange;
    expect(d.rangeDb).toBeLessThan(quiet.rangeDb);
    expect(toMarkdown(r)).toContain("resistor and op-amp noise");
    expect(fromJson(toJson(r)).verification.headroom).toEqual(r.verification.headroom);
  });

  it("refuses a noise density out of range, naming the field", () => {
    expect(thrownBy(() => designFilter({ ...notch, levels: { opampVoltageNoise: -1e-9 } }), SpecError).issues.map((i) => i.path)).toEqual(["levels.opampVoltageNoise"]);
    expect(thrownBy(() => designFilter({ ...notch, levels: { opampCurrentNoise: 1 } }), SpecError).issues.map((i) => i.path)).toEqual(["levels.opampCurrentNoise"]);
  });
});

describe("toJson / fromJson with headroom", () => {
  it("round-trips the op-amp peaks, the levels and the headroom", () => {
    const r = designFilter({ ...notch, levels: { inputPeakV: "250m", outputSwingV: 3 } });
    const back = fromJson(toJson(r));
    expect(back).toEqual(r);
    expect(back.verification.headroom).toEqual(r.verification.headroom);
    expect(back.spec.levels).toEqual({ inputPeakV: 0.25, outputSwingV: 3, opampVoltageNoise: 0, opampCurrentNoise: 0 });
  });

  it("refuses a file whose op-amp peaks or headroom are malformed, naming the field", () => {
    const r = designFilter({ ...notch, levels: { outputSwingV: 3 } });
    const data = JSON.parse(toJson(r));
    data.result.stages[0].opampPeaks[0].gain = -1;
    expect(thrownBy(() => fromJson(JSON.stringify(data)), ParseError).path).toBe("result.stages.0.opampPeaks.0.gain");
    const fewer = JSON.parse(toJson(r));
    fewer.result.stages[0].opampPeaks.pop();
    expect(thrownBy(() => fromJson(JSON.stringify(fewer)), ParseError).path).toBe("result.stages.0.opampPeaks");
    const renamed = JSON.parse(toJson(r));
    renamed.result.stages[0].opampPeaks[0].opamp = "U99";
    expect(thrownBy(() => fromJson(JSON.stringify(renamed)), ParseError).path).toBe("result.stages.0.opampPeaks.0.opamp");
    const head = JSON.parse(toJson(r));
    head.result.verification.headroom.clips = "no";
    expect(thrownBy(() => fromJson(JSON.stringify(head)), ParseError).path).toBe("result.verification.headroom.clips");
    const lv = JSON.parse(toJson(r));
    lv.result.spec.levels.outputSwingV = 0;
    expect(thrownBy(() => fromJson(JSON.stringify(lv)), ParseError).path).toBe("result.spec");
  });
});
