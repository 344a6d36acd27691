import { readdirSync, readFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { runCli } from "../../src/cli/run.ts";
import { fakeIo } from "./fake-io.ts";
import { fromJson } from "../../src/report/index.ts";

const LP = ["design", "--response", "lowpass", "--pass", "1k", "--pass-loss", "0.5", "--stop", "5k", "--stop-atten", "50"];

describe("runCli", () => {
  it("designs from options, prints the stage table and verification, exits 0", () => {
    const io = fakeIo();
    expect(runCli(LP, io)).toBe(0);
    expect(io.out).toContain("MEETS the spec");
    expect(io.out).toMatch(/stage\s+topology/);
    expect(io.out).toContain("cautions:");
  });

  it("writes the JSON, netlist, BOM and Markdown on request", () => {
    const io = fakeIo();
    const code = runCli([...LP, "--json", "d.json", "--netlist", "d.cir", "--bom", "d.csv", "--markdown", "d.md", "--svg", "d.svg"], io);
    expect(code).toBe(0);
    expect(fromJson(io.files["d.json"] as string).verification.meetsSpec).toBe(true);
    expect(io.files["d.cir"]).toContain("Vin in 0 DC 0 AC 1");
    expect(io.files["d.csv"]?.startsWith("designators,part,value")).toBe(true);
    expect(io.files["d.md"]).toContain("## Cautions");
    expect(io.files["d.svg"]?.startsWith("<svg")).toBe(true);
  });

  it("takes part tolerances as percentages into the BOM and the Monte Carlo run", () => {
    const io = fakeIo();
    const code = runCli([...LP, "--cap-tol", "2%", "--res-tol", "0.001", "--bom", "t.csv", "--yield", "50"], io);
    expect(code).toBe(0);
    const rows = (io.files["t.csv"] as string).trim().split("\n").slice(1);
    expect(rows.filter((r) => r.includes(",capacitor,")).every((r) => r.includes(",2%,"))).toBe(true);
    expect(rows.filter((r) => r.includes(",resistor,")).every((r) => r.includes(",0.1%,"))).toBe(true);
    expect(io.out).toMatch(/resistors \+-0\.1 %, capacitors \+-2\.0 %/);
    const bad = fakeIo();
    expect(runCli([...LP, "--cap-tol", "80%"], bad)).toBe(2);
    expect(bad.err).toBe('filterwright: --cap-tol "80%": expected a tolerance as a fraction (0.01 for 1 %) greater than 0 and at most 0.5, e.g. --cap-tol 2%\n');
  });

  it("prints the output noise and its largest contributors with --noise", () => {
    const io = fakeIo();
    expect(runCli([...LP, "--noise", "8n", "--noise-in", "1p"], io)).toBe(0);
    expect(io.out).toMatch(/output noise 100 Hz to 50 kHz: [\d.]+ [nµm]?V rms at the output; largest contributors: \S+ [\d.]+ %/);
    const bad = fakeIo();
    expect(runCli([...LP, "--noise", "loud"], bad)).toBe(2);
    expect(bad.err).toContain("--noise");
    const orphan = fakeIo();
    expect(runCli([...LP, "--noise-in", "1p"], orphan)).toBe(2);
  });

  it("designs every example spec in examples/", () => {
    const dir = join(dirname(fileURLToPath(import.meta.url)), "..", "..", "examples");
    const files = readdirSync(dir).filter((f) => f.endsWith(".json"));
    expect(files.length).toBeGreaterThanOrEqual(3);
    for (const f of files) {
      const io = fakeIo({ [f]: readFileSync(join(dir, f), "utf8") });
      expect(runCli(["design", "--spec", f, "--quiet"], io), `${f}: ${io.err}`).toBe(0);
    }
  });

  it("reads a spec file and lets options override it", () => {
    const spec = {
      response: "highpass",
      passband: { edgeHz: "300", maxLossDb: 1 },
      stopband: { edgeHz: 60, minAttenuationDb: 40 },
      family: "butterworth",
    };
    const io = fakeIo({ "s.json": JSON.stringify(spec) });
    expect(runCli(["design", "--spec", "s.json", "--quiet"], io)).toBe(0);
    expect(io.out).toMatch(/^meets the spec: butterworth order \d/);
    const io2 = fakeIo({ "s.json": JSON.stringify(spec) });
    expect(runCli(["design", "--spec", "s.json", "--order", "1", "--quiet"], io2)).toBe(1);
    expect(io2.out).toMatch(/^does not meet the spec: butterworth order 1/);
  });

  it("exits 2 with every spec problem listed and no stack trace", () => {
    const io = fakeIo();
    const code = runCli(["design", "--response", "lowpass", "--pass", "fast", "--pass-loss", "-1", "--stop", "5k", "--stop-atten", "50", "--family", "gaussian"], io);
    expect(code).toBe(2);
    // One line per problem, each naming the flag as typed (not the spec's field path).
    const lines = io.err.trimEnd().split("\n");
    expect(lines).toHaveLength(3);
    expect(lines[0]).toMatch(/^filterwright: --pass "fast": expected the passband edge in Hz/);
    expect(lines[1]).toMatch(/^filterwright: --pass-loss "-1": expected a loss in dB at least 0.001/);
    expect(lines[2]).toMatch(/^filterwright: --family "gaussian": expected one of "butterworth"/);
    expect(io.err).not.toContain("passband.");
    expect(io.err).not.toMatch(/\n\s+at /);
  });

  it("exits 2 on unknown options, commands and unreadable files", () => {
    for (const argv of [["design", "--colour", "red"], ["paint"], ["design", "--spec", "missing.json"], []]) {
      const io = fakeIo();
      expect(runCli(argv, io)).toBe(2);
    }
  });

  it("runs the demo scenarios", () => {
    const io = fakeIo();
    expect(runCli(["demo"], io)).toBe(0);
    expect(io.out).toContain("vibration sensor");
    expect(io.out).toContain("MEETS the spec");
    for (const scenario of ["hydrophone", "hum-notch"]) {
      const io2 = fakeIo();
      expect(runCli(["demo", "--scenario", scenario, "--quiet"], io2), io2.err).toBe(0);
    }
  });

  it("lists part sensitivities on request", () => {
    const io = fakeIo();
    expect(runCli([...LP, "--sensitivity"], io)).toBe(0);
    expect(io.out).toMatch(/stage\s+part\s+value\s+S\^f0\s+S\^Q/);
  });

  it("runs a Monte Carlo yield on request", () => {
    const io = fakeIo();
    expect(runCli([...LP, "--yield", "20", "--seed", "5"], io)).toBe(0);
    expect(io.out).toMatch(/Monte Carlo: 20 boards, resistors \+-\d\.\d %, capacitors \+-\d\.\d %/);
    expect(io.out).toMatch(/% of boards \[[\d.]+, [\d.]+\] at/);
    expect(runCli([...LP, "--yield", "zero"], fakeIo())).toBe(2);
    // The boards spread their parts as --distribution says (they were always uniform).
    const normal = fakeIo();
    expect(runCli([...LP, "--yield", "20", "--distribution", "normal", "--quiet"], normal)).toBe(0);
    expect(normal.out).toMatch(/Monte Carlo: 20 boards, .* \(normal\): /);
  });

  it("checks the op-amp outputs for clipping at the signal levels given, and fails a design that clips", () => {
    const ok = fakeIo();
    expect(runCli([...LP, "--input-peak", "1", "--swing", "10"], ok)).toBe(0);
    expect(ok.out).toMatch(/headroom at 1 V peak in, 10 V swing: worst U\d+ [\d.]+ dB/);
    expect(ok.out).toMatch(/dynamic range [\d.]+ dB \(largest unclipped input [\d.]+ V peak, output noise [\d.]+ [µnm]?V rms, resistors only\)/);
    const hot = fakeIo();
    expect(runCli([...LP, "--gain", "20", "--input-peak", "2", "--swing", "10"], hot)).toBe(1);
    expect(hot.out).toContain("(CLIPS)");
    // the verdict line says why: the mask is met, an op-amp clips (it once said "misses the mask" with a positive margin)
    expect(hot.out).toMatch(/meets the mask nominally \(margin [\d.]+ dB\) but op-amp U\d+ clips at the spec's signal levels/);
    expect(hot.out).not.toContain("misses the mask");
    expect(runCli([...LP, "--swing", "-3"], fakeIo())).toBe(2);
  });

  it("counts the op-amp's noise densities in the dynamic range when --opamp-en / --opamp-in give them", () => {
    const range = (args: string[]): number => {
      const io = fakeIo();
      expect(runCli([...LP, "--input-peak", "1", ...args], io)).toBe(0);
      const m = io.out.match(/dynamic range ([\d.]+) dB \(.*, (resistors only|resistors and op-amps)\)/);
      expect(m).not.toBeNull();
      expect(m![2]).toBe(args.length === 0 ? "resistors only" : "resistors and op-amps");
      return Number(m![1]);
    };
    const resistors = range([]);
    const en = range(["--opamp-en", "8n"]);
    const both = range(["--opamp-en", "8n", "--opamp-in", "1p"]);
    expect(en).toBeLessThan(resistors);
    expect(both).toBeLessThan(en);
    const bad = fakeIo();
    expect(runCli([...LP, "--opamp-en", "-3"], bad)).toBe(2);
    expect(bad.err).toMatch(/--opamp-en/);
  });

  it("exits 1 when the boards miss the yield target, and names it in the summary line", () => {
    const io = fakeIo();
    expect(runCli([...LP, "--cap-tol", "10%", "--res-tol", "5%", "--order", "3", "--quiet"], io)).toBe(1);
    expect(io.out).toMatch(/% of boards \[[\d.]+, [\d.]+\] at 5 % R \/ 10 % C .*target 95 %: NOT met/);
  });

  it("meets the spec in the README's command-line example", () => {
    const io = fakeIo();
    const argv = ["design", "--response", "lowpass", "--pass", "20k", "--pass-loss", "0.5", "--stop", "60k", "--stop-atten", "60", "--gain", "6", "--gbw", "10M", "--quiet"];
    expect(runCli(argv, io), io.out).toBe(0);
  });

  it("checks with a real op-amp when --gbw is given", () => {
    const io = fakeIo();
    expect(runCli([...LP, "--gbw", "10M", "--a0", "1e5", "--json", "r.json"], io)).toBe(0);
    expect(fromJson(io.files["r.json"] as string).verification.opamp).toEqual({ kind: "single-pole", a0: 1e5, gbwHz: 1e7 });
    const slow = fakeIo();
    expect(runCli([...LP, "--gbw", "2k"], slow)).toBe(1);
    expect(slow.out).toContain("GBW");
  });

  it("prints help, version and the topology list", () => {
    const io = fakeIo();
    expect(runCli(["--help"], io)).toBe(0);
    expect(io.out).toContain("usage:");
    expect(runCli(["--version"], io)).toBe(0);
    const io2 = fakeIo();
    expect(runCli(["topologies"], io2)).toBe(0);
    expect(io2.out).toContain("sallen-key-lowpass-unity");
  });
});
