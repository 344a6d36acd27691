import { describe, expect, it } from "vitest";
import {
  BOCTOR_GAIN_MARGIN,
  BOCTOR_MAX_RATIO,
  BOCTOR_MIN_ZERO_SEPARATION,
  boctorHighpassNotch,
  boctorLowpassNotch,
} from "../../src/topologies/boctor.ts";
import { UnrealisableError } from "../../src/errors.ts";
import { acAnalysis } from "../../src/circuit/mna.ts";
import { circuitToSpice } from "../../src/circuit/spice.ts";
import type { Circuit, Element, OpAmpModel } from "../../src/circuit/types.ts";
import type { ComponentValues, StageTarget, Topology } from "../../src/topologies/types.ts";
import { requireNgspice, runAc } from "../helpers/ngspice.ts";
import fixture from "../fixtures/boctor-nodal.json" with { type: "json" };
import { polyMagnitude } from "../helpers/poly-magnitude.ts";

const ideal: OpAmpModel = { kind: "ideal" };
const realistic: OpAmpModel = { kind: "single-pole", a0: 2e5, gbwHz: 1e6 };

const lpn: StageTarget = { order: 2, kind: "lowpass-notch", f0Hz: 1000, q: 2, fzHz: 2000, gain: 1 };
const hpn: StageTarget = { order: 2, kind: "highpass-notch", f0Hz: 1000, q: 2, fzHz: 500, gain: 0.8 };

function nodal(topo: Topology, v: ComponentValues, freqHz: Float64Array, opamp: OpAmpModel): { re: Float64Array; im: Float64Array } {
  const elements: Element[] = [{ kind: "V", name: "Vin", a: "in", b: "0", ac: 1 }, ...topo.elements(v, { input: "in", output: "out", nodePrefix: "x_", opamp })];
  return acAnalysis({ title: topo.id, elements }, { source: "Vin", outputs: ["out"], freqHz }).outputs["out"]!;
}

const db = (x: number): number => 20 * Math.log10(x);

