import { availableParallelism } from "node:os";
import { defineConfig } from "vitest/config";

// The seeded, bounded fuzz run (fuzz/), run by .ci/run after `npm test`; it needs
// `npm run build` first (the random spec generator reads the built PRNG).
export default defineConfig({
  test: {
    // Vitest's default is one worker fewer than the cores (one on the 2-core CI machine); the main
    // process only collects results, so a worker per core runs the files side by side.
    maxWorkers: Math.max(2, availableParallelism()),
    include: ["fuzz/**/*.fuzz.test.ts"],
    testTimeout: 900_000,
  },
});
