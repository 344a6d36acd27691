// The parts corpus: seeded random valid specs from scripts/spec-corpus.mjs
// (the same generator as the stability corpus), designed by the nominal
// pipeline (family choice, order search, fallback ladder). On every design:
// no resistor outside 100 Ω-10 MΩ and no capacitor outside 10 pF-10 µF
// (the specs give no windows, so these are the library's limits) except in a
// stage that no value set builds inside them (built beyond them as the last
// resort, with a warning in the result; counted apart), no part
// value zero, negative or not finite, and honest op-amp counts: the count the
// family choice records for the built family equal to the built count (the
// sum of the stages' op-amps), and, under the fewest-op-amps priority, no
// other family ranked below it (estimated at fewer op-amps and not built, or
// built and meeting the mask with fewer; src/design/family-recount.ts).
import { expect, it } from "vitest";
import { validateSpec } from "../src/design/spec.ts";
import { chooseFamily } from "../src/design/family.ts";
import { orderRange, searchDesign } from "../src/design/recovery.ts";
import { recountFamilies, type Recounted } from "../src/design/family-recount.ts";
import type { DesignSpec } from "../src/design/spec.ts";
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
  /** Designs whose built op-amp count differs from the count the family choice records for the built family. */
  estimateMismatch: number;
  /** Designs (fewest-op-amps priority) with another family ranked below the built count: estimated at fewer op-amps and not built, or built and meeting the mask with fewer. */
  cheaperFamilyMissed: number;
  /** Designs whose first estimate (the simplest topologies at the minimum order) differs from the built count: informational, the choice then builds the families ranked below. */
  estimateOff: number;
  /** Designs the recount moved to another family that meets the mask with fewer op-amps. */
  familyChanged: number;
  /** Designs whose order was raised above the minimum. */
  orderRaised: number;
  /** Of the out-of-window designs, the first few, for the log. */
  examples: string[];
}

const R_LIMIT = [100, 10e6] as const;
const C_LIMIT = [10e-12, 10e-6] as const;

/** The nominal pipeline of designFilter up to the yield step: family, order search, the op-amp recount. */
export function nominalDesign(canonical: DesignSpec): { outcome: ReturnType<typeof chooseFamily>; recounted: Recounted } {
  const outcome = chooseFamily(canonical);
  const orders = orderRange(canonical, outcome.order);
  const recounted = recountFamilies(canonical, { family: outcome.family, orders, nominal: searchDesign(canonical, outcome.family, orders) }, outcome.choice);
  return { outcome, recounted };
}

/**
 * The parts invariants of one design (no expect inside): its parts inside the limits, none zero or
 * negative, honest op-amp counts (see the header).
 */
export function countPartsInvariants(id: string, canonical: DesignSpec, recounted: Recounted, tally: PartsTally): void {
  const attempt = recounted.nominal.attempt;
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
  const choice = recounted.choice;
  const cand = choice.candidates.find((c) => c.family === recounted.family);
  if (cand !== undefined && cand.order !== null && attempt.proto.order !== cand.order) tally.orderRaised++;
  if (recounted.actions.some((a) => a.code === "changed-family-for-op-amps")) tally.familyChanged++;
  if (cand === undefined) return; // the spec named the family: no choice to count
  if (cand.opamps !== built) tally.estimateOff++;
  if (cand.built?.opamps !== built) {
    tally.estimateMismatch++;
    if (tally.examples.length < 12) tally.examples.push(`${id} ${recounted.family}: recorded ${cand.built?.opamps} built ${built} (${attempt.plans.map((p) => p.topology.id).join(", ")})`);
  }
  if (canonical.priority !== "fewest-op-amps") return;
  const cheaper = choice.candidates.filter(
    (c) => c.family !== recounted.family && c.order !== null && (c.built === undefined ? (c.opamps ?? Infinity) < built : c.built.meetsSpec && c.built.opamps < built),
  );
  if (cheaper.length > 0) {
    tally.cheaperFamilyMissed++;
    if (tally.examples.length < 12) tally.examples.push(`${id} ${recounted.family} built ${built}; ranked below: ${cheaper.map((c) => `${c.family} ${c.built?.opamps ?? c.opamps}`).join(", ")}`);
  }
}

/** Design `n` specs of the corpus from `seed` and count the parts invariants' failures (no expect inside). */
export function runPartsCorpus(seed: number, n: number): PartsTally {
  const tally: PartsTally = { designs: 0, skipped: 0, outOfWindow: 0, builtBeyondLimits: 0, nonPositive: 0, estimateMismatch: 0, cheaperFamilyMissed: 0, estimateOff: 0, familyChanged: 0, orderRaised: 0, examples: [] };
  for (const { id, spec } of randomSpecs(seed, n) as { id: string; spec: Record<string, unknown> }[]) {
    let canonical;
    let recounted;
    try {
      canonical = validateSpec(spec);
      recounted = nominalDesign(canonical).recounted;
    } catch (e) {
      if (e instanceof UnrealisableError || e instanceof SpecError) {
        tally.skipped++;
        if (tally.examples.length < 12) tally.examples.push(`${id} skipped: ${e.message.slice(0, 300)}`);
        continue;
      }
      throw e;
    }
    countPartsInvariants(id, canonical, recounted, tally);
  }
  return tally;
}

/** A tally with nothing counted yet. */
export function emptyPartsTally(): PartsTally {
  return { designs: 0, skipped: 0, outOfWindow: 0, builtBeyondLimits: 0, nonPositive: 0, estimateMismatch: 0, cheaperFamilyMissed: 0, estimateOff: 0, familyChanged: 0, orderRaised: 0, examples: [] };
}

/** The parts invariants' expectations on a corpus tally of `n` specs. */
export function expectPartsInvariants(t: PartsTally, n: number): void {
  expect(t.outOfWindow, t.examples.join("\n")).toBe(0);
  expect(t.nonPositive, t.examples.join("\n")).toBe(0);
  // a stage built beyond the limits is the last resort: at most one design in a thousand
  expect(t.builtBeyondLimits, t.examples.join("\n")).toBeLessThanOrEqual(Math.ceil(n / 1000));
  expect(t.estimateMismatch, t.examples.join("\n")).toBe(0);
  expect(t.cheaperFamilyMissed, t.examples.join("\n")).toBe(0);
}

/**
 * The parts corpus test of one seed: `CORPUS_SIZE` specs (default 1000),
 * the tally printed, every invariant's failure count required to be zero.
 */
export function partsCorpusTest(label: string, seed: number): void {
  const n = Number(process.env["CORPUS_SIZE"] ?? 1000);
  it(`corpus ${label} (${n} specs, seed ${seed}): every part inside 100 Ω-10 MΩ / 10 pF-10 µF, none zero or negative, op-amp count recorded = built, no family ranked below it`, () => {
    const t = runPartsCorpus(seed, n);
    console.log(`parts corpus ${label}`, JSON.stringify(t));
    expect(t.designs + t.skipped).toBe(n);
    expect(t.designs).toBeGreaterThan(0.9 * n);
    expectPartsInvariants(t, n);
  });
}
