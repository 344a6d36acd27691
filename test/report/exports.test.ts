import { describe, expect, it } from "vitest";
import { CURVE_POINTS, designFilter, designResponse, type DesignResult, type FilterSpec } from "../../src/design/index.ts";
import { sectionRows, toCurveCsv, toSectionsCsv, toSectionsJson } from "../../src/report/index.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { logGrid } from "../../src/tf/grid.ts";
import { thrownBy } from "../helpers/throws.ts";

// our own scenarios: a seismometer lowpass, a turntable rumble highpass, a 50 Hz hum notch on a twin-T and on the default stages
const specs: Record<string, FilterSpec> = {
  lowpass: { response: "lowpass", passband: { edgeHz: 20, maxLossDb: 0.5 }, stopband: { edgeHz: 60, minAttenuationDb: 45 } },
  highpass: { response: "highpass", passband: { edgeHz: 25, maxLossDb: 1 }, stopband: { edgeHz: 8, minAttenuationDb: 40 }, family: "elliptic" },
  "twin-t notch": { response: "bandstop", passband: { edgeHz: [30, 85], maxLossDb: 3 }, stopband: { edgeHz: [48, 52], minAttenuationDb: 20 }, topology: "twin-t-notch", order: 1 },
  bandstop: { response: "bandstop", passband: { edgeHz: [35, 70], maxLossDb: 1 }, stopband: { edgeHz: [47, 53], minAttenuationDb: 35 } },
};
const designs: [string, DesignResult][] = Object.entries(specs).map(([k, s]) => [k, designFilter(s)]);

/** The product of the rows at s = j w, evaluated as scipy's freqs would (descending powers). */
function rowsAt(rows: ReturnType<typeof sectionRows>, w: number): { re: number; im: number } {
  let re = 1;
  let im = 0;
  for (const r of rows) {
    const ev = (c: readonly number[]): [number, number] => [(c[2] as number) - (c[0] as number) * w * w, (c[1] as number) * w];
    const [nr, ni] = ev(r.num);
    const [dr, di] = ev(r.den);
    const d2 = dr * dr + di * di;
    const qr = (nr * dr + ni * di) / d2;
    const qi = (ni * dr - nr * di) / d2;
    [re, im] = [re * qr - im * qi, re * qi + im * qr];
  }
  return { re, im };
}

describe("sectionRows / toSectionsCsv", () => {
  it.each(designs)("%s: the rows' product is the as-built response with ideal op-amps (1e-9 relative)", (_name, r) => {
    const rows = sectionRows(r);
    const f = logGrid(r.verification.curve.freqHz[0]!, r.verification.curve.freqHz.at(-1)!, 400);
    const h = designResponse(r, f, { opamp: { kind: "ideal" } });
    for (let i = 0; i < f.length; i++) {
      const got = rowsAt(rows, 2 * Math.PI * f[i]!);
      const want = Math.hypot(h.re[i]!, h.im[i]!);
      expect(Math.hypot(got.re - h.re[i]!, got.im - h.im[i]!) / want).toBeLessThan(1e-9);
    }
    for (const row of rows) {
      // the leading denominator coefficient is 1 (a0 for a second-order row, a1 for a first-order one)
      expect(row.den[0] === 1 || (row.den[0] === 0 && row.den[1] === 1)).toBe(true);
      expect([...row.num, ...row.den].every(Number.isFinite)).toBe(true);
    }
    expect(new Set(rows.map((x) => x.stage))).toEqual(new Set(r.stages.map((s) => s.index)));
  });

  it("factors a stage of degree three (the twin-T's real pole) into two rows", () => {
    const r = designs.find(([n]) => n === "twin-t notch")![1];
    expect(r.stages.every((s) => s.topology === "twin-t-notch")).toBe(true);
    const rows = sectionRows(r);
    expect(rows.length).toBeGreaterThan(r.stages.length);
    expect(rows.filter((x) => x.den[0] === 0)).toHaveLength(r.stages.length);
  });

  it("writes scipy's analog sos layout with every digit", () => {
    const r = designs[0]![1];
    const csv = toSectionsCsv(r);
    const lines = csv.trimEnd().split("\n");
    expect(lines[0]).toBe("stage,b0,b1,b2,a0,a1,a2");
    const rows = sectionRows(r);
    expect(lines).toHaveLength(rows.length + 1);
    lines.slice(1).forEach((l, i) => {
      const cells = l.split(",").map(Number);
      expect(cells).toEqual([rows[i]!.stage, ...rows[i]!.num, ...rows[i]!.den]);
    });
    expect(() => sectionRows({} as DesignResult)).toThrow(InvalidArgumentError);
  });
});

