import { describe, expect, it } from "vitest";
import { isInSeries } from "../../src/parts/index.ts";
import { asBuiltPole, getTopology } from "../../src/topologies/index.ts";
import type { StageTarget } from "../../src/topologies/types.ts";
import { validateSpec } from "../../src/design/spec.ts";
import { tuneStage } from "../../src/design/components.ts";
import { neighbours, searchResistors } from "../../src/design/resistor-search.ts";
import { stageErrors, type ValueSet } from "../../src/design/stage-cost.ts";
import type { ComponentValues, Topology } from "../../src/topologies/types.ts";

const spec = validateSpec({
  response: "lowpass",
  passband: { edgeHz: 1000, maxLossDb: 1 },
  stopband: { edgeHz: 4000, minAttenuationDb: 40 },
  parts: { resistorSeries: "E24", capacitorSeries: "E12" },
});
const target: StageTarget = { order: 2, kind: "lowpass", f0Hz: 1234, q: 1.3, gain: -2.2 };
const mfb = getTopology("mfb-lowpass");

function expectFromSeries(v: ValueSet): void {
  for (const [name, x] of Object.entries(v.values)) {
    if (name.startsWith("R")) expect(isInSeries(x, spec.resistorSeries), `${name} = ${x}`).toBe(true);
    if (name.startsWith("C")) expect(isInSeries(x, spec.capacitorSeries), `${name} = ${x}`).toBe(true);
  }
}

describe("stageErrors", () => {
  it("gives the relative errors of f0, Q, fz and gain, Q only for second order", () => {
    const e = stageErrors({ f0Hz: 1010, q: 0.99, gain: -2.2 * 1.02 }, target);
    expect(e.f0).toBeCloseTo(1 - 1010 / 1234, 12);
    expect(e.q).toBeCloseTo(1 - 0.99 / 1.3, 12);
    expect(e.fz).toBe(0);
    expect(e.gain).toBeCloseTo(0.02, 12);
    expect(stageErrors({ f0Hz: 100, q: 3, gain: 1 }, { order: 1, kind: "lowpass", f0Hz: 100, gain: 1 }).q).toBe(0);
  });
});

describe("tuneStage", () => {
  const tuned = tuneStage(mfb, target, spec);

  it("returns preferred values from the spec's series, capacitors inside the window", () => {
    expect(tuned).not.toBeNull();
    const t = tuned!;
    for (const v of [t.best, t.plain, ...t.alternatives]) expectFromSeries(v);
    for (const [name, x] of Object.entries(t.best.values)) {
      if (name.startsWith("C")) {
        expect(x).toBeGreaterThanOrEqual(spec.capacitorRange.min);
        expect(x).toBeLessThanOrEqual(spec.capacitorRange.max);
      }
    }
  });

  it("states the figures and errors the values really have, within 1 % after re-tuning (E24 resistors, E12 capacitors)", () => {
    const t = tuned!;
    for (const v of [t.best, ...t.alternatives]) {
      expect(v.figures).toEqual(mfb.figures(v.values));
      expect(v.errors).toEqual(stageErrors(mfb.figures(v.values), target));
    }
    expect(Math.max(t.best.errors.f0, t.best.errors.q)).toBeLessThan(1e-2);
    expect(t.best.errors.gain).toBeLessThan(2e-2);
    expect(t.best.cost).toBeLessThanOrEqual(t.plain.cost);
    const costs = t.alternatives.map((v) => v.cost);
    expect([...costs].sort((a, b) => a - b)).toEqual(costs);
    expect(t.alternatives).not.toContain(t.best);
  });

  it("rounds the exact design part by part for the plain baseline", () => {
    const t = tuned!;
    expect(Object.keys(t.plain.values).sort()).toEqual(Object.keys(t.exact).sort());
    for (const [name, x] of Object.entries(t.plain.values)) expect(Math.abs(Math.log(x / t.exact[name]!))).toBeLessThan(0.1);
  });

  it("under op-amp scoring, states the pole each set has with that op-amp", () => {
    const opamp = { kind: "single-pole", a0: 1e5, gbwHz: 1e6 } as const;
    const t = tuneStage(mfb, target, spec, { opampScoring: { opamp, wanted: target } })!;
    expect(t.best.withOpamp).toEqual(asBuiltPole(mfb, t.best.values, opamp));
    expect(t.best.errors.f0).toBeCloseTo(Math.abs(t.best.withOpamp!.f0Hz / target.f0Hz - 1), 12);
  });

  it("prefers capacitor values already used by earlier stages when that costs under 0.1 %", () => {
    const t = tuned!;
    const used = new Set(Object.entries(t.alternatives.at(-1)!.values).filter(([k]) => k.startsWith("C")).map(([, v]) => v));
    const again = tuneStage(mfb, target, spec, { preferredCapacitors: used })!;
    expect(again.best.cost).toBeLessThanOrEqual(t.best.cost + 1e-3 + 1e-12);
  });
});

/** The ranking cost as documented (largest error, half the gain error, plus a tenth of their sum). */
function referenceCost(e: ValueSet["errors"]): number {
  const g = 0.5 * e.gain;
  return Math.max(e.f0, e.q, e.fz, g) + 0.1 * (e.f0 + e.q + e.fz + g);
}

/** Every set of values costed through the topology's public figures, ranked by cost (ties in the order given), the best `keep`. */
function rankAll(t: Topology, target: StageTarget, sets: readonly ComponentValues[], keep: number): ValueSet[] {
  const out: ValueSet[] = [];
  for (const values of sets) {
    const figures = t.figures(values);
    if (!Number.isFinite(figures.f0Hz) || !Number.isFinite(figures.gain)) continue;
    const errors = stageErrors(figures, target);
    const cost = referenceCost(errors);
    if (Number.isFinite(cost)) out.push({ values, figures, errors, cost });
  }
  return out.sort((a, b) => a.cost - b.cost).slice(0, keep);
}

