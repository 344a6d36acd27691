import { describe, expect, it } from "vitest";
import { readArgs } from "../../src/cli/args.ts";
import { inFlagTerms, issueLines, specFromOptions } from "../../src/cli/spec-options.ts";
import { checkSpec } from "../../src/design/index.ts";

describe("inFlagTerms", () => {
  it("replaces spec field names with the flags that set them, and drops the library callers' hints", () => {
    expect(inFlagTerms("widen parts.capacitorMinF/capacitorMaxF or name another topology")).toBe("widen --c-min/--c-max or name another topology");
    expect(inFlagTerms("a negative vPerV asks for an inverting filter")).toBe("a negative --gain-vv asks for an inverting filter");
    expect(inFlagTerms("a part value must be greater than zero (pass allowNegative to accept negative values)")).toBe(
      "a part value must be greater than zero; write it without the minus sign",
    );
    expect(inFlagTerms("must be greater than zero (pass allowZero to accept zero)")).toBe("must be greater than zero");
    // Words that only resemble a field are left alone.
    expect(inFlagTerms("the edgeHz of both bands")).toBe("the edgeHz of both bands");
  });
});

describe("specFromOptions", () => {
  it("merges over the base without changing it; --gain replaces a file's vPerV; --gbw alone gets the default a0", () => {
    const base = { response: "lowpass", gain: { vPerV: 4 }, opamp: "ideal" };
    const args = readArgs(["design", "--gain", "6", "--gbw", "5M", "--pass", "1k"]);
    const { spec, problems } = specFromOptions(base, args.options);
    expect(problems).toEqual([]);
    expect(spec).toEqual({ response: "lowpass", gain: { db: 6 }, opamp: { gbwHz: 5e6, a0: 1e5 }, passband: { edgeHz: 1000 } });
    expect(base).toEqual({ response: "lowpass", gain: { vPerV: 4 }, opamp: "ideal" });
    // --a0 alone changes the file's op-amp; with no op-amp to change it is refused.
    const withOpamp = specFromOptions({ opamp: { a0: 1e4, gbwHz: 1e6 } }, readArgs(["design", "--a0", "2e5"]).options);
    expect(withOpamp.spec["opamp"]).toEqual({ a0: 2e5, gbwHz: 1e6 });
    expect(specFromOptions({}, readArgs(["design", "--a0", "2e5"]).options).problems).toHaveLength(1);
  });
});

describe("issueLines", () => {
  it("tells each issue as the flag typed, the file's field, or the required flag", () => {
    const base = { stopband: { edgeHz: 500, minAttenuationDb: 40 } };
    const args = readArgs(["design", "--response", "lowpass", "--pass", "1k"]);
    const { spec } = specFromOptions(base, args.options);
    const lines = issueLines(checkSpec(spec), { name: "f.json", base, options: args.options });
    expect(lines).toEqual([
      "--pass-loss is required (or passband.maxLossDb in f.json): the largest passband loss in dB, e.g. --pass-loss 0.5",
      "f.json: stopband.edgeHz: a lowpass stopband edge must lie above the passband edge (1000 Hz) (received 500) (correct it in f.json or override it with --stop)",
    ]);
  });

  it("leaves out the fields of options whose values were already refused", () => {
    const args = readArgs(["design", "--response", "lowpass", "--pass", "0x10", "--pass-loss", "1", "--stop", "5k", "--stop-atten", "40"]);
    expect(args.valueProblems).toHaveLength(1);
    const { spec } = specFromOptions({}, args.options);
    expect(issueLines(checkSpec(spec), { name: undefined, base: {}, options: args.options }, args.failed)).toEqual([]);
  });
});
