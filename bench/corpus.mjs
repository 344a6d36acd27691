// `npm run bench:corpus [-- N]`: design N seeded random valid specs
// (scripts/spec-corpus.mjs: every response, family, op-amp and series; 2,000 by
// default) with the built package, one call each, and report the distribution
// of designFilter's time: median, 90th percentile, slowest, and how many took
// over 500 ms. With --write it records the figures in docs/benchmarks.md
// between the corpus markers. No reference program: no other tool designs
// parts from a spec; the figures stand against the targets
// (median <= 10 ms, none over 500 ms).
import { readFileSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { performance } from "node:perf_hooks";
import { randomSpecs } from "../scripts/spec-corpus.mjs";

const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const { designFilter } = await import(join(root, "dist", "index.js"));
const args = process.argv.slice(2);
const n = Number(args.find((a) => /^\d+$/.test(a)) ?? 2000);
const seed = 20261201;

const specs = randomSpecs(seed, n);
for (const { spec } of specs.slice(0, 5)) designFilter(spec); // warm-up
const times = [];
const slow = [];
let failed = 0;
let met = 0;
for (const { id, spec } of specs) {
  const t0 = performance.now();
  try {
    if (designFilter(spec).verification.meetsSpec) met++;
  } catch {
    failed++;
  }
  const ms = performance.now() - t0;
  times.push(ms);
  if (ms > 500) slow.push(`${id} ${ms.toFixed(0)} ms`);
}
times.sort((a, b) => a - b);
const q = (p) => times[Math.min(times.length - 1, Math.floor(p * times.length))];
const line =
  `${n} random valid specs (seed ${seed}): median ${q(0.5).toFixed(1)} ms, 90th percentile ${q(0.9).toFixed(1)} ms, ` +
  `slowest ${times[times.length - 1].toFixed(0)} ms, ${slow.length} over 500 ms; ${met} meet their mask as built, ${failed} threw`;
console.log(line);
for (const s of slow.slice(0, 20)) console.log(`  ${s}`);
if (args.includes("--write")) {
  const path = join(root, "docs", "benchmarks.md");
  const doc = readFileSync(path, "utf8");
  const start = "<!-- corpus:start -->";
  const end = "<!-- corpus:end -->";
  const i = doc.indexOf(start);
  const j = doc.indexOf(end);
  if (i < 0 || j < i) throw new Error("docs/benchmarks.md lacks the corpus markers");
  const date = new Date().toISOString().slice(0, 10);
  writeFileSync(path, `${doc.slice(0, i + start.length)}\n${date}: ${line}.\n${doc.slice(j)}`);
}
