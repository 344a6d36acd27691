import { describe, expect, it } from "vitest";
import { SpecError } from "../../src/errors.ts";
import { checkSpec, specToInput, validateSpec } from "../../src/design/spec.ts";
import { thrownBy } from "../helpers/throws.ts";

const base = {
  response: "lowpass",
  passband: { edgeHz: "2k", maxLossDb: 0.5 },
  stopband: { edgeHz: 12000, minAttenuationDb: 60 },
} as const;

function issuesOf(spec: unknown): { path: string; message: string }[] {
  try {
    validateSpec(spec);
  } catch (e) {
    expect(e).toBeInstanceOf(SpecError);
    return [...(e as SpecError).issues];
  }
  throw new Error("expected a SpecError");
}

describe("validateSpec part tolerances", () => {
  it("defaults to 5 % C0G/film capacitors and the resistor series' usual tolerance, and takes an explicit fraction", () => {
    const d = validateSpec(base);
    expect(d.capacitorTolerance).toBe(0.05);
    expect(d.resistorTolerance).toBe(0.01);
    expect([d.capacitorToleranceFixed, d.resistorToleranceFixed]).toEqual([false, false]);
    expect(validateSpec(specToInput(d))).toEqual(d);
    const s = validateSpec({ ...base, parts: { capacitorSeries: "E24", capacitorTolerance: 0.02, resistorTolerance: 0.001 } });
    expect(s.capacitorTolerance).toBe(0.02);
    expect(s.resistorTolerance).toBe(0.001);
    expect([s.capacitorToleranceFixed, s.resistorToleranceFixed]).toEqual([true, true]);
    expect(validateSpec(specToInput(s))).toEqual(s);
  });

  it("lists a non-positive or too-large tolerance with its path", () => {
    const issues = issuesOf({ ...base, parts: { capacitorTolerance: 0, resistorTolerance: 0.7 } });
    expect(issues.map((i) => i.path).sort()).toEqual(["parts.capacitorTolerance", "parts.resistorTolerance"]);
  });
});

