// Benchmark harness: times one call of our code (median of repeated batches)
// and, where a benchmark gives a python snippet, the scipy/numpy equivalent
// in the same run, so the ratio is measured on the same machine at the same time.
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

/**
 * Time a zero-argument function. Warms up, sizes a batch to ~50 ms, then takes
 * the median per-call time over `batches` batches.
 * @param {() => unknown} fn
 * @param {{ batches?: number, targetBatchMs?: number }} [options]
 * @returns {{ perCallS: number, callsPerBatch: number, batches: number }}
 */
export function timeIt(fn, options = {}) {
  const batches = options.batches ?? 9;
  const targetMs = options.targetBatchMs ?? 50;
  let sink = 0;
  // warm-up and batch sizing
  let n = 1;
  for (;;) {
    const t0 = performance.now();
    for (let i = 0; i < n; i++) sink += fn() === undefined ? 0 : 1;
    const dt = performance.now() - t0;
    if (dt >= targetMs || n >= 1 << 24) break;
    n = Math.max(n * 2, Math.ceil((n * targetMs) / Math.max(dt, 0.01)));
    if (n > 1 << 24) n = 1 << 24;
  }
  const samples = [];
  for (let b = 0; b < batches; b++) {
    const t0 = performance.now();
    for (let i = 0; i < n; i++) sink += fn() === undefined ? 0 : 1;
    samples.push((performance.now() - t0) / 1000 / n);
  }
  samples.sort((a, b) => a - b);
  if (sink < 0) console.log(sink);
  return { perCallS: samples[Math.floor(samples.length / 2)], callsPerBatch: n, batches };
}

const PY_WRAPPER = `
import json, sys, timeit
ns = {}
exec(compile(sys.stdin.read(), "<bench>", "exec"), ns)
run = ns["run"]
t = timeit.Timer(run)
n, _ = t.autorange()
n = max(n, 1)
samples = sorted(x / n for x in t.repeat(repeat=7, number=n))
print(json.dumps({"perCallS": samples[len(samples) // 2], "callsPerBatch": n}))
`;

/**
 * Time a python snippet that defines `run()` (one call of the reference code).
 * @param {string} source python source defining run()
 * @returns {{ perCallS: number, callsPerBatch: number } | { error: string }}
 */
export function timePython(source) {
  const r = spawnSync("python3", ["-c", PY_WRAPPER], { input: source, encoding: "utf8", timeout: 300_000 });
  if (r.status !== 0) return { error: (r.stderr || r.stdout || "python failed").trim().split("\n").slice(-1)[0] };
  try {
    return JSON.parse(r.stdout.trim().split("\n").slice(-1)[0]);
  } catch {
    return { error: `unreadable python output: ${r.stdout.slice(0, 200)}` };
  }
}

/** Versions of the python reference stack, for the record. */
export function pythonVersions() {
  const r = spawnSync(
    "python3",
    ["-c", "import sys, scipy, numpy; print(sys.version.split()[0], scipy.__version__, numpy.__version__)"],
    { encoding: "utf8" },
  );
  if (r.status !== 0) return "python3 with scipy not available";
  const [py, sp, np] = r.stdout.trim().split(" ");
  return `Python ${py}, scipy ${sp}, numpy ${np}`;
}

/** Format seconds per call in engineering style. */
export function formatTime(s) {
  if (!Number.isFinite(s)) return "n/a";
  if (s >= 1) return `${s.toFixed(3)} s`;
  if (s >= 1e-3) return `${(s * 1e3).toFixed(3)} ms`;
  if (s >= 1e-6) return `${(s * 1e6).toFixed(3)} µs`;
  return `${(s * 1e9).toFixed(1)} ns`;
}

/**
 * Time one Monte Carlo trial in ngspice's own control language on a design's
 * netlist: each trial alters every resistor and capacitor uniformly within its
 * tolerance (`sunif`), runs an AC sweep over the mask's bands at the density
 * filterwright's mask check uses (about 130 points per decade in the
 * passband, 200 in the stopband) and measures the band extremes with `meas`.
 * The per-trial time is the difference of two runs (many and few trials), so
 * ngspice's start-up and parsing are not counted.
 * @param {string} netlist the SPICE netlist (`toSpiceNetlist`)
 * @param {{ resistor: number, capacitor: number }} tolerance fractions
 * @param {{ pass: [number, number][], stop: [number, number][] }} bands Hz intervals
 * @returns {{ perCallS: number } | { error: string }}
 */
export function timeNgspiceMonteCarlo(netlist, tolerance, bands) {
  const lines = netlist.split("\n").filter((l) => !/^\.(ac|end)\b/i.test(l.trim()));
  const parts = lines.filter((l) => /^[RC]\w*\s/i.test(l)).map((l) => l.trim().split(/\s+/));
  const body = (trials) => {
    const alters = parts.map(([name, , , value]) => {
      const t = name.toUpperCase().startsWith("C") ? tolerance.capacitor : tolerance.resistor;
      return `  alter ${name} = ${value}*(1 + ${t}*sunif(0))`;
    });
    const sweeps = [];
    bands.pass.forEach(([a, b], i) => {
      sweeps.push(`  ac dec 130 ${a} ${b}`, `  meas ac pmax${i} MAX vdb(out) from=${a} to=${b}`, `  meas ac pmin${i} MIN vdb(out) from=${a} to=${b}`);
    });
    bands.stop.forEach(([a, b], i) => {
      sweeps.push(`  ac dec 200 ${a} ${b}`, `  meas ac smax${i} MAX vdb(out) from=${a} to=${b}`);
    });
    return [...lines, ".control", "set noaskquit", "let k = 0", `while k < ${trials}`, ...alters, ...sweeps, "  destroy all", "  let k = k + 1", "end", "quit", ".endc", ".end", ""].join("\n");
  };
  const dir = mkdtempSync(join(tmpdir(), "fw-bench-"));
  const run = (trials) => {
    const file = join(dir, `mc${trials}.cir`);
    writeFileSync(file, body(trials));
    const t0 = performance.now();
    const r = spawnSync("ngspice", ["-b", file], { encoding: "utf8", timeout: 600_000 });
    const dt = (performance.now() - t0) / 1000;
    if (r.status !== 0 || /error/i.test(r.stderr ?? "")) return { error: (r.stderr || r.stdout || "ngspice failed").trim().split("\n").slice(-1)[0] };
    return { seconds: dt };
  };
  const few = run(20);
  const many = run(220);
  if ("error" in few) return few;
  if ("error" in many) return many;
  return { perCallS: (many.seconds - few.seconds) / 200 };
}
