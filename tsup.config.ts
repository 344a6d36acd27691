import { defineConfig } from "tsup";

/** Layer folders published as subpath exports (`filterwright/<layer>`). */
export const layers = [
  "units",
  "math",
  "tf",
  "approx",
  "ladder",
  "parts",
  "scaling",
  "circuit",
  "ladder/active",
  "topologies",
  "design",
  "analysis",
  "report",
] as const;

/**
 * Node-only entries, published as subpath exports like the layers but
 * importing node: built-ins (kept external): `filterwright/node` and the
 * worker thread it starts (`node/worker`, reached by its path beside it, not
 * exported).
 */
export const nodeEntries = { "node/index": "src/node/index.ts", "node/worker": "src/node/worker.ts" } as const;

/** Layers built into dist/ for the benchmarks (bench/*.bench.mjs) but not (yet) published as subpath exports. */
export const internalLayers = ["evaluate"] as const;

export default defineConfig([
  {
    entry: {
      index: "src/index.ts",
      ...Object.fromEntries([...layers, ...internalLayers].map((l) => [`${l}/index`, `src/${l}/index.ts`])),
      // in this build (not one of its own) so that it shares the chunks, and so the error classes, of the other entries
      ...nodeEntries,
    },
    external: [/^node:/],
    format: ["esm", "cjs"],
    dts: true,
    sourcemap: false,
    clean: true,
    target: "es2022",
    platform: "neutral",
    splitting: true,
    treeshake: true,
  },
  {
    entry: { "cli/main": "src/cli/main.ts" },
    format: ["esm"],
    dts: false,
    sourcemap: false,
    clean: false,
    target: "es2022",
    platform: "node",
    banner: { js: "#!/usr/bin/env node" },
  },
]);
