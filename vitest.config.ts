import { availableParallelism } from "node:os";
import { defineConfig } from "vitest/config";

export default defineConfig({
  test: {
    // Vitest's default is one worker fewer than the cores (one on the 2-core CI machine); the main
    // process only collects results, so a worker per core runs the files side by side.
    maxWorkers: Math.max(2, availableParallelism()),
    include: ["test/**/*.test.ts"],
    setupFiles: ["test/setup.ts"],
    testTimeout: 120_000,
    hookTimeout: 120_000,
  },
});
