import { describe, expect, it } from "vitest";
import { designFilter } from "../../src/design/pipeline.ts";
import { builtStages } from "../../src/design/response.ts";
import { maskPlan, spanRadS } from "../../src/design/verify.ts";
import { headroomOf, peakSpanHz, sampledPeakGains, stagePeakGains } from "../../src/design/headroom.ts";
import type { FilterSpec } from "../../src/design/spec.ts";
import type { DesignResult } from "../../src/design/types.ts";
import { opampOutputTransfers } from "../../src/evaluate/opamp-outputs.ts";
import { mulberry32 } from "../../src/math/random.ts";
import { logGrid } from "../../src/tf/index.ts";
import { SCENARIOS } from "../../src/cli/scenarios.ts";
import { denseCascadePeaks } from "../helpers/dense-peak.ts";

const db = (x: number): number => 20 * Math.log10(x);
const RESPONSES = ["lowpass", "highpass", "bandpass", "bandstop"] as const;
const FAMILIES = ["butterworth", "chebyshev1", "chebyshev2", "elliptic", "legendre"] as const;

/** Seeded random specs of our own: every response, equiripple and flat families, mostly real op-amps. */
function randomSpecs(seed: number, n: number): FilterSpec[] {
  const rnd = mulberry32(seed);
  const logUniform = (lo: number, hi: number): number => lo * Math.pow(hi / lo, rnd());
  const r3 = (x: number): number => Number(x.toPrecision(3));
  return Array.from({ length: n }, (_, i) => {
    const response = RESPONSES[i % 4]!;
    const family = FAMILIES[Math.floor(rnd() * FAMILIES.length)]!;
    const f = logUniform(20, 50_000);
    const ratio = logUniform(1.6, 5);
    const maxLossDb = [0.1, 0.5, 1, 2][Math.floor(rnd() * 4)]!;
    const minAttenuationDb = Math.round(logUniform(25, 70));
    const width = logUniform(0.2, 2);
    const lo = f / Math.sqrt(1 + width);
    const hi = lo * (1 + width);
    const inner = [r3(lo), r3(hi)] as const;
    const outer = [r3(lo / ratio), r3(hi * ratio)] as const;
    const bands =
      response === "lowpass"
        ? { passband: { edgeHz: r3(f), maxLossDb }, stopband: { edgeHz: r3(f * ratio), minAttenuationDb } }
        : response === "highpass"
          ? { passband: { edgeHz: r3(f * ratio), maxLossDb }, stopband: { edgeHz: r3(f), minAttenuationDb } }
          : response === "bandpass"
            ? { passband: { edgeHz: inner, maxLossDb }, stopband: { edgeHz: outer, minAttenuationDb } }
            : { passband: { edgeHz: outer, maxLossDb }, stopband: { edgeHz: inner, minAttenuationDb } };
    const real = rnd() < 0.75;
    return {
      response,
      ...bands,
      family,
      ...(rnd() < 0.4 ? { gain: { db: r3(logUniform(1, 30)) } } : {}),
      ...(real ? { opamp: { a0: Math.round(logUniform(3e4, 1e6)), gbwHz: r3(Math.max(1e6, f * ratio * logUniform(50, 500))) } } : {}),
    };
  });
}

/** The design's tapped stages, as the dense reference reads them. */
function tapped(r: DesignResult) {
  const span = spanRadS(maskPlan(r.spec).bands);
  return builtStages(r).map((s) => {
    const outs = opampOutputTransfers(s.topology, s.values, r.spec.opamp, span)!;
    return { output: outs.find((o) => o.node === "out")!.transfer, taps: outs.map((o) => o.transfer) };
  });
}

