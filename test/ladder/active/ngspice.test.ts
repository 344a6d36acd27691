import { describe, expect, it } from "vitest";
import { acAnalysis, circuitToSpice } from "../../../src/circuit/index.ts";
import type { OpAmpModel } from "../../../src/circuit/types.ts";
import { fdnrLowpassLadder, gicHighpassLadder, leapfrogLowpassLadder, type ActiveLadder } from "../../../src/ladder/active/index.ts";
import { butterworthLadder, chebyshev1Ladder, dualLadder } from "../../helpers/ladder-prototypes.ts";
import { ellipticLadders } from "../../helpers/active-ladder-check.ts";
import { requireNgspice, runAc } from "../../helpers/ngspice.ts";

const haveNgspice = requireNgspice();
const FLOOR_DB = -90;

const MODELS: readonly OpAmpModel[] = [{ kind: "ideal" }, { kind: "single-pole", a0: 2e5, gbwHz: 3e6 }];

/** ngspice against the circuit's own nodal analysis over four decades about the edge; returns the worst dB and degree gaps. */
function compare(f: ActiveLadder, edgeHz: number): { db: number; deg: number; points: number } {
  const netlist = circuitToSpice(f.circuit, { ac: { pointsPerDecade: 40, startHz: edgeHz / 100, stopHz: edgeHz * 100 } });
  const sim = runAc(netlist, [f.output]);
  const ours = acAnalysis(f.circuit, { source: "Vin", outputs: [f.output], freqHz: sim.freqHz }).outputs[f.output] as { re: Float64Array; im: Float64Array };
  const theirs = sim.vectors[f.output.toLowerCase()] as { re: Float64Array; im: Float64Array };
  let db = 0;
  let deg = 0;
  let points = 0;
  for (let i = 0; i < sim.freqHz.length; i++) {
    const mb = Math.hypot(theirs.re[i] as number, theirs.im[i] as number);
    if (20 * Math.log10(mb) < FLOOR_DB) continue;
    const ma = Math.hypot(ours.re[i] as number, ours.im[i] as number);
    db = Math.max(db, Math.abs(20 * Math.log10(ma / mb)));
    const [ar, ai, br, bi] = [ours.re[i] as number, ours.im[i] as number, theirs.re[i] as number, theirs.im[i] as number];
    deg = Math.max(deg, Math.abs((Math.atan2(ai * br - ar * bi, ar * br + ai * bi) * 180) / Math.PI));
    points++;
  }
  return { db, deg, points };
}

const cases: readonly [string, (opamp: OpAmpModel) => ActiveLadder, number][] = [
  ["leapfrog, Chebyshev I order 7", (opamp) => leapfrogLowpassLadder(chebyshev1Ladder(7, 0.125, "series-first"), { edgeHz: 18_000, opamp }), 18_000],
  ["leapfrog, elliptic order 5, series-first", (opamp) => leapfrogLowpassLadder(ellipticLadders()[1] as never, { edgeHz: 3_400, opamp }), 3_400],
  ["leapfrog, elliptic order 5, shunt-first", (opamp) => leapfrogLowpassLadder(dualLadder(ellipticLadders()[1] as never), { edgeHz: 3_400, opamp }), 3_400],
  ["leapfrog, Butterworth order 6", (opamp) => leapfrogLowpassLadder(butterworthLadder(6, "shunt-first"), { edgeHz: 2_000, opamp }), 2_000],
  ["FDNR, Chebyshev I order 7", (opamp) => fdnrLowpassLadder(chebyshev1Ladder(7, 0.125, "series-first"), { edgeHz: 18_000, opamp }), 18_000],
  ["FDNR, Chebyshev I order 6 (unequal terminations)", (opamp) => fdnrLowpassLadder(chebyshev1Ladder(6, 0.5, "series-first"), { edgeHz: 5_000, gain: 2, opamp }), 5_000],
  ["FDNR, elliptic order 5", (opamp) => fdnrLowpassLadder(ellipticLadders()[1] as never, { edgeHz: 3_400, opamp }), 3_400],
  ["GIC highpass, Chebyshev I order 7", (opamp) => gicHighpassLadder(chebyshev1Ladder(7, 0.125, "shunt-first"), { edgeHz: 300, opamp }), 300],
  ["GIC highpass, elliptic order 5", (opamp) => gicHighpassLadder(ellipticLadders()[1] as never, { edgeHz: 1_200, opamp }), 1_200],
];

describe.skipIf(!haveNgspice)("active ladder netlists in ngspice", () => {
  for (const [name, make, edgeHz] of cases) {
    for (const opamp of MODELS) {
      it(`${name}, ${opamp.kind} op-amps: ngspice agrees with the nodal analysis to 0.01 dB and 0.1 degree above ${FLOOR_DB} dB`, () => {
        const r = compare(make(opamp), edgeHz);
        expect(r.points).toBeGreaterThan(100);
        expect(r.db).toBeLessThan(0.01);
        expect(r.deg).toBeLessThan(0.1);
      });
    }
  }
});
