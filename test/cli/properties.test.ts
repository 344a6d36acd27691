import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { OPTIONS } from "../../src/cli/options.ts";
import { runCli } from "../../src/cli/run.ts";
import { fakeIo } from "./fake-io.ts";

const LP = ["design", "--response", "lowpass", "--pass", "1k", "--pass-loss", "0.5", "--stop", "5k", "--stop-atten", "50"];

/** The contract of every run: no exception, exit 0, 1 or 2, no stack trace; a failure says why on stderr, every line prefixed. */
function checkRun(argv: readonly string[]): number {
  const io = fakeIo({ "s.json": JSON.stringify({ response: "highpass", passband: { edgeHz: 300, maxLossDb: 1 }, stopband: { edgeHz: 60, minAttenuationDb: 30 } }) });
  let code: number | undefined;
  expect(() => {
    code = runCli(argv, io);
  }).not.toThrow();
  expect([0, 1, 2]).toContain(code);
  const all = io.out + io.err;
  expect(all).not.toMatch(/\n\s+at \S/);
  expect(all).not.toMatch(/\b(TypeError|ReferenceError|RangeError)\b/);
  expect(io.err).not.toContain("internal error");
  if (code === 2) {
    expect(io.err).not.toBe("");
    for (const line of io.err.trimEnd().split("\n")) expect(line).toMatch(/^(filterwright: |wrote )/);
  }
  return code as number;
}

const names = OPTIONS.map((o) => o.name);
const value = fc.oneof(
  fc.constantFrom("1k", "2k", "5k", "300,3.4k", "0.5", "50", "6", "-1", "0", "0x4", "1e5", "10M", "2%", "95%", "3", "1_0", "NaN", "Infinity", " ", "", "-", "6dB", "-2k", "4k7"),
  fc.constantFrom("lowpass", "highpass", "bandpass", "lowpas", "butterworth", "elliptic", "auto", "E12", "e24", "normal", "ideal", "hydrophone", "mfb-lowpass", "auto,auto", "x.json", "s.json"),
  fc.string({ maxLength: 6 }),
);
const token = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom(...names).map((n) => `--${n}`) },
  { weight: 2, arbitrary: fc.tuple(fc.constantFrom(...names), value).map(([n, v]) => `--${n}=${v}`) },
  { weight: 4, arbitrary: value },
  { weight: 1, arbitrary: fc.constantFrom("design", "demo", "topologies", "help", "-h", "-q", "--", "--=", "---pass", "--pass-los") },
);

describe("runCli on random argument vectors", () => {
  it("never throws, exits 0, 1 or 2, never prints a stack trace (vectors of known flags and values)", () => {
    fc.assert(fc.property(fc.array(token, { maxLength: 10 }), (argv) => void checkRun(argv)), { numRuns: 150, seed: 4242 });
  });

  it("the same after a complete spec, so that some vectors reach the design and the outputs", () => {
    const codes: number[] = [];
    fc.assert(fc.property(fc.array(token, { maxLength: 4 }), (tail) => void codes.push(checkRun([...LP, ...tail]))), { numRuns: 40, seed: 777 });
    // The vectors must exercise the design and its outputs too, not only the refusals.
    expect(codes.filter((c) => c !== 2).length).toBeGreaterThanOrEqual(5);
  });

  it("the same for vectors of arbitrary strings", () => {
    fc.assert(fc.property(fc.array(fc.string({ maxLength: 12 }), { maxLength: 8 }), (argv) => void checkRun(argv)), { numRuns: 300, seed: 99 });
  });

  it("a flag that takes no value refuses any value, naming itself", () => {
    const flags = OPTIONS.filter((o) => o.kind === "none").map((o) => o.name);
    fc.assert(
      fc.property(fc.constantFrom(...flags), fc.string({ maxLength: 8 }), (flag, v) => {
        const io = fakeIo();
        expect(runCli([...LP, `--${flag}=${v}`], io)).toBe(2);
        expect(io.err).toContain(`--${flag}`);
        expect(io.out).toBe("");
      }),
      { numRuns: 100, seed: 5 },
    );
  });

  it("--order takes only whole numbers written as digits", () => {
    const notDigits = fc.oneof(
      fc.integer({ min: 1, max: 16 }).map((n) => `0x${n.toString(16)}`),
      fc.integer({ min: 1, max: 16 }).map((n) => `0o${n.toString(8)}`),
      fc.integer({ min: 1, max: 16 }).map((n) => `${n}.5`),
      fc.integer({ min: 1, max: 16 }).map((n) => `${n}e0`),
      fc.string({ maxLength: 6 }).filter((s) => !/^\s*[+-]?\d+\s*$/.test(s)),
    );
    fc.assert(
      fc.property(notDigits, (text) => {
        const io = fakeIo();
        expect(runCli([...LP, "--order", text], io)).toBe(2);
        expect(io.err).toMatch(/^filterwright: --order/);
        expect(io.out).toBe("");
      }),
      { numRuns: 150, seed: 16 },
    );
  });
});
