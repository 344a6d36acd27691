import { describe, expect, it } from "vitest";
import { ellipticStopbandEdge } from "../../src/approx/elliptic.ts";
import { prototype } from "../../src/approx/prototype.ts";
import { transfer as mnaTransfer } from "../../src/circuit/mna.ts";
import { ladderPrototype, type LadderPrototype, type LadderPrototypeSpec } from "../../src/ladder/index.ts";
import { LADDER_FORMS } from "../../src/ladder/types.ts";
import { magnitudeDb } from "../../src/tf/magnitude.ts";
import { TWO_PI } from "../../src/units/constants.ts";
import { chainMagnitudeDb } from "../helpers/ladder-chain.ts";
import { ladderCircuit } from "../helpers/ladder-circuit.ts";
import { FAMILY_SETTINGS, label, ORDERS, type FamilySettings } from "./ladder-cases.ts";

/** 2000 log-spaced points 1e-2..1e2 rad/s, 201 linear points across 0.9..1.1 (the passband edge), 1 exactly, and the elliptic stopband edge. */
function denseGrid(settings: FamilySettings, order: number): Float64Array {
  const w: number[] = [];
  for (let i = 0; i < 2000; i++) w.push(10 ** (-2 + (4 * i) / 1999));
  for (let i = 0; i <= 200; i++) w.push(0.9 + (0.2 * i) / 200);
  w.push(1);
  if (settings.family === "elliptic") {
    w.push(ellipticStopbandEdge(order, { rippleDb: settings.rippleDb as number, attenuationDb: settings.attenuationDb as number }));
  }
  return Float64Array.from(w.sort((a, b) => a - b));
}

/** Points of `w` not within 1e-4 (relative) of a transmission zero, where the dB value of either side is set by its last digits. */
function awayFromZeros(ladder: LadderPrototype, w: Float64Array): Float64Array {
  return Float64Array.from(Array.from(w).filter((x) => !ladder.transfer.zeros.some((z) => Math.abs(x - Math.abs(z.im)) <= 1e-4 * x)));
}

interface Deviation {
  readonly worst: number;
  readonly at: number;
  readonly points: number;
}

function worstOf(grid: Float64Array, want: Float64Array, got: (i: number) => number, floorDb: number): Deviation {
  let worst = 0;
  let at = 0;
  let points = 0;
  for (let i = 0; i < grid.length; i++) {
    if ((want[i] as number) < floorDb) continue;
    points++;
    const d = Math.abs(got(i) - (want[i] as number));
    if (!(d <= worst)) {
      worst = d;
      at = grid[i] as number;
    }
  }
  return { worst, at, points };
}

/**
 * Largest |dB| difference between the ladder's modified nodal analysis (src/circuit) and `transfer`,
 * on the points where `transfer` is above `floorDb`. The dense LU solve of the nodal equations is
 * backward stable, so a node voltage far below the source (deep stopband) carries an error relative to
 * the largest one: about 1e-8 dB at -150 dB, 1e-4 dB at -300 dB. Hence the floor of -100 dB here, and
 * the chained ABCD matrices ({@link chainDeviationDb}) for the rest of the stopband.
 */
export function nodalDeviationDb(ladder: LadderPrototype, w: Float64Array, floorDb = -100): Deviation {
  const { circuit, output } = ladderCircuit(ladder);
  const grid = awayFromZeros(ladder, w);
  const want = magnitudeDb(ladder.transfer, grid);
  const got = mnaTransfer(circuit, { source: "Vs", output, freqHz: grid.map((x) => x / TWO_PI) });
  return worstOf(grid, want, (i) => 10 * Math.log10((got.re[i] as number) ** 2 + (got.im[i] as number) ** 2), floorDb);
}

/** Largest |dB| difference between the ladder's chained ABCD matrices (test/helpers) and `transfer`, above -300 dB. */
export function chainDeviationDb(ladder: LadderPrototype, w: Float64Array): Deviation {
  const grid = awayFromZeros(ladder, w);
  const want = magnitudeDb(ladder.transfer, grid);
  return worstOf(grid, want, (i) => chainMagnitudeDb(ladder.elements, ladder.sourceOhms, ladder.loadOhms, grid[i] as number), -300);
}

function expectPositiveFinite(ladder: LadderPrototype): void {
  for (const [i, e] of ladder.elements.entries()) {
    for (const v of [e.value, e.parallelC, e.seriesL]) {
      if (v === undefined) continue;
      expect(Number.isFinite(v) && v > 0, `element ${i + 1} of ${JSON.stringify(e)}`).toBe(true);
    }
  }
}

