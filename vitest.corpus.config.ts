import { availableParallelism } from "node:os";
import { defineConfig } from "vitest/config";

// The long seeded corpus checks, run by .ci/run after `npm test` (they need `npm run build` first:
// the spec generator reads the built PRNG).
export default defineConfig({
  test: {
    // Vitest's default is one worker fewer than the cores (one on the 2-core CI machine); the main
    // process only collects results, so a worker per core runs the files side by side.
    maxWorkers: Math.max(2, availableParallelism()),
    include: ["corpus/**/*.corpus.test.ts"],
    testTimeout: 1_500_000,
  },
});
