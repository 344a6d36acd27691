import { describe, expect, it } from "vitest";
import { designFilter, type FilterSpec } from "../../src/design/index.ts";
import { mulberry32 } from "../../src/math/random.ts";

const FAMILIES = ["butterworth", "chebyshev1", "chebyshev2", "elliptic", "bessel", "legendre"] as const;

/** A random but sensible spec: edges from 1 Hz to 100 kHz, moderate selectivity, prototype order 2 to 6. */
function randomSpec(r: () => number): FilterSpec {
  const family = FAMILIES[Math.floor(r() * FAMILIES.length)] as (typeof FAMILIES)[number];
  const f = 10 ** (r() * 5);
  const loss = 0.2 + r() * 0.8;
  const atten = 25 + r() * 30;
  const order = 2 + Math.floor(r() * 5);
  const kind = r();
  if (kind < 0.4) {
    return { response: "lowpass", passband: { edgeHz: f, maxLossDb: loss }, stopband: { edgeHz: f * (2 + r() * 4), minAttenuationDb: atten }, family, order };
  }
  if (kind < 0.8) {
    return { response: "highpass", passband: { edgeHz: f, maxLossDb: loss }, stopband: { edgeHz: f / (2 + r() * 4), minAttenuationDb: atten }, family, order };
  }
  const bw = 1.5 + r() * 2;
  const lo = f;
  const hi = f * bw;
  const spread = 2 + r() * 3;
  return {
    response: "bandpass",
    passband: { edgeHz: [lo, hi], maxLossDb: loss },
    stopband: { edgeHz: [lo / spread, hi * spread], minAttenuationDb: atten },
    family,
    order: Math.min(order, 4),
  };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}

describe("designFilter joint re-tuning", () => {
  it("halves the median worst-stage f0 error of plain rounding over 200 random specs", () => {
    const r = mulberry32(20261201); // seeded, so the 200 specs are the same on every run
    const plain: number[] = [];
    const tuned: number[] = [];
    const plainQ: number[] = [];
    const tunedQ: number[] = [];
    for (let i = 0; i < 200; i++) {
      const d = designFilter(randomSpec(r));
      plain.push(Math.max(...d.stages.map((s) => s.plainSnapErrors.f0)));
      tuned.push(Math.max(...d.stages.map((s) => s.errors.f0)));
      plainQ.push(Math.max(...d.stages.map((s) => s.plainSnapErrors.q)));
      tunedQ.push(Math.max(...d.stages.map((s) => s.errors.q)));
    }
    const figures = {
      specs: 200,
      medianWorstStageF0ErrorPlain: median(plain),
      medianWorstStageF0ErrorRetuned: median(tuned),
      medianWorstStageQErrorPlain: median(plainQ),
      medianWorstStageQErrorRetuned: median(tunedQ),
    };
    console.log(`re-tuning figures: ${JSON.stringify(figures)}`);
    expect(figures.medianWorstStageF0ErrorPlain).toBeGreaterThan(0);
    expect(figures.medianWorstStageF0ErrorRetuned).toBeLessThanOrEqual(0.5 * figures.medianWorstStageF0ErrorPlain);
  });
});
