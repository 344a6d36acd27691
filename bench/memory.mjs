// `npm run bench:memory`: resident memory of a 100,000-board Monte Carlo run
// of the 8th-order Chebyshev I lowpass (the per-board benchmark's design),
// read from the process's peak resident set size (getrusage maxrss), against
// the 200 MB budget. Prints the figure; nothing is written.
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { resourceUsage } from "node:process";

const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const { designFilter, monteCarlo } = await import(join(root, "dist", "index.js"));
const boards = Number(process.argv[2] ?? 100_000);
const result = designFilter({
  response: "lowpass",
  passband: { edgeHz: 10000, maxLossDb: 0.5 },
  stopband: { edgeHz: 19000, minAttenuationDb: 70 },
  family: "chebyshev1",
  order: 8,
});
const before = resourceUsage().maxRSS / 1024;
const t0 = performance.now();
const mc = monteCarlo(result, { runs: boards });
const seconds = (performance.now() - t0) / 1000;
const peak = resourceUsage().maxRSS / 1024;
console.log(
  `${boards} boards in ${seconds.toFixed(1)} s (${((seconds / boards) * 1e6).toFixed(1)} µs per board), yield ${mc.yield}; ` +
    `peak resident ${peak.toFixed(0)} MB (${before.toFixed(0)} MB before the run)`,
);