describe("toSectionsJson", () => {
  it("carries the same rows as the CSV, in scipy's analog sos layout", () => {
    for (const [, r] of designs) {
      const data = JSON.parse(toSectionsJson(r)) as { layout: string; columns: string[]; sections: { stage: number; sos: number[] }[] };
      expect(data.layout).toBe("scipy analog sos");
      expect(data.columns).toEqual(["b0", "b1", "b2", "a0", "a1", "a2"]);
      expect(data.sections).toEqual(sectionRows(r).map((x) => ({ stage: x.stage, sos: [...x.num, ...x.den] })));
    }
  });
});

describe("toCurveCsv", () => {
  it("is the design's own stored curve at its points, and any span and density asked for", () => {
    const r = designs[1]![1];
    const lines = toCurveCsv(r, { points: CURVE_POINTS }).trimEnd().split("\n");
    expect(lines[0]).toBe("frequency_hz,magnitude_db,phase_deg,group_delay_s");
    const c = r.verification.curve;
    lines.slice(1).forEach((l, i) => {
      expect(l.split(",").map(Number)).toEqual([c.freqHz[i], c.magnitudeDb[i], c.phaseDeg[i], c.groupDelayS[i]]);
    });
    const dense = toCurveCsv(r, { points: 5, startHz: 10, stopHz: 1000 }).trimEnd().split("\n");
    expect(dense.slice(1).map((l) => Number(l.split(",")[0]))).toEqual(Array.from(logGrid(10, 1000, 5)));
  });

  it("refuses a span or density it cannot draw, naming the option", () => {
    const r = designs[0]![1];
    const path = (o: object): string => thrownBy(() => toCurveCsv(r, o), InvalidArgumentError).path;
    expect(path({ points: 1 })).toBe("options.points");
    expect(path({ points: 2.5 })).toBe("options.points");
    expect(path({ startHz: -1 })).toBe("options.startHz");
    expect(path({ startHz: 100, stopHz: 50 })).toBe("options.stopHz");
    expect(path({ opamp: { kind: "magic" } })).toBe("options.opamp.kind");
  });
});

describe("filterwright --sections / --curves", () => {
  it("writes the section table to standard output and the curves to a file", async () => {
    const { runCli } = await import("../../src/cli/run.ts");
    const out: string[] = [];
    const err: string[] = [];
    const files = new Map<string, string>();
    const io = { stdout: (t: string) => void out.push(t), stderr: (t: string) => void err.push(t), readFile: () => "", readStdin: () => "", writeFile: (p: string, t: string) => void files.set(p, t) };
    const argv = ["design", "--response", "lowpass", "--pass", "20", "--pass-loss", "0.5", "--stop", "60", "--stop-atten", "45", "--sections", "-", "--curves", "c.csv"];
    expect([0, 1]).toContain(runCli(argv, io));
    expect(out.join("")).toBe(toSectionsCsv(designs[0]![1]));
    expect(files.get("c.csv")).toBe(toCurveCsv(designs[0]![1]));
    const json = new Map<string, string>();
    expect([0, 1]).toContain(runCli([...argv.slice(0, -4), "--sections", "sos.json"], { ...io, writeFile: (p: string, t: string) => void json.set(p, t) }));
    expect(json.get("sos.json")).toBe(toSectionsJson(designs[0]![1]));
  });
});