describe("ladderPrototype: the ladder's own response (nodal analysis above -100 dB, chained ABCD matrices down to -300 dB) equals `transfer` to 1e-9 dB", () => {
  for (const settings of FAMILY_SETTINGS) {
    for (const order of ORDERS) {
      it(`${label(settings)}, order ${order}: both forms, default terminations and 600/50 ohm`, () => {
        const w = denseGrid(settings, order);
        for (const form of LADDER_FORMS) {
          // default terminations, then 600 ohm into 50 ohm for the shunt-first form and 50 into 600 for
          // series-first (the natural sides of an even order); odd orders also take the other side (turned round)
          const terms: { sourceOhms?: number; loadOhms?: number }[] = [{}];
          if (settings.family !== "chebyshev1" || order % 2 === 1) {
            terms.push(form === "series-first" ? { sourceOhms: 50, loadOhms: 600 } : { sourceOhms: 600, loadOhms: 50 });
            if (order % 2 === 1) terms.push(form === "series-first" ? { sourceOhms: 600, loadOhms: 50 } : { sourceOhms: 50, loadOhms: 600 });
          }
          for (const t of terms) {
            const spec: LadderPrototypeSpec = { ...settings, order, form, ...t };
            const ladder = ladderPrototype(spec);
            expect(ladder.elements).toHaveLength(order);
            expect(ladder.elements.map((e) => e.kind)).toEqual(
              Array.from({ length: order }, (_, i) => ((i % 2 === 0) === (form === "series-first") ? "series-L" : "shunt-C")),
            );
            expectPositiveFinite(ladder);
            const nodal = nodalDeviationDb(ladder, w);
            expect(nodal.points).toBeGreaterThan(400);
            expect(nodal.worst, `${JSON.stringify(spec)}, nodal analysis: worst at ${nodal.at} rad/s`).toBeLessThanOrEqual(1e-9);
            const chain = chainDeviationDb(ladder, w);
            expect(chain.points).toBeGreaterThan(1000);
            expect(chain.worst, `${JSON.stringify(spec)}, ABCD chain: worst at ${chain.at} rad/s`).toBeLessThanOrEqual(1e-9);
          }
        }
      });
    }
  }
});

describe("ladderPrototype: transfer", () => {
  it("is the prototype itself scaled to R_L / (R_s + R_L) at DC, except for the type b forms", () => {
    for (const settings of FAMILY_SETTINGS) {
      for (const order of [3, 4, 7, 8]) {
        const ladder = ladderPrototype({ ...settings, order, sourceOhms: 50, ...(order % 2 === 1 ? { loadOhms: 75 } : {}) });
        const h = prototype({ ...settings, order } as Parameters<typeof prototype>[0]);
        const r = ladder.loadOhms / ladder.sourceOhms;
        const dc = magnitudeDb(ladder.transfer, Float64Array.of(0))[0] as number;
        expect(Math.abs(dc - 20 * Math.log10(r / (1 + r)))).toBeLessThan(1e-12);
        if (ladder.variant === "type-b") {
          expect(order % 2).toBe(0);
          expect(["elliptic", "chebyshev2"]).toContain(settings.family);
          expect(ladder.transfer.zeros).toHaveLength(h.zeros.length - 2);
          continue;
        }
        expect(ladder.transfer.poles).toEqual(h.poles);
        expect(ladder.transfer.zeros).toEqual(h.zeros);
      }
    }
  });

  it("is frozen, as are the elements", () => {
    const ladder = ladderPrototype({ family: "elliptic", order: 5, rippleDb: 0.5, attenuationDb: 60 });
    expect(Object.isFrozen(ladder)).toBe(true);
    expect(Object.isFrozen(ladder.elements)).toBe(true);
    expect(Object.isFrozen(ladder.elements[1])).toBe(true);
    expect(Object.isFrozen(ladder.transfer.poles)).toBe(true);
  });
});

