import { describe, expect, it } from "vitest";
import { designFilter, type FilterSpec } from "../../src/design/index.ts";
import { monteCarlo } from "../../src/analysis/index.ts";
import { CancelledError, InvalidArgumentError } from "../../src/errors.ts";
import type { Progress } from "../../src/evaluate/progress.ts";
import { runCli, type CliIo } from "../../src/cli/run.ts";
import { thrownBy } from "../helpers/throws.ts";

// a 2 kHz lowpass for a pressure-sensor logger (our own scenario), tolerances fixed so the yield ladder climbs
const spec: FilterSpec = {
  response: "lowpass",
  passband: { edgeHz: "2k", maxLossDb: 0.5 },
  stopband: { edgeHz: "6k", minAttenuationDb: 50 },
  family: "chebyshev1",
};
const plain = designFilter(spec);

describe("designFilter control", () => {
  it("reports each step in order of time and designs exactly what it designs unwatched", () => {
    const seen: Progress[] = [];
    const r = designFilter(spec, { onProgress: (p) => void seen.push(p) });
    expect(r).toEqual(plain);
    const steps = new Set(seen.map((p) => p.step));
    for (const s of ["family", "search", "yield", "boards", "result"] as const) expect(steps.has(s), s).toBe(true);
    expect(seen[0]?.step).toBe("family");
    expect(seen[seen.length - 1]?.step).toBe("result");
    for (let i = 1; i < seen.length; i++) expect(seen[i]!.elapsedMs).toBeGreaterThanOrEqual(seen[i - 1]!.elapsedMs);
    for (const p of seen.filter((q) => q.step === "boards")) {
      expect(p.boards).toBeGreaterThanOrEqual(0);
      expect(p.boards).toBeLessThan(p.totalBoards!);
    }
    expect(seen.some((p) => /^yield: chebyshev1 order \d+, the nominal design/.test(p.message))).toBe(true);
  });

  it("stops when the callback returns false, when the signal is aborted, and when the time runs out", () => {
    const byCallback = thrownBy(() => designFilter(spec, { onProgress: (p) => p.step !== "yield" }), CancelledError);
    expect(byCallback.code).toBe("CANCELLED");
    expect(byCallback.path).toBe("control.onProgress");
    expect(byCallback.message).toMatch(/stopped by onProgress at "yield: chebyshev1/);
    const controller = new AbortController();
    const bySignal = thrownBy(() => designFilter(spec, { signal: controller.signal, onProgress: (p) => void (p.step === "boards" && controller.abort()) }), CancelledError);
    expect(bySignal.path).toBe("control.signal");
    const byTime = thrownBy(() => designFilter({ ...spec, parts: { capacitorTolerance: 0.1, resistorTolerance: 0.05 }, order: 9 }, { timeLimitMs: 1 }), CancelledError);
    expect(byTime.path).toBe("control.timeLimitMs");
    expect(byTime.message).toMatch(/time limit of 1 ms ran out/);
    // a stopped run leaves nothing behind: the next one is watched afresh, and an unwatched one is as before
    expect(designFilter(spec)).toEqual(plain);
    expect(designFilter(spec, { timeLimitMs: 600_000 })).toEqual(plain);
  });

  it("refuses a control it cannot use, naming the field", () => {
    expect(thrownBy(() => designFilter(spec, { onProgress: 3 } as never), InvalidArgumentError).path).toBe("control.onProgress");
    expect(thrownBy(() => designFilter(spec, { signal: {} } as never), InvalidArgumentError).path).toBe("control.signal");
    for (const t of [0, -1, Number.NaN, Infinity, 1e12]) expect(thrownBy(() => designFilter(spec, { timeLimitMs: t }), InvalidArgumentError).path).toBe("control.timeLimitMs");
    expect(thrownBy(() => designFilter(spec, 7 as never), InvalidArgumentError).path).toBe("control");
  });
});

describe("monteCarlo control", () => {
  it("reports every batch of boards after the first and gives the same boards watched or not", () => {
    const seen: Progress[] = [];
    const a = monteCarlo(plain, { runs: 1000, onProgress: (p) => void seen.push(p) });
    const b = monteCarlo(plain, { runs: 1000 });
    expect(a).toEqual(b);
    expect(seen.map((p) => p.boards)).toEqual([0, 256, 512, 768]);
    expect(seen.every((p) => p.totalBoards === 1000 && p.step === "boards")).toBe(true);
  });

  it("stops part-way when asked", () => {
    const e = thrownBy(() => monteCarlo(plain, { runs: 2000, onProgress: (p) => (p.boards ?? 0) < 512 }), CancelledError);
    expect(e.path).toBe("options.onProgress");
    expect(e.fn).toBe("monteCarlo");
    expect(thrownBy(() => monteCarlo(plain, { runs: 10, timeLimitMs: 0 }), InvalidArgumentError).path).toBe("options.timeLimitMs");
  });
});

describe("filterwright --progress", () => {
  it("prints the steps on standard error and the summary as before", () => {
    const out: string[] = [];
    const err: string[] = [];
    const io: CliIo = { stdout: (t) => void out.push(t), stderr: (t) => void err.push(t), readFile: () => "", readStdin: () => "", writeFile: () => undefined };
    const argv = ["design", "--response", "lowpass", "--pass", "2k", "--pass-loss", "0.5", "--stop", "6k", "--stop-atten", "50", "--family", "chebyshev1", "--quiet"];
    const quietOut: string[] = [];
    const code = runCli(argv, { ...io, stdout: (t) => void quietOut.push(t) });
    expect(runCli([...argv, "--progress"], io)).toBe(code);
    expect(out.join("")).toBe(quietOut.join(""));
    const lines = err.join("").trimEnd().split("\n");
    expect(lines[0]).toMatch(/^\[\d+\.\d s\] family and order$/);
    expect(lines.some((l) => /^\[\d+\.\d s\] yield: chebyshev1 order \d+/.test(l))).toBe(true);
    expect(lines[lines.length - 1]).toMatch(/^\[\d+\.\d s\] result: chebyshev1$/);
  });
});

describe("filterwright on a terminal", () => {
  const argv = ["design", "--response", "lowpass", "--pass", "2k", "--pass-loss", "0.5", "--stop", "6k", "--stop-atten", "50", "--family", "chebyshev1"];
  const run = (extra: string[], terminal: boolean): { out: string; err: string } => {
    const out: string[] = [];
    const err: string[] = [];
    runCli([...argv, ...extra], { stdout: (t) => void out.push(t), stderr: (t) => void err.push(t), readFile: () => "", readStdin: () => "", writeFile: () => undefined, stderrIsTerminal: terminal });
    return { out: out.join(""), err: err.join("") };
  };

  it("shows one progress line rewritten in place and clears it before the summary", () => {
    const tty = run([], true);
    const plain = run([], false);
    expect(tty.out).toBe(plain.out);
    expect(plain.err).toBe("");
    expect(tty.err).toMatch(/^\r\x1b\[2K\[\d+\.\d s\] family and order/);
    expect(tty.err).not.toContain("\n");
    expect(tty.err.endsWith("\r\x1b[2K")).toBe(true);
  });

  it("stays silent with --quiet and prints full lines with --progress", () => {
    expect(run(["--quiet"], true).err).toBe("");
    const p = run(["--progress"], true).err;
    expect(p).not.toContain("\r");
    expect(p.trimEnd().split("\n").length).toBeGreaterThan(2);
  });
});
