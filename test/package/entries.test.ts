/**
 * The package's entry points are declared in four places that must agree:
 * package.json `exports` and `typesVersions`, the tsup build's layer list and
 * typedoc's entry points. A subpath missing from one of them builds but does
 * not resolve, has no types under older resolvers, or has no API reference.
 */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { layers, nodeEntries } from "../../tsup.config.ts";

const root = new URL("../../", import.meta.url);
const pkg = JSON.parse(readFileSync(new URL("package.json", root), "utf8")) as {
  exports: Record<string, unknown>;
  typesVersions: { "*": Record<string, string[]> };
};
const typedoc = JSON.parse(readFileSync(new URL("typedoc.json", root), "utf8")) as { entryPoints: string[] };

const subpaths = Object.keys(pkg.exports)
  .filter((k) => k !== "." && k !== "./package.json")
  .map((k) => k.slice(2));

describe("package entry points", () => {
  it("exports, typesVersions, the tsup layers (and node entry) and typedoc list the same subpaths", () => {
    const built = [...layers, ...Object.keys(nodeEntries).filter((k) => k.endsWith("/index")).map((k) => k.slice(0, -"/index".length))];
    expect([...subpaths].sort()).toEqual([...built].sort());
    expect(Object.keys(pkg.typesVersions["*"]).sort()).toEqual([...subpaths].sort());
    expect(typedoc.entryPoints.filter((e) => e !== "src/index.ts").sort()).toEqual(subpaths.map((s) => `src/${s}/index.ts`).sort());
  });

  it("publishes filterwright/ladder", () => {
    expect(subpaths).toContain("ladder");
  });
});