describe("ladderPrototype: terminations", () => {
  it("defaults to equal terminations, and for even-order Chebyshev I to the ratio its ripple needs", () => {
    expect(ladderPrototype({ family: "bessel", order: 4, sourceOhms: 50 }).loadOhms).toBe(50);
    expect(ladderPrototype({ family: "elliptic", order: 4, rippleDb: 1, attenuationDb: 50, sourceOhms: 50 }).loadOhms).toBe(50);
    const eps = Math.sqrt(10 ** 0.05 - 1);
    const r = (eps + Math.sqrt(1 + eps * eps)) ** 2;
    expect(ladderPrototype({ family: "chebyshev1", order: 4, rippleDb: 0.5 }).loadOhms).toBeCloseTo(r, 14);
    expect(ladderPrototype({ family: "chebyshev1", order: 4, rippleDb: 0.5, form: "shunt-first" }).loadOhms).toBeCloseTo(1 / r, 14);
    expect(ladderPrototype({ family: "chebyshev1", order: 5, rippleDb: 0.5 }).loadOhms).toBe(1);
  });

  it("accepts any even-order Chebyshev I load at or beyond the ripple's ratio (unequal closed form)", () => {
    const ladder = ladderPrototype({ family: "chebyshev1", order: 6, rippleDb: 0.2, loadOhms: 4 });
    expect(ladder.loadOhms).toBe(4);
    expect(nodalDeviationDb(ladder, denseGrid({ family: "chebyshev1" }, 6)).worst).toBeLessThan(1e-9);
    expect(chainDeviationDb(ladder, denseGrid({ family: "chebyshev1" }, 6)).worst).toBeLessThan(1e-9);
  });

  it("scales the normalised values by the source resistance (L times R, C divided by R)", () => {
    const one = ladderPrototype({ family: "elliptic", order: 5, rippleDb: 0.5, attenuationDb: 60 });
    const fifty = ladderPrototype({ family: "elliptic", order: 5, rippleDb: 0.5, attenuationDb: 60, sourceOhms: 50 });
    expect(fifty.loadOhms).toBe(50);
    one.elements.forEach((e, i) => {
      const f = fifty.elements[i];
      const k = e.kind === "series-L" ? 50 : 1 / 50;
      expect((f?.value as number) / e.value).toBeCloseTo(k, 12);
      if (e.parallelC !== undefined) expect((f?.parallelC as number) / e.parallelC).toBeCloseTo(1 / 50, 12);
      if (e.seriesL !== undefined) expect((f?.seriesL as number) / e.seriesL).toBeCloseTo(50, 12);
    });
  });

  it("turns an odd-order ladder end to end for a load on the other side", () => {
    // series-first into a smaller load: the ladder for the reciprocal ratio reversed
    const up = ladderPrototype({ family: "butterworth", order: 5, loadOhms: 4 });
    const down = ladderPrototype({ family: "butterworth", order: 5, sourceOhms: 4, loadOhms: 1 });
    expect(down.elements.map((e) => e.value)).toEqual([...up.elements].reverse().map((e) => e.value));
  });
});

describe("ladderPrototype: the shapes of the element lists", () => {
  it("puts the tanks of an odd elliptic ladder in the series arms (shunt-first) or the shunt arms (series-first)", () => {
    const shunt = ladderPrototype({ family: "elliptic", order: 7, rippleDb: 0.5, attenuationDb: 60, form: "shunt-first" });
    expect(shunt.elements.map((e) => e.parallelC !== undefined)).toEqual([false, true, false, true, false, true, false]);
    const series = ladderPrototype({ family: "elliptic", order: 7, rippleDb: 0.5, attenuationDb: 60, form: "series-first" });
    expect(series.elements.map((e) => e.seriesL !== undefined)).toEqual([false, true, false, true, false, true, false]);
  });

  it("places each tank's resonance on one of the transfer's zeros", () => {
    const l = ladderPrototype({ family: "chebyshev2", order: 7, attenuationDb: 80, form: "shunt-first" });
    const tanks = l.elements.filter((e) => e.parallelC !== undefined).map((e) => 1 / Math.sqrt(e.value * (e.parallelC as number)));
    const zeros = l.transfer.zeros.filter((z) => z.im > 0).map((z) => z.im);
    expect(tanks.sort()).toHaveLength(3);
    for (const t of tanks) expect(Math.min(...zeros.map((z) => Math.abs(z / t - 1)))).toBeLessThan(1e-13);
  });

  it("ends an even-order type b ladder in two plain arms (two transmission zeros at infinity)", () => {
    const l = ladderPrototype({ family: "elliptic", order: 6, rippleDb: 0.5, attenuationDb: 60, form: "shunt-first" });
    expect(l.variant).toBe("type-b");
    expect(l.elements.map((e) => e.parallelC !== undefined)).toEqual([false, true, false, true, false, false]);
  });

  it("gives order 1 as a single arm", () => {
    const l = ladderPrototype({ family: "butterworth", order: 1 });
    expect(l.elements).toEqual([{ kind: "series-L", value: 2 }]);
    const b = ladderPrototype({ family: "bessel", order: 1, form: "shunt-first" });
    expect(b.elements).toHaveLength(1);
    expect(nodalDeviationDb(b, denseGrid({ family: "bessel" }, 1)).worst).toBeLessThan(1e-12);
  });
});
