// `npm run bench:ladder-yield [-- boards] [--write]`: Monte Carlo yield of
// the biquad cascade that designFilter builds for a sharp lowpass spec
// against the same prototype realised as a leapfrog and as an FDNR active
// ladder (filterwright/ladder/active), every realisation on the same
// preferred-value series (E96 resistors, E12 capacitors), the same part
// tolerances, the same seeded boards and the same mask check
// (monteCarlo and activeLadderMonteCarlo). The ladder is the very
// prototype the design placed: its design ripple, scaled to its natural
// frequency; its element values come from the closed-form Chebyshev I
// recurrence (G. L. Matthaei, L. Young, E. M. T. Jones, "Microwave Filters,
// Impedance-Matching Networks, and Coupling Structures", McGraw-Hill 1964,
// sec. 4.05). With --write the table is recorded in docs/benchmarks.md
// between the ladder-yield markers. Ideal op-amps, as the spec's default.
// The second table sweeps the op-amp's gain-bandwidth (single-pole op-amps,
// a0 2e5, in the spec and in every op-amp of the ladders, which are
// pre-distorted for it) at 1 % / 2 %: each ladder with every part at its
// exact value, rounded to the nearest preferred values (`retune: false`)
// and rounded then re-tuned (the default); recorded between the
// ladder-gbw markers. `gbw` or `tolerances` among the arguments runs one
// table only.
import { readFileSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

const root = join(dirname(fileURLToPath(import.meta.url)), "..");
const load = (p) => import(pathToFileURL(join(root, "dist", p)).href);
const { designFilter } = await load("index.js");
const { monteCarlo, activeLadderMonteCarlo } = await load("analysis/index.js");
const { chebyshev1 } = await load("approx/index.js");
const { fdnrLowpassLadder, leapfrogLowpassLadder } = await load("ladder/active/index.js");

const args = process.argv.slice(2);
const boards = Number(args.find((a) => /^\d+$/.test(a)) ?? 10_000);
const seed = 20_260_314;

/** The doubly terminated Chebyshev I ladder, series inductor first, 1-ohm source (odd n: 1-ohm load). */
function chebyshevLadder(n, rippleDb) {
  const beta = Math.log(1 / Math.tanh(rippleDb / (40 / Math.LN10)));
  const gamma = Math.sinh(beta / (2 * n));
  const a = (k) => Math.sin(((2 * k - 1) * Math.PI) / (2 * n));
  const b = (k) => gamma ** 2 + Math.sin((k * Math.PI) / n) ** 2;
  const g = [(2 * a(1)) / gamma];
  for (let k = 2; k <= n; k++) g.push((4 * a(k - 1) * a(k)) / (b(k - 1) * g[k - 2]));
  if (n % 2 === 0) throw new Error("odd orders only here (equal terminations)");
  const z = chebyshev1(n, { rippleDb });
  return {
    family: "chebyshev1",
    order: n,
    form: "series-first",
    sourceOhms: 1,
    loadOhms: 1,
    elements: g.map((value, i) => ({ kind: i % 2 === 0 ? "series-L" : "shunt-C", value })),
    transfer: { zeros: z.zeros, poles: z.poles, gain: z.gain / 2 },
  };
}

// Our own scenario: the anti-alias lowpass ahead of a converter sampling at 52 kHz, flat to
// 18 kHz within 0.25 dB and 33 dB down from its Nyquist frequency: a 7th-order Chebyshev I.
const base = {
  response: "lowpass",
  passband: { edgeHz: 18_000, maxLossDb: 0.25 },
  stopband: { edgeHz: 26_000, minAttenuationDb: 33 },
  family: "chebyshev1",
  order: 7,
};
const tolerances = [
  [0.01, 0.02],
  [0.01, 0.05],
  [0.001, 0.01],
];
const pct = (x, digits = 1) => `${(100 * x).toFixed(digits)} %`;
const only = args.find((a) => a === "gbw" || a === "tolerances");
const tables = [];

if (only !== "gbw") {
  const rows = [];
  for (const [rt, ct] of tolerances) {
    const design = designFilter({ ...base, parts: { resistorSeries: "E96", capacitorSeries: "E12", resistorTolerance: rt, capacitorTolerance: ct } });
    const ladder = chebyshevLadder(7, design.placement.designRippleDb);
    const edgeHz = design.placement.chosenHz;
    const runs = [
      ["biquad cascade", design.stages.reduce((n, s) => n + s.opamps.length, 0), monteCarlo(design, { runs: boards, seed })],
      ...[
        ["leapfrog ladder", leapfrogLowpassLadder(ladder, { edgeHz })],
        ["FDNR ladder", fdnrLowpassLadder(ladder, { edgeHz })],
      ].map(([name, l]) => [name, l.opampCount, activeLadderMonteCarlo(design, l, { runs: boards, seed })]),
    ];
    for (const [name, opamps, r] of runs) {
      rows.push(
        `| ${(rt * 100).toString()} % / ${(ct * 100).toString()} % | ${name} | ${opamps} | ${pct(r.yield)} ± ${pct(r.yieldStandardError, 2)} | ${r.marginDb.median.toFixed(3)} | ${r.marginDb.min.toFixed(3)} |`,
      );
    }
  }
  const table = [
    `${boards} boards per row (seed ${seed}), uniform spread within each tolerance, ideal op-amps; design ripple and natural frequency from designFilter's placement; the ladders' resistors re-tuned after rounding.`,
    "",
    "| R / C tolerance | realisation | op-amps | yield | median margin, dB | worst margin, dB |",
    "|---|---|---|---|---|---|",
    ...rows,
  ].join("\n");
  tables.push(["ladder-yield", table]);
}

if (only !== "tolerances") {
  const gbws = [3e6, 10e6, 30e6, 100e6, 1e9];
  const parts = { resistorSeries: "E96", capacitorSeries: "E12", resistorTolerance: 0.01, capacitorTolerance: 0.02 };
  const nominal = (design, l) => activeLadderMonteCarlo(design, l, { runs: 1, resistorTolerance: 0, capacitorTolerance: 0 }).marginDb.min;
  const rows = [];
  const swing = {};
  for (const [name, make] of [["leapfrog", leapfrogLowpassLadder], ["FDNR", fdnrLowpassLadder]]) {
    for (const gbwHz of gbws) {
      const design = designFilter({ ...base, parts, opamp: { a0: 2e5, gbwHz } });
      const ladder = chebyshevLadder(7, design.placement.designRippleDb);
      const edgeHz = design.placement.chosenHz;
      const opamp = { kind: "single-pole", a0: 2e5, gbwHz };
      const cells = [];
      for (const [key, options] of [["exact", { values: "exact" }], ["rounded", { retune: false }], ["retuned", {}]]) {
        const l = make(ladder, { edgeHz, opamp, ...options });
        const r = activeLadderMonteCarlo(design, l, { runs: boards, seed });
        (swing[`${name} ${key}`] ??= []).push(r.yield);
        const tune = key === "retuned" && l.retune !== null ? `, ${l.retune.moved} moved, ${l.retune.errorBeforeDb.toFixed(3)} → ${l.retune.errorAfterDb.toFixed(3)} dB` : "";
        cells.push(`${pct(r.yield)} (${nominal(design, l).toFixed(3)} dB${tune})`);
      }
      rows.push(`| ${name} | ${gbwHz / 1e6} MHz | ${cells.join(" | ")} |`);
    }
  }
  const range = (k) => `${pct(Math.min(...swing[k]))} to ${pct(Math.max(...swing[k]))}`;
  const table = [
    `${boards} boards per cell (seed ${seed}), 1 % resistors (E96), 2 % capacitors (E12), uniform spread; single-pole op-amps (a0 2e5) of the gain-bandwidth shown in the spec and in every op-amp of the ladders, which are pre-distorted for it. Each cell: yield (nominal margin with no spread; for the re-tuned ladders the resistors moved and the largest pole error before → after, see \`ActiveLadderRetune\`).`,
    "",
    "| ladder | op-amp GBW | exact values | rounded to the nearest | rounded, then re-tuned |",
    "|---|---|---|---|---|",
    ...rows,
    "",
    `Yield range over the five gain-bandwidths: leapfrog ${range("leapfrog exact")} exact, ${range("leapfrog rounded")} rounded, ${range("leapfrog retuned")} re-tuned; FDNR ${range("FDNR exact")}, ${range("FDNR rounded")}, ${range("FDNR retuned")}.`,
  ].join("\n");
  tables.push(["ladder-gbw", table]);
}

for (const [, table] of tables) console.log(`${table}\n`);
if (args.includes("--write")) {
  const path = join(root, "docs", "benchmarks.md");
  let doc = readFileSync(path, "utf8");
  const date = new Date().toISOString().slice(0, 10);
  for (const [marker, table] of tables) {
    const start = `<!-- ${marker}:start -->`;
    const end = `<!-- ${marker}:end -->`;
    const i = doc.indexOf(start);
    const j = doc.indexOf(end);
    if (i < 0 || j < i) throw new Error(`docs/benchmarks.md lacks the ${marker} markers`);
    doc = `${doc.slice(0, i + start.length)}\n${date}: ${table}\n${doc.slice(j)}`;
  }
  writeFileSync(path, doc);
}
