import { it, expect } from "vitest";
import { runStabilityCorpus } from "./stability.ts";

const n = Number(process.env["CORPUS_SIZE"] ?? 1000);

it(`corpus A (${n} specs, seed 20261202): no design meets the spec with an unstable stage; peaks agree with a dense evaluation to 0.01 dB`, () => {
  const t = runStabilityCorpus(20261202, n);
  console.log("stability corpus A", JSON.stringify(t));
  expect(t.designs + t.skipped).toBe(n);
  expect(t.designs).toBeGreaterThan(0.9 * n);
  expect(t.peaksChecked).toBeGreaterThan(0.8 * n);
});
