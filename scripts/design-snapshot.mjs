// Design every spec of the corpus with the built package and record each
// result's fingerprint, so a refactor can show its designs are bit-identical.
//
//   node scripts/design-snapshot.mjs --out before.json [--random N] [--seed S]
//   node scripts/design-snapshot.mjs --compare before.json [--random N]
//
// The corpus: the end-to-end specs of test/fixtures/design-specs.json, the
// examples/*.json specs, and N seeded random specs (scripts/spec-corpus.mjs).
// A fingerprint is a SHA-256 of the result's JSON (`toJson`), so any change of
// a part value, a margin bit or an action shows; a second one covers the BOM
// alone, to tell a change of figures from a change of parts.
import { createHash } from "node:crypto";
import { readFileSync, readdirSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { performance } from "node:perf_hooks";
import { randomSpecs } from "./spec-corpus.mjs";

const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const { designFilter, toJson, toBomCsv } = await import(join(root, "dist", "index.js"));

const args = process.argv.slice(2);
const opt = (name, fallback) => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : fallback;
};
const nRandom = Number(opt("--random", "60"));
const seed = Number(opt("--seed", "20261201"));

function corpus() {
  const fixture = JSON.parse(readFileSync(join(root, "test", "fixtures", "design-specs.json"), "utf8"));
  const list = fixture.specs.map((s) => ({ id: s.id, spec: s.spec }));
  for (const f of readdirSync(join(root, "examples")).filter((f) => f.endsWith(".json")).sort()) {
    const data = JSON.parse(readFileSync(join(root, "examples", f), "utf8"));
    list.push({ id: `example-${f}`, spec: data.spec ?? data });
  }
  return list.concat(randomSpecs(seed, nRandom));
}

const results = {};
for (const { id, spec } of corpus()) {
  const t0 = performance.now();
  let entry;
  try {
    const r = designFilter(spec);
    const text = toJson(r);
    entry = {
      hash: createHash("sha256").update(text).digest("hex").slice(0, 16),
      parts: createHash("sha256").update(toBomCsv(r)).digest("hex").slice(0, 16),
      meets: r.verification.meetsSpec,
    };
  } catch (e) {
    entry = { error: e && e.code ? e.code : String(e) };
  }
  entry.ms = Math.round((performance.now() - t0) * 10) / 10;
  results[id] = entry;
  process.stderr.write(`${id.padEnd(28)} ${String(entry.ms).padStart(9)} ms ${entry.hash ?? entry.error}\n`);
}

const compare = opt("--compare", undefined);
if (compare) {
  const before = JSON.parse(readFileSync(compare, "utf8"));
  let same = 0;
  let sameParts = 0;
  const changed = [];
  for (const [id, e] of Object.entries(results)) {
    const b = before[id];
    if (!b) continue;
    if ((b.hash ?? b.error) === (e.hash ?? e.error)) same++;
    else if (b.parts !== undefined && b.parts === e.parts && b.meets === e.meets) sameParts++;
    else changed.push(`${id}: ${b.hash ?? b.error} (meets ${b.meets}) -> ${e.hash ?? e.error} (meets ${e.meets})`);
  }
  console.log(`${same} identical, ${sameParts} with the same parts and verdict (figures differ), ${changed.length} changed`);
  for (const c of changed) console.log(`  ${c}`);
}
const out = opt("--out", undefined);
if (out) writeFileSync(out, JSON.stringify(results, null, 1));
