/**
 * Load a JSON fixture from test/fixtures/ and check that it records where its
 * numbers come from (`source`: library and version, or book and table).
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { dirname, join } from "node:path";

const here = dirname(fileURLToPath(import.meta.url));

/** Every fixture carries a `source` block saying where its numbers come from. */
export interface FixtureSource {
  /** Library and version (e.g. "scipy 1.17.1"), or book and table. */
  readonly source: string | Record<string, unknown>;
}

/** Read `test/fixtures/<name>` as JSON; throws if it lacks a `source` field. */
export function loadFixture<T>(name: string): T & FixtureSource {
  const text = readFileSync(join(here, "..", "fixtures", name), "utf8");
  const data = JSON.parse(text) as T & FixtureSource;
  if (data === null || typeof data !== "object" || !("source" in data)) {
    throw new Error(`fixture ${name} does not record its source`);
  }
  return data;
}

/** Decode a complex list stored as [[re, im], ...]. */
export function complexList(pairs: readonly (readonly [number, number])[]): { re: number; im: number }[] {
  return pairs.map(([re, im]) => ({ re, im }));
}
