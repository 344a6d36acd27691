import { defineConfig } from "vitest/config";

// The long seeded corpus checks, run by .ci/run after `npm test` (they need `npm run build` first:
// the spec generator reads the built PRNG).
export default defineConfig({
  test: {
    include: ["corpus/**/*.corpus.test.ts"],
    testTimeout: 1_500_000,
  },
});
