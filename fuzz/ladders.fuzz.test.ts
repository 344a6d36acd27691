// The seeded, bounded fuzz of the ladder layers: random (often invalid)
// arguments to ladderPrototype, scaleLadder, asBuiltLadder, ladderParts,
// ladderCircuit and the three active ladder builders. Nothing may escape but
// the library's typed errors, and no returned number may be non-finite; every
// part a call does return is positive. Counts are printed at the end.
import { afterAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import { FAMILY_NAMES } from "../src/approx/index.ts";
import { asBuiltLadder, ladderParts, ladderPrototype, scaleLadder, LADDER_RESPONSES, type LadderPrototype } from "../src/ladder/index.ts";
import { fdnrLowpassLadder, gicHighpassLadder, leapfrogLowpassLadder } from "../src/ladder/active/index.ts";
import { ladderCircuit } from "../src/circuit/index.ts";
import { SERIES_NAMES } from "../src/parts/index.ts";
import { anyNumber, anyValue, makeGuard } from "./guard.ts";

const SEED = 20261203;
const counts = { lowLevel: 0, typedErrors: 0, prototypes: 0, ladders: 0, activeLadders: 0 };
const guarded = makeGuard(counts);
const RUNS = Number(process.env["FUZZ_LADDER_RUNS"] ?? 2000);

/** A prototype the other calls start from, or null when the random spec is refused. */
function tryPrototype(spec: Record<string, unknown>): LadderPrototype | null {
  try {
    const p = ladderPrototype(spec as never);
    counts.prototypes++;
    return p;
  } catch {
    return null;
  }
}

const positive = (what: string, xs: readonly number[]): void => {
  for (const x of xs) expect(x > 0 && Number.isFinite(x), `${what}: part value ${x}`).toBe(true);
};

describe("fuzz: ladders", () => {
  it("ladderPrototype with random family fields, forms and terminations", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...FAMILY_NAMES),
        fc.oneof(fc.integer({ min: -2, max: 20 }), anyNumber),
        fc.oneof(anyNumber, fc.double({ min: 0.01, max: 3, noNaN: true })),
        fc.oneof(anyNumber, fc.double({ min: 20, max: 100, noNaN: true })),
        fc.oneof(fc.constantFrom("series-first", "shunt-first"), anyValue),
        fc.oneof(fc.constant(undefined), anyNumber, fc.double({ min: 0.1, max: 10, noNaN: true })),
        fc.oneof(fc.constant(undefined), anyNumber, fc.double({ min: 0.1, max: 10, noNaN: true })),
        (family, order, rippleDb, attenuationDb, form, sourceOhms, loadOhms) => {
          const spec = { family, order, rippleDb, attenuationDb, form, ...(sourceOhms === undefined ? {} : { sourceOhms }), ...(loadOhms === undefined ? {} : { loadOhms }) };
          guarded(`ladderPrototype(${JSON.stringify(spec)})`, () => {
            const p = ladderPrototype(spec as never);
            positive("ladderPrototype", p.elements.flatMap((e) => [e.value, ...(e.parallelC === undefined ? [] : [e.parallelC]), ...(e.seriesL === undefined ? [] : [e.seriesL])]));
            return p;
          });
        },
      ),
      { numRuns: RUNS, seed: SEED },
    );
  });

  it("scaleLadder, asBuiltLadder, ladderParts and ladderCircuit with random options", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...FAMILY_NAMES),
        fc.integer({ min: 2, max: 9 }),
        fc.constantFrom(...LADDER_RESPONSES),
        fc.oneof(fc.double({ min: 1, max: 1e8, noNaN: true }), anyNumber),
        fc.oneof(fc.double({ min: 1.05, max: 4, noNaN: true }), anyNumber),
        fc.oneof(fc.double({ min: 1, max: 1e4, noNaN: true }), anyNumber),
        fc.record({ inductorSeries: fc.oneof(fc.constantFrom("E12", "E24"), anyValue), capacitorSeries: fc.oneof(fc.constantFrom(...SERIES_NAMES), anyValue), inductorQ: fc.oneof(fc.double({ min: 5, max: 500, noNaN: true }), anyValue), capacitorEsrOhms: fc.oneof(fc.constant(undefined), anyNumber) }, { requiredKeys: [] }),
        (family, order, response, edgeHz, ratio, ohms, asBuilt) => {
          const proto = tryPrototype({ family, order, rippleDb: 0.5, attenuationDb: 50 });
          if (proto === null) return;
          const band = response === "bandpass" || response === "bandstop";
          const options = { response, edgeHz: band ? [edgeHz, edgeHz * ratio] : edgeHz, sourceOhms: ohms };
          guarded(`scaleLadder(${family} ${order}, ${JSON.stringify(options)})`, () => {
            const l = scaleLadder(proto, options as never);
            counts.ladders++;
            positive("scaleLadder", l.components.map((c) => c.value));
            guarded("ladderCircuit", () => ladderCircuit(l));
            guarded(`asBuiltLadder(${JSON.stringify(asBuilt)})`, () => {
              const b = asBuiltLadder(l, asBuilt as never);
              positive("asBuiltLadder", b.components.map((c) => c.value));
              guarded("ladderParts", () => ladderParts(b));
              return b;
            });
            return l;
          });
        },
      ),
      { numRuns: RUNS, seed: SEED + 1 },
    );
  });

  it("the active ladder builders with random options", () => {
    fc.assert(
      fc.property(
        fc.constantFrom("butterworth", "chebyshev1", "bessel", "legendre", "elliptic"),
        fc.integer({ min: 2, max: 8 }),
        fc.record(
          {
            edgeHz: fc.oneof(fc.double({ min: 1, max: 1e7, noNaN: true }), anyNumber),
            capacitorF: fc.oneof(fc.constant(undefined), anyNumber, fc.double({ min: 1e-11, max: 1e-5, noNaN: true })),
            gain: fc.oneof(fc.constant(undefined), anyNumber, fc.double({ min: 0.1, max: 10, noNaN: true })),
            opamp: fc.oneof(fc.constant(undefined), anyValue, fc.record({ kind: fc.constant("single-pole"), a0: fc.oneof(anyNumber, fc.constant(2e5)), gbwHz: fc.oneof(anyNumber, fc.constant(1e7)) })),
            dcPathRatio: fc.oneof(fc.constant(undefined), anyNumber),
            capacitorSeries: fc.oneof(fc.constant(undefined), fc.constantFrom(...SERIES_NAMES), anyValue),
          },
          { requiredKeys: ["edgeHz"] },
        ),
        (family, order, raw) => {
          const proto = tryPrototype({ family, order, rippleDb: 0.5, attenuationDb: 50 });
          if (proto === null) return;
          const options = Object.fromEntries(Object.entries(raw).filter(([, v]) => v !== undefined));
          for (const [name, build] of [
            ["leapfrogLowpassLadder", leapfrogLowpassLadder],
            ["fdnrLowpassLadder", fdnrLowpassLadder],
            ["gicHighpassLadder", gicHighpassLadder],
          ] as const) {
            guarded(`${name}(${family} ${order}, ${JSON.stringify(options)})`, () => {
              const a = build(proto, options as never);
              counts.activeLadders++;
              positive(name, a.parts.map((p) => p.value));
              return { parts: a.parts, target: a.target, opampCount: a.opampCount };
            });
          }
        },
      ),
      { numRuns: RUNS, seed: SEED + 2 },
    );
  });

  afterAll(() => {
    console.log(
      `fuzz ladders: ${counts.lowLevel} calls (${counts.typedErrors} typed errors), ${counts.prototypes} prototypes, ${counts.ladders} scaled ladders, ${counts.activeLadders} active ladders built`,
    );
  });
});
