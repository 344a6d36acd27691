import { defineConfig } from "vitest/config";

// The browser checks of the plots and schematics (headless Chromium, the Debian package `chromium`):
// `npm run test:browser`, run by .ci/run after the unit tests; not part of `npm test`.
export default defineConfig({
  test: {
    include: ["browser/**/*.browser.test.ts"],
    testTimeout: 300_000,
    hookTimeout: 300_000,
    fileParallelism: false,
  },
});
