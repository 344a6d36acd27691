import { describe, expect, it } from "vitest";
import { getTopology } from "../../src/topologies/registry.ts";
import {
  DELIYANNIS_FRIEND_MAX_Q,
  DELIYANNIS_FRIEND_MIN_Q,
  deliyannisFriendBandpass as df,
  deliyannisFriendDefaultRatio,
} from "../../src/topologies/deliyannis-friend.ts";
import type { ComponentValues, StageChoices, StageTarget, Topology } from "../../src/topologies/types.ts";
import { UnrealisableError } from "../../src/errors.ts";
import { asBuiltPole } from "../../src/topologies/as-built.ts";
import { cascadeResponse } from "../../src/evaluate/cascade.ts";
import { circuitToSpice } from "../../src/circuit/spice.ts";
import type { Element, OpAmpModel } from "../../src/circuit/types.ts";
import { mulberry32 } from "../../src/math/index.ts";
import { loadFixture } from "../helpers/fixtures.ts";
import { requireNgspice, runAc } from "../helpers/ngspice.ts";
import { thrownBy } from "../helpers/throws.ts";
import { relErr } from "../helpers/tolerance.ts";

interface FixtureCase {
  readonly target: StageTarget;
  readonly choices: StageChoices;
  readonly values: Record<string, number>;
  readonly opamp: OpAmpModel;
  readonly freqHz: number[];
  readonly response: [number, number][];
  readonly gbwHz: number;
}
const fixture = loadFixture<{ cases: FixtureCase[] }>("topology-deliyannis-friend.json");

const bp = (f0Hz: number, q: number, gain: number): StageTarget & { readonly q: number } => ({ order: 2, kind: "bandpass", f0Hz, q, gain });
const REALISTIC: OpAmpModel = { kind: "single-pole", a0: 2e5, gbwHz: 1e6 };

/** Response of the stage's closed-form polynomials at frequencies in Hz. */
function polynomialResponse(v: ComponentValues, opamp: OpAmpModel, freqHz: readonly number[]) {
  const p = df.polynomials!(v, opamp)!;
  return cascadeResponse([p], Float64Array.from(freqHz, (f) => 2 * Math.PI * f));
}

/** Magnitude (dB) and phase (degree) differences of a from b. */
function differences(a: { re: number; im: number }, b: { re: number; im: number }): { db: number; deg: number } {
  const db = Math.abs(20 * Math.log10(Math.hypot(a.re, a.im) / Math.hypot(b.re, b.im)));
  const deg = Math.abs((Math.atan2(a.im * b.re - a.re * b.im, a.re * b.re + a.im * b.im) * 180) / Math.PI);
  return { db, deg };
}

describe("deliyannisFriendBandpass.check", () => {
  it.each([
    [bp(1000, 60, -5), {}, /state-variable-bandpass/],
    [bp(1000, 3, -2), {}, /mfb-bandpass-attenuated/],
    [bp(1000, 10, 5), {}, /inverting/],
    [bp(1000, 10, -5), { resistorRatio: 500 }, /from 1 to 400/],
    [bp(1000, 50, -5), { resistorRatio: 10 }, /multiply Q by 31\.62/],
    [bp(1000, 10, -5), { resistorRatio: 300 }, /multiply Q by 1\.155/],
    [bp(1000, 10, -70), {}, /at most 64\.75/],
  ] as const)("refuses %j with %j", (target, choices, msg) => {
    expect(df.check(target, choices)).toMatch(msg);
    expect(thrownBy(() => df.design(target, choices), UnrealisableError).message).toMatch(msg);
  });

  it("accepts Q from 5 to 50 and the gain up to 99 % of 2 Q Q0 (1 + alpha)", () => {
    expect(df.check(bp(1000, DELIYANNIS_FRIEND_MIN_Q, -1), {})).toBeNull();
    expect(df.check(bp(1000, DELIYANNIS_FRIEND_MAX_Q, -1), {})).toBeNull();
    // Q 10, rho 40: Q0 = sqrt(10), alpha = (1 - Q0/10)/20, 2 Q Q0 (1 + alpha) = 64.1...
    const q0 = Math.sqrt(10);
    const max = 2 * 10 * q0 * (1 + (1 - q0 / 10) / (2 * q0 * q0));
    expect(df.check(bp(1000, 10, -0.989 * max), {})).toBeNull();
    expect(df.check(bp(1000, 10, -0.991 * max), {})).toMatch(/at most/);
  });
});

