// `npm run bench:parallel`: wall-clock time of one 20,000-board Monte Carlo
// run of the 8th-order Chebyshev I lowpass of bench/analysis.bench.mjs, in
// the main thread (`monteCarlo`) and on 1 and 2 worker threads
// (`monteCarloParallel`, filterwright/node). The bench runner times
// synchronous calls only, so this script times the asynchronous run itself:
// the three take turns for `rounds` rounds and the median of each is
// printed, with the speed-up and the cores the run had (the process's CPU
// time over the wall-clock time: on a busy machine the second worker may
// not get a core of its own). Every parallel result is checked to be the
// main thread's. Prints the figures; nothing is written (docs/benchmarks.md
// records them by hand).
import { dirname, join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { cpus } from "node:os";

const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const { designFilter, monteCarlo } = await import(pathToFileURL(join(root, "dist", "index.js")).href);
const { monteCarloParallel } = await import(pathToFileURL(join(root, "dist", "node", "index.js")).href);
const boards = Number(process.argv[2] ?? 20_000);
const rounds = Number(process.argv[3] ?? 5);
const spec = {
  response: "lowpass",
  passband: { edgeHz: 10000, maxLossDb: 0.5 },
  stopband: { edgeHz: 19000, minAttenuationDb: 70 },
  family: "chebyshev1",
  order: 8,
};
const result = designFilter(spec);
const reference = JSON.stringify(monteCarlo(result, { runs: 256 })); // warm-up
void reference;

const cases = [
  { name: "monteCarlo (main thread)", run: async () => monteCarlo(result, { runs: boards }) },
  { name: "monteCarloParallel, threads 1", run: () => monteCarloParallel(result, { runs: boards, threads: 1 }) },
  { name: "monteCarloParallel, threads 2", run: () => monteCarloParallel(result, { runs: boards, threads: 2 }) },
];
const seconds = cases.map(() => []);
// the process's CPU time (every thread) over the wall-clock time: the cores the run actually had
const cores = cases.map(() => []);
let expected;
for (let r = 0; r < rounds; r++) {
  for (const [i, c] of cases.entries()) {
    const t0 = performance.now();
    const cpu0 = process.cpuUsage();
    const out = JSON.stringify(await c.run());
    const wall = (performance.now() - t0) / 1000;
    const cpu = process.cpuUsage(cpu0);
    seconds[i].push(wall);
    cores[i].push((cpu.user + cpu.system) / 1e6 / wall);
    expected ??= out;
    if (out !== expected) throw new Error(`${c.name}: a different result from the main thread's`);
  }
}
const median = (xs) => [...xs].sort((a, b) => a - b)[xs.length >> 1];
const m = seconds.map(median);
console.log(`${boards} boards, ${rounds} rounds, ${cpus().length} cores (${cpus()[0]?.model ?? "unknown CPU"}), Node ${process.version}; median wall-clock:`);
cases.forEach((c, i) => {
  console.log(
    `  ${c.name.padEnd(32)} ${m[i].toFixed(3)} s  (${((m[i] / boards) * 1e6).toFixed(1)} µs per board; cores used ${median(cores[i]).toFixed(2)}; all: ${seconds[i].map((s) => s.toFixed(2)).join(", ")})`,
  );
});
console.log(`  speed-up, threads 1 -> 2: ${(m[1] / m[2]).toFixed(2)}x; main thread -> threads 2: ${(m[0] / m[2]).toFixed(2)}x`);
