import { describe, expect, it } from "vitest";
import { circuitPolynomials } from "../../../src/evaluate/index.ts";
import { fdnrLowpassLadder, gicHighpassLadder, leapfrogLowpassLadder, type ActiveLadder } from "../../../src/ladder/active/index.ts";
import type { Element } from "../../../src/circuit/types.ts";
import { polyRoots } from "../../../src/math/index.ts";
import { chebyshev1Ladder } from "../../helpers/ladder-prototypes.ts";
import { ellipticLadders, unstableRoots } from "../../helpers/active-ladder-check.ts";
import { loadFixture } from "../../helpers/fixtures.ts";

interface Circuits {
  readonly circuits: readonly { name: string; output: string; edgeHz: number; elements: Element[] }[];
}
interface Poles {
  readonly circuits: readonly { name: string; poles: [number, number][]; maxRealPart: number }[];
}

const opamp = { kind: "single-pole", a0: 1e5, gbwHz: 3e6 } as const;
const c7 = chebyshev1Ladder(7, 0.125, "series-first");
const e5 = ellipticLadders()[1] as never;
// the cases of scripts/reference/ladder-active-circuits.mjs, rebuilt from the sources (built for the op-amp as
// it is: the pre-distorted circuits are checked in predistort.test.ts)
const built: Record<string, ActiveLadder> = {
  "leapfrog Chebyshev I 7": leapfrogLowpassLadder(c7, { edgeHz: 18000, opamp, predistort: false }),
  "leapfrog elliptic 5": leapfrogLowpassLadder(e5, { edgeHz: 3400, opamp, predistort: false }),
  "FDNR Chebyshev I 7": fdnrLowpassLadder(c7, { edgeHz: 18000, opamp, predistort: false }),
  "FDNR elliptic 5": fdnrLowpassLadder(e5, { edgeHz: 3400, opamp, predistort: false }),
  "GIC highpass Chebyshev I 7": gicHighpassLadder(c7, { edgeHz: 300, opamp, predistort: false }),
  "GIC highpass elliptic 5": gicHighpassLadder(e5, { edgeHz: 1200, opamp, predistort: false }),
};

describe("active ladder poles with single-pole op-amps, against numpy", () => {
  const circuits = loadFixture<Circuits>("ladder-active-circuits.json").circuits;
  const poles = loadFixture<Poles>("ladder-active-poles.json").circuits;

  it.each(circuits.map((c) => [c.name, c] as const))("%s: the fixture's circuit is the one the sources build", (name, c) => {
    const f = built[name] as ActiveLadder;
    // a difference here means a realisation changed: regenerate the two fixtures (see scripts/reference/ladder-active-circuits.mjs)
    expect(JSON.parse(JSON.stringify(f.circuit.elements))).toEqual(c.elements);
  });

  it.each(circuits.map((c) => [c.name, c] as const))("%s: every pole in the left half-plane, by numpy's eigenvalues and our Routh array, the filter's poles equal", (name, c) => {
    const ref = poles.find((p) => p.name === name) as Poles["circuits"][number];
    expect(ref.maxRealPart).toBeLessThan(0);
    const circuit = { title: name, elements: c.elements };
    const s = unstableRoots(circuit, c.output, c.edgeHz);
    expect(s.rhp).toBe(0);
    expect(s.degree).toBe(ref.poles.length);
    // the filter's own poles (the op-amps' cluster near GBW / 2 aside) agree root by root
    const w = 2 * Math.PI * c.edgeHz;
    const p = circuitPolynomials(circuit, { source: "Vin", output: c.output, spanRadS: [w / 1000, w * 1000] }, w) as NonNullable<ReturnType<typeof circuitPolynomials>>;
    const ours = polyRoots(Array.from(p.den)).map((r) => ({ re: r.re * p.scale, im: r.im * p.scale })).filter((r) => Math.hypot(r.re, r.im) < 30 * w);
    expect(ours.length).toBeGreaterThan(0);
    for (const r of ours) {
      const near = Math.min(...ref.poles.map(([re, im]) => Math.hypot(re - r.re, im - r.im)));
      expect(near / Math.hypot(r.re, r.im), `${name}: ${r.re} ${r.im}`).toBeLessThan(1e-6);
    }
  });
});
