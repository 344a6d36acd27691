import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { topologies } from "../../src/topologies/registry.ts";
import { realisableArb } from "./arbitraries.ts";
import { targetResponse } from "./target-response.ts";

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
