import { defineConfig } from "tsup";

/** Layer folders published as subpath exports (`filterwright/<layer>`). */
export const layers = [
  "units",
  "math",
  "tf",
  "approx",
  "parts",
  "scaling",
  "circuit",
  "topologies",
  "design",
  "analysis",
  "report",
] as const;

/** Layers built into dist/ for the benchmarks (bench/*.bench.mjs) but not (yet) published as subpath exports. */
export const internalLayers = ["evaluate"] as const;

export default defineConfig([
  {
    entry: {
      index: "src/index.ts",
      ...Object.fromEntries([...layers, ...internalLayers].map((l) => [`${l}/index`, `src/${l}/index.ts`])),
    },
    format: ["esm", "cjs"],
    dts: true,
    sourcemap: true,
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
    sourcemap: true,
    clean: false,
    target: "es2022",
    platform: "node",
    banner: { js: "#!/usr/bin/env node" },
  },
]);
