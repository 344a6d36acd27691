/**
 * Run ngspice in batch mode on a netlist and read back an AC analysis.
 *
 * Tests that need ngspice are declared with `it.skipIf(!requireNgspice())`
 * (or `describe.skipIf`): when ngspice is missing they show as skipped
 * locally, but under CI (the CI environment variable set) they run and FAIL,
 * because every simulation first calls {@link assertNgspice}. So a CI machine
 * without ngspice can never pass silently, and the file's other tests still run.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

let cached: boolean | undefined;

/** True when an `ngspice` binary is on the PATH. */
export function hasNgspice(): boolean {
  if (cached === undefined) {
    const r = spawnSync("ngspice", ["--version"], { encoding: "utf8" });
    cached = r.status === 0 || (r.stdout ?? "").includes("ngspice");
  }
  return cached;
}

/**
 * Whether the ngspice tests run, for `it.skipIf(!requireNgspice())`: true when
 * ngspice is on the PATH, false locally without it (the tests are skipped),
 * and always true under CI, where a missing ngspice then fails each test in
 * {@link assertNgspice}.
 */
export function requireNgspice(): boolean {
  return hasNgspice() || Boolean(process.env["CI"]);
}

/** Throw when ngspice is not on the PATH. Every simulation calls this first. */
export function assertNgspice(): void {
  if (!hasNgspice()) throw new Error("ngspice is required (the CI environment variable is set) but was not found on the PATH");
}

/**
 * The netlist without its `.control` blocks (an exported design's mask
 * check), so a harness's own control block is the only one that runs.
 *
 * @param netlist - SPICE netlist text
 */
export function withoutControl(netlist: string): string {
  return netlist.replace(/^\.control\s*$[\s\S]*?^\.endc\s*$\n?/gim, "");
}

/** One AC sweep read back from ngspice: frequencies (Hz) and complex values of the probed vectors. */
export interface AcResult {
  /** Frequencies in Hz. */
  readonly freqHz: Float64Array;
  /** Real and imaginary parts per probed vector name (lower-case). */
  readonly vectors: Record<string, { re: Float64Array; im: Float64Array }>;
}

/**
 * Simulate a netlist that contains an `.ac` card and return the complex
 * voltages of the given nodes at every frequency.
 *
 * @param netlist - SPICE netlist text (ends with `.end`)
 * @param nodes - node names to read, e.g. `["out"]`
 */
export function runAc(netlist: string, nodes: readonly string[]): AcResult {
  assertNgspice();
  const dir = mkdtempSync(join(tmpdir(), "fw-ngspice-"));
  try {
    const cir = join(dir, "circuit.cir");
    const out = join(dir, "out.txt");
    const body = withoutControl(netlist).replace(/\n\.end\s*$/i, "\n");
    const probes = nodes.map((n) => `v(${n})`).join(" ");
    const control = [
      ".control",
      "set wr_singlescale",
      "set wr_vecnames",
      "set filetype=ascii",
      "option numdgt=15",
      "run",
      `wrdata ${out} ${probes}`,
      "quit",
      ".endc",
      ".end",
      "",
    ].join("\n");
    writeFileSync(cir, `${body}\n${control}`);
    const r = spawnSync("ngspice", ["-b", cir], { encoding: "utf8", timeout: 120_000 });
    if (r.status !== 0) {
      throw new Error(`ngspice failed (${r.status}): ${r.stderr}\n${r.stdout}`);
    }
    const text = readFileSync(out, "utf8").trim().split("\n");
    const header = (text[0] ?? "").trim().split(/\s+/);
    const rows = text.slice(1).map((l) => l.trim().split(/\s+/).map(Number));
    const n = rows.length;
    const freqHz = new Float64Array(n);
    const vectors: Record<string, { re: Float64Array; im: Float64Array }> = {};
    // wr_singlescale + complex vectors: frequency, then re/im pairs per vector.
    for (const name of nodes) vectors[name.toLowerCase()] = { re: new Float64Array(n), im: new Float64Array(n) };
    for (let i = 0; i < n; i++) {
      const row = rows[i] as number[];
      freqHz[i] = row[0] as number;
      nodes.forEach((name, k) => {
        const v = vectors[name.toLowerCase()] as { re: Float64Array; im: Float64Array };
        v.re[i] = row[1 + 2 * k] as number;
        v.im[i] = row[2 + 2 * k] as number;
      });
    }
    void header;
    return { freqHz, vectors };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * Largest |dB difference| between two complex responses on the same
 * frequencies, over the points where `reference` is above `floorDb`.
 *
 * @param a - one response
 * @param reference - the other (its level picks the points compared)
 * @param floorDb - points below this level of `reference` are skipped
 */
export function worstDbGap(a: { re: Float64Array; im: Float64Array }, reference: { re: Float64Array; im: Float64Array }, floorDb = -100): { worst: number; points: number } {
  let worst = 0;
  let points = 0;
  for (let i = 0; i < reference.re.length; i++) {
    const x = 10 * Math.log10((a.re[i] as number) ** 2 + (a.im[i] as number) ** 2);
    const y = 10 * Math.log10((reference.re[i] as number) ** 2 + (reference.im[i] as number) ** 2);
    if (!(y > floorDb)) continue;
    points++;
    worst = Math.max(worst, Math.abs(x - y));
  }
  return { worst, points };
}