describe("boctor-lowpass-notch and boctor-highpass-notch limits", () => {
  it("refuse a zero closer to the pole than the separation limit, naming the Tow-Thomas forms", () => {
    const near = { ...lpn, fzHz: 1000 * (BOCTOR_MIN_ZERO_SEPARATION - 0.001) };
    expect(boctorLowpassNotch.check(near, {})).toMatch(/Tow-Thomas lowpass-notch/);
    expect(boctorLowpassNotch.check({ ...lpn, fzHz: 1000 * BOCTOR_MIN_ZERO_SEPARATION, gain: 0.5 }, {})).toBeNull();
    const nearHp = { ...hpn, fzHz: 1000 / (BOCTOR_MIN_ZERO_SEPARATION - 0.001) };
    expect(boctorHighpassNotch.check(nearHp, {})).toMatch(/Tow-Thomas highpass-notch/);
    expect(boctorHighpassNotch.check({ ...hpn, fzHz: 1000 / BOCTOR_MIN_ZERO_SEPARATION }, {})).toBeNull();
    expect(() => boctorLowpassNotch.design(near, {})).toThrow(UnrealisableError);
  });

  it("refuse the wrong side of the pole (common rule) and a negative gain", () => {
    expect(boctorLowpassNotch.check({ ...lpn, fzHz: 900 }, {})).toMatch(/highpass-notch/);
    expect(boctorHighpassNotch.check({ ...hpn, fzHz: 1100 }, {})).toMatch(/lowpass-notch/);
    expect(boctorLowpassNotch.check({ ...lpn, gain: -1 }, {})).toMatch(/non-inverting/);
  });

  it("bound the gain: the highpass-notch stays below 1 at HF, the lowpass-notch below (fz/f0)^2 at DC", () => {
    expect(boctorHighpassNotch.check({ ...hpn, gain: 1 }, {})).toMatch(/lower the stage gain/);
    expect(boctorHighpassNotch.check({ ...hpn, gain: 0.98 }, {})).toBeNull(); // needs a capacitor ratio above 1, taken by default
    // ceiling 0.99 r^2 Q^2 (1 + m)/(Q^2 (1 + m) + r^2) at the largest ratio m = 20 (Q = 2, r = 2)
    const ceiling = (BOCTOR_GAIN_MARGIN * 4 * 4 * (1 + BOCTOR_MAX_RATIO)) / (4 * (1 + BOCTOR_MAX_RATIO) + 4);
    expect(boctorLowpassNotch.check({ ...lpn, gain: ceiling * 1.001 }, {})).toMatch(/lower the stage gain/);
    expect(boctorLowpassNotch.check({ ...lpn, gain: ceiling * 0.999 }, {})).toBeNull();
    expect(boctorLowpassNotch.check({ ...lpn, gain: ceiling * 0.999 }, { capacitorRatio: BOCTOR_MAX_RATIO * 1.01 })).toMatch(/up to 20/);
  });

  it("at equal capacitors the gain bound is 0.99 * 2Q^2 r^2/(2Q^2 + r^2) (DC, lowpass-notch); an explicit ratio 1 refuses more and names the ratio it needs", () => {
    const r2 = 4;
    const bound = (BOCTOR_GAIN_MARGIN * 2 * 4 * r2) / (2 * 4 + r2);
    expect(boctorLowpassNotch.check({ ...lpn, gain: bound * (1 - 1e-9) }, { capacitorRatio: 1 })).toBeNull();
    const why = boctorLowpassNotch.check({ ...lpn, gain: bound * 1.01 }, { capacitorRatio: 1 });
    expect(why).toMatch(/capacitorRatio \(C1\/C2\) to at least/);
    // the ratio named in the message is enough
    const need = Number(/at least ([0-9.e+-]+)/.exec(why as string)![1]);
    expect(boctorLowpassNotch.check({ ...lpn, gain: bound * 1.01 }, { capacitorRatio: need * 1.001 })).toBeNull();
  });

  it("takes no resistor ratio", () => {
    expect(boctorLowpassNotch.check(lpn, { resistorRatio: 2 })).toMatch(/no resistorRatio/);
  });

  it("raises the capacitor ratio by itself only as far as the gain needs, up to the default maximum", () => {
    const v1 = boctorLowpassNotch.design(lpn, {});
    expect(v1["C1"]! / v1["C2"]!).toBeCloseTo(1, 12);
    const v2 = boctorHighpassNotch.design({ ...hpn, q: 0.7, gain: 0.75 }, {});
    const m = v2["C1"]! / v2["C2"]!;
    expect(m).toBeGreaterThan(1);
    expect(m).toBeLessThanOrEqual(BOCTOR_MAX_RATIO);
    // R2 = 10 (R1 || R2) at the ratio it takes
    const rt = 1 / (1 / v2["R1"]! + 1 / v2["R2"]!);
    expect(v2["R2"]! / rt).toBeCloseTo(10, 9);
  });
});