describe("DesignStage.opampPeaks and peakGain", () => {
  it("has one peak per op-amp, named as the stage's op-amps, the output one equal to the stage's peak", () => {
    const r = designFilter(SCENARIOS["hum-notch"]!.spec);
    for (const st of r.stages) {
      expect(st.opampPeaks.map((p) => p.opamp)).toEqual(st.opamps);
      const out = st.opampPeaks.filter((p) => p.node === "out");
      expect(out).toHaveLength(1);
      expect(out[0]!.gain).toBe(st.peakGain);
      expect(out[0]!.hz).toBe(st.peakHz);
    }
  });

  it("agrees with a dense evaluation (200,000 log points, refined) to 0.01 dB and to nodal analysis on 12 random designs of every response", () => {
    let worst = 0;
    let internalAbove = 0;
    let nodalGap = 0;
    for (const spec of randomSpecs(20261211, 12)) {
      const r = designFilter(spec);
      const [lo, hi] = peakSpanHz(r.spec);
      const dense = denseCascadePeaks(tapped(r), [2 * Math.PI * lo, 2 * Math.PI * hi]);
      // and against nodal analysis of each stage's own elements, sampled: never above the found peak, and close below it
      const nodal = sampledPeakGains(builtStages(r), r.spec.opamp, logGrid(lo, hi, 2000));
      r.stages.forEach((st, k) => {
        const d = dense[k]!;
        st.opampPeaks.forEach((p, j) => {
          const m = nodal[k]!.opamps[j]!;
          expect(p.node).toBe(m.node);
          expect(db(m.gain) - db(p.gain), `${spec.response} stage ${k + 1} ${p.opamp} by nodal analysis`).toBeLessThan(1e-9);
          expect(db(p.gain) - db(m.gain), `${spec.response} stage ${k + 1} ${p.opamp} by nodal analysis`).toBeLessThan(0.05);
          nodalGap = Math.max(nodalGap, db(p.gain) - db(m.gain));
        });
        const out = db(st.peakGain) - 10 * Math.log10(d.output.magnitudeSquared);
        expect(Math.abs(out), `${spec.response} stage ${k + 1} output`).toBeLessThan(0.01);
        worst = Math.max(worst, Math.abs(out));
        st.opampPeaks.forEach((p, j) => {
          const e = db(p.gain) - 10 * Math.log10(d.taps[j]!.magnitudeSquared);
          expect(Math.abs(e), `${spec.response} stage ${k + 1} ${p.opamp} at ${p.node}`).toBeLessThan(0.01);
          worst = Math.max(worst, Math.abs(e));
          if (p.node !== "out" && p.gain > st.peakGain) internalAbove++;
        });
      });
    }
    console.log(`found vs dense peaks over 12 designs: worst ${worst.toExponential(2)} dB (nodal analysis on 2000 points at most ${nodalGap.toFixed(4)} dB below); ${internalAbove} internal op-amp outputs peak above their stage output`);
  });

  it("is never below the peak sampled on a grid (the fallback), and finds the narrow peaks a grid misses", () => {
    const r = designFilter({ ...SCENARIOS["hum-notch"]!.spec, opamp: { a0: 2e5, gbwHz: "1M" } });
    const stages = builtStages(r);
    const [lo, hi] = peakSpanHz(r.spec);
    const found = stagePeakGains(r.spec, stages, r.spec.opamp, logGrid(lo, hi, 50));
    const coarse = sampledPeakGains(stages, r.spec.opamp, logGrid(lo, hi, 50));
    const fine = sampledPeakGains(stages, r.spec.opamp, logGrid(lo, hi, 20_000));
    let missed = 0;
    found.forEach((f, k) => {
      f.opamps.forEach((p, j) => {
        expect(p.node).toBe(coarse[k]!.opamps[j]!.node);
        expect(p.gain).toBeGreaterThanOrEqual(fine[k]!.opamps[j]!.gain * (1 - 1e-12));
        expect(db(p.gain) - db(fine[k]!.opamps[j]!.gain)).toBeLessThan(0.01);
        missed = Math.max(missed, db(p.gain) - db(coarse[k]!.opamps[j]!.gain));
      });
    });
    expect(missed).toBeGreaterThan(0.1);
  });
});

