import { describe, expect, it } from "vitest";
import { runCli, type CliIo } from "../../src/cli/run.ts";

describe("filterwright design --compare", () => {
  it("prints the cascade and the active ladders with their yields and the choice", () => {
    const out: string[] = [];
    const io: CliIo = { stdout: (t) => void out.push(t), stderr: () => undefined, readFile: () => "", readStdin: () => "", writeFile: () => undefined };
    const code = runCli(["design", "--response", "lowpass", "--pass", "18k", "--pass-loss", "0.25", "--stop", "26k", "--stop-atten", "33", "--family", "chebyshev1", "--order", "7", "--compare", "--yield", "300"], io);
    expect([0, 1]).toContain(code);
    const text = out.join("");
    expect(text).toMatch(/realisations on 300 boards each at 1\.0 % R \/ \d\.\d % C \(seed \d+\):/);
    for (const m of ["biquad-cascade", "leapfrog", "fdnr"]) expect(text).toMatch(new RegExp(`^${m}\\s+\\d+\\s+\\d+\\s+\\d+\\.\\d %`, "m"));
    expect(text).toMatch(/^choice: the (biquad cascade|leapfrog active ladder|fdnr active ladder): /m);
  });

  it("writes the chosen realisation's netlist and BOM, and the comparison into the report", () => {
    const files = new Map<string, string>();
    const io: CliIo = { stdout: () => undefined, stderr: () => undefined, readFile: () => "", readStdin: () => "", writeFile: (p, t) => void files.set(p, t) };
    const argv = ["design", "--response", "lowpass", "--pass", "18k", "--pass-loss", "0.25", "--stop", "26k", "--stop-atten", "33", "--family", "chebyshev1", "--order", "7", "--yield", "300", "--netlist", "f.cir", "--bom", "f.csv", "--markdown", "f.md"];
    runCli([...argv, "--compare"], io);
    const chosen = files.get("f.md")?.match(/\| \*\*([a-z-]+)\*\* \|/)?.[1];
    expect(files.get("f.md")).toContain("## Realisations compared");
    // at 1 % R / 5 % C no realisation reaches 95 %: the leapfrog ladder comes closest (about 25 % against 0.4 % for the cascade)
    expect(chosen).toBe("leapfrog");
    expect(files.get("f.cir")).toContain("as an active ladder (leapfrog");
    expect(files.get("f.csv")?.split("\r\n").some((l) => l.startsWith('"R') && l.includes(",resistor,"))).toBe(true);
    const plain = new Map<string, string>();
    runCli(argv, { ...io, writeFile: (p, t) => void plain.set(p, t) });
    expect(plain.get("f.md")).not.toContain("## Realisations compared");
    expect(plain.get("f.cir")).not.toContain("as an active ladder");
  });
});

describe("filterwright design --realisation", () => {
  const argv = ["design", "--response", "lowpass", "--pass", "18k", "--pass-loss", "0.25", "--stop", "26k", "--stop-atten", "33", "--family", "chebyshev1", "--order", "7", "--res-tol", "1%", "--cap-tol", "2%", "--yield-target", "50%"];

  it("auto writes the chosen ladder, and the exit code follows the ladder's boards", () => {
    const files = new Map<string, string>();
    const out: string[] = [];
    const io: CliIo = { stdout: (t) => void out.push(t), stderr: () => undefined, readFile: () => "", readStdin: () => "", writeFile: (p, t) => void files.set(p, t) };
    // the cascade's boards miss a 50 % target at 1 % R / 2 % C (about 4 %), the ladders' meet it (about 73-79 %)
    const code = runCli([...argv, "--realisation", "auto", "--netlist", "f.cir", "--markdown", "f.md"], io);
    expect(code).toBe(0);
    const text = out.join("");
    expect(text).toMatch(/^MEETS the spec: realised as the fdnr active ladder \(7 op-amps\)/m);
    expect(text).toMatch(/^choice: the fdnr active ladder: /m);
    expect(files.get("f.cir")).toContain("as an active ladder (fdnr");
    expect(files.get("f.md")).toContain("realised as the fdnr active ladder");
    const cascade = runCli([...argv, "--quiet"], { ...io, stdout: () => undefined });
    expect(cascade).toBe(1);
  });

  it("refuses --realisation with --compare, a misspelt value, and lc-ladder from a spec file", () => {
    const err: string[] = [];
    const io: CliIo = { stdout: () => undefined, stderr: (t) => void err.push(t), readFile: () => JSON.stringify({ realisation: "lc-ladder" }), readStdin: () => "", writeFile: () => undefined };
    expect(runCli([...argv, "--realisation", "auto", "--compare"], io)).toBe(2);
    expect(err.join("")).toContain("--realisation already compares the realisations");
    expect(runCli([...argv, "--realisation", "autp"], io)).toBe(2);
    expect(err.join("")).toContain('did you mean "auto"');
    expect(runCli([...argv, "--spec", "s.json"], io)).toBe(2);
    expect(err.join("")).toContain("filterwright ladder");
  });
});

describe("filterwright design --svg --plot", () => {
  it("draws the kind asked for, and refuses --plot without --svg or with an unknown kind", () => {
    const files = new Map<string, string>();
    const err: string[] = [];
    const io: CliIo = { stdout: () => undefined, stderr: (t) => void err.push(t), readFile: () => "", readStdin: () => "", writeFile: (p, t) => void files.set(p, t) };
    const argv = ["design", "--response", "lowpass", "--pass", "2k", "--pass-loss", "0.5", "--stop", "8k", "--stop-atten", "50"];
    expect([0, 1]).toContain(runCli([...argv, "--svg", "p.svg", "--plot", "phase"], io));
    expect(files.get("p.svg")).toMatch(/^<svg/);
    expect(files.get("p.svg")).toContain("Phase");
    expect(runCli([...argv, "--plot", "phase"], io)).toBe(2);
    expect(err.join("")).toContain("--plot chooses what --svg draws");
    expect(runCli([...argv, "--svg", "p.svg", "--plot", "phsae"], io)).toBe(2);
    expect(err.join("")).toContain("did you mean");
  });
});
