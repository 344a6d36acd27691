/**
 * The KHN state-variable notch and allpass at a lower internal level
 * (`resistorRatio` = R2/R1, the input summer's gain): the transfer function
 * to the stage output is the same as at the default level, and the loop's
 * three op-amp outputs scale by exactly that ratio, both by nodal analysis
 * of the stage's elements (independent of the closed forms); the closed-form
 * polynomials follow the nodal analysis with a real op-amp; a ratio that
 * leaves no divider for Q is refused.
 */
import { describe, expect, it } from "vitest";
import { acAnalysis } from "../../src/circuit/mna.ts";
import type { Element, OpAmpModel } from "../../src/circuit/types.ts";
import { getTopology } from "../../src/topologies/index.ts";
import type { ComponentValues, StageChoices, StageTarget, Topology } from "../../src/topologies/types.ts";
import { logGrid } from "../../src/tf/index.ts";
import { polyMagnitude } from "../helpers/poly-magnitude.ts";

const ideal: OpAmpModel = { kind: "ideal" };
const real: OpAmpModel = { kind: "single-pole", a0: 2e5, gbwHz: 5e6 };
const NODES = ["hp", "bp", "lp", "out"];

function nodal(topo: Topology, v: ComponentValues, freqHz: Float64Array, opamp: OpAmpModel): Record<string, { re: Float64Array; im: Float64Array }> {
  const elements: Element[] = [{ kind: "V", name: "Vin", a: "in", b: "0", ac: 1 }, ...topo.elements(v, { input: "in", output: "out", nodePrefix: "x_", opamp })];
  const outs = NODES.map((n) => (n === "out" ? n : `x_${n}`));
  const r = acAnalysis({ title: topo.id, elements }, { source: "Vin", outputs: outs, freqHz }).outputs;
  return Object.fromEntries(NODES.map((n, i) => [n, r[outs[i] as string] as { re: Float64Array; im: Float64Array }]));
}

const cases: { id: string; target: StageTarget }[] = [
  { id: "state-variable-notch", target: { order: 2, kind: "notch", f0Hz: 400, q: 8, fzHz: 400, gain: 1 } },
  { id: "state-variable-notch", target: { order: 2, kind: "lowpass-notch", f0Hz: 1200, q: 5, fzHz: 1900, gain: 2 } },
  { id: "state-variable-notch", target: { order: 2, kind: "highpass-notch", f0Hz: 60, q: 12, fzHz: 50, gain: 0.5 } },
  { id: "state-variable-allpass", target: { order: 2, kind: "allpass", f0Hz: 3000, q: 0.9, gain: 1 } },
];

describe("state-variable notch and allpass: the internal level", () => {
  for (const { id, target } of cases) {
    const topo = getTopology(id);
    const f = logGrid(target.f0Hz / 20, target.f0Hz * 20, 401);
    const at = (c: StageChoices): ComponentValues => topo.design(target, { capacitor: 10e-9, ...c });
    const base = at({});
    const ref = nodal(topo, base, f, ideal);
    for (const h of [0.5, 0.125]) {
      it(`${id} ${target.kind}, ratio ${h}: the same transfer, the loop nodes scaled by ${h}, the figures on target`, () => {
        const v = at({ resistorRatio: h });
        expect((v["R2"] as number) / (v["R1"] as number)).toBeCloseTo(h, 12);
        const fig = topo.figures(v);
        expect(Math.abs(fig.f0Hz / target.f0Hz - 1)).toBeLessThan(1e-12);
        expect(Math.abs((fig.q as number) / (target.q as number) - 1)).toBeLessThan(1e-12);
        expect(Math.abs(fig.gain / target.gain - 1)).toBeLessThan(1e-12);
        const got = nodal(topo, v, f, ideal);
        for (let i = 0; i < f.length; i++) {
          const o = got["out"] as { re: Float64Array; im: Float64Array };
          const r = ref["out"] as { re: Float64Array; im: Float64Array };
          const scale = Math.max(1e-6, Math.hypot(r.re[i] as number, r.im[i] as number));
          expect(Math.hypot((o.re[i] as number) - (r.re[i] as number), (o.im[i] as number) - (r.im[i] as number)) / scale).toBeLessThan(1e-8);
          for (const n of ["hp", "bp", "lp"]) {
            const a = got[n] as { re: Float64Array; im: Float64Array };
            const b = ref[n] as { re: Float64Array; im: Float64Array };
            const ratio = Math.hypot(a.re[i] as number, a.im[i] as number) / Math.hypot(b.re[i] as number, b.im[i] as number);
            expect(Math.abs(ratio / h - 1), `${n} at ${f[i]} Hz`).toBeLessThan(1e-9);
          }
        }
      });

      it(`${id} ${target.kind}, ratio ${h}: the closed-form polynomials follow the nodal analysis with a real op-amp (1e-9 dB)`, () => {
        const v = at({ resistorRatio: h });
        const out = nodal(topo, v, f, real)["out"] as { re: Float64Array; im: Float64Array };
        for (let i = 0; i < f.length; i += 4) {
          const m = Math.hypot(out.re[i] as number, out.im[i] as number);
          if (!(m > 1e-4)) continue;
          expect(Math.abs(20 * Math.log10(polyMagnitude(topo, v, f[i] as number, real) / m))).toBeLessThan(1e-9);
        }
      });
    }
  }

  it("refuses a ratio that leaves no divider for Q, and asks to raise it", () => {
    const topo = getTopology("state-variable-notch");
    const t: StageTarget = { order: 2, kind: "notch", f0Hz: 1000, q: 0.4, fzHz: 1000, gain: 1 };
    expect(topo.check(t, { resistorRatio: 0.4 })).toMatch(/raise resistorRatio/);
    expect(topo.check(t, { resistorRatio: 1 })).toBeNull();
    expect(() => topo.design(t, { resistorRatio: 0.4 })).toThrow(/resistorRatio/);
  });
});
