/**
 * Bad input to the topology objects: every method of every topology in the
 * registry (check, design, figures, response, elements, gbwDemandHz, and
 * fixedGain and polynomials where present) is called with wrong arguments (missing, negative,
 * zero, NaN and infinite numbers, wrong kinds, non-objects, empty arrays).
 * Each call must either throw a FilterwrightError subclass or return data
 * with no NaN and no infinity anywhere (Float64Arrays included).
 */
import { describe, expect, it } from "vitest";
import { FilterwrightError } from "../../src/errors.ts";
import { firstNonFinite } from "../helpers/finite.ts";
import { topologies } from "../../src/topologies/registry.ts";
import type { ComponentValues, StageTarget } from "../../src/topologies/types.ts";
import { sampleTarget } from "../topologies/arbitraries.ts";

/** Run a call: it must throw a FilterwrightError or return finite data. Returns a failure description or null. */
function verdict(call: () => unknown): string | null {
  let out: unknown;
  try {
    out = call();
  } catch (e) {
    return e instanceof FilterwrightError ? null : `threw ${(e as Error)?.constructor?.name}: ${(e as Error)?.message}`;
  }
  const bad = firstNonFinite(out);
  return bad === null ? null : `returned ${bad}`;
}

const BAD_NUMBERS: readonly unknown[] = [undefined, null, -1, 0, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, "1000", {}, [], true];
const NON_OBJECTS: readonly unknown[] = [undefined, null, 0, Number.NaN, "x", true, [], [1, 2]];

/** Targets with one field made wrong at a time, and wrong targets as a whole. */
function badTargets(good: StageTarget): unknown[] {
  const out: unknown[] = [...NON_OBJECTS, {}];
  for (const field of ["order", "kind", "f0Hz", "q", "gain", "fzHz"]) {
    for (const x of BAD_NUMBERS) out.push({ ...good, [field]: x });
    out.push({ ...good, [field]: "lowpass" });
  }
  for (const kind of ["notch", "lowpass-notch", "highpass-notch"]) out.push({ ...good, kind, fzHz: undefined });
  return out;
}

const BAD_CHOICES: readonly unknown[] = [
  null,
  "x",
  7,
  ...["capacitor", "resistor", "capacitorRatio", "resistorRatio"].flatMap((k) => BAD_NUMBERS.filter((x) => x !== undefined).map((x) => ({ [k]: x }))),
];

function badValues(good: ComponentValues): unknown[] {
  const out: unknown[] = [...NON_OBJECTS, {}];
  for (const name of Object.keys(good)) {
    for (const x of BAD_NUMBERS) out.push({ ...good, [name]: x });
  }
  return out;
}

const BAD_FREQS: readonly unknown[] = [
  undefined,
  null,
  [],
  [1000],
  "1000",
  new Float32Array([1000]),
  Float64Array.of(Number.NaN),
  Float64Array.of(-1),
  Float64Array.of(Number.POSITIVE_INFINITY),
  Float64Array.of(100, Number.NaN),
];

const BAD_OPAMPS: readonly unknown[] = [
  ...NON_OBJECTS,
  {},
  { kind: "bogus" },
  ...["a0", "gbwHz"].flatMap((k) =>
    BAD_NUMBERS.map((x) => ({ kind: "single-pole", a0: 1e5, gbwHz: 1e6, [k]: x })),
  ),
  ...BAD_NUMBERS.map((x) => ({ kind: "single-pole-rout", a0: 1e5, gbwHz: 1e6, routOhm: x })),
];

const GOOD_OPAMP = { kind: "single-pole", a0: 1e5, gbwHz: 1e7 } as const;

const BAD_PLACEMENTS: readonly unknown[] = [
  ...NON_OBJECTS,
  {},
  { input: "a", output: "b", nodePrefix: "s1_" },
  { input: 1, output: "b", nodePrefix: "s1_", opamp: { kind: "ideal" } },
  { input: "a", output: null, nodePrefix: "s1_", opamp: { kind: "ideal" } },
  { input: "a", output: "b", nodePrefix: 5, opamp: { kind: "ideal" } },
  { input: "a", output: "b", nodePrefix: "s1_", opamp: { kind: "ideal" }, rename: "R" },
  { input: "a", output: "b", nodePrefix: "s1_", opamp: { kind: "ideal" }, rename: () => 7 },
  ...BAD_OPAMPS.map((opamp) => ({ input: "a", output: "b", nodePrefix: "s1_", opamp })),
];

type AnyFn = (...args: unknown[]) => unknown;

