import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { topologies } from "../../src/topologies/registry.ts";
import { acAnalysis } from "../../src/circuit/mna.ts";
import { circuitToSpice } from "../../src/circuit/spice.ts";
import type { Circuit, Element, OpAmpModel } from "../../src/circuit/types.ts";
import { requireNgspice, runAc } from "../helpers/ngspice.ts";
import { realisableArb } from "./arbitraries.ts";
import { targetResponse } from "./target-response.ts";

const haveNgspice = requireNgspice();
const DESIGNS_PER_TOPOLOGY = 4;
const FLOOR_DB = -80;

const modelArb: fc.Arbitrary<(f0: number) => OpAmpModel> = fc.oneof(
  fc.constant(() => ({ kind: "ideal" }) as OpAmpModel),
  fc
    .record({ a0: fc.double({ min: 3, max: 6.5, noNaN: true }), gbw: fc.double({ min: 1, max: 3.5, noNaN: true }) })
    .map(({ a0, gbw }) => (f0: number) => ({ kind: "single-pole", a0: 10 ** a0, gbwHz: f0 * 10 ** gbw }) as OpAmpModel),
  fc
    .record({
      a0: fc.double({ min: 3, max: 6.5, noNaN: true }),
      gbw: fc.double({ min: 1, max: 3.5, noNaN: true }),
      rout: fc.double({ min: 1, max: 300, noNaN: true }),
    })
    .map(({ a0, gbw, rout }) => (f0: number) => ({ kind: "single-pole-rout", a0: 10 ** a0, gbwHz: f0 * 10 ** gbw, routOhm: rout }) as OpAmpModel),
);

const worst = { db: 0, deg: 0, designs: 0, idealDb: 0, idealDeg: 0, idealDesigns: 0 };

describe.skipIf(!haveNgspice)("Topology.elements netlists in ngspice", () => {
  topologies.forEach((topo, k) => {
    it(`${topo.id}: ngspice agrees with acAnalysis to 0.01 dB and 0.1 degree above ${FLOOR_DB} dB`, () => {
      const samples = fc.sample(fc.tuple(realisableArb(topo), modelArb), { numRuns: DESIGNS_PER_TOPOLOGY, seed: 4242 + k });
      const elements: Element[] = [{ kind: "V", name: "Vin", a: "in", b: "0", ac: 1 }];
      const outs: string[] = [];
      const idealTargets = new Map<string, (typeof samples)[number][0]["target"]>();
      let fLo = Infinity;
      let fHi = 0;
      samples.forEach(([{ target, choices }, model], i) => {
        const v = topo.design(target, choices);
        const out = `o${i}`;
        outs.push(out);
        if (model(target.f0Hz).kind === "ideal") idealTargets.set(out, target);
        elements.push(
          ...topo.elements(v, {
            input: "in",
            output: out,
            nodePrefix: `s${i}_`,
            rename: (n) => `${n}_${i}`,
            opamp: model(target.f0Hz),
          }),
        );
        // a load on each output so op-amp output resistance matters
        elements.push({ kind: "R", name: `RL${i}`, a: out, b: "0", value: 10_000 });
        fLo = Math.min(fLo, target.f0Hz / 100);
        fHi = Math.max(fHi, target.f0Hz * 100);
      });
      const circuit: Circuit = { title: `${topo.id} batch`, elements };
      const netlist = circuitToSpice(circuit, { ac: { pointsPerDecade: 15, startHz: fLo, stopHz: fHi } });
      const sim = runAc(netlist, outs);
      const ours = acAnalysis(circuit, { source: "Vin", outputs: outs, freqHz: sim.freqHz }).outputs;
      for (const o of outs) {
        const a = ours[o]!;
        const b = sim.vectors[o]!;
        let compared = 0;
        for (let i = 0; i < sim.freqHz.length; i++) {
          const mb = Math.hypot(b.re[i]!, b.im[i]!);
          if (20 * Math.log10(mb) < FLOOR_DB) continue;
          const ma = Math.hypot(a.re[i]!, a.im[i]!);
          const db = Math.abs(20 * Math.log10(ma / mb));
          const deg = Math.abs(
            (Math.atan2(a.im[i]! * b.re[i]! - a.re[i]! * b.im[i]!, a.re[i]! * b.re[i]! + a.im[i]! * b.im[i]!) * 180) / Math.PI,
          );
          worst.db = Math.max(worst.db, db);
          worst.deg = Math.max(worst.deg, deg);
          expect(db, `${o} at ${sim.freqHz[i]} Hz`).toBeLessThan(0.01);
          expect(deg, `${o} at ${sim.freqHz[i]} Hz`).toBeLessThan(0.1);
          compared++;
        }
        expect(compared).toBeGreaterThan(10);
        worst.designs++;
        // With the ideal model, the simulated stage must be the target section itself.
        const t = idealTargets.get(o);
        if (t !== undefined) {
          for (let i = 0; i < sim.freqHz.length; i++) {
            const e = targetResponse(t, sim.freqHz[i]!);
            const me = Math.hypot(e.re, e.im);
            if (20 * Math.log10(me) < FLOOR_DB) continue;
            const db = Math.abs(20 * Math.log10(Math.hypot(b.re[i]!, b.im[i]!) / me));
            const deg = Math.abs((Math.atan2(b.im[i]! * e.re - b.re[i]! * e.im, b.re[i]! * e.re + b.im[i]! * e.im) * 180) / Math.PI);
            worst.idealDb = Math.max(worst.idealDb, db);
            worst.idealDeg = Math.max(worst.idealDeg, deg);
            expect(db, `${o} vs target at ${sim.freqHz[i]} Hz`).toBeLessThan(0.01);
            expect(deg, `${o} vs target at ${sim.freqHz[i]} Hz`).toBeLessThan(0.1);
          }
          worst.idealDesigns++;
        }
      }
    });
  });

  it("compared at least 50 designs and reports the worst difference", () => {
    console.log(`ngspice vs MNA over ${worst.designs} designs: worst ${worst.db.toExponential(2)} dB, ${worst.deg.toExponential(2)} degree`);
    console.log(
      `ngspice (ideal op-amps) vs target sections over ${worst.idealDesigns} designs: worst ${worst.idealDb.toExponential(2)} dB, ${worst.idealDeg.toExponential(2)} degree`,
    );
    expect(worst.designs).toBeGreaterThanOrEqual(50);
  });
});