describe("deliyannisFriendBandpass.design", () => {
  it.each([
    [bp(10_000, 15, -10), {}],
    [bp(250, 5, -1), { capacitor: 22e-9 }],
    [bp(40_000, 45, -3), { resistor: 4700, resistorRatio: 150 }],
    [bp(1_000, 8, -20), { resistorRatio: 12 }],
  ] as const)("realises %j with %j: figures equal the target to 1e-9, equal capacitors, the documented ratios", (target, choices) => {
    const v = df.design(target, choices);
    const f = df.figures(v);
    expect(relErr(f.f0Hz, target.f0Hz)).toBeLessThan(1e-9);
    expect(relErr(f.q!, target.q)).toBeLessThan(1e-9);
    expect(relErr(f.gain, target.gain)).toBeLessThan(1e-9);
    expect(v["C1"]).toBe(v["C2"]);
    const rho = (choices as StageChoices).resistorRatio ?? deliyannisFriendDefaultRatio(target.q);
    const ra = 1 / (1 / v["R1"]! + 1 / v["R2"]!);
    expect(relErr(v["R3"]! / ra, rho)).toBeLessThan(1e-12);
    const q0 = Math.sqrt(rho) / 2;
    expect(relErr(v["R5"]! / v["R4"]!, (1 - q0 / target.q) / (2 * q0 * q0))).toBeLessThan(1e-12);
    expect(relErr(v["R4"]!, v["R3"]! / Math.sqrt(rho))).toBeLessThan(1e-12);
    if ((choices as StageChoices).capacitor === undefined && (choices as StageChoices).resistor === undefined) expect(v["R4"]).toBe(10_000);
  });

  it("has its zero at DC: 0 at 0 Hz, +20 dB/decade far below f0, -20 dB/decade far above, the peak |gain| at f0 with phase 180 degrees", () => {
    const target = bp(10_000, 15, -10);
    const v = df.design(target, {});
    const f = Float64Array.of(0, 1, 10, 1e4, 1e7, 1e8);
    const h = df.response(v, f, { kind: "ideal" });
    const mag = (i: number) => Math.hypot(h.re[i]!, h.im[i]!);
    expect(mag(0)).toBe(0);
    expect(relErr(mag(2) / mag(1), 10)).toBeLessThan(1e-6);
    expect(relErr(mag(4) / mag(5), 10)).toBeLessThan(1e-6);
    expect(relErr(h.re[3]!, -10)).toBeLessThan(1e-9);
    expect(Math.abs(h.im[3]!)).toBeLessThan(1e-9);
    const ideal = df.polynomials!(v, { kind: "ideal" })!;
    expect(ideal.num.length).toBe(2); // N = -G1 w C1 z: the only zero is z = 0
    expect(ideal.num[1]).toBe(0);
  });
});