describe("validateSpec", () => {
  it("fills every default and reads engineering notation", () => {
    const s = validateSpec(base);
    expect(s.passbandHz).toEqual([2000]);
    expect(s.stopbandHz).toEqual([12000]);
    expect(s.gain).toBe(1);
    expect(s.polarity).toBe("either");
    expect(s.family).toBe("auto");
    expect(s.priority).toBe("fewest-op-amps");
    expect(s.order).toBeNull();
    expect(s.capacitorSeries).toBe("E12");
    expect(s.resistorSeries).toBe("E96");
    // the default window follows the filter's frequency (edges 2 kHz and 12 kHz: geometric mean 4.9 kHz)
    expect(s.resistorRange.min).toBeCloseTo(1000 * Math.sqrt(1 / (2 * Math.PI * 1e-4) / Math.sqrt(2000 * 12000)), 6);
    expect(s.resistorRange.max / s.resistorRange.min).toBeCloseTo(100, 9);
    expect(s.capacitorRange).toEqual({ min: 1e-11, max: 1e-5 });
    expect(s.opamp).toEqual({ kind: "ideal" });
    expect(Object.isFrozen(s)).toBe(true);
  });

  it("reads gain in dB and in V/V with the sign as polarity", () => {
    expect(validateSpec({ ...base, gain: { db: 20 } }).gain).toBeCloseTo(10, 12);
    const inv = validateSpec({ ...base, gain: { vPerV: -2.5 } });
    expect(inv.gain).toBe(2.5);
    expect(inv.polarity).toBe("inverting");
  });

  it("reads a real op-amp and part windows given as strings", () => {
    const s = validateSpec({
      ...base,
      opamp: { a0: 2e5, gbwHz: "10 MHz" },
      parts: { resistorMinOhm: "2k2", resistorMaxOhm: "470k", capacitorSeries: "E24" },
    });
    expect(s.opamp).toEqual({ kind: "single-pole", a0: 2e5, gbwHz: 1e7 });
    expect(s.resistorRange).toEqual({ min: 2200, max: 470000 });
    expect(s.capacitorSeries).toBe("E24");
  });

  it("collects every problem of a malformed spec into one SpecError with paths", () => {
    const issues = issuesOf({
      response: "lowpass",
      passband: { edgeHz: "fast", maxLossDb: -1 },
      stopband: { edgeHz: 1000, minAttenuationDb: "lots" },
      gain: { db: 6, vPerV: 2 },
      family: "gaussian",
      order: 2.5,
      topology: "no-such-circuit",
      parts: { resistorSeries: "E7" },
      opamp: { a0: 1e5 },
      colour: "blue",
    });
    const paths = issues.map((i) => i.path).sort();
    expect(paths).toEqual(
      [
        "colour",
        "family",
        "gain",
        "opamp.gbwHz",
        "order",
        "parts.resistorSeries",
        "passband.edgeHz",
        "passband.maxLossDb",
        "stopband.minAttenuationDb",
        "topology",
      ].sort(),
    );
  });

  it("checks edge ordering for each response", () => {
    expect(issuesOf({ ...base, stopband: { edgeHz: 1000, minAttenuationDb: 60 } }).map((i) => i.path)).toEqual([
      "stopband.edgeHz",
    ]);
    expect(
      issuesOf({
        response: "bandpass",
        passband: { edgeHz: [1000, 2000], maxLossDb: 1 },
        stopband: { edgeHz: [1500, 4000], minAttenuationDb: 30 },
      }).map((i) => i.path),
    ).toEqual(["stopband.edgeHz"]);
    expect(
      issuesOf({
        response: "bandstop",
        passband: { edgeHz: 1000, maxLossDb: 1 },
        stopband: { edgeHz: [1500, 4000], minAttenuationDb: 30 },
      }).map((i) => i.path),
    ).toEqual(["passband.edgeHz"]);
    expect(issuesOf({ ...base, stopband: { edgeHz: 12000, minAttenuationDb: 0.2 } }).map((i) => i.path)).toEqual([
      "stopband.minAttenuationDb",
    ]);
  });

  it("reads a highpass passband top and refuses it elsewhere", () => {
    const hp = { response: "highpass", passband: { edgeHz: 1000, maxLossDb: 1, topHz: "20k" }, stopband: { edgeHz: 200, minAttenuationDb: 40 } };
    expect(validateSpec(hp).passbandTopHz).toBe(20000);
    expect(validateSpec(base).passbandTopHz).toBeNull();
    expect(issuesOf({ ...base, passband: { ...base.passband, topHz: 5000 } }).map((i) => i.path)).toEqual(["passband.topHz"]);
    expect(issuesOf({ ...hp, passband: { ...hp.passband, topHz: 500 } }).map((i) => i.path)).toEqual(["passband.topHz"]);
  });

  it("rejects a non-object spec", () => {
    expect(issuesOf(42).map((i) => i.path)).toEqual([""]);
  });

  it("round-trips through specToInput", () => {
    const s = validateSpec({
      response: "bandstop",
      passband: { edgeHz: [30, 80], maxLossDb: 1 },
      stopband: { edgeHz: [47, 53], minAttenuationDb: 25 },
      gain: { vPerV: -3 },
      family: "chebyshev1",
      order: 3,
      topology: "auto",
      opamp: { a0: 1e5, gbwHz: 1e6 },
    });
    expect(validateSpec(specToInput(s))).toEqual(s);
  });
});

