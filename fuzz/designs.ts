// The random designs of the fuzz run, shared by fuzz/designs-a.fuzz.test.ts
// and fuzz/designs-b.fuzz.test.ts (each takes every other spec, so the two
// files, run side by side on two cores, carry about the same load). Every
// design goes through every export: typed errors only, finite results, BOM
// values in their series, toJson/fromJson round trips equal, and every tenth
// netlist of each share run in ngspice. FUZZ_DESIGNS sets the number of designs in all
// (default 1000).
import { afterAll, expect, it } from "vitest";
import { FilterwrightError } from "../src/errors.ts";
import { designFilter, fromJson, toBomCsv, toJson, toSpiceNetlist, type DesignResult, type FilterSpec } from "../src/index.ts";
import { isInSeries } from "../src/parts/index.ts";
import { hasNgspice, runAc } from "../test/helpers/ngspice.ts";
import { firstNonFinite } from "../test/helpers/finite.ts";
// @ts-expect-error plain JavaScript module without types
import { randomSpecs } from "../scripts/spec-corpus.mjs";

const SEED = 20261202;
const SPICE_EVERY = 10;

/**
 * Register the test of one share of the random designs: the specs whose
 * index is `part` modulo `parts`.
 */
export function fuzzDesigns(part: number, parts: number): void {
  const n = Number(process.env["FUZZ_DESIGNS"] ?? 1000);
  const specs = (randomSpecs(SEED, n) as { id: string; spec: FilterSpec }[])
    .map((e, i) => ({
      ...e,
      index: i,
      // a lighter yield check keeps the run bounded; the design loop is the same
      spec: { ...e.spec, yieldCheck: { maxBoards: 512, seed: i + 1 } } as FilterSpec,
    }))
    .filter((e) => e.index % parts === part);
  const counts = { designs: 0, typedErrors: 0, roundTrips: 0, bomParts: 0, netlists: 0 };
  afterAll(() => {
    console.log(
      `fuzz designs ${part + 1}/${parts}: ${specs.length} specs, ${counts.designs} designs (${counts.typedErrors} typed errors), ${counts.roundTrips} JSON round trips, ${counts.bomParts} BOM parts in series, ${counts.netlists} netlists run in ngspice`,
    );
  });
  it(`${specs.length} random specs (${part + 1} of ${parts}): typed errors only, finite results, BOM values in series, JSON round trips equal, netlists accepted by ngspice`, () => {
    const spice = hasNgspice();
    specs.forEach((e, k) => {
      let r: DesignResult;
      try {
        r = designFilter(e.spec);
      } catch (err) {
        if (err instanceof FilterwrightError) {
          counts.typedErrors++;
          return;
        }
        throw new Error(`${e.id}: threw ${err instanceof Error ? err.stack : String(err)}`);
      }
      counts.designs++;
      expect(firstNonFinite(r), `${e.id}: a non-finite value`).toBeNull();
      const text = toJson(r);
      const back = fromJson(text);
      expect(toJson(back), `${e.id}: toJson(fromJson(toJson(r)))`).toBe(text);
      counts.roundTrips++;
      const bom = toBomCsv(r).trim().split("\n").slice(1);
      for (const st of r.stages) {
        for (const [d, v] of Object.entries(st.components)) {
          expect(v > 0, `${e.id}: ${d} = ${v}`).toBe(true);
          const series = d.startsWith("C") ? r.spec.capacitorSeries : r.spec.resistorSeries;
          expect(isInSeries(v, series), `${e.id}: ${d} = ${v} not in ${series}`).toBe(true);
          counts.bomParts++;
        }
      }
      expect(bom.length).toBeGreaterThan(0);
      if (spice && k % SPICE_EVERY === 0) {
        const sim = runAc(toSpiceNetlist(r, { pointsPerDecade: 5 }), ["out"]);
        expect(sim.freqHz.length, `${e.id}: ngspice points`).toBeGreaterThan(5);
        counts.netlists++;
      }
    });
    expect(counts.designs).toBeGreaterThan(specs.length / 2);
  });
}
