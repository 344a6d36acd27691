import { defineConfig } from "vitest/config";

// The headless-Chromium tests (browser/), run by .ci/run after the build:
// `npm run test:browser` (Node 20 needs --experimental-websocket for the
// DevTools client; the script sets it).
export default defineConfig({
  test: {
    include: ["browser/**/*.browser.test.ts"],
    testTimeout: 180_000,
    hookTimeout: 120_000,
    fileParallelism: false,
  },
});
