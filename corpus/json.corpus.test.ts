// The JSON corpus: seeded random valid specs from scripts/spec-corpus.mjs (a third with slow op-amps),
// each designed, written by toJson and read back by fromJson, which re-verifies the file from its parts
// (src/design/recheck.ts): every design must come back equal, so the recomputation agrees with the
// pipeline's own figures on every kind of design the corpus makes.
import { expect, it } from "vitest";
import { designFilter } from "../src/design/index.ts";
import { fromJson, toJson } from "../src/report/json.ts";
import { UnrealisableError } from "../src/errors.ts";
// @ts-expect-error plain JavaScript module without types
import { randomSpecs } from "../scripts/spec-corpus.mjs";

const SIZE = Number(process.env["CORPUS_SIZE"] ?? 200);

it(`fromJson(toJson(design)) equals the design for ${SIZE} seeded random specs`, () => {
  const specs = randomSpecs(20261203, SIZE) as { id: string; spec: never }[];
  let checked = 0;
  for (const { id, spec } of specs) {
    let r;
    try {
      r = designFilter(spec);
    } catch (e) {
      if (e instanceof UnrealisableError) continue; // no design to write (the stability corpus counts these)
      throw e;
    }
    expect(fromJson(toJson(r)), id).toEqual(r);
    checked++;
  }
  expect(checked).toBeGreaterThan(SIZE / 2);
});
