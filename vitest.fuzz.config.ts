import { defineConfig } from "vitest/config";

// The seeded, bounded fuzz run (fuzz/), run by .ci/run after `npm test`; it needs
// `npm run build` first (the random spec generator reads the built PRNG).
export default defineConfig({
  test: {
    include: ["fuzz/**/*.fuzz.test.ts"],
    testTimeout: 900_000,
  },
});
