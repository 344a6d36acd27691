/**
 * Smoke test of the built package (dist/): every entry of the `exports` map
 * loads through both `import` and `require` via package self-reference, and
 * ESM and CJS builds expose the same names. Needs `npm run build` first; CI
 * builds before testing, so under CI a missing dist/ is a failure.
 */
import { describe, expect, it } from "vitest";
import { existsSync, readFileSync } from "node:fs";
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { dirname, join } from "node:path";
import * as source from "../../src/index.ts";

const root = join(dirname(fileURLToPath(import.meta.url)), "..", "..");
const built = existsSync(join(root, "dist", "index.js"));
if (!built && process.env["CI"]) throw new Error("dist/ is missing: CI must run `npm run build` before `npm test`");

const pkg = JSON.parse(readFileSync(join(root, "package.json"), "utf8")) as { exports: Record<string, unknown> };
const entries = Object.keys(pkg.exports)
  .filter((k) => k !== "./package.json")
  .map((k) => (k === "." ? "filterwright" : `filterwright/${k.slice(2)}`));

function run(code: string, type: "module" | "commonjs"): string {
  const r = spawnSync(process.execPath, ["--input-type=" + type, "-e", code], { cwd: root, encoding: "utf8" });
  if (r.status !== 0) throw new Error(r.stderr);
  return r.stdout.trim();
}

describe.skipIf(!built)("built package", () => {
  it.each(entries)("import and require of %s expose the same non-empty API", (spec) => {
    const esm = JSON.parse(run(`const m = await import(${JSON.stringify(spec)}); console.log(JSON.stringify(Object.keys(m).sort()))`, "module")) as string[];
    const cjs = JSON.parse(run(`const m = require(${JSON.stringify(spec)}); console.log(JSON.stringify(Object.keys(m).sort()))`, "commonjs")) as string[];
    expect(esm.length).toBeGreaterThan(0);
    expect(cjs).toEqual(esm);
    expect(esm).not.toContain("default");
  });

  it("the built root exposes the names of src/index.ts, and no layer's internals", () => {
    const esm = JSON.parse(run(`const m = await import("filterwright"); console.log(JSON.stringify(Object.keys(m).sort()))`, "module")) as string[];
    expect(esm).toEqual(Object.keys(source).sort());
    expect(esm).not.toContain("GBW_DEMAND_A0");
    expect(esm).not.toContain("DEFAULT_LEVEL_OHMS");
  });
});