describe("deliyannisFriendBandpass against numpy and scipy (scripts/reference/topology_deliyannis_friend.py)", () => {
  for (const c of fixture.cases) {
    it(`Q ${c.target.q}, f0 ${c.target.f0Hz} Hz ${JSON.stringify(c.choices)}: the design values, the polynomial response at a0 2e5, GBW 1 MHz to 0.01 dB, the GBW demand to 0.2 % (default ratio)`, () => {
      const v = df.design(c.target, c.choices);
      for (const n of df.componentNames) expect(relErr(v[n]!, c.values[n]!), n).toBeLessThan(1e-12);
      const h = polynomialResponse(c.values, c.opamp, c.freqHz);
      let worst = 0;
      c.freqHz.forEach((f, i) => {
        const [re, im] = c.response[i]!;
        const d = differences({ re: h.re[i]!, im: h.im[i]! }, { re, im });
        worst = Math.max(worst, d.db);
        expect(d.db, `${f} Hz`).toBeLessThan(0.01);
        expect(d.deg, `${f} Hz`).toBeLessThan(0.1);
      });
      // The agreement is in fact at rounding level.
      expect(worst).toBeLessThan(1e-9);
      // gbwDemandHz designs with the default choices: compare where the fixture's design is the default one (the level does not matter).
      if (c.choices.resistorRatio === undefined) expect(Math.abs(df.gbwDemandHz(c.target) / c.gbwHz - 1)).toBeLessThan(0.002);
    });
  }
});

describe.skipIf(!requireNgspice())("deliyannisFriendBandpass netlist in ngspice", () => {
  it("agrees with the polynomial form to 0.01 dB and 0.1 degree at a0 2e5, GBW 1 MHz (Q 10 at 1 kHz, gain -5)", () => {
    const target = bp(1000, 10, -5);
    const v = df.design(target, {});
    const elements: Element[] = [
      { kind: "V", name: "Vin", a: "in", b: "0", ac: 1 },
      ...df.elements(v, { input: "in", output: "out", nodePrefix: "s_", opamp: REALISTIC }),
    ];
    const netlist = circuitToSpice({ title: "Deliyannis-Friend bandpass", elements }, { ac: { pointsPerDecade: 40, startHz: 10, stopHz: 1e5 } });
    const sim = runAc(netlist, ["out"]);
    const h = polynomialResponse(v, REALISTIC, Array.from(sim.freqHz));
    const b = sim.vectors["out"]!;
    let worst = 0;
    for (let i = 0; i < sim.freqHz.length; i++) {
      const d = differences({ re: h.re[i]!, im: h.im[i]! }, { re: b.re[i]!, im: b.im[i]! });
      worst = Math.max(worst, d.db);
      expect(d.db, `${sim.freqHz[i]} Hz`).toBeLessThan(0.01);
      expect(d.deg, `${sim.freqHz[i]} Hz`).toBeLessThan(0.1);
    }
    console.log(`Deliyannis-Friend: ngspice vs polynomials over ${sim.freqHz.length} points: worst ${worst.toExponential(2)} dB`);
    expect(sim.freqHz.length).toBeGreaterThan(100);
  });
});

/** The header's first-order sensitivities of Q and |gain| at a design point with equal capacitors. */
function headerSensitivities(v: ComponentValues, q: number, rho: number): { q: Record<string, number>; k: Record<string, number> } {
  const e = q / (Math.sqrt(rho) / 2);
  const g1 = 1 / v["R1"]!;
  const g2 = 1 / v["R2"]!;
  const ga = g1 + g2;
  const alpha = v["R5"]! / v["R4"]!;
  const sk = alpha / (1 + alpha) + e - 1;
  return {
    q: { R1: -(g1 / ga) * (e - 0.5), R2: -(g2 / ga) * (e - 0.5), R3: e - 0.5, R4: -(e - 1), R5: e - 1, C1: e / 2 - 0.5, C2: 0.5 - e / 2 },
    k: { R1: -1 - (g1 / ga) * (e - 1), R2: -(g2 / ga) * (e - 1), R3: e, R4: -sk, R5: sk, C1: e / 2, C2: -e / 2 },
  };
}