describe("verification.headroom", () => {
  const notch = SCENARIOS["hum-notch"]!.spec;

  it("is absent without levels; with them, each op-amp's margin is 20 log10(swing / (input x gain))", () => {
    expect(designFilter(notch).verification.headroom).toBeUndefined();
    const r = designFilter({ ...notch, levels: { inputPeakV: 2, outputSwingV: 12 } });
    const h = r.verification.headroom!;
    expect(h.inputPeakV).toBe(2);
    expect(h.outputSwingV).toBe(12);
    const all = r.stages.flatMap((st) => st.opampPeaks.map((p) => ({ st, p })));
    expect(h.opamps).toHaveLength(all.length);
    h.opamps.forEach((o, i) => {
      const { st, p } = all[i]!;
      expect(o).toEqual({ opamp: p.opamp, stage: st.index, peakV: 2 * p.gain, hz: p.hz, marginDb: db(12 / (2 * p.gain)) });
    });
    const worst = h.opamps.reduce((a, b) => (b.marginDb < a.marginDb ? b : a));
    expect(h.worstOpamp).toBe(worst.opamp);
    expect(h.worstMarginDb).toBe(worst.marginDb);
    expect(h.clips).toBe(false);
    expect(r.verification.meetsSpec).toBe(true);
    expect(r.warnings.some((w) => w.code === "clips")).toBe(false);
  });

  it("fails the spec when an op-amp output clips, with a clipping warning naming it", () => {
    const ok = designFilter({ ...notch, levels: { inputPeakV: 1, outputSwingV: 10 } });
    // the stage outputs: a lower internal level cannot help there (internal-level.ts)
    const peak = Math.max(...ok.stages.flatMap((st) => st.opampPeaks.filter((p) => p.node === "out").map((p) => p.gain)));
    // an input just large enough to drive the highest stage output 1 dB past a 10 V swing
    const r = designFilter({ ...notch, levels: { inputPeakV: (10 * 10 ** (1 / 20)) / peak, outputSwingV: 10 } });
    expect(r.stages.map((st) => st.topology)).toEqual(ok.stages.map((st) => st.topology));
    const h = r.verification.headroom!;
    expect(h.clips).toBe(true);
    expect(Math.abs(h.worstMarginDb + 1)).toBeLessThan(0.05);
    expect(r.verification.meetsSpec).toBe(false);
    expect(r.verification.marginDb).toBeGreaterThan(0);
    const w = r.warnings.find((x) => x.code === "clips")!;
    expect(w.message).toContain(h.worstOpamp);
    expect(r.warnings.some((x) => x.code === "spec-not-met")).toBe(true);
  });

  it("meets an input that would clip only a state-variable loop node with a lower internal level, the stage output unchanged", () => {
    const ok = designFilter({ ...notch, levels: { inputPeakV: 1, outputSwingV: 10 } });
    const loops = ok.stages.flatMap((st) => (st.topology === "state-variable-notch" ? st.opampPeaks.filter((p) => p.node !== "out") : []));
    const outs = ok.stages.flatMap((st) => st.opampPeaks.filter((p) => p.node === "out"));
    const loop = Math.max(...loops.map((p) => p.gain));
    const out = Math.max(...outs.map((p) => p.gain));
    expect(loop).toBeGreaterThan(out * 1.2);
    // the loop driven 1 dB past a 10 V swing at the default level; the outputs stay below it
    const r = designFilter({ ...notch, levels: { inputPeakV: (10 * 10 ** (1 / 20)) / loop, outputSwingV: 10 } });
    expect(r.verification.headroom?.clips).toBe(false);
    expect(r.verification.meetsSpec).toBe(true);
    expect(r.verification.boardsMeetSpec).toBe(true);
  });

  it("matches headroomOf on the result's own stages", () => {
    const r = designFilter({ ...notch, levels: { inputPeakV: 0.5, outputSwingV: 2.4 } });
    expect(headroomOf(r.spec, r.stages)).toEqual(r.verification.headroom);
  });
});