describe("checkSpec", () => {
  it("returns no issue for a valid spec", () => {
    expect(checkSpec(base)).toEqual([]);
  });

  it("returns the same issues validateSpec throws, with paths, messages and the values received", () => {
    const bad = {
      response: "lowpass",
      passband: { edgeHz: "1k", maxLossDb: 1 },
      stopband: { edgeHz: 500, minAttenuationDb: 40 },
      gain: { db: 100 },
      parts: { resistorSeries: "E7" },
      opamp: { a0: 1e5, gbwHz: -1 },
    };
    const issues = checkSpec(bad);
    expect(issues.map((i) => i.path)).toEqual(["stopband.edgeHz", "gain.db", "parts.resistorSeries", "opamp.gbwHz"]);
    expect(issues[0]).toEqual({ path: "stopband.edgeHz", message: "a lowpass stopband edge must lie above the passband edge (1000 Hz)", received: 500 });
    expect(thrownBy(() => validateSpec(bad), SpecError).issues).toEqual(issues);
  });

  it("reports a non-object spec at the empty path", () => {
    expect(checkSpec(null)).toEqual([{ path: "", message: "expected a specification object", received: null }]);
  });

  it("reports only the response when an invalid response comes with a passband top", () => {
    const spec = { ...base, response: "notch", passband: { ...base.passband, topHz: "20k" } };
    expect(checkSpec(spec).map((i) => i.path)).toEqual(["response"]);
  });
});

describe("checkSpec received values", () => {
  it("copies a non-finite received number as its text, so the returned issues hold no NaN", () => {
    const issues = checkSpec({ ...base, passband: { edgeHz: Number.NaN, maxLossDb: Number.POSITIVE_INFINITY } });
    expect(issues.map((i) => [i.path, i.received])).toEqual([
      ["passband.edgeHz", "NaN"],
      ["passband.maxLossDb", "Infinity"],
    ]);
    expect(checkSpec({ ...base, extra: { re: Number.NaN } }).map((i) => i.received)).toEqual([{ re: "NaN" }]);
    expect(checkSpec([Number.NaN])[0]?.received).toEqual(["NaN"]);
  });
});

describe("validateSpec own properties", () => {
  it("refuses fields inherited from a prototype, at the top level and inside a band", () => {
    const top = Object.create({ passband: base.passband }) as Record<string, unknown>;
    top["response"] = "lowpass";
    top["stopband"] = base.stopband;
    expect(issuesOf(top).map((i) => i.path)).toEqual(["passband"]);
    const inner = Object.create({ edgeHz: "2k" }) as Record<string, unknown>;
    inner["maxLossDb"] = 0.5;
    expect(issuesOf({ ...base, passband: inner }).map((i) => i.path)).toEqual(["passband.edgeHz"]);
    const oa = Object.create({ a0: 1e5 }) as Record<string, unknown>;
    oa["gbwHz"] = 1e6;
    expect(issuesOf({ ...base, opamp: oa }).map((i) => i.path)).toEqual(["opamp.a0"]);
  });

  it("reads a spec whose own fields are all there as before", () => {
    const own = Object.assign(Object.create(null) as object, base);
    expect(validateSpec(own)).toEqual(validateSpec(base));
  });

  it("reports an unknown field holding data nested 100,000 deep without exhausting the stack", () => {
    let deep: unknown[] = [];
    const root = deep;
    for (let i = 0; i < 100000; i++) {
      const next: unknown[] = [];
      deep.push(next);
      deep = next;
    }
    const issues = checkSpec({ ...base, deep: root });
    expect(issues.map((i) => i.path)).toEqual(["deep"]);
    expect(thrownBy(() => validateSpec({ ...base, deep: root }), SpecError).issues.map((i) => i.path)).toEqual(["deep"]);
  });
});