describe("deliyannisFriendBandpass sensitivities", () => {
  it("the header's Q and gain sensitivities equal central differences of figures to 1e-5", () => {
    for (const [target, rho] of [
      [bp(10_000, 15, -10), 60],
      [bp(500, 40, -2), 90],
    ] as const) {
      const v = df.design(target, { resistorRatio: rho });
      const s = headerSensitivities(v, target.q, rho);
      for (const n of df.componentNames) {
        const h = 1e-6;
        const up = df.figures({ ...v, [n]: v[n]! * (1 + h) });
        const dn = df.figures({ ...v, [n]: v[n]! * (1 - h) });
        const sq = Math.log(up.q! / dn.q!) / Math.log((1 + h) / (1 - h));
        const sg = Math.log(up.gain / dn.gain) / Math.log((1 + h) / (1 - h));
        expect(Math.abs(sq - s.q[n]!), `S(Q; ${n})`).toBeLessThan(1e-5);
        expect(Math.abs(sg - s.k[n]!), `S(K; ${n})`).toBeLessThan(1e-5);
      }
    }
  });

  it("a finite DC gain A lowers Q by about 2 Q Q0 (1 + alpha)^2 / A (the polynomial form at a0 1e5 with no op-amp pole to speak of)", () => {
    const target = bp(10_000, 15, -10);
    const v = df.design(target, {});
    const q0 = Math.sqrt(60) / 2;
    const alpha = v["R5"]! / v["R4"]!;
    const a0 = 1e5;
    const p = df.polynomials!(v, { kind: "single-pole", a0, gbwHz: 1e15 })!;
    // den = [d3, d2, d1, d0] with d3 ~ 0: Q of the quadratic d2 z^2 + d1 z + d0
    const n = p.den.length;
    const [d2, d1, d0] = [p.den[n - 3]!, p.den[n - 2]!, p.den[n - 1]!];
    const qa = Math.sqrt(d0 * d2) / d1;
    const predicted = (2 * 15 * q0 * (1 + alpha) ** 2) / a0;
    expect(Math.abs((1 - qa / 15) / predicted - 1)).toBeLessThan(0.02);
  });

  it("the GBW demand is about 100 Q0 (1 + alpha)(1 + 1/(4 Q0^2)) f0, above the passive MFB's of the same Q0 and below the MFB bandpass's at the full Q", () => {
    const target = bp(10_000, 15, -10);
    const v = df.design(target, {});
    const q0 = Math.sqrt(60) / 2;
    const alpha = v["R5"]! / v["R4"]!;
    const d = df.gbwDemandHz(target);
    expect(Math.abs(d / (100 * q0 * (1 + alpha) * (1 + 1 / (4 * q0 * q0)) * 1e4) - 1)).toBeLessThan(0.05);
    const passive = getTopology("mfb-bandpass-attenuated").gbwDemandHz(bp(10_000, q0, -10));
    const full = getTopology("mfb-bandpass-attenuated").gbwDemandHz(target);
    console.log(`GBW demand / f0 at Q 15: Deliyannis-Friend ${(d / 1e4).toFixed(0)}, MFB with attenuator at Q0 ${q0.toFixed(3)} ${(passive / 1e4).toFixed(0)}, at Q 15 ${(full / 1e4).toFixed(0)}`);
    expect(d).toBeGreaterThan(passive);
    expect(d).toBeLessThan(full);
    // At GBW = 1000 f0 the pole moves by about delta = Q0 (1 + alpha)(1 + 1/(4 Q0^2)) / 1000 (first order): f0 down, Q up.
    const delta = (q0 * (1 + alpha) * (1 + 1 / (4 * q0 * q0))) / 1000;
    const pole = asBuiltPole(df, v, { kind: "single-pole", a0: 1e12, gbwHz: 1e7 });
    expect(Math.abs((1 - pole.f0Hz / 1e4) / delta - 1)).toBeLessThan(0.05);
    expect(Math.abs((pole.q! / 15 - 1) / delta - 1)).toBeLessThan(0.05);
  });
});

