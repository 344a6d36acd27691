import { describe, expect, it } from "vitest";
import { UnrealisableError } from "../../../src/errors.ts";
import { isInSeries } from "../../../src/parts/index.ts";
import { leapfrogLowpassLadder } from "../../../src/ladder/active/index.ts";
import type { LadderForm } from "../../../src/ladder/types.ts";
import { butterworthLadder, chebyshev1Ladder, dualLadder } from "../../helpers/ladder-prototypes.ts";
import { denseGridHz, ellipticLadders, errorAgainst, unstableRoots } from "../../helpers/active-ladder-check.ts";
import { thrownBy } from "../../helpers/throws.ts";

const FORMS: readonly LadderForm[] = ["series-first", "shunt-first"];

describe("leapfrogLowpassLadder", () => {
  it("realises Butterworth ladders of orders 1-10 to 1e-9 dB with ideal op-amps (nodal analysis)", () => {
    const edgeHz = 3300;
    const grid = denseGridHz(edgeHz);
    for (const form of FORMS) {
      for (let n = 1; n <= 10; n++) {
        const f = leapfrogLowpassLadder(butterworthLadder(n, form), { edgeHz, values: "exact" });
        const e = errorAgainst(f, f.target, grid);
        expect(e.db, `${form} n=${n}`).toBeLessThan(1e-9);
        expect(e.rad, `${form} n=${n}`).toBeLessThan(1e-9);
      }
    }
  });

  it("realises Chebyshev I ladders of orders 2-10 (equal and unequal terminations) to 1e-9 dB", () => {
    const edgeHz = 12_000;
    const grid = denseGridHz(edgeHz);
    for (const form of FORMS) {
      for (const ripple of [0.1, 0.5, 1]) {
        for (let n = 2; n <= 10; n++) {
          const f = leapfrogLowpassLadder(chebyshev1Ladder(n, ripple, form), { edgeHz, values: "exact", gain: 2 });
          expect(errorAgainst(f, f.target, grid).db, `${form} ${ripple} dB n=${n}`).toBeLessThan(1e-9);
        }
      }
    }
  });

  it("takes the ladder's maximum-power-transfer level to the gain asked for, and inverts for n = 1, 5, 9", () => {
    for (let n = 1; n <= 10; n++) {
      const f = leapfrogLowpassLadder(butterworthLadder(n, "series-first"), { edgeHz: 1000, gain: 3, values: "exact" });
      // a Butterworth ladder's peak is at DC: the target's DC gain
      const dc = f.target.gain * f.target.poles.reduce((acc, p) => acc / Math.hypot(p.re, p.im), 1);
      expect(Math.abs(dc)).toBeCloseTo(3, 12);
      expect(f.inverting, `n=${n}`).toBe(n % 4 === 1);
      expect(Math.sign(f.target.gain)).toBe(f.inverting ? -1 : 1);
    }
  });

  it("uses n integrators and an inverter per even arm, every integrating capacitor the shared one", () => {
    const p = chebyshev1Ladder(7, 0.125, "series-first");
    // rounded only: each resistor the nearest E96 value; re-tuned (the default): within three E96 steps of it
    for (const [retune, within] of [[false, 0.0125], [true, 1.0245 ** 3.5 - 1]] as const) {
      const f = leapfrogLowpassLadder(p, { edgeHz: 18_000, capacitorF: 1e-9, retune });
      expect(f.opampCount).toBe(10);
      const caps = f.parts.filter((p) => p.kind === "capacitor");
      expect(caps.length).toBe(7);
      expect(caps.every((c) => c.value === 1e-9)).toBe(true);
      for (const r of f.parts.filter((p) => p.kind === "resistor")) {
        expect(isInSeries(r.value, "E96"), r.name).toBe(true);
        expect(Math.abs(r.value / r.ideal - 1), r.name).toBeLessThan(within);
      }
    }
  });

  it("stays stable with single-pole op-amps (the nodal equations' poles, by the Routh array)", () => {
    for (const gbwHz of [1e6, 10e6]) {
      for (const p of [butterworthLadder(5, "shunt-first"), chebyshev1Ladder(7, 0.125, "series-first"), chebyshev1Ladder(8, 0.5, "shunt-first")]) {
        const f = leapfrogLowpassLadder(p, { edgeHz: 18_000, opamp: { kind: "single-pole", a0: 1e5, gbwHz }, predistort: false });
        const s = unstableRoots(f.circuit, f.output, 18_000);
        // one pole per integrator and one per op-amp
        expect(s.degree).toBe(p.order + f.opampCount);
        expect(s.rhp, `${p.family} ${p.order} GBW ${gbwHz}`).toBe(0);
      }
    }
  });

  it("realises elliptic ladders (orders 3 and 5, both forms) to 1e-9 dB: the zeros by feed-forward capacitors", () => {
    const edgeHz = 3_400;
    const grid = denseGridHz(edgeHz, 3, 2);
    for (const p of ellipticLadders().flatMap((l) => [l, dualLadder(l)])) {
      const f = leapfrogLowpassLadder(p, { edgeHz, values: "exact" });
      const e = errorAgainst(f, f.target, grid);
      expect(e.db, `${p.order} ${p.form}`).toBeLessThan(1e-9);
      expect(e.rad, `${p.order} ${p.form}`).toBeLessThan(1e-9);
      // one feed-forward capacitor each way across every arm with a zero
      const zeros = (p.order - 1) / 2;
      expect(f.parts.filter((x) => x.role.includes("feed-forward")).length).toBe(2 * zeros);
      expect(f.opampCount).toBe(p.order + Math.floor(p.order / 2));
    }
  });

  it("keeps an elliptic leapfrog ladder stable with single-pole op-amps", () => {
    for (const p of ellipticLadders().flatMap((l) => [l, dualLadder(l)])) {
      const f = leapfrogLowpassLadder(p, { edgeHz: 3_400, opamp: { kind: "single-pole", a0: 1e5, gbwHz: 3e6 } });
      expect(unstableRoots(f.circuit, f.output, 3_400).rhp, `${p.order} ${p.form}`).toBe(0);
    }
  });

  it("refuses a transmission zero in an end arm", () => {
    const p = butterworthLadder(3, "series-first");
    const bad = { ...p, elements: [{ kind: "series-L", value: 1, parallelC: 0.3 }, ...p.elements.slice(1)] } as typeof p;
    expect(thrownBy(() => leapfrogLowpassLadder(bad, { edgeHz: 1000 }), UnrealisableError).path).toBe("prototype.elements[0].parallelC");
    const last = { ...p, elements: [...p.elements.slice(0, 2), { kind: "series-L", value: 1, parallelC: 0.3 }] } as typeof p;
    expect(thrownBy(() => leapfrogLowpassLadder(last, { edgeHz: 1000 }), UnrealisableError).path).toBe("prototype.elements[2].parallelC");
  });
});
