import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { topologies, getTopology } from "../../src/topologies/registry.ts";
import { InvalidArgumentError, UnrealisableError } from "../../src/errors.ts";
import { realisableArb } from "./arbitraries.ts";
import { thrownBy } from "../helpers/throws.ts";
import { relErr } from "../helpers/tolerance.ts";

let worst = 0;

describe("Topology.design then Topology.figures", () => {
  for (const topo of topologies) {
    it(`${topo.id}: gives back f0, Q, gain and fz to 1e-9 with positive finite values`, () => {
      fc.assert(
        fc.property(realisableArb(topo), ({ target, choices }) => {
          const v = topo.design(target, choices);
          expect(Object.keys(v).sort()).toEqual([...topo.componentNames].sort());
          for (const n of topo.componentNames) {
            const x = v[n] as number;
            expect(Number.isFinite(x) && x > 0, `${n} = ${x}`).toBe(true);
          }
          if (choices.capacitor !== undefined) expect(Object.values(v)).toContain(choices.capacitor);
          else if (choices.resistor !== undefined) expect(Object.values(v)).toContain(choices.resistor);
          const f = topo.figures(v);
          const errs = [relErr(f.f0Hz, target.f0Hz), relErr(f.gain, target.gain)];
          if (topo.order === 2) errs.push(relErr(f.q as number, target.q as number));
          if (target.fzHz !== undefined || target.kind === "notch") {
            errs.push(relErr(f.fzHz as number, target.fzHz ?? target.f0Hz));
          }
          const e = Math.max(...errs);
          worst = Math.max(worst, e);
          expect(e, JSON.stringify({ target, choices, f })).toBeLessThan(1e-9);
        }),
        { numRuns: 150 },
      );
    });
  }
  it("reports the worst relative error", () => {
    console.log(`design->figures worst relative error: ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(1e-9);
  });
});

describe("Topology.check and Topology.design on unrealisable targets", () => {
  it("says what to change for a unity-gain Sallen-Key lowpass with too small a capacitor ratio", () => {
    const t = getTopology("sallen-key-lowpass-unity");
    const target = { order: 2, kind: "lowpass", f0Hz: 1000, q: 1.4, gain: 1 } as const;
    const why = t.check(target, { capacitorRatio: 4 });
    expect(why).toMatch(/4Q\^2 = 7\.840/);
    expect(why).toMatch(/raise capacitorRatio/);
    expect(() => t.design(target, { capacitorRatio: 4 })).toThrow(UnrealisableError);
    expect(t.check(target, { capacitorRatio: 7.85 })).toBeNull();
  });

  it("realises any Q with a chosen resistor ratio and refuses both ratios at once", () => {
    const t = getTopology("sallen-key-lowpass-unity");
    const target = { order: 2, kind: "lowpass", f0Hz: 1000, q: 8, gain: 1 } as const;
    const v = t.design(target, { resistorRatio: 1, capacitor: 1e-9 });
    expect(v["R2"]! / v["R1"]!).toBeCloseTo(1, 12);
    expect(v["C1"]! / v["C2"]!).toBeCloseTo(4 * 64, 9);
    expect(t.check(target, { resistorRatio: 2, capacitorRatio: 300 })).toMatch(/not both/);
  });

  it.each([
    ["sallen-key-lowpass-equal", { order: 2, kind: "lowpass", f0Hz: 100, q: 0.5, gain: 2 }, /Q above 0.5/],
    ["sallen-key-lowpass-equal", { order: 2, kind: "lowpass", f0Hz: 100, q: 12, gain: 3 - 1 / 12 }, /impractically sensitive/],
    ["sallen-key-highpass-equal", { order: 2, kind: "highpass", f0Hz: 100, q: 2, gain: 2 }, /fixed .* at 2\.5/],
    ["sallen-key-lowpass-gain", { order: 2, kind: "lowpass", f0Hz: 100, q: 2, gain: 1 }, /gain of at least 1\.02/],
    ["mfb-lowpass", { order: 2, kind: "lowpass", f0Hz: 100, q: 2, gain: 2 }, /inverting/],
    ["mfb-bandpass", { order: 2, kind: "bandpass", f0Hz: 100, q: 5, gain: -10 }, /above Q\^2/],
    ["mfb-bandpass-attenuated", { order: 2, kind: "bandpass", f0Hz: 100, q: 2, gain: -9 }, /at most 2Q\^2/],
    ["first-order-lowpass-buffer", { order: 1, kind: "lowpass", f0Hz: 100, gain: 2 }, /gain 1/],
    ["first-order-lowpass-noninverting", { order: 1, kind: "lowpass", f0Hz: 100, gain: 0.5 }, /gain of at least 1\.02/],
    ["state-variable-notch", { order: 2, kind: "lowpass-notch", f0Hz: 100, q: 0.3, fzHz: 200, gain: 1 }, /above 1\/3/],
    ["state-variable-notch", { order: 2, kind: "lowpass-notch", f0Hz: 100, q: 2, fzHz: 50, gain: 1 }, /highpass-notch/],
    ["tow-thomas-notch", { order: 2, kind: "notch", f0Hz: 100, q: 2, fzHz: 120, gain: -1 }, /lowpass-notch/],
  ] as const)("%s rejects %j", (id, target, msg) => {
    const t = getTopology(id);
    expect(t.check(target, {})).toMatch(msg);
    expect(thrownBy(() => t.design(target, {}), UnrealisableError).message).toMatch(msg);
  });

  it("rejects malformed targets and choices with paths", () => {
    const t = getTopology("mfb-lowpass");
    const ok = { order: 2, kind: "lowpass", f0Hz: 100, q: 1, gain: -1 } as const;
    expect(() => t.design({ ...ok, f0Hz: Number.NaN }, {})).toThrow(InvalidArgumentError);
    expect(() => t.design({ ...ok, q: -1 }, {})).toThrow(/target\.q/);
    expect(() => t.design({ ...ok, kind: "highpass" }, {})).toThrow(/target\.kind/);
    expect(() => t.design({ ...ok, order: 1 }, {})).toThrow(/target\.order/);
    expect(() => t.design(ok, { capacitor: 0 })).toThrow(/choices\.capacitor/);
    expect(t.check({ ...ok, gain: 0 }, {})).toMatch(/target\.gain/);
  });

  it("never returns negative or non-finite values over a wide random sweep", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...topologies),
        fc.double({ min: -3, max: 7, noNaN: true }),
        fc.double({ min: -2, max: 3, noNaN: true }),
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.double({ min: -2, max: 2, noNaN: true }),
        fc.double({ min: -3, max: 4, noNaN: true }),
        (topo, lf, lq, lg, lz, lr) => {
          const kind = topo.kinds[0]!;
          const target = {
            order: topo.order,
            kind,
            f0Hz: 10 ** lf,
            q: 10 ** lq,
            gain: (topo.inverting ? -1 : 1) * 10 ** lg,
            fzHz: 10 ** (lf + lz),
          };
          const choices = { capacitorRatio: 10 ** lr };
          let v: Record<string, number> | null = null;
          try {
            v = topo.design(target, choices);
          } catch (e) {
            expect(e instanceof UnrealisableError || e instanceof InvalidArgumentError).toBe(true);
            expect(typeof topo.check(target, choices)).toBe("string");
            return;
          }
          for (const x of Object.values(v)) expect(Number.isFinite(x) && x > 0).toBe(true);
        },
      ),
      { numRuns: 400 },
    );
  });
});
