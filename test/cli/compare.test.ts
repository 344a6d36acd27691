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
});
