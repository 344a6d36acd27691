import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { topologies } from "../../src/topologies/registry.ts";
import type { OpAmpModel } from "../../src/circuit/types.ts";
import type { Topology } from "../../src/topologies/types.ts";
import { isBoard, mnaOf, opampOf, spreadValues } from "../helpers/stage-cases.ts";
import { compileStage, genericStagePolynomialsInto, stagePolynomials, stagePolynomialsInto } from "../../src/evaluate/stage-polynomials.ts";
import { cascadeMagnitudeSquared, cascadeResponse } from "../../src/evaluate/cascade.ts";
import type { ScaledRational } from "../../src/evaluate/types.ts";
import { realisableArb, sampleTarget } from "./arbitraries.ts";

const withClosedForm = topologies.filter((t) => t.polynomials !== undefined);

/** Topologies whose passive network is of higher order than the stage (the twin-T is third order unless its parts balance). */
const extraNetworkOrder: Readonly<Record<string, number>> = { "twin-t-notch": 1 };

const caseArb = (topo: Topology) =>
  fc.record({
    design: realisableArb(topo),
    spread: fc.array(fc.double({ min: 0.7, max: 1.4, noNaN: true }), { minLength: 12, maxLength: 12 }),
    freqs: fc.array(fc.double({ min: -2, max: 2, noNaN: true }), { minLength: 1, maxLength: 8 }),
    model: fc.constantFrom("ideal", "single-pole", "single-pole-rout"), // the last with routOhm 0
    a0Log: fc.double({ min: 3, max: 7, noNaN: true }),
    gbwLog: fc.double({ min: 0.5, max: 4, noNaN: true }),
  });

/** Magnitude (dB) and phase (degree) differences of `h` from `m` at point i. */
function difference(h: { re: Float64Array; im: Float64Array }, m2: Float64Array, m: { re: Float64Array; im: Float64Array }, i: number) {
  const magDb = Math.abs(10 * Math.log10(m2[i]!) - 20 * Math.log10(Math.hypot(m.re[i]!, m.im[i]!)));
  let dp = Math.atan2(h.im[i]!, h.re[i]!) - Math.atan2(m.im[i]!, m.re[i]!);
  dp -= 2 * Math.PI * Math.round(dp / (2 * Math.PI));
  return { magDb, deg: Math.abs((dp * 180) / Math.PI) };
}

const worst: Record<string, { mag: number; deg: number }> = {};