describe("validateSpec op-amp ranges", () => {
  it("refuses gbwHz = 5e-324 (it gave NaN margins), below 1 Hz and above 100 GHz, naming the field and the range", () => {
    for (const gbwHz of [5e-324, 0.5, 2e11]) {
      const issues = issuesOf({ ...base, opamp: { a0: 1e5, gbwHz } });
      expect(issues.map((i) => i.path)).toEqual(["opamp.gbwHz"]);
      expect(issues[0]?.message).toContain("from 1 Hz to 100000000000 Hz");
    }
  });

  it("refuses a gain-bandwidth product at or below the highest passband frequency", () => {
    const issues = issuesOf({ ...base, opamp: { a0: 1e5, gbwHz: 2000 } });
    expect(issues.map((i) => i.path)).toEqual(["opamp.gbwHz"]);
    expect(issues[0]?.message).toContain("highest passband frequency (2000 Hz)");
    expect(validateSpec({ ...base, opamp: { a0: 1e5, gbwHz: 2001 } }).opamp.kind).toBe("single-pole");
    const hp = { response: "highpass", passband: { edgeHz: 1000, maxLossDb: 1, topHz: "50k" }, stopband: { edgeHz: 200, minAttenuationDb: 30 } };
    expect(issuesOf({ ...hp, opamp: { a0: 1e5, gbwHz: 40000 } })[0]?.message).toContain("(50000 Hz)");
    expect(validateSpec({ ...hp, opamp: { a0: 1e5, gbwHz: 60000 } }).opamp).toEqual({ kind: "single-pole", a0: 1e5, gbwHz: 60000 });
  });

  it("refuses a0 outside 10 to 1e9", () => {
    for (const a0 of [5, 2e9, 5e-324]) expect(issuesOf({ ...base, opamp: { a0, gbwHz: 1e6 } }).map((i) => i.path)).toEqual(["opamp.a0"]);
    expect(validateSpec({ ...base, opamp: { a0: 10, gbwHz: 1e11 } }).opamp).toEqual({ kind: "single-pole", a0: 10, gbwHz: 1e11 });
  });
});

describe("validateSpec ranges of the bands", () => {
  it("edges from 1 mHz to 1 GHz, and a top frequency up to 100 GHz", () => {
    const lp = (pass: unknown, stop: unknown) => ({ response: "lowpass", passband: { edgeHz: pass, maxLossDb: 0.5 }, stopband: { edgeHz: stop, minAttenuationDb: 40 } });
    expect(checkSpec(lp(1e-3, 5e-3))).toEqual([]);
    expect(checkSpec(lp(2e8, 1e9))).toEqual([]);
    const low = issuesOf(lp(5e-4, 5e-3));
    expect(low.map((i) => i.path)).toEqual(["passband.edgeHz"]);
    expect(low[0]?.message).toContain("from 0.001 Hz to 1000000000 Hz");
    expect(issuesOf(lp("1k", "2G")).map((i) => i.path)).toEqual(["stopband.edgeHz"]);
    const bs = { response: "bandstop", passband: { edgeHz: [1e8, 2e9], maxLossDb: 0.5 }, stopband: { edgeHz: [2e8, 5e8], minAttenuationDb: 40 } };
    expect(issuesOf(bs).map((i) => i.path)).toEqual(["passband.edgeHz.1"]);
    const hp = { response: "highpass", passband: { edgeHz: 1000, maxLossDb: 0.5, topHz: 2e11 }, stopband: { edgeHz: 200, minAttenuationDb: 40 } };
    expect(issuesOf(hp).map((i) => i.path)).toEqual(["passband.topHz"]);
  });

  it("a passband loss from 0.001 dB (was: anything above zero, and 1e-9 dB failed deep in the prototype with the wrong field)", () => {
    const lp = (loss: number) => ({ response: "lowpass", passband: { edgeHz: 1000, maxLossDb: loss }, stopband: { edgeHz: 5000, minAttenuationDb: 40 } });
    expect(checkSpec(lp(0.001))).toEqual([]);
    const tiny = issuesOf(lp(1e-9));
    expect(tiny.map((i) => i.path)).toEqual(["passband.maxLossDb"]);
    expect(tiny[0]?.message).toBe("expected a loss in dB at least 0.001 and at most 20");
  });
});

describe("validateSpec quantities written as text", () => {
  it("a negative or zero edge is refused in the spec's terms, without the parser's option names", () => {
    const lp = (pass: unknown) => ({ response: "lowpass", passband: { edgeHz: pass, maxLossDb: 0.5 }, stopband: { edgeHz: "5k", minAttenuationDb: 40 } });
    const negative = issuesOf(lp("-2k"));
    expect(negative.map((i) => i.path)).toEqual(["passband.edgeHz"]);
    expect(negative[0]?.message).toBe("expected a number of Hz greater than zero; write it without the minus sign");
    const zero = issuesOf(lp("0k"));
    expect(zero[0]?.message).toBe("expected a number of Hz greater than zero");
    expect(checkSpec(lp("2k"))).toEqual([]);
  });
});
