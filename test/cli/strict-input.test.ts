import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { runCli } from "../../src/cli/run.ts";
import { fromJson } from "../../src/report/index.ts";
import { fakeIo, type FakeIo } from "./fake-io.ts";

const LP = ["design", "--response", "lowpass", "--pass", "1k", "--pass-loss", "0.5", "--stop", "5k", "--stop-atten", "50"];

/** Run and return the io; the exit code is checked by the caller. */
function run(argv: readonly string[], io: FakeIo = fakeIo()): { code: number; io: FakeIo } {
  return { code: runCli(argv, io), io };
}

/** The one line printed on standard error (fails when there are more or none). */
function oneLine(io: FakeIo): string {
  const lines = io.err.split("\n").filter((l) => l !== "");
  expect(lines, io.err).toHaveLength(1);
  expect(lines[0]).toMatch(/^filterwright: /);
  return lines[0] as string;
}

const dir = mkdtempSync(join(tmpdir(), "filterwright-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
/** A real file system for the I/O failures, with captured streams. */
const realFiles = (): FakeIo => fakeIo({}, { readFile: (p) => readFileSync(p, "utf8"), writeFile: (p, t) => writeFileSync(p, t, "utf8") });

describe("runCli: I/O failures exit 2 with the path and the reason in plain words", () => {
  it("an output in a folder that does not exist (was exit 3 'internal error: ENOENT')", () => {
    const path = join(dir, "no-such-folder", "lp.json");
    const { code, io } = run([...LP, "--json", path], realFiles());
    expect(code).toBe(2);
    expect(oneLine(io)).toBe(`filterwright: cannot write ${path} (--json): the folder it goes in does not exist (ENOENT)`);
    expect(io.err).not.toContain("internal error");
  });

  it("an output path that is a folder", () => {
    const { code, io } = run([...LP, "--netlist", dir], realFiles());
    expect(code).toBe(2);
    expect(oneLine(io)).toBe(`filterwright: cannot write ${dir} (--netlist): it is a folder, not a file (EISDIR)`);
  });

  it("a spec file that does not exist, and one that is not JSON", () => {
    const missing = join(dir, "missing.json");
    const a = run(["design", "--spec", missing], realFiles());
    expect(a.code).toBe(2);
    expect(oneLine(a.io)).toBe(`filterwright: cannot read ${missing} (--spec): there is no such file (ENOENT)`);
    const b = run(["design", "--spec", "s.json"], fakeIo({ "s.json": "{ response: lowpass" }));
    expect(b.code).toBe(2);
    expect(oneLine(b.io)).toMatch(/^filterwright: s\.json \(--spec\) is not valid JSON: /);
    // A value refused on the command line is still reported beside the file's problem.
    const c = run(["design", "--spec", "nothing.json", "--order", "0x4"]);
    expect(c.code).toBe(2);
    expect(c.io.err).toBe(
      'filterwright: --order "0x4": expected the prototype order, a whole number from 1 to 16, e.g. --order 6\n' +
        "filterwright: cannot read nothing.json (--spec): there is no such file (ENOENT)\n",
    );
  });

  it("an unexpected exception is one line and exit 2, never 3 and never a stack trace", () => {
    const boom = fakeIo({}, {
      writeFile: () => {
        throw new TypeError("disk on fire");
      },
    });
    const { code, io } = run([...LP, "--bom", "x.csv"], boom);
    expect(code).toBe(2);
    expect(oneLine(io)).toBe("filterwright: cannot write x.csv (--bom): disk on fire");
    expect(io.err).not.toMatch(/\n\s+at /);
  });
});

describe("runCli: - is standard output for every output option", () => {
  it("--json - prints the record on stdout, writes no file named -, and moves the summary to stderr", () => {
    const { code, io } = run([...LP, "--json", "-"]);
    expect(code).toBe(0);
    expect(io.files["-"]).toBeUndefined();
    expect(Object.keys(io.files)).toEqual([]);
    expect(fromJson(io.out).verification.meetsSpec).toBe(true);
    expect(io.err).toContain("MEETS the spec");
  });

  it("each output option takes -, and --quiet's line goes to stderr", () => {
    const expected: Record<string, RegExp> = { netlist: /Vin in 0 DC 0 AC 1/, bom: /^designators,part,value/, markdown: /## Cautions/, svg: /^<svg/ };
    for (const [k, re] of Object.entries(expected)) {
      const { code, io } = run([...LP, `--${k}`, "-", "--quiet"]);
      expect(code, io.err).toBe(0);
      expect(io.out).toMatch(re);
      expect(io.err).toMatch(/^meets the spec: /);
      expect(io.files).toEqual({});
    }
  });

  it("two outputs to standard output, or to one file, are refused before designing", () => {
    const a = run([...LP, "--json", "-", "--svg", "-"]);
    expect(a.code).toBe(2);
    expect(oneLine(a.io)).toBe("filterwright: --json and --svg both write to standard output (-); send one of them to a file");
    const b = run([...LP, "--bom", "x", "--markdown", "x"]);
    expect(b.code).toBe(2);
    expect(oneLine(b.io)).toBe('filterwright: --bom and --markdown both write to "x"; give each its own file');
  });
});

describe("runCli: strict numbers", () => {
  it("--order 0x4 is refused (was read as 4), naming the flag and its form", () => {
    const { code, io } = run([...LP, "--order", "0x4"]);
    expect(code).toBe(2);
    expect(oneLine(io)).toBe('filterwright: --order "0x4": expected the prototype order, a whole number from 1 to 16, e.g. --order 6');
  });

  it("refuses what Number() would accept but a decimal is not", () => {
    const cases: [string, string][] = [
      ["--order", "4.5"],
      ["--order", "0b11"],
      ["--order", "1e1"],
      ["--order", "4 5"],
      ["--pass-loss", "0x1"],
      ["--pass-loss", "Infinity"],
      ["--stop-atten", "60abc"],
      ["--gain", "1_0"],
      ["--cap-tol", "2%%"],
      ["--yield-target", ".95.5"],
      ["--pass", "0x10"],
      ["--stop", "5k,"],
      ["--gbw", "1e999"],
      ["--a0", "1e5Hz"],
      ["--yield", "1e3"],
      ["--seed", "0x10"],
    ];
    for (const [flag, text] of cases) {
      const { code, io } = run([...LP.filter((_, i) => LP[i] !== flag && LP[i - 1] !== flag), flag, text]);
      expect(code, `${flag} ${text}`).toBe(2);
      expect(oneLine(io), `${flag} ${text}`).toContain(`${flag} ${JSON.stringify(text)}`);
    }
  });

  it("takes engineering notation where the flag takes a quantity, dB after a dB figure, and percentages", () => {
    const io = fakeIo();
    const argv = ["design", "--response", "lowpass", "--pass", "1kHz", "--pass-loss", "0.5 dB", "--stop", "5e3", "--stop-atten", "50dB", "--r-min", "4k7", "--gbw", "10 MHz", "--a0", "200k", "--cap-tol", "5 %", "--quiet", "--json", "r.json"];
    expect(runCli(argv, io), io.err).toBe(0);
    const r = fromJson(io.files["r.json"] as string);
    expect(r.spec.passbandHz).toEqual([1000]);
    expect(r.spec.stopbandHz).toEqual([5000]);
    expect(r.spec.resistorRange.min).toBe(4700);
    expect(r.verification.opamp).toEqual({ kind: "single-pole", a0: 200000, gbwHz: 1e7 });
    expect(r.spec.capacitorTolerance).toBe(0.05);
  });
});

describe("runCli: flags and their values", () => {
  it("--quiet=yes is refused (was silently ignored)", () => {
    const { code, io } = run([...LP, "--quiet=yes"]);
    expect(code).toBe(2);
    expect(oneLine(io)).toBe('filterwright: --quiet takes no value (got "yes"); write --quiet alone');
    for (const flag of ["--sensitivity=1", "--help=please", "--version=2"]) {
      const r = run([...LP, flag]);
      expect(r.code, flag).toBe(2);
      expect(oneLine(r.io)).toContain(`${flag.split("=")[0]} takes no value`);
    }
  });

  it("--gain with --gain-vv is refused, naming both (was accepted)", () => {
    const { code, io } = run([...LP, "--gain", "6", "--gain-vv", "2"]);
    expect(code).toBe(2);
    expect(oneLine(io)).toBe("filterwright: --gain and --gain-vv cannot be used together (both set the passband gain); keep one");
  });

  it("other combinations that cannot work are refused before designing", () => {
    const cases: [string[], string][] = [
      [["--gbw", "ideal", "--a0", "1e5"], "--gbw ideal and --a0 cannot be used together"],
      [["--a0", "1e5"], "--a0 needs --gbw as well"],
      [["--seed", "3"], "--seed sets the boards of --yield"],
      [["--noise-in", "1p"], "--noise-in needs --noise as well"],
      [["--scenario", "hydrophone"], "--scenario belongs to the demo command, not to design"],
    ];
    for (const [extra, text] of cases) {
      const { code, io } = run([...LP, ...extra]);
      expect(code, extra.join(" ")).toBe(2);
      expect(oneLine(io)).toContain(text);
    }
    const demo = run(["demo", "--spec", "s.json"]);
    expect(demo.code).toBe(2);
    expect(oneLine(demo.io)).toBe("filterwright: --spec belongs to the design and ladder commands, not to demo");
    const topo = run(["topologies", "--quiet"]);
    expect(topo.code).toBe(2);
    expect(oneLine(topo.io)).toContain("the topologies command takes no options");
  });

  it("a missing value names the option (was 'unexpected argument \"2k\"')", () => {
    const argv = ["design", "--response", "lowpass", "--pass", "--stop", "2k", "--pass-loss", "0.5", "--stop-atten", "40"];
    const { code, io } = run(argv);
    expect(code).toBe(2);
    expect(oneLine(io)).toBe("filterwright: --pass needs a value (the passband edge in Hz, or two separated by a comma, e.g. --pass 20k) but is followed by --stop");
    const last = run([...LP, "--gbw"]);
    expect(last.code).toBe(2);
    expect(oneLine(last.io)).toContain("--gbw needs a value");
    expect(oneLine(last.io)).toContain("but is the last argument");
  });

  it("a stray argument says which option took one value", () => {
    const { code, io } = run(["design", "--response", "bandpass", "--pass", "1k", "2k"]);
    expect(code).toBe(2);
    expect(oneLine(io)).toBe('filterwright: unexpected argument "2k" after --pass 1k, which takes one value (the passband edge in Hz, or two separated by a comma: write both as --pass 1k,2k)');
  });
});

describe("runCli: messages name the flag, not the spec's field path", () => {
  it("a missing required option (was 'passband.maxLossDb ... received undefined')", () => {
    const { code, io } = run(["design", "--response", "lowpass", "--pass", "1k", "--stop", "5k", "--stop-atten", "50"]);
    expect(code).toBe(2);
    expect(oneLine(io)).toBe("filterwright: --pass-loss is required: the largest passband loss in dB, e.g. --pass-loss 0.5");
    expect(io.err).not.toContain("received undefined");
  });

  it("nothing but the command lists each required option once", () => {
    const { code, io } = run(["design"]);
    expect(code).toBe(2);
    const lines = io.err.trimEnd().split("\n");
    expect(lines.map((l) => /^filterwright: (--[a-z-]+) is required/.exec(l)?.[1])).toEqual(["--response", "--pass", "--pass-loss", "--stop", "--stop-atten"]);
  });

  it("a range problem found by the spec check names the flag and the value typed", () => {
    const { code, io } = run([...LP, "--swing", "500"]);
    expect(code).toBe(2);
    expect(oneLine(io)).toMatch(/^filterwright: --swing "500": expected an output swing in volts peak greater than 0 and at most 100/);
    const window = run([...LP, "--c-min", "1u", "--c-max", "1.5u"]);
    expect(window.code).toBe(2);
    expect(oneLine(window.io)).toMatch(/^filterwright: --c-max "1.5u": the capacitor window must span at least a factor of 2/);
  });

  it("a field of a spec file is named by its path in the file, with the flag that overrides it", () => {
    const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 30 }, stopband: { edgeHz: "5k", minAttenuationDb: 50 } };
    const { code, io } = run(["design", "--spec", "s.json"], fakeIo({ "s.json": JSON.stringify(spec) }));
    expect(code).toBe(2);
    expect(oneLine(io)).toBe("filterwright: s.json: passband.maxLossDb: expected a loss in dB at least 0.001 and at most 20 (received 30) (correct it in s.json or override it with --pass-loss)");
    const fixed = run(["design", "--spec", "s.json", "--pass-loss", "0.5", "--quiet"], fakeIo({ "s.json": JSON.stringify(spec) }));
    expect(fixed.code, fixed.io.err).toBe(0);
  });

  it("a fraction out of range shows how to type one; a spec file's misspelt field gets a suggestion", () => {
    const { code, io } = run([...LP, "--yield-target", "95"]);
    expect(code).toBe(2);
    expect(oneLine(io)).toBe('filterwright: --yield-target "95": expected a fraction of boards (0.95 for 95 %) greater than 0 and less than 1, e.g. --yield-target 99%');
    const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 0.5, maxLosDb: 1 }, stopband: { edgeHz: "5k", minAttenuationDb: 50 } };
    const file = run(["design", "--spec", "s.json"], fakeIo({ "s.json": JSON.stringify(spec) }));
    expect(file.code).toBe(2);
    expect(oneLine(file.io)).toMatch(/^filterwright: s\.json: passband\.maxLosDb: unknown field; .*; did you mean "maxLossDb"\?$/);
  });

  it("a negative frequency says what to type (was 'pass allowNegative')", () => {
    const { code, io } = run(["design", "--response", "lowpass", "--pass", "-2k", "--pass-loss", "0.5", "--stop", "5k", "--stop-atten", "50"]);
    expect(code).toBe(2);
    expect(oneLine(io)).toBe('filterwright: --pass "-2k": a frequency must be above zero; type it without the minus sign, e.g. --pass 2k');
    const zero = run([...LP, "--gbw", "0"]);
    expect(oneLine(zero.io)).toBe('filterwright: --gbw "0": a gain-bandwidth must be above zero, e.g. --gbw 10M');
    const spec = { response: "lowpass", passband: { edgeHz: "-2k", maxLossDb: 0.5 }, stopband: { edgeHz: "5k", minAttenuationDb: 50 } };
    const file = run(["design", "--spec", "s.json"], fakeIo({ "s.json": JSON.stringify(spec) }));
    expect(file.code).toBe(2);
    expect(oneLine(file.io)).toContain("write it without the minus sign");
    expect(file.io.err).not.toContain("allowNegative");
  });
});

