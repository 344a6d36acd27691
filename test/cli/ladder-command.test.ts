/**
 * filterwright ladder: a passive LC ladder from the mask options, its verdict
 * on the boards, its netlist, BOM and Markdown summary; flag errors told as flags.
 */
import { describe, expect, it } from "vitest";
import { runCli, type CliIo } from "../../src/cli/run.ts";
import { designLcLadder, lcLadderMarkdown, lcLadderNetlist, toLcLadderBomCsv } from "../../src/index.ts";

// A 30 MHz anti-alias lowpass ahead of a fast converter, 50 ohm (our own scenario).
const MASK = ["--response", "lowpass", "--pass", "30M", "--pass-loss", "1", "--stop", "60M", "--stop-atten", "40"];
const PARTS = ["--inductor-q", "80", "--inductors", "E24", "--ind-tol", "2%", "--cap-tol", "1%", "--boards", "300"];

function run(argv: readonly string[], stdin = ""): { code: number; out: string; err: string; files: Map<string, string> } {
  const out: string[] = [];
  const err: string[] = [];
  const files = new Map<string, string>();
  const io: CliIo = { stdout: (t) => void out.push(t), stderr: (t) => void err.push(t), readFile: () => stdin, readStdin: () => stdin, writeFile: (p, t) => void files.set(p, t) };
  return { code: runCli(argv, io), out: out.join(""), err: err.join(""), files };
}

describe("filterwright ladder", () => {
  it("designs the ladder, prints its verdict on the boards and its parts, exits 0 when they meet the spec", () => {
    const r = run(["ladder", ...MASK, ...PARTS, "--netlist", "l.cir", "--bom", "l.csv", "--markdown", "l.md"]);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^MEETS the spec: lowpass LC ladder, \w+ order \d+ \((shunt|series)-first\), 50 Ω source, 50 Ω load/);
    expect(r.out).toMatch(/^boards: [\d.]+ % of 300 \[/m);
    const d = designLcLadder(
      { response: "lowpass", passband: { edgeHz: "30M", maxLossDb: 1 }, stopband: { edgeHz: "60M", minAttenuationDb: 40 }, parts: { capacitorTolerance: 0.01 } },
      { inductorQ: 80, inductorSeries: "E24", inductorTolerance: 0.02, boards: 300 },
    );
    expect(r.files.get("l.cir")).toBe(lcLadderNetlist(d));
    expect(r.files.get("l.csv")).toBe(toLcLadderBomCsv(d));
    expect(r.files.get("l.md")).toBe(lcLadderMarkdown(d));
    expect(r.files.get("l.csv")?.split("\r\n")[0]).toBe("designators,part,value,rkm,series,tolerance,requirement,quantity");
    for (const p of d.parts) expect(r.out).toContain(p.designators.join(", "));
  });

  it("reads the mask from a spec file and writes the netlist to standard output with the summary on standard error", () => {
    const spec = JSON.stringify({ response: "lowpass", passband: { edgeHz: "30M", maxLossDb: 1 }, stopband: { edgeHz: "60M", minAttenuationDb: 40 } });
    const r = run(["ladder", "--spec", "s.json", ...PARTS, "--netlist", "-", "--quiet"], spec);
    expect(r.out).toMatch(/^\S.*\n[\s\S]*\.end\s*$/);
    expect(r.err).toMatch(/the spec: lowpass LC ladder/);
    expect(r.err.split("\n").filter((l) => l.length > 0).length).toBe(3);
  });

  it("tells bad ladder options and active-only flags as flags, exit 2", () => {
    const q = run(["ladder", ...MASK, "--inductor-q", "-3"]);
    expect(q.code).toBe(2);
    expect(q.err).toContain('--inductor-q "-3"');
    const g = run(["ladder", ...MASK, "--gbw", "10M"]);
    expect(g.code).toBe(2);
    expect(g.err).toContain("--gbw belongs to the design and demo commands, not to ladder");
    const f = run(["ladder", ...MASK, "--form", "shunt-frist"]);
    expect(f.code).toBe(2);
    expect(f.err).toContain("did you mean");
    const m = run(["ladder", "--response", "lowpass"]);
    expect(m.code).toBe(2);
    expect(m.err).toContain("--pass is required");
  });
});
