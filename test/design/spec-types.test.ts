/**
 * The spec's types catch typos at compile time (`npm run typecheck` fails if
 * any `@ts-expect-error` below stops being an error), and the run-time
 * validation still refuses the same specs for JavaScript callers.
 */
import { describe, expect, it } from "vitest";
import { designFilter, type FamilyName, type FamilyPriority, type FilterSpec, type Polarity, type ResponseType, type SeriesName } from "../../src/index.ts";
import { SpecError } from "../../src/errors.ts";

const good: FilterSpec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };

/** Specs with a typo each: every one is a compile error and a run-time SpecError. */
const typos: (() => unknown)[] = [
  // @ts-expect-error a misspelt response
  () => designFilter({ ...good, response: "lowpas" }),
  // @ts-expect-error a misspelt field: maxLoss for maxLossDb
  () => designFilter({ ...good, passband: { edgeHz: "1k", maxLoss: 1 } }),
  // @ts-expect-error an unknown family
  () => designFilter({ ...good, family: "chebychev1" }),
  // @ts-expect-error an unknown priority
  () => designFilter({ ...good, priority: "fewest-opamps" }),
  // @ts-expect-error a polarity that does not exist
  () => designFilter({ ...good, gain: { db: 6, polarity: "positive" } }),
  // @ts-expect-error an unknown part distribution
  () => designFilter({ ...good, parts: { distribution: "gaussian" } }),
  // @ts-expect-error the op-amp's gain-bandwidth under a wrong name
  () => designFilter({ ...good, opamp: { a0: 1e5, gbw: "1M" } }),
  // @ts-expect-error the stopband is required
  () => designFilter({ response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 } }),
];

describe("FilterSpec types", () => {
  it("the literal unions name every accepted value", () => {
    const responses: ResponseType[] = ["lowpass", "highpass", "bandpass", "bandstop"];
    const priorities: FamilyPriority[] = ["fewest-op-amps", "fewest-stages", "flattest-delay", "monotonic"];
    const polarities: Polarity[] = ["non-inverting", "inverting", "either"];
    const families: FamilyName[] = ["butterworth", "chebyshev1", "chebyshev2", "elliptic", "bessel", "legendre"];
    const series: SeriesName[] = ["E12", "E24", "E96"];
    expect(responses.length + priorities.length + polarities.length + families.length + series.length).toBe(20);
    expect(designFilter(good).verification.meetsSpec).toBe(true);
  });

  it.each(typos.map((f, i) => [i, f] as const))("typo %i is refused at run time as well, with a SpecError", (_, f) => {
    expect(f).toThrow(SpecError);
  });
});
