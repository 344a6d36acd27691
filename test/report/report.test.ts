import { describe, expect, it } from "vitest";
import { designFilter, type FilterSpec } from "../../src/design/index.ts";
import { bomLines, fromJson, toBomCsv, toJson, toMarkdown, toSpiceNetlist } from "../../src/report/index.ts";
import { InvalidArgumentError, ParseError } from "../../src/errors.ts";
import { parseValue } from "../../src/units/index.ts";
import { thrownBy } from "../helpers/throws.ts";

const spec: FilterSpec = {
  response: "lowpass",
  passband: { edgeHz: "2k", maxLossDb: 0.5 },
  stopband: { edgeHz: "9k", minAttenuationDb: 50 },
  family: "chebyshev1",
  gain: { db: 6 },
};
const result = designFilter(spec);

describe("toSpiceNetlist", () => {
  it("drives node in from a 1 V AC source, names the output out and carries an .ac card", () => {
    const text = toSpiceNetlist(result);
    const lines = text.split("\n");
    expect(lines).toContain("Vin in 0 DC 0 AC 1");
    expect(lines.some((l) => /^\.ac dec 50 /.test(l))).toBe(true);
    expect(lines.some((l) => / out( |$)/.test(l))).toBe(true);
    expect(text.trimEnd().endsWith(".end")).toBe(true);
    for (const st of result.stages) for (const d of Object.keys(st.components)) expect(text).toMatch(new RegExp(`^${d} `, "m"));
  });
});

describe("toBomCsv", () => {
  it("groups identical parts with their designators and quantity", () => {
    const csv = toBomCsv(result);
    const rows = csv.trimEnd().split("\r\n");
    expect(rows[0]).toBe("designators,part,value,rkm,series,tolerance,dielectric,quantity");
    const lines = bomLines(result);
    const passive = lines.filter((l) => l.part !== "op-amp");
    const count = result.stages.reduce((k, s) => k + Object.keys(s.components).length, 0);
    expect(passive.reduce((k, l) => k + l.quantity, 0)).toBe(count);
    for (const l of passive) {
      expect(l.quantity).toBe(l.designators.length);
      // Both written forms read back to the value.
      expect(parseValue(l.rkm)).toBeCloseTo(l.value, 20);
      expect(Math.abs(parseValue(l.valueText) / l.value - 1)).toBeLessThan(5e-3);
      // each part's own tolerance, as the design allocated it
      for (const d of l.designators) {
        const own = result.stages.find((st) => d in st.components)!.tolerances[d]!;
        expect(l.tolerance).toBe(`${Number((own * 100).toPrecision(3))}%`);
      }
    }
    const values = passive.map((l) => `${l.part}${l.value}${l.tolerance}`);
    expect(new Set(values).size).toBe(values.length);
    const op = lines.find((l) => l.part === "op-amp");
    expect(op?.quantity).toBe(result.stages.reduce((k, s) => k + s.opamps.length, 0));
    expect(rows.length).toBe(lines.length + 1);
  });
});

describe("toJson / fromJson", () => {
  it("round-trips a design", () => {
    const back = fromJson(toJson(result));
    expect(back).toEqual(result);
    expect(JSON.parse(toJson(result)).formatVersion).toBe(3); // 3: the checksum (2: the yield, stability and per-part tolerances)
  });

  it("round-trips designs with every optional spec field", () => {
    const hp = designFilter({
      response: "highpass",
      passband: { edgeHz: 300, maxLossDb: 1, topHz: "20k" },
      stopband: { edgeHz: 80, minAttenuationDb: 40 },
      family: "butterworth",
      order: 4,
      topology: ["sallen-key-highpass-unity", "mfb-highpass"],
      gain: { vPerV: -2, toleranceDb: 0.5 },
      parts: { resistorSeries: "E24", capacitorSeries: "E6", resistorMinOhm: "2k", resistorMaxOhm: "200k" },
      opamp: { a0: 1e5, gbwHz: "5M" },
    });
    expect(fromJson(toJson(hp))).toEqual(hp);
  });

  it("refuses other versions, bad JSON and malformed stages with the path", () => {
    const data = JSON.parse(toJson(result));
    expect(() => fromJson(JSON.stringify({ ...data, formatVersion: 99 }))).toThrow(ParseError);
    expect(() => fromJson("{ not json")).toThrow(ParseError);
    const bad = structuredClone(data);
    const first = Object.keys(bad.result.stages[0].components)[0] as string;
    bad.result.stages[0].components[first] = -1;
    expect(thrownBy(() => fromJson(JSON.stringify(bad)), ParseError).path).toBe(`result.stages.0.components.${first}`);
    const badSpec = structuredClone(data);
    badSpec.result.spec.maxLossDb = "x";
    expect(() => fromJson(JSON.stringify(badSpec))).toThrow(ParseError);
  });
});

describe("toMarkdown", () => {
  it("summarises stages, verification and the cautions", () => {
    const md = toMarkdown(result);
    expect(md.split("\n")[0]).toBe("# Lowpass filter: chebyshev1, " + `${result.filterOrder} poles`);
    expect(md).toContain("## Verification (as built)");
    expect(md).toContain("## Cautions");
    expect(md).toContain("## What each op-amp must do");
    expect(md).toMatch(/isolation/);
    for (const st of result.stages) expect(md).toContain(`| ${st.index} | ${st.topologyName} |`);
  });
});

describe("toSvgPlot", () => {
  it("draws the magnitude with the mask and the group delay", async () => {
    const { toSvgPlot } = await import("../../src/report/index.ts");
    const mag = toSvgPlot(result);
    expect(mag.startsWith("<svg")).toBe(true);
    expect(mag).toMatch(/<g clip-path="url\(#fw-clip-[0-9a-f]{8}\)">/);
    expect(mag).toContain("Magnitude (dB)");
    const gd = toSvgPlot(result, { kind: "group-delay" });
    expect(gd).toContain("group delay");
  });
});

const SPEC_FOR_CHECKS: FilterSpec = {
  response: "lowpass",
  passband: { edgeHz: 1000, maxLossDb: 1 },
  stopband: { edgeHz: 4000, minAttenuationDb: 40 },
};

describe("report functions given something that is not a design result", () => {
  it("name the first bad field of a hand-edited result instead of failing deep inside", () => {
    const good = designFilter(SPEC_FOR_CHECKS);
    const edited = JSON.parse(JSON.stringify(good)) as Record<string, unknown>;
    (edited["stages"] as Record<string, unknown>[])[0]!["components"] = { R1: -4700 };
    for (const f of [toBomCsv, toMarkdown, toSpiceNetlist, toJson]) {
      let caught: unknown;
      try {
        f(edited as never);
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(InvalidArgumentError);
      expect((caught as InvalidArgumentError).path).toBe("result.stages.0.components.R1");
    }
    // an unedited copy read back from JSON (not the same object) passes the full check
    expect(toBomCsv(JSON.parse(JSON.stringify(good)) as never)).toBe(toBomCsv(good));
  });
});
