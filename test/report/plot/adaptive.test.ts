import { describe, expect, it } from "vitest";
import { adaptiveSample } from "../../../src/report/plot/adaptive.ts";
import { sampleResponse } from "../../../src/report/plot/response-curves.ts";
import { designResponse } from "../../../src/design/index.ts";
import { plotDesign } from "../../helpers/plot-designs.ts";

/** |H| in dB of a design at the given frequencies, by its public response. */
function dbAt(name: "bandstop" | "lowpass", f: Float64Array): Float64Array {
  const h = designResponse(plotDesign(name), f);
  return Float64Array.from(f, (_, i) => 20 * Math.log10(Math.hypot(h.re[i] as number, h.im[i] as number)));
}

/** The deepest point of |H| between lo and hi Hz by brute force: 200,001 log points, then twice 20,001 points about the best. */
function bruteMinimum(name: "bandstop" | "lowpass", lo: number, hi: number): { hz: number; db: number } {
  let a = lo;
  let b = hi;
  let best = { hz: lo, db: Infinity };
  for (const n of [200001, 20001, 20001]) {
    const f = Float64Array.from({ length: n }, (_, i) => a * (b / a) ** (i / (n - 1)));
    const y = dbAt(name, f);
    let k = 0;
    for (let i = 1; i < n; i++) if ((y[i] as number) < (y[k] as number)) k = i;
    best = { hz: f[k] as number, db: y[k] as number };
    a = f[Math.max(0, k - 2)] as number;
    b = f[Math.min(n - 1, k + 2)] as number;
  }
  return best;
}

describe("adaptiveSample", () => {
  it("finds the top of a narrow peak between grid points and keeps every segment within tolerance", () => {
    // a resonance of Q 300 at 1234.5 Hz: |H| = 1 / |1 - x^2 + j x / Q|, x = f / f0
    const f0 = 1234.5;
    const q = 300;
    const curve = (f: Float64Array): Float64Array[] => [
      Float64Array.from(f, (x) => {
        const u = x / f0;
        return -10 * Math.log10((1 - u * u) ** 2 + (u / q) ** 2);
      }),
    ];
    const s = adaptiveSample(curve, { startHz: 10, stopHz: 1e5, initialPoints: 50, maxPoints: 3000, tolerance: [0.05], polish: [true] });
    const y = s.curves[0] as Float64Array;
    // the peak of this |H| is at f0 sqrt(1 - 1/(2 Q^2)), height Q / sqrt(1 - 1/(4 Q^2))
    const truePeak = 20 * Math.log10(q / Math.sqrt(1 - 1 / (4 * q * q)));
    expect(Math.max(...y)).toBeCloseTo(truePeak, 6);
    expect(s.freqHz.length).toBeLessThanOrEqual(3000);
    for (let i = 1; i < s.freqHz.length; i++) expect(s.freqHz[i] as number).toBeGreaterThan(s.freqHz[i - 1] as number);
    // between any two neighbours the curve departs from the drawn segment by about the tolerance at most
    const mids = Float64Array.from({ length: s.freqHz.length - 1 }, (_, i) => Math.sqrt((s.freqHz[i] as number) * (s.freqHz[i + 1] as number)));
    const ym = curve(mids)[0] as Float64Array;
    let worst = 0;
    for (let i = 0; i < mids.length; i++) worst = Math.max(worst, Math.abs((ym[i] as number) - ((y[i] as number) + (y[i + 1] as number)) / 2));
    expect(worst).toBeLessThan(0.05 * 1.0001);
  });

  it("stops at the point budget", () => {
    const wild = (f: Float64Array): Float64Array[] => [Float64Array.from(f, (x) => 100 * Math.sin(1e4 / x))];
    const s = adaptiveSample(wild, { startHz: 1, stopHz: 1e4, initialPoints: 20, maxPoints: 500, tolerance: [1e-6] });
    expect(s.freqHz.length).toBeLessThanOrEqual(500 + 64);
  });
});

describe("sampleResponse", () => {
  it("finds the as-built notch bottom of a bandstop within 0.1 dB of its true depth (a 256-point grid does not)", () => {
    const r = plotDesign("bandstop");
    const s = sampleResponse(r, ["magnitude"], { startHz: 50, stopHz: 20000, heightPx: 300, ranges: [[-70, 10]] });
    const y = s.curves[0] as Float64Array;
    let k = 0;
    for (let i = 1; i < y.length; i++) if ((y[i] as number) < (y[k] as number)) k = i;
    const truth = bruteMinimum("bandstop", 0.9 * (s.freqHz[k] as number), 1.1 * (s.freqHz[k] as number));
    expect(Number.isFinite(truth.db)).toBe(true);
    expect(Math.abs((y[k] as number) - truth.db)).toBeLessThan(0.1);
    expect(Math.abs((s.freqHz[k] as number) / truth.hz - 1)).toBeLessThan(1e-4);
    // the stored 256-point curve misses the bottom by far more
    const stored = Math.min(...r.verification.curve.magnitudeDb);
    expect(stored - truth.db).toBeGreaterThan(1);
    expect(y.length).toBeLessThan(4000);
  });

  it("agrees with the design's public response at every sample", () => {
    const r = plotDesign("lowpass");
    const s = sampleResponse(r, ["magnitude", "phase", "group-delay"], { startHz: 100, stopHz: 50000, heightPx: 300, ranges: [[-80, 10], [-450, 0], [0, 1e-3]] });
    const h = designResponse(r, s.freqHz);
    s.freqHz.forEach((_, i) => {
      const db = 20 * Math.log10(Math.hypot(h.re[i] as number, h.im[i] as number));
      const m = (s.curves[0] as Float64Array)[i] as number;
      if (Number.isFinite(db) && db > -200) expect(m).toBeCloseTo(db, 9);
      const ph = (Math.atan2(h.im[i] as number, h.re[i] as number) * 180) / Math.PI;
      const unwrapped = (s.curves[1] as Float64Array)[i] as number;
      const d = ((unwrapped - ph) % 360 + 540) % 360 - 180;
      expect(Math.abs(d)).toBeLessThan(1e-6);
    });
    // unwrapped: no step of more than 180 degrees between neighbours
    const ph = s.curves[1] as Float64Array;
    for (let i = 1; i < ph.length; i++) expect(Math.abs((ph[i] as number) - (ph[i - 1] as number))).toBeLessThanOrEqual(180);
  });
});