describe("Topology.polynomials", () => {
  it("every topology has closed-form polynomials (the generic path stays for internal nodes and op-amps with an output resistance)", () => {
    const ids = withClosedForm.map((t) => t.id);
    expect(ids.length).toBe(topologies.length);
    for (const t of topologies) {
      expect(t.polynomials, t.id).toBeDefined();
      expect(t.polynomialsInto, t.id).toBeDefined();
      expect(t.polynomialDegree, t.id).toBeDefined();
    }
  });

  for (const topo of withClosedForm) {
    it(`${topo.id}: agrees with nodal analysis, the closed-form response and the generic path to 1e-9 dB and 1e-7 degree`, () => {
      fc.assert(
        fc.property(caseArb(topo), ({ design, spread, freqs, model, a0Log, gbwLog }) => {
          const v = spreadValues(topo, topo.design(design.target, design.choices), spread);
          fc.pre(isBoard(topo, v));
          const f0 = design.target.f0Hz;
          const opamp = opampOf(model, f0, a0Log, gbwLog, 0);
          const freqHz = Float64Array.from(freqs.map((x) => f0 * 10 ** x));
          const w = freqHz.map((f) => 2 * Math.PI * f);
          const p = topo.polynomials!(v, opamp)!;
          expect(p.den.length).toBeLessThanOrEqual(topo.polynomialDegree! + 1);
          const h = cascadeResponse([p], w);
          const m2 = cascadeMagnitudeSquared([p], w);
          const generic = stagePolynomials(topo, v, opamp, { closedForm: false })!;
          const references = [mnaOf(topo, v, freqHz, opamp), topo.response(v, freqHz, opamp), cascadeResponse([generic], w)];
          for (const m of references) {
            for (let i = 0; i < freqHz.length; i++) {
              const d = Math.hypot(h.re[i]! - m.re[i]!, h.im[i]! - m.im[i]!);
              expect(d / Math.abs(design.target.gain), `f = ${freqHz[i]} Hz (${opamp.kind})`).toBeLessThan(1e-10);
              const e = difference(h, m2, m, i);
              const acc = (worst[topo.id] ??= { mag: 0, deg: 0 });
              acc.mag = Math.max(acc.mag, e.magDb);
              acc.deg = Math.max(acc.deg, e.deg);
              expect(e.magDb, `f = ${freqHz[i]} Hz (${opamp.kind})`).toBeLessThan(1e-9);
              expect(e.deg, `f = ${freqHz[i]} Hz (${opamp.kind})`).toBeLessThan(1e-7);
            }
          }
        }),
        { numRuns: 60 },
      );
    });
  }

  it("reports the worst agreement per topology", () => {
    const rows = Object.entries(worst).map(([id, e]) => `${id}: ${e.mag.toExponential(2)} dB, ${e.deg.toExponential(2)} deg`);
    console.log(rows.join("\n"));
    expect(rows.length).toBe(withClosedForm.length);
  });

  it("the ideal op-amp gives the network's own degree; the single-pole model adds one per op-amp", () => {
    for (const topo of withClosedForm) {
      const v = topo.design(sampleTarget(topo), {});
      const ideal = topo.polynomials!(v, { kind: "ideal" })!;
      const finite = topo.polynomials!(v, { kind: "single-pole", a0: 1e5, gbwHz: 1e6 })!;
      const network = topo.order + (extraNetworkOrder[topo.id] ?? 0);
      expect(ideal.den.length, topo.id).toBe(network + 1);
      expect(finite.den.length, topo.id).toBe(network + 1 + topo.opampCount);
      expect(topo.polynomialDegree, topo.id).toBe(network + topo.opampCount);
      expect(Math.max(...finite.den.map(Math.abs)), topo.id).toBe(1);
      expect(finite.scale, topo.id).toBeCloseTo(2 * Math.PI * topo.figures(v).f0Hz, 6);
    }
  });

  it("declines an op-amp with an output resistance: null, and stagePolynomialsInto falls back to the generic path", () => {
    const opamp: OpAmpModel = { kind: "single-pole-rout", a0: 1e5, gbwHz: 1e6, routOhm: 50 };
    for (const topo of withClosedForm) {
      const v = topo.design(sampleTarget(topo), {});
      expect(topo.polynomials!(v, opamp), topo.id).toBeNull();
      const cs = compileStage(topo, v, opamp);
      expect(cs.closedForm, topo.id).toBeNull();
      const x = Float64Array.from(topo.componentNames, (n) => v[n]!);
      expect(topo.polynomialsInto!(x, opamp, 1e4, new Float64Array(cs.points), new Float64Array(cs.points)), topo.id).toBe(0);
    }
  });
});

describe("stagePolynomialsInto", () => {
  it("takes the closed form where there is one, in the generic path's layout and scale", () => {
    const opamps: OpAmpModel[] = [{ kind: "ideal" }, { kind: "single-pole", a0: 2e5, gbwHz: 3e6 }];
    for (const topo of withClosedForm) {
      for (const opamp of opamps) {
        const v = topo.design(sampleTarget(topo), {});
        const cs = compileStage(topo, v, opamp);
        expect(cs.closedForm, topo.id).not.toBeNull();
        const x = Float64Array.from(cs.componentNames, (n) => v[n]!);
        const radius = 2 * Math.PI * topo.figures(v).f0Hz;
        const fast = { num: new Float64Array(cs.points), den: new Float64Array(cs.points) };
        const generic = { num: new Float64Array(cs.points), den: new Float64Array(cs.points) };
        expect(stagePolynomialsInto(cs, x, radius, fast.num, fast.den)).toBe(radius);
        const r = genericStagePolynomialsInto(cs, x, radius, generic.num, generic.den);
        expect(r, topo.id).toBe(radius);
        // the same coefficients to rounding, up to the common sign (the generic path's determinant may be negative)
        const sign = Math.sign(generic.den.reduce((a, b) => (Math.abs(b) > Math.abs(a) ? b : a), 0));
        for (let k = 0; k < cs.points; k++) {
          expect(Math.abs(fast.num[k]! - sign * generic.num[k]!), `${topo.id} num[${k}]`).toBeLessThan(1e-11 * Math.max(...fast.num.map(Math.abs)));
          expect(Math.abs(fast.den[k]! - sign * generic.den[k]!), `${topo.id} den[${k}]`).toBeLessThan(1e-11);
        }
        const auto: ScaledRational = stagePolynomials(topo, v, opamp)!;
        const expected = topo.polynomials!(v, opamp)!;
        expect(Array.from(auto.den)).toEqual(Array.from(expected.den));
        expect(Array.from(auto.num)).toEqual(Array.from(expected.num));
      }
    }
  });
});
