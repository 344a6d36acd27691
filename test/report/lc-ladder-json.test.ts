/**
 * lcLadderToJson / lcLadderFromJson on the passive ladder scenarios: the
 * round trip gives the same design and the same text; reading re-makes the
 * design, so an edited part, figure, verdict or family, an unknown or
 * missing field, another format, text over the limits and a spec the
 * designer refuses are all refused with a ParseError naming the field; the
 * command line writes the same record.
 */
import { describe, expect, it } from "vitest";
import { runCli, type CliIo } from "../../src/cli/run.ts";
import { designLcLadder } from "../../src/design/lc-ladder.ts";
import { ParseError } from "../../src/errors.ts";
import { JSON_MAX_CHARS, JSON_MAX_DEPTH, lcLadderFromJson, lcLadderToJson, LC_LADDER_FORMAT } from "../../src/report/index.ts";
import { ADC_SPEC, IF_SPEC, TIGHT } from "../design/lc-ladder-scenarios.ts";

/** The ParseError `f` throws (fails when it throws nothing or something else). */
function parseErrorOf(f: () => unknown): ParseError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(ParseError);
    return e as ParseError;
  }
  throw new Error("expected a ParseError");
}

/** The text with one field of the parsed record changed. */
function edited(text: string, edit: (o: Record<string, any>) => void): string {
  const o = JSON.parse(text) as Record<string, any>;
  edit(o);
  return JSON.stringify(o);
}

describe("lcLadderToJson / lcLadderFromJson", () => {
  const adc = designLcLadder(ADC_SPEC, TIGHT);
  const text = lcLadderToJson(adc);

  it("round-trips a design: the same parts, figures and text, for a lowpass and a bandpass", () => {
    const back = lcLadderFromJson(text);
    expect(back.asBuilt.components).toEqual(adc.asBuilt.components);
    expect(back.verification).toEqual(adc.verification);
    expect(back.options).toEqual(adc.options);
    expect(lcLadderToJson(back)).toBe(text);
    const bp = designLcLadder(IF_SPEC, { ...TIGHT, loadOhms: 75 });
    expect(lcLadderToJson(lcLadderFromJson(lcLadderToJson(bp)))).toBe(lcLadderToJson(bp));
    const o = JSON.parse(text);
    expect(o.format).toBe(LC_LADDER_FORMAT);
    expect(Object.keys(o.parts)).toEqual(adc.asBuilt.components.map((c) => c.designator));
  });

  it("refuses an edited part, figure, verdict or family, naming it", () => {
    const first = adc.asBuilt.components[0]?.designator as string;
    expect(parseErrorOf(() => lcLadderFromJson(edited(text, (o) => (o.parts[first] *= 1.1)))).path).toBe(`parts.${first}`);
    expect(parseErrorOf(() => lcLadderFromJson(edited(text, (o) => (o.parts.L99 = 1e-6)))).path).toBe("parts.L99");
    expect(parseErrorOf(() => lcLadderFromJson(edited(text, (o) => (o.verification.marginDb += 0.01)))).path).toBe("verification.marginDb");
    expect(parseErrorOf(() => lcLadderFromJson(edited(text, (o) => (o.verification.meetsSpec = !o.verification.meetsSpec)))).path).toBe("verification.meetsSpec");
    expect(parseErrorOf(() => lcLadderFromJson(edited(text, (o) => (o.verification.yield.passed -= 1)))).path).toBe("verification.yield.passed");
    expect(parseErrorOf(() => lcLadderFromJson(edited(text, (o) => (o.family = o.family === "elliptic" ? "butterworth" : "elliptic")))).path).toBe("family");
  });

  it("refuses unknown and missing fields, another format, a spec the designer refuses, and text over the limits", () => {
    expect(parseErrorOf(() => lcLadderFromJson(edited(text, (o) => (o.extra = 1)))).path).toBe("extra");
    expect(parseErrorOf(() => lcLadderFromJson(edited(text, (o) => (o.verification.yield.worst = 1)))).path).toBe("verification.yield.worst");
    expect(parseErrorOf(() => lcLadderFromJson(edited(text, (o) => delete o.options))).path).toBe("options");
    expect(parseErrorOf(() => lcLadderFromJson(edited(text, (o) => (o.format = "something-else")))).path).toBe("format");
    expect(parseErrorOf(() => lcLadderFromJson(edited(text, (o) => (o.options.inductorQ = -3)))).path).toBe("options.inductorQ");
    expect(parseErrorOf(() => lcLadderFromJson(edited(text, (o) => (o.spec.passband.maxLossDb = "lots")))).path.startsWith("spec")).toBe(true);
    expect(parseErrorOf(() => lcLadderFromJson("{ not json")).message).toMatch(/not valid JSON/);
    expect(parseErrorOf(() => lcLadderFromJson(`${"[".repeat(JSON_MAX_DEPTH + 1)}${"]".repeat(JSON_MAX_DEPTH + 1)}`)).message).toMatch(/JSON_MAX_DEPTH/);
    expect(parseErrorOf(() => lcLadderFromJson(" ".repeat(JSON_MAX_CHARS + 1))).message).toMatch(/JSON_MAX_CHARS/);
    expect(parseErrorOf(() => lcLadderFromJson(42 as never)).path).toBe("");
  });

  it("is what filterwright ladder --json writes", () => {
    const files = new Map<string, string>();
    const io: CliIo = { stdout: () => undefined, stderr: () => undefined, readFile: () => "", readStdin: () => "", writeFile: (p, t) => void files.set(p, t) };
    const argv = ["ladder", "--response", "lowpass", "--pass", "30M", "--pass-loss", "1", "--stop", "60M", "--stop-atten", "45", "--caps", "E24",
      "--inductors", "E24", "--ind-tol", "2%", "--cap-tol", "1%", "--inductor-q", "80", "--boards", "512", "--json", "l.json"];
    const code = runCli(argv, io);
    expect([0, 1]).toContain(code);
    const file = files.get("l.json") as string;
    const same = designLcLadder({ ...ADC_SPEC, parts: { capacitorSeries: "E24", capacitorTolerance: 0.01 } }, { inductorSeries: "E24", inductorTolerance: 0.02, inductorQ: 80, boards: 512 });
    expect(file).toBe(lcLadderToJson(same));
    expect(lcLadderToJson(lcLadderFromJson(file))).toBe(file);
  });
});