/** Spread of Q and of the peak gain (|gain at f0|) over Monte Carlo boards of a design. */
function monteCarlo(topo: Topology, v: ComponentValues, draws: number, seed: number) {
  const rand = mulberry32(seed);
  const qs = new Float64Array(draws);
  const ks = new Float64Array(draws);
  const x: Record<string, number> = {};
  for (let i = 0; i < draws; i++) {
    for (const n of topo.componentNames) x[n] = v[n]! * (1 + (n.startsWith("C") ? 0.05 : 0.01) * (2 * rand() - 1));
    const f = topo.figures(x);
    qs[i] = f.q!;
    ks[i] = Math.abs(f.gain);
  }
  const stats = (a: Float64Array, nominal: number) => {
    const mean = a.reduce((s, y) => s + y, 0) / draws;
    const sd = Math.sqrt(a.reduce((s, y) => s + (y - mean) ** 2, 0) / (draws - 1));
    const sorted = Float64Array.from(a).sort();
    return { sd: sd / nominal, lo: sorted[Math.floor(0.005 * draws)]! / nominal - 1, hi: sorted[Math.ceil(0.995 * draws) - 1]! / nominal - 1 };
  };
  const f0 = topo.figures(v);
  return { q: stats(qs, f0.q!), k: stats(ks, Math.abs(f0.gain)) };
}

describe("Monte Carlo spread of Q and peak gain, Q 15 at 10 kHz, resistors 1 %, capacitors 5 % (uniform), 2,000 boards", () => {
  const cases: [string, StageTarget, StageChoices][] = [
    ["deliyannis-friend-bandpass", bp(10_000, 15, -10), {}],
    ["deliyannis-friend-bandpass", bp(10_000, 15, -10), { resistorRatio: 16 }],
    ["mfb-bandpass", bp(10_000, 15, -450), {}], // gain 2 Q^2: equal capacitors
    ["mfb-bandpass-attenuated", bp(10_000, 15, -10), {}],
    ["state-variable-bandpass", bp(10_000, 15, 10), {}],
  ];
  const results = new Map<string, ReturnType<typeof monteCarlo>>();
  for (const [id, target, choices] of cases) {
    const topo = getTopology(id);
    const v = topo.design(target, choices);
    results.set(`${id} ${JSON.stringify(choices)}`, monteCarlo(topo, v, 2000, 20261202));
  }

  it("prints MONTE CARLO FIGURES (standard deviation and 0.5-99.5 % range, relative)", () => {
    const pct = (x: number) => `${(100 * x).toFixed(2)} %`;
    const rows = [...results].map(
      ([k, r]) => `${k}: Q sd ${pct(r.q.sd)} [${pct(r.q.lo)}, ${pct(r.q.hi)}]; peak gain sd ${pct(r.k.sd)} [${pct(r.k.lo)}, ${pct(r.k.hi)}]`,
    );
    console.log(`MONTE CARLO FIGURES\n${rows.join("\n")}`);
    expect(rows).toHaveLength(cases.length);
  });

  it("the Deliyannis-Friend spreads match the header's sensitivities (root sum of squares, sd of a uniform part tol/sqrt 3) to 15 %", () => {
    const v = df.design(bp(10_000, 15, -10), {});
    const s = headerSensitivities(v, 15, 60);
    const rss = (sens: Record<string, number>) =>
      Math.sqrt(df.componentNames.reduce((acc, n) => acc + (sens[n]! * (n.startsWith("C") ? 0.05 : 0.01)) ** 2 / 3, 0));
    const r = results.get("deliyannis-friend-bandpass {}")!;
    expect(Math.abs(r.q.sd / rss(s.q) - 1)).toBeLessThan(0.15);
    expect(Math.abs(r.k.sd / rss(s.k) - 1)).toBeLessThan(0.15);
  });

  it("the positive feedback costs Q spread: more than the MFB and state-variable bandpasses, less with the default ratio than with rho = 16", () => {
    const q = (k: string) => results.get(k)!.q.sd;
    const dfDefault = q("deliyannis-friend-bandpass {}");
    expect(dfDefault).toBeGreaterThan(2 * q('mfb-bandpass {}'));
    expect(dfDefault).toBeGreaterThan(2 * q("state-variable-bandpass {}"));
    expect(q('deliyannis-friend-bandpass {"resistorRatio":16}')).toBeGreaterThan(1.5 * dfDefault);
  });
});