describe("runCli: did you mean", () => {
  const cases: [string[], string][] = [
    [[...LP, "--pass-los", "1"], 'unknown option --pass-los; did you mean "--pass-loss"?'],
    [[...LP, "--sensitivty"], 'unknown option --sensitivty; did you mean "--sensitivity"?'],
    [[...LP, "--family", "buterworth"], 'did you mean "butterworth"?'],
    [[...LP, "--family", "chebychev1"], 'did you mean "chebyshev1"?'],
    [["design", "--response", "lowpas", "--pass", "1k", "--pass-loss", "0.5", "--stop", "5k", "--stop-atten", "50"], 'did you mean "lowpass"?'],
    [[...LP, "--priority", "fewest-opamps"], 'did you mean "fewest-op-amps"?'],
    [[...LP, "--polarity", "invertng"], 'did you mean "inverting"?'],
    // A transposition is one edit (Damerau), so E96 is as close as E6 (one deletion).
    [[...LP, "--caps", "E69"], 'did you mean "E6" or "E96"?'],
    [[...LP, "--distribution", "normla"], 'did you mean "normal"?'],
    [[...LP, "--topology", "sallen-key-lowpass-untiy"], 'did you mean "sallen-key-lowpass-unity"?'],
    [[...LP, "--topology", "auto,mfb-lowpas"], 'did you mean "mfb-lowpass"?'],
    [["demo", "--scenario", "hydrofone"], 'did you mean "hydrophone"?'],
    [["desing"], 'unknown command "desing"; did you mean "design"?'],
    [["design", "-quiet"], 'options start with two dashes; did you mean "--quiet"?'],
  ];
  it.each(cases)("%j", (argv, text) => {
    const { code, io } = run(argv);
    expect(code).toBe(2);
    expect(oneLine(io)).toContain(text);
  });

  it("suggests nothing when nothing is close, and nothing for a valid name", () => {
    const { io } = run([...LP, "--family", "gaussian"]);
    expect(io.err).not.toContain("did you mean");
    const stage = run([...LP, "--topology", "mfb-bandpass"]);
    expect(stage.code).toBe(2);
    expect(stage.io.err).not.toContain("did you mean");
  });
});