describe("designed stages have the target's figures", () => {
  const cases: [Topology, StageTarget, object][] = [];
  for (const f0Hz of [3.3, 1000, 77_000]) {
    for (const q of [0.4, 1.1, 6, 25]) {
      for (const r of [1.02, 1.7, 6]) {
        cases.push([boctorLowpassNotch, { order: 2, kind: "lowpass-notch", f0Hz, q, fzHz: f0Hz * r, gain: 0.3 }, {}]);
        cases.push([boctorLowpassNotch, { order: 2, kind: "lowpass-notch", f0Hz, q, fzHz: f0Hz * r, gain: 0.9 * r * r }, { capacitor: 4.7e-9 }]);
        cases.push([boctorHighpassNotch, { order: 2, kind: "highpass-notch", f0Hz, q, fzHz: f0Hz / r, gain: 0.5 }, { resistor: 22_000 }]);
        cases.push([boctorHighpassNotch, { order: 2, kind: "highpass-notch", f0Hz, q, fzHz: f0Hz / r, gain: 0.9 }, {}]);
      }
    }
  }
  it(`f0, Q, fz and gain to 1e-9 over ${cases.length} targets (the realisable ones), every part positive and finite`, () => {
    let designed = 0;
    for (const [topo, t, c] of cases) {
      if (topo.check(t, c) !== null) continue;
      const v = topo.design(t, c);
      for (const n of topo.componentNames) expect(Number.isFinite(v[n]) && v[n]! > 0, `${topo.id} ${n}`).toBe(true);
      const f = topo.figures(v);
      expect(Math.abs(f.f0Hz / t.f0Hz - 1)).toBeLessThan(1e-9);
      expect(Math.abs(f.q! / t.q! - 1)).toBeLessThan(1e-9);
      expect(Math.abs(f.fzHz! / t.fzHz! - 1)).toBeLessThan(1e-9);
      expect(Math.abs(f.gain / t.gain - 1)).toBeLessThan(1e-9);
      expect(f.zeroDamping!).toBeLessThan(1e-9);
      designed++;
    }
    expect(designed).toBeGreaterThan(cases.length * 0.8);
  });

  it("the default level is R1 = 10 kOhm; capacitor sets C2, resistor sets R1", () => {
    expect(boctorLowpassNotch.design(lpn, {})["R1"]).toBe(10_000);
    expect(boctorLowpassNotch.design(lpn, { capacitor: 1e-8 })["C2"]).toBe(1e-8);
    expect(boctorHighpassNotch.design(hpn, { resistor: 4700 })["R1"]).toBe(4700);
  });

  it("a typical lowpass-notch has moderate values (f0 1 kHz, Q 2, fz 2 kHz, DC gain 1)", () => {
    const v = boctorLowpassNotch.design(lpn, {});
    // G3 = w0 C/(2Q), Gt = 2Q w0 C, G1 = gamma (Gt + 2 G3 r^2) with gamma = 1/4: R2 = 6k, R3 = 60k, R4 = 15k, R5 = 5k, R6 = 20k
    const want: Record<string, number> = { R1: 10_000, R2: 6000, R3: 60_000, R4: 15_000, R5: 5000, R6: 20_000 };
    for (const [k, x] of Object.entries(want)) expect(Math.abs(v[k]! / x - 1)).toBeLessThan(1e-12);
  });
});

describe("the zeros sit on the jw axis", () => {
  for (const [topo, t, ref] of [
    [boctorLowpassNotch, lpn, 0],
    [boctorHighpassNotch, hpn, 1e7],
  ] as const) {
    it(`${topo.id}: the notch is below -150 dB with nominal values, with the ideal and the single-pole op-amp (the numerator does not involve A)`, () => {
      const v = topo.design(t, {});
      for (const opamp of [ideal, realistic]) {
        const f = Float64Array.of(ref, t.fzHz!);
        const h = nodal(topo, v, f, opamp);
        const closed = topo.response(v, f, opamp);
        const depth = (re: Float64Array, im: Float64Array): number => db(Math.hypot(re[1]!, im[1]!) / Math.hypot(re[0]!, im[0]!));
        expect(depth(h.re, h.im)).toBeLessThan(-150);
        expect(depth(closed.re, closed.im)).toBeLessThan(-150);
      }
      const a = topo.polynomials!(v, ideal)!;
      const b = topo.polynomials!(v, realistic)!;
      // same numerator up to the normalisation by the largest denominator coefficient
      const k = b.num[b.num.length - 1]! / a.num[a.num.length - 1]!;
      for (let i = 1; i <= 3; i++) expect(Math.abs(b.num[b.num.length - i]! / (k * a.num[a.num.length - i]!) - 1)).toBeLessThan(1e-9);
    });
  }

  it("a 1 % error in R1 leaves the notch the depth the header's residual-N1 formula gives (lowpass-notch)", () => {
    const v = boctorLowpassNotch.design(lpn, {});
    const off: ComponentValues = { ...v, R1: v["R1"]! * 1.01 };
    const fz = boctorLowpassNotch.figures(off).fzHz!;
    const f = Float64Array.of(0, fz);
    const h = nodal(boctorLowpassNotch, off, f, ideal);
    const depth = Math.hypot(h.re[1]!, h.im[1]!) / Math.hypot(h.re[0]!, h.im[0]!);
    // residual N1 from the header's coefficients, at the built values
    const g = (n: string): number => 1 / off[n]!;
    const gamma = g("R4") / (g("R4") + g("R5"));
    const c1 = off["C1"]!;
    const c2 = off["C2"]!;
    const n1 = gamma * (c1 * (g("R2") + g("R3") + g("R6")) + c2 * (g("R3") + g("R6"))) - (1 - gamma) * c1 * g("R1");
    const n0 = gamma * (g("R1") + g("R2")) * (g("R3") + g("R6"));
    const wz = 2 * Math.PI * fz;
    const gt = g("R1") + g("R2");
    const d0 = g("R3") * gt;
    const dAbs = Math.hypot(d0 - c1 * c2 * wz * wz, g("R3") * (c1 + c2) * wz);
    expect(Math.abs(depth / ((Math.abs(n1) * wz * d0) / (n0 * dAbs)) - 1)).toBeLessThan(1e-6);
    // the reported zero damping is the same residual: |N1| / (2 sqrt(N0 N2))
    expect(Math.abs(boctorLowpassNotch.figures(off).zeroDamping! / (Math.abs(n1) / (2 * Math.sqrt(n0 * gamma * c1 * c2))) - 1)).toBeLessThan(1e-9);
    expect(db(depth)).toBeGreaterThan(-60);
    expect(db(depth)).toBeLessThan(-30);
  });
});

