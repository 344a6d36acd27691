// The parts corpus: seeded random valid specs from scripts/spec-corpus.mjs
// (the same generator as the stability corpus), designed by the nominal
// pipeline (family choice, order search, fallback ladder). On every design:
// no resistor outside 100 Ω-10 MΩ and no capacitor outside 10 pF-10 µF
// (the specs give no windows, so these are the library's limits) except in a
// stage that no value set builds inside them (built beyond them as the last
// resort, with a warning in the result; counted apart), no part
// value zero, negative or not finite, and the op-amp estimate the family
// choice made for the built family and order equal to the built count (the
// sum of the stages' op-amps).
import { expect, it } from "vitest";
import { validateSpec } from "../src/design/spec.ts";
import { chooseFamily } from "../src/design/family.ts";
import { orderRange, searchDesign } from "../src/design/recovery.ts";
import { SpecError, UnrealisableError } from "../src/errors.ts";
// @ts-expect-error plain JavaScript module without types
import { randomSpecs } from "../scripts/spec-corpus.mjs";

/** What the corpus counted. */
export interface PartsTally {
  designs: number;
  skipped: number;
  /** Designs with at least one resistor outside 100 Ω-10 MΩ or capacitor outside 10 pF-10 µF. */
  outOfWindow: number;
  /** Designs with a part value that is zero, negative or not finite. */
  nonPositive: number;
  /** Designs with a stage that no value set builds inside the limits, built beyond them (the result warns): not counted in `outOfWindow`. */
  builtBeyondLimits: number;
  /** Designs whose built op-amp count differs from the family choice's estimate at the built order. */
  estimateMismatch: number;
  /** Designs whose estimate differs because the fallback ladder re-planned the stages after the first attempt missed (counted apart). */
  sturdierRebuilt: number;
  /** Designs whose order was raised above the minimum (their estimate is compared at the built order). */
  orderRaised: number;
  /** Of the out-of-window designs, the first few, for the log. */
  examples: string[];
}

const R_LIMIT = [100, 10e6] as const;
const C_LIMIT = [10e-12, 10e-6] as const;

/**
 * The parts invariants of one design (no expect inside): its parts inside the limits, none zero or
 * negative, the family choice's op-amp estimate at the built order equal to the built count.
 */
export function countPartsInvariants(id: string, outcome: ReturnType<typeof chooseFamily>, attempt: ReturnType<typeof searchDesign>["attempt"], tally: PartsTally, sturdier = false): void {
  tally.designs++;
  let out = false;
  let bad = false;
  if (attempt.tuned.some((t) => t.beyondLimits === true)) tally.builtBeyondLimits++;
  attempt.chosen.forEach((set, i) => {
    const beyond = attempt.tuned[i]!.beyondLimits === true;
    for (const [k, v] of Object.entries(set.values)) {
      if (!(v > 0) || !Number.isFinite(v)) bad = true;
      const lim = k.startsWith("R") ? R_LIMIT : k.startsWith("C") ? C_LIMIT : null;
      if (lim !== null && !beyond && (v < lim[0] * (1 - 1e-9) || v > lim[1] * (1 + 1e-9))) {
        out = true;
        if (tally.examples.length < 12) tally.examples.push(`${id} stage ${i + 1} ${attempt.plans[i]!.topology.id} ${k}=${v.toPrecision(3)}`);
      }
    }
  });
  if (out) tally.outOfWindow++;
  if (bad) tally.nonPositive++;
  const built = attempt.plans.reduce((s, p) => s + p.topology.opampCount, 0);
  const order = attempt.proto.order;
  if (outcome.order !== null && order !== outcome.order) tally.orderRaised++;
  const cand = outcome.choice.candidates.find((c) => c.family === attempt.proto.family);
  // The family choice records the estimate at the minimum order; compare it where the built order is that order.
  if (cand !== undefined && cand.order === order && cand.opamps !== built && sturdier) {
    // the first attempt missed the mask and the fallback ladder re-planned the stages after the family was chosen
    // (a moved placement, a tightened prototype or sturdier stages can change the sections' topologies): the
    // estimate is of the first plan
    tally.sturdierRebuilt++;
  } else if (cand !== undefined && cand.order === order && cand.opamps !== built) {
    tally.estimateMismatch++;
    if (tally.examples.length < 12) tally.examples.push(`${id} estimate ${cand.opamps} built ${built} (${attempt.plans.map((p) => p.topology.id).join(", ")})`);
  }
}

/** Design `n` specs of the corpus from `seed` and count the parts invariants' failures (no expect inside). */
export function runPartsCorpus(seed: number, n: number): PartsTally {
  const tally: PartsTally = { designs: 0, skipped: 0, outOfWindow: 0, builtBeyondLimits: 0, nonPositive: 0, estimateMismatch: 0, sturdierRebuilt: 0, orderRaised: 0, examples: [] };
  for (const { id, spec } of randomSpecs(seed, n) as { id: string; spec: Record<string, unknown> }[]) {
    let canonical;
    let outcome;
    let attempt;
    try {
      canonical = validateSpec(spec);
      outcome = chooseFamily(canonical);
      attempt = searchDesign(canonical, outcome.family, orderRange(canonical, outcome.order)).attempt;
    } catch (e) {
      if (e instanceof UnrealisableError || e instanceof SpecError) {
        tally.skipped++;
        if (tally.examples.length < 12) tally.examples.push(`${id} skipped: ${e.message.slice(0, 300)}`);
        continue;
      }
      throw e;
    }
    countPartsInvariants(id, outcome, attempt, tally);
  }
  return tally;
}

/** A tally with nothing counted yet. */
export function emptyPartsTally(): PartsTally {
  return { designs: 0, skipped: 0, outOfWindow: 0, builtBeyondLimits: 0, nonPositive: 0, estimateMismatch: 0, sturdierRebuilt: 0, orderRaised: 0, examples: [] };
}

/** The parts invariants' expectations on a corpus tally of `n` specs. */
export function expectPartsInvariants(t: PartsTally, n: number): void {
  expect(t.outOfWindow, t.examples.join("\n")).toBe(0);
  expect(t.nonPositive, t.examples.join("\n")).toBe(0);
  // a stage built beyond the limits is the last resort: at most one design in a thousand
  expect(t.builtBeyondLimits, t.examples.join("\n")).toBeLessThanOrEqual(Math.ceil(n / 1000));
  expect(t.estimateMismatch, t.examples.join("\n")).toBe(0);
}

/**
 * The parts corpus test of one seed: `CORPUS_SIZE` specs (default 1000),
 * the tally printed, every invariant's failure count required to be zero.
 */
export function partsCorpusTest(label: string, seed: number): void {
  const n = Number(process.env["CORPUS_SIZE"] ?? 1000);
  it(`corpus ${label} (${n} specs, seed ${seed}): every part inside 100 Ω-10 MΩ / 10 pF-10 µF, none zero or negative, op-amp estimate = built count`, () => {
    const t = runPartsCorpus(seed, n);
    console.log(`parts corpus ${label}`, JSON.stringify(t));
    expect(t.designs + t.skipped).toBe(n);
    expect(t.designs).toBeGreaterThan(0.9 * n);
    expectPartsInvariants(t, n);
  });
}