describe("runCli: --spec - reads the spec from standard input", () => {
  const spec = { response: "lowpass", passband: { edgeHz: 1000, maxLossDb: 0.5 }, stopband: { edgeHz: 5000, minAttenuationDb: 50 } };

  it("designs the piped spec, and flags still override its fields", () => {
    const a = run(["design", "--spec", "-", "--quiet", "--json", "out.json"], fakeIo({ "<stdin>": JSON.stringify(spec) }));
    expect(a.code, a.io.err).toBe(0);
    expect(fromJson(a.io.files["out.json"]!).spec.passbandHz).toEqual([1000]);
    const b = run(["design", "--spec", "-", "--stop-atten", "40", "--quiet", "--json", "out.json"], fakeIo({ "<stdin>": JSON.stringify(spec) }));
    expect(b.code, b.io.err).toBe(0);
    expect(fromJson(b.io.files["out.json"]!).spec.minAttenuationDb).toBe(40);
  });

  it("empty input, unreadable input and text that is not JSON each exit 2 with one line naming standard input", () => {
    const empty = run(["design", "--spec", "-"], fakeIo({ "<stdin>": "  \n" }));
    expect(empty.code).toBe(2);
    expect(oneLine(empty.io)).toBe("filterwright: standard input (--spec -) is empty; pipe a JSON spec into the command, or give the path of a JSON file");
    const unreadable = run(["design", "--spec", "-"], fakeIo());
    expect(unreadable.code).toBe(2);
    expect(oneLine(unreadable.io)).toMatch(/^filterwright: cannot read standard input \(--spec\): /);
    const text = run(["design", "--spec", "-"], fakeIo({ "<stdin>": "response: lowpass" }));
    expect(text.code).toBe(2);
    expect(oneLine(text.io)).toMatch(/^filterwright: standard input \(--spec\) is not valid JSON: /);
  });
});
