import { describe, expect, it } from "vitest";
import { SpecError } from "../../src/errors.ts";
import { checkSpec, requireDesignSpec, specToInput, validateSpec } from "../../src/design/spec.ts";
import { DEFAULT_INPUT_PEAK_V, DEFAULT_OUTPUT_SWING_V, MAX_LEVEL_V } from "../../src/design/spec-levels.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { thrownBy } from "../helpers/throws.ts";

const base = {
  response: "lowpass",
  passband: { edgeHz: "2k", maxLossDb: 0.5 },
  stopband: { edgeHz: 12000, minAttenuationDb: 60 },
} as const;

describe("validateSpec levels", () => {
  it("is null without levels, and fills the defaults of a partial levels object", () => {
    expect(validateSpec(base).levels).toBeNull();
    expect(validateSpec({ ...base, levels: {} }).levels).toEqual({ inputPeakV: DEFAULT_INPUT_PEAK_V, outputSwingV: DEFAULT_OUTPUT_SWING_V, opampVoltageNoise: 0, opampCurrentNoise: 0 });
    expect(validateSpec({ ...base, levels: { outputSwingV: 2.4 } }).levels).toEqual({ inputPeakV: 1, outputSwingV: 2.4, opampVoltageNoise: 0, opampCurrentNoise: 0 });
  });

  it("reads the input level in engineering notation", () => {
    expect(validateSpec({ ...base, levels: { inputPeakV: "500m", outputSwingV: 12 } }).levels).toEqual({ inputPeakV: 0.5, outputSwingV: 12, opampVoltageNoise: 0, opampCurrentNoise: 0 });
    expect(validateSpec({ ...base, levels: { opampVoltageNoise: "4.5n", opampCurrentNoise: "2p" } }).levels).toEqual({ inputPeakV: 1, outputSwingV: 10, opampVoltageNoise: 4.5e-9, opampCurrentNoise: 2e-12 });
    expect(validateSpec({ ...base, levels: { inputPeakV: "2.5V" } }).levels?.inputPeakV).toBe(2.5);
  });

  it("names every bad level with its path, all at once", () => {
    const e = thrownBy(() => validateSpec({ ...base, levels: { inputPeakV: -1, outputSwingV: Number.NaN, extra: 1 } }), SpecError);
    expect(e.issues.map((i) => i.path).sort()).toEqual(["levels.extra", "levels.inputPeakV", "levels.outputSwingV"]);
    const big = checkSpec({ ...base, levels: { inputPeakV: MAX_LEVEL_V * 2, outputSwingV: 0 } });
    expect(big.map((i) => i.path).sort()).toEqual(["levels.inputPeakV", "levels.outputSwingV"]);
    expect(checkSpec({ ...base, levels: { inputPeakV: "1x" } }).map((i) => i.path)).toEqual(["levels.inputPeakV"]);
    expect(checkSpec({ ...base, levels: 5 }).map((i) => i.path)).toEqual(["levels"]);
    expect(checkSpec({ ...base, levels: { outputSwingV: "10" } }).map((i) => i.path)).toEqual(["levels.outputSwingV"]);
  });

  it("round-trips through specToInput", () => {
    const s = validateSpec({ ...base, levels: { inputPeakV: "300m", outputSwingV: 4.5 } });
    expect(specToInput(s).levels).toEqual({ inputPeakV: 0.3, outputSwingV: 4.5 });
    expect(validateSpec(specToInput(s))).toEqual(s);
    expect(specToInput(validateSpec(base)).levels).toBeUndefined();
  });

  it("is checked by requireDesignSpec on a spec not made here", () => {
    const s = { ...validateSpec(base), levels: { inputPeakV: 1, outputSwingV: -2 } };
    expect(thrownBy(() => requireDesignSpec("f", s), InvalidArgumentError).path).toBe("spec.levels");
    expect(requireDesignSpec("f", { ...validateSpec(base) })).toBeTruthy();
  });
});
