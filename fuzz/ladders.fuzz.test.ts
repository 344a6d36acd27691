// The seeded, bounded fuzz of the ladder layers: random (often invalid)
// arguments to ladderPrototype, scaleLadder, asBuiltLadder, ladderParts,
// ladderCircuit and the three active ladder builders, randomly edited JSON
// records of a passive ladder design read back, and random specs with a
// random realisation designed (the comparison exported and read back). Nothing may escape but
// the library's typed errors, and no returned number may be non-finite; every
// part a call does return is positive. Counts are printed at the end.
import { afterAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import { FAMILY_NAMES } from "../src/approx/index.ts";
import { asBuiltLadder, ladderParts, ladderPrototype, scaleLadder, LADDER_RESPONSES, type LadderPrototype } from "../src/ladder/index.ts";
import { fdnrLowpassLadder, gicHighpassLadder, leapfrogLowpassLadder } from "../src/ladder/active/index.ts";
import { ladderCircuit } from "../src/circuit/index.ts";
import { designLcLadder } from "../src/design/lc-ladder.ts";
import { fromJson, lcLadderFromJson, lcLadderToJson, toJson, toSpiceNetlist } from "../src/report/index.ts";
import { designFilter, type DesignResult, type LcLadderDesign } from "../src/design/index.ts";
import { SERIES_NAMES } from "../src/parts/index.ts";
import { anyNumber, anyValue, makeGuard } from "./guard.ts";

const SEED = 20261203;
const counts = { lowLevel: 0, typedErrors: 0, prototypes: 0, ladders: 0, activeLadders: 0, jsonEdits: 0, realisations: 0, compared: 0 };
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

  it("lcLadderFromJson on randomly edited records of a passive ladder design", () => {
    // a 30 MHz anti-alias lowpass (our own scenario), few boards so each re-made design is quick
    const d = designLcLadder(
      { response: "lowpass", passband: { edgeHz: 30e6, maxLossDb: 1 }, stopband: { edgeHz: 60e6, minAttenuationDb: 45 }, parts: { capacitorSeries: "E24", capacitorTolerance: 0.01 } },
      { inductorSeries: "E24", inductorTolerance: 0.02, inductorQ: 80, boards: 64 },
    );
    const text = lcLadderToJson(d);
    const record = JSON.parse(text) as Record<string, unknown>;
    const leaves: string[][] = [];
    const walk = (o: unknown, path: string[]): void => {
      if (o !== null && typeof o === "object") for (const [k, v] of Object.entries(o)) walk(v, [...path, k]);
      else leaves.push(path);
    };
    walk(record, []);
    fc.assert(
      fc.property(fc.nat(leaves.length - 1), fc.oneof(anyValue, fc.constant(undefined)), (at, value) => {
        const copy = JSON.parse(text) as Record<string, unknown>;
        const path = leaves[at] as string[];
        let o = copy as Record<string, unknown>;
        for (const k of path.slice(0, -1)) o = o[k] as Record<string, unknown>;
        const last = path[path.length - 1] as string;
        if (value === undefined) delete o[last];
        else o[last] = value;
        counts.jsonEdits++;
        guarded(`lcLadderFromJson(${path.join(".")} = ${String(value)})`, () => {
          const back = lcLadderFromJson(JSON.stringify(copy));
          // an accepted edit changed nothing the design depends on (a spec field at its default, say):
          // the parts are the stored ones, and the record of what was read reads back to itself
          expect(back.asBuilt.components.map((c) => c.value)).toEqual(d.asBuilt.components.map((c) => c.value));
          const again = lcLadderToJson(back);
          expect(lcLadderToJson(lcLadderFromJson(again))).toBe(again);
          return back.verification;
        });
      }),
      { numRuns: Number(process.env["FUZZ_LADDER_JSON_RUNS"] ?? 120), seed: SEED + 3 },
    );
  });

  it("designFilter with a random realisation: typed errors only, the choice exported and read back", () => {
    fc.assert(
      fc.property(
        fc.constantFrom("lowpass", "highpass", "bandpass"),
        fc.double({ min: 100, max: 1e6, noNaN: true }),
        fc.double({ min: 1.4, max: 4, noNaN: true }),
        fc.double({ min: 0.1, max: 1, noNaN: true }),
        fc.double({ min: 20, max: 60, noNaN: true }),
        fc.oneof(fc.constantFrom("cascade", "active-ladder", "auto", "lc-ladder"), anyValue),
        fc.constantFrom(0.005, 0.01, 0.02, 0.05),
        (response, edgeHz, ratio, maxLossDb, minAttenuationDb, realisation, tolerance) => {
          const bands =
            response === "lowpass"
              ? { passband: { edgeHz, maxLossDb }, stopband: { edgeHz: edgeHz * ratio, minAttenuationDb } }
              : response === "highpass"
                ? { passband: { edgeHz: edgeHz * ratio, maxLossDb }, stopband: { edgeHz, minAttenuationDb } }
                : { passband: { edgeHz: [edgeHz, edgeHz * 1.5], maxLossDb }, stopband: { edgeHz: [edgeHz / ratio, edgeHz * 1.5 * ratio], minAttenuationDb } };
          const spec = { response, ...bands, parts: { resistorTolerance: tolerance, capacitorTolerance: tolerance }, yieldCheck: { maxBoards: 256, seed: 3 }, realisation };
          counts.realisations++;
          guarded(`designFilter(${JSON.stringify(spec)})`, () => {
            const r = designFilter(spec as never) as DesignResult | LcLadderDesign;
            if (!("stages" in r)) return r.verification;
            if (r.realisation !== undefined) {
              counts.compared++;
              const k = r.realisation.candidates[r.realisation.chosen];
              expect(k).toBeDefined();
              if (k?.realisation === "active-ladder") expect(toSpiceNetlist(r)).toContain("as an active ladder");
              expect(toJson(fromJson(toJson(r)))).toBe(toJson(r));
            }
            return r.verification;
          });
        },
      ),
      { numRuns: Number(process.env["FUZZ_REALISATION_RUNS"] ?? 10), seed: SEED + 4 },
    );
    // the seeded draws reach the comparison (a run that only met typed errors would prove little)
    expect(counts.compared).toBeGreaterThan(0);
  });

  afterAll(() => {
    console.log(
      `fuzz ladders: ${counts.lowLevel} calls (${counts.typedErrors} typed errors), ${counts.prototypes} prototypes, ${counts.ladders} scaled ladders, ${counts.activeLadders} active ladders built, ${counts.jsonEdits} edited LC ladder records read, ${counts.realisations} specs with a random realisation designed (${counts.compared} with the realisations compared)`,
    );
  });
});