describe("every topology's methods reject bad input with a typed error or return finite data", () => {
  it("the registry holds the 35 topologies", () => {
    expect(topologies.length).toBe(35);
  });

  for (const topo of topologies) {
    describe(topo.id, () => {
      const target = sampleTarget(topo);
      const values = topo.design(target, {});
      const m = topo as unknown as Record<string, AnyFn>;
      const expectAll = (calls: readonly [string, () => unknown][]): void => {
        const failures = calls.flatMap(([what, call]) => {
          const v = verdict(call);
          return v === null ? [] : [`${what}: ${v}`];
        });
        expect(failures).toEqual([]);
      };

      it("check", () => {
        expectAll([
          ["no arguments", () => (m["check"] as AnyFn)()],
          ...badTargets(target).map((t): [string, () => unknown] => [`target ${String(JSON.stringify(t))}`, () => topo.check(t as StageTarget, {})]),
          ...BAD_CHOICES.map((c): [string, () => unknown] => [`choices ${String(JSON.stringify(c))}`, () => (m["check"] as AnyFn)(target, c)]),
        ]);
      });

      it("design", () => {
        expectAll([
          ["no arguments", () => (m["design"] as AnyFn)()],
          ...badTargets(target).map((t): [string, () => unknown] => [`target ${String(JSON.stringify(t))}`, () => topo.design(t as StageTarget, {})]),
          ...BAD_CHOICES.map((c): [string, () => unknown] => [`choices ${String(JSON.stringify(c))}`, () => (m["design"] as AnyFn)(target, c)]),
        ]);
      });

      it("figures", () => {
        expectAll([
          ["no arguments", () => (m["figures"] as AnyFn)()],
          ...badValues(values).map((v): [string, () => unknown] => [`values ${String(JSON.stringify(v))}`, () => (m["figures"] as AnyFn)(v)]),
        ]);
      });

      it("response", () => {
        const f = Float64Array.of(0, 100, 2000, 1e5);
        expectAll([
          ["no arguments", () => (m["response"] as AnyFn)()],
          ...badValues(values).map((v): [string, () => unknown] => [`values ${String(JSON.stringify(v))}`, () => (m["response"] as AnyFn)(v, f, GOOD_OPAMP)]),
          ...BAD_FREQS.map((x): [string, () => unknown] => [`freqHz ${String(x)}`, () => (m["response"] as AnyFn)(values, x, GOOD_OPAMP)]),
          ...BAD_OPAMPS.map((o): [string, () => unknown] => [`opamp ${String(JSON.stringify(o))}`, () => (m["response"] as AnyFn)(values, f, o)]),
          ["empty grid", () => topo.response(values, new Float64Array(0), GOOD_OPAMP)],
        ]);
      });

      it("elements", () => {
        const place = { input: "a", output: "b", nodePrefix: "s1_", opamp: GOOD_OPAMP };
        expectAll([
          ["no arguments", () => (m["elements"] as AnyFn)()],
          ...badValues(values).map((v): [string, () => unknown] => [`values ${String(JSON.stringify(v))}`, () => (m["elements"] as AnyFn)(v, place)]),
          ...BAD_PLACEMENTS.map((p): [string, () => unknown] => [`placement ${String(JSON.stringify(p))}`, () => (m["elements"] as AnyFn)(values, p)]),
        ]);
      });

      it("gbwDemandHz", () => {
        expectAll([
          ["no arguments", () => (m["gbwDemandHz"] as AnyFn)()],
          ...badTargets(target).map((t): [string, () => unknown] => [`target ${String(JSON.stringify(t))}`, () => topo.gbwDemandHz(t as StageTarget)]),
        ]);
      });

      if (topo.polynomials !== undefined) {
        it("polynomials", () => {
          expectAll([
            ["no arguments", () => (m["polynomials"] as AnyFn)()],
            ...badValues(values).map((v): [string, () => unknown] => [`values ${String(JSON.stringify(v))}`, () => (m["polynomials"] as AnyFn)(v, GOOD_OPAMP)]),
            ...BAD_OPAMPS.map((o): [string, () => unknown] => [`opamp ${String(JSON.stringify(o))}`, () => (m["polynomials"] as AnyFn)(values, o)]),
            ["values 600 decades apart", () => (m["polynomials"] as AnyFn)(Object.fromEntries(Object.keys(values).map((n, i) => [n, i % 2 === 0 ? 1e-300 : 1e300])), GOOD_OPAMP)],
          ]);
        });
      }

      if (topo.fixedGain !== undefined) {
        it("fixedGain", () => {
          expectAll([
            ["no arguments", () => (m["fixedGain"] as AnyFn)()],
            ...badTargets(target).map((t): [string, () => unknown] => [`target ${String(JSON.stringify(t))}`, () => (m["fixedGain"] as AnyFn)(t)]),
          ]);
        });
      }
    });
  }
});