/** Every combination of the resistors' neighbour values, the first resistor's changing fastest. */
function allCombinations(exact: ComponentValues, spread: number): ComponentValues[] {
  const names = Object.keys(exact).filter((n) => n.startsWith("R"));
  let sets: Record<string, number>[] = [{ ...exact }];
  for (const n of [...names].reverse()) {
    const next: Record<string, number>[] = [];
    for (const s of sets) for (const v of neighbours(exact[n]!, spec.resistorSeries, spread)) next.push({ ...s, [n]: v });
    sets = next;
  }
  // Built slowest-first from the last resistor: reorder so the first resistor changes fastest.
  const key = (s: ComponentValues): number[] => [...names].reverse().map((n) => neighbours(exact[n]!, spec.resistorSeries, spread).indexOf(s[n]!));
  return sets.sort((a, b) => {
    const ka = key(a);
    const kb = key(b);
    for (let i = 0; i < ka.length; i++) if (ka[i] !== kb[i]) return ka[i]! - kb[i]!;
    return 0;
  });
}

/** The pairwise coordinate descent written plainly: every trial copied and costed through the public figures, none pruned. */
function plainDescent(t: Topology, target: StageTarget, exact: ComponentValues, spread: number, keep: number): ValueSet[] {
  const names = Object.keys(exact).filter((n) => n.startsWith("R"));
  const options = names.map((n) => neighbours(exact[n]!, spec.resistorSeries, spread));
  const tried: ComponentValues[] = [];
  const cost = (idx: readonly number[]): number => {
    const values: Record<string, number> = { ...exact };
    names.forEach((n, i) => (values[n] = options[i]![idx[i]!]!));
    tried.push(values);
    const r = rankAll(t, target, [values], 1)[0];
    return r === undefined ? Infinity : r.cost;
  };
  const idx = names.map((n, i) => {
    const d = options[i]!.map((v) => Math.abs(Math.log(v / exact[n]!)));
    return d.indexOf(Math.min(...d));
  });
  let cur = cost(idx);
  for (let sweep = 0; sweep < 4; sweep++) {
    let improved = false;
    for (let i = 0; i < names.length; i++) {
      for (let k = i + 1; k < names.length; k++) {
        let best: [number, number] = [idx[i]!, idx[k]!];
        for (let a = 0; a < options[i]!.length; a++) {
          for (let b = 0; b < options[k]!.length; b++) {
            if (a === idx[i] && b === idx[k]) continue;
            const trial = [...idx];
            trial[i] = a;
            trial[k] = b;
            const c = cost(trial);
            if (c < cur) [cur, best, improved] = [c, [a, b], true];
          }
        }
        [idx[i], idx[k]] = best;
      }
    }
    if (!improved) break;
  }
  return rankAll(t, target, tried, keep);
}

describe("searchResistors", () => {
  const cases: { id: string; target: StageTarget }[] = [
    { id: "mfb-lowpass", target },
    { id: "sallen-key-lowpass-unity", target: { order: 2, kind: "lowpass", f0Hz: 1234, q: 1.3, gain: 1 } },
    { id: "tow-thomas-lowpass", target: { order: 2, kind: "lowpass", f0Hz: 1234, q: 2.7, gain: 1.5 } },
    { id: "tow-thomas-bandpass", target: { order: 2, kind: "bandpass", f0Hz: 777, q: 4.2, gain: -2 } },
    { id: "tow-thomas-lowpass-notch", target: { order: 2, kind: "lowpass-notch", f0Hz: 1234, q: 3.1, fzHz: 1717, gain: -1 } },
    { id: "tow-thomas-highpass-notch", target: { order: 2, kind: "highpass-notch", f0Hz: 1234, q: 3.1, fzHz: 913, gain: -1 } },
    { id: "state-variable-notch", target: { order: 2, kind: "lowpass-notch", f0Hz: 1234, q: 2.1, fzHz: 1717, gain: 1 } },
    { id: "state-variable-allpass", target: { order: 2, kind: "allpass", f0Hz: 987, q: 1.7, gain: 1 } },
    { id: "state-variable-bandpass", target: { order: 2, kind: "bandpass", f0Hz: 987, q: 5, gain: 2 } },
  ];

  for (const { id, target: tg } of cases) {
    const t = getTopology(id);
    const exact = t.design(tg, { capacitor: 10e-9 });
    const resistors = Object.keys(exact).filter((n) => n.startsWith("R")).length;

    if (resistors <= 10) {
      it(`${id} (${resistors} resistors): returns exactly the best sets of a brute force over the same neighbour sets`, () => {
        // spread 1 keeps every stage up to ten resistors at no more than 1024 combinations, the exhaustive path.
        const spread = resistors <= 5 ? 2 : 1;
        expect(searchResistors(t, tg, exact, spec, spread, 6)).toEqual(rankAll(t, tg, allCombinations(exact, spread), 6));
      });
    }

    it(`${id}: returns exactly what the unpruned search returns at the design's own spread`, () => {
      const found = searchResistors(t, tg, exact, spec, 2, 6);
      const combinations = Object.keys(exact)
        .filter((n) => n.startsWith("R"))
        .reduce((p, n) => p * neighbours(exact[n]!, spec.resistorSeries, 2).length, 1);
      const reference = combinations <= 1024 ? rankAll(t, tg, allCombinations(exact, 2), 6) : plainDescent(t, tg, exact, 2, 6);
      expect(found).toEqual(reference);
      expect(found.length).toBe(6);
    });
  }
});
