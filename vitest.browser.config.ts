import { defineConfig } from "vitest/config";

// The headless-Chromium tests (browser/): the plots and schematics, and the
// live page of the docs site. `npm run test:browser`, run by .ci/run after the
// build; not part of `npm test`. Node 20 needs --experimental-websocket for
// the DevTools client of the live-page test (the script sets it).
export default defineConfig({
  test: {
    include: ["browser/**/*.browser.test.ts"],
    testTimeout: 300_000,
    hookTimeout: 300_000,
    fileParallelism: false,
  },
});