describe.skipIf(!requireNgspice())("ngspice agrees with the as-built polynomials (a0 = 2e5, GBW = 1 MHz)", () => {
  for (const [topo, t] of [
    [boctorLowpassNotch, { ...lpn, f0Hz: 12_000, fzHz: 15_000, q: 4, gain: 1.1 }],
    [boctorHighpassNotch, { ...hpn, f0Hz: 12_000, fzHz: 9_000, q: 4, gain: 0.9 }],
  ] as const) {
    it(`${topo.id}: to 0.01 dB wherever |H| is above -60 dB`, () => {
      const v = topo.design(t, { capacitor: 2.2e-9 });
      const elements: Element[] = [{ kind: "V", name: "Vin", a: "in", b: "0", ac: 1 }, ...topo.elements(v, { input: "in", output: "out", nodePrefix: "x_", opamp: realistic })];
      const circuit: Circuit = { title: topo.id, elements };
      const sim = runAc(circuitToSpice(circuit, { ac: { pointsPerDecade: 40, startHz: 100, stopHz: 2e6 } }), ["out"]);
      const o = sim.vectors["out"]!;
      let compared = 0;
      let worst = 0;
      for (let i = 0; i < sim.freqHz.length; i++) {
        const ms = Math.hypot(o.re[i]!, o.im[i]!);
        if (db(ms) < -60) continue;
        const err = Math.abs(db(polyMagnitude(topo, v, sim.freqHz[i]!, realistic) / ms));
        worst = Math.max(worst, err);
        compared++;
      }
      expect(compared).toBeGreaterThan(150);
      expect(worst).toBeLessThan(0.01);
    });
  }
});

describe("against a numpy nodal analysis (test/fixtures/boctor-nodal.json)", () => {
  for (const [i, c] of fixture.cases.entries()) {
    const topo = c.topology === "boctor-lowpass-notch" ? boctorLowpassNotch : boctorHighpassNotch;
    it(`case ${i} (${c.topology}, f0 ${c.target.f0Hz} Hz, Q ${c.target.q}, fz ${c.target.fzHz} Hz, ${c.opamp.kind}): values to 1e-12, response and polynomials to 1e-9`, () => {
      const v = topo.design(c.target as StageTarget, c.choices);
      for (const [k, x] of Object.entries(c.values)) expect(Math.abs(v[k]! / x - 1), k).toBeLessThan(1e-12);
      const opamp = c.opamp as OpAmpModel;
      const f = Float64Array.from(c.freqHz);
      const h = topo.response(v, f, opamp);
      const p = topo.polynomials!(v, opamp)!;
      for (let j = 0; j < f.length; j++) {
        const ref = Math.hypot(c.re[j]!, c.im[j]!);
        expect(Math.hypot(h.re[j]! - c.re[j]!, h.im[j]! - c.im[j]!) / ref).toBeLessThan(1e-9);
        expect(Math.abs(polyMagnitude(topo, v, f[j]!, opamp) / ref - 1)).toBeLessThan(1e-9);
      }
    });
  }
});
