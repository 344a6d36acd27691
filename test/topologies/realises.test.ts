import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { topologies } from "../../src/topologies/registry.ts";
import type { StageTarget } from "../../src/topologies/types.ts";
import { realisableArb } from "./arbitraries.ts";

/** The section a target asks for, evaluated directly from f0, Q, fz and gain (no circuit involved). */
function targetResponse(t: StageTarget, fHz: number): { re: number; im: number } {
  const w0 = 2 * Math.PI * t.f0Hz;
  const w = 2 * Math.PI * fHz;
  const k = t.gain;
  const div = (a: [number, number], b: [number, number]): { re: number; im: number } => {
    const d = b[0] * b[0] + b[1] * b[1];
    return { re: (a[0] * b[0] + a[1] * b[1]) / d, im: (a[1] * b[0] - a[0] * b[1]) / d };
  };
  if (t.order === 1) {
    const den: [number, number] = [w0, w];
    if (t.kind === "lowpass") return div([k * w0, 0], den);
    if (t.kind === "highpass") return div([0, k * w], den);
    return div([k * w0, -k * w], den); // allpass, +k at DC
  }
  const q = t.q as number;
  // s = j w: s^2 = -w^2
  const den: [number, number] = [w0 * w0 - w * w, (w0 / q) * w];
  switch (t.kind) {
    case "lowpass":
      return div([k * w0 * w0, 0], den);
    case "highpass":
      return div([-k * w * w, 0], den);
    case "bandpass":
      return div([0, (k * w0 * w) / q], den);
    case "allpass":
      return div([k * (w0 * w0 - w * w), (-k * w0 * w) / q], den);
    default: {
      const wz = 2 * Math.PI * (t.fzHz ?? t.f0Hz);
      // lowpass-notch: gain at DC; highpass-notch and notch: gain at high frequency
      const scale = t.kind === "lowpass-notch" ? (w0 * w0) / (wz * wz) : 1;
      return div([k * scale * (wz * wz - w * w), 0], den);
    }
  }
}

let worst = 0;

describe("Topology.design", () => {
  for (const topo of topologies) {
    it(`${topo.id}: the designed stage's ideal response is the target section to 1e-9`, () => {
      fc.assert(
        fc.property(
          realisableArb(topo),
          fc.array(fc.double({ min: -2, max: 2, noNaN: true }), { minLength: 1, maxLength: 6 }),
          ({ target, choices }, lf) => {
            const v = topo.design(target, choices);
            const f = Float64Array.from(lf.map((x) => target.f0Hz * 10 ** x));
            const h = topo.response(v, f, { kind: "ideal" });
            for (let i = 0; i < f.length; i++) {
              const e = targetResponse(target, f[i]!);
              const d = Math.hypot(h.re[i]! - e.re, h.im[i]! - e.im);
              // relative to the response, floored at 1e-3 of the stage gain (points at or next to an exact notch)
              const rel = d / Math.max(Math.hypot(e.re, e.im), 1e-3 * Math.abs(target.gain));
              worst = Math.max(worst, rel);
              expect(rel, `${f[i]} Hz: got ${h.re[i]}+${h.im[i]}j, want ${e.re}+${e.im}j`).toBeLessThan(1e-9);
            }
          },
        ),
        { numRuns: 80 },
      );
    });
  }
  it("reports the worst relative error", () => {
    console.log(`designed stage vs target section worst relative error: ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(1e-9);
  });
});
