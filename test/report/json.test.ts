import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { designFilter, type DesignResult, type FilterSpec } from "../../src/design/index.ts";
import { deepFreeze } from "../../src/design/check.ts";
import { fromJson, toJson, JSON_MAX_CHARS, JSON_MAX_DEPTH } from "../../src/report/json.ts";
import { ParseError, SpecError } from "../../src/errors.ts";
import { firstNonFinite } from "../helpers/finite.ts";
import { eSeries } from "../../src/parts/index.ts";
import { thrownBy } from "../helpers/throws.ts";

// A scenario of our own: a 1.2 kHz anti-alias lowpass ahead of a 10 kHz converter, real op-amp, signal levels.
const spec: FilterSpec = {
  response: "lowpass",
  passband: { edgeHz: "1.2k", maxLossDb: 1 },
  stopband: { edgeHz: "5k", minAttenuationDb: 40 },
  opamp: { a0: 2e5, gbwHz: "3M" },
  levels: { inputPeakV: 1, outputSwingV: 10 },
};
const result: DesignResult = designFilter(spec);
const text = toJson(result);

type Json = Record<string, unknown>;
/** The parsed file, a fresh copy each call. */
const file = (): Json => JSON.parse(text) as Json;
const res = (f: Json): Json => f["result"] as Json;
const at = (root: unknown, path: string): Json => (path === "" ? root : path.split(".").reduce<unknown>((o, k) => (o as Json)[k], root)) as Json;
const refused = (f: Json): ParseError => thrownBy(() => fromJson(JSON.stringify(f)), ParseError);

describe("fromJson", () => {
  it("reads back exactly what toJson wrote", () => {
    expect(fromJson(text)).toEqual(result);
    expect(JSON.parse(text).checksum).toMatch(/^fnv1a64:[0-9a-f]{16}$/);
  });

  it("reads a format-2 file (no checksum) with every other check", () => {
    const f = file();
    delete f["checksum"];
    f["formatVersion"] = 2;
    expect(fromJson(JSON.stringify(f))).toEqual(result);
    f["checksum"] = "x";
    expect(refused(f).path).toBe("checksum");
  });

  it("refuses data nested 100,000 deep in a field it does not read, with a ParseError naming the limit (was a RangeError from deepFreeze)", () => {
    const deep = `${"[".repeat(100000)}${"]".repeat(100000)}`;
    const t = text.replace('"familyChoice": {', `"familyChoice": { "deep": ${deep},`);
    const e = thrownBy(() => fromJson(t), ParseError);
    expect(e.message).toContain(`${JSON_MAX_DEPTH} levels`);
  });

  it("freezes data of any depth without recursion", () => {
    let v: unknown[] = [];
    const root = v;
    for (let i = 0; i < 100000; i++) {
      const next: unknown[] = [];
      v.push(next);
      v = next;
    }
    expect(deepFreeze(root)).toBe(root);
    expect(Object.isFrozen(v)).toBe(true);
  });

  it("refuses text over the size limit before parsing it, naming the limit", () => {
    const big = text.replace('"familyChoice": {', `"familyChoice": { "pad": [${new Array(2_000_000).fill("1.5").join(",")}],`);
    expect(big.length).toBeGreaterThan(JSON_MAX_CHARS);
    expect(thrownBy(() => fromJson(big), ParseError).message).toContain("JSON_MAX_CHARS");
  });

  it("refuses an unknown field (a large numeric array included) at its path without reading it", () => {
    const f = file();
    at(f, "result.familyChoice")["pad"] = new Array(100_000).fill(1.5);
    const e = refused(f);
    expect(e.path).toBe("result.familyChoice.pad");
    expect(e.message).toContain("unknown field");
  });

  it("refuses a misspelt spec field", () => {
    const f = file();
    at(f, "result.spec")["maxLossdb"] = 1;
    expect(refused(f).path).toBe("result.spec.maxLossdb");
    const g = file();
    const s = at(g, "result.spec");
    s["maxLossdb"] = s["maxLossDb"];
    delete s["maxLossDb"];
    expect(refused(g).path).toBe("result.spec");
  });

  it("refuses unknown fields at every level: top, result, stage, verification, yield, headroom, warning", () => {
    for (const path of ["", "result", "result.stages.0", "result.stages.0.asBuilt", "result.verification", "result.verification.yield", "result.verification.headroom", "result.placement"]) {
      const f = file();
      const o = path === "" ? f : at(f, path);
      o["extra"] = 0;
      expect(refused(f).path).toBe(path === "" ? "extra" : `${path}.extra`);
    }
    // a warning: from a design with one (an op-amp too slow for its stages)
    const warned = designFilter({ ...spec, opamp: { a0: 2e5, gbwHz: "60k" } });
    expect(warned.warnings.length).toBeGreaterThan(0);
    const w = JSON.parse(toJson(warned)) as Json;
    at(w, "result.warnings.0")["extra"] = 0;
    expect(refused(w).path).toBe("result.warnings.0.extra");
  });

  it("refuses a flipped meetsSpec, saying the stored and the recomputed value", () => {
    const f = file();
    const v = at(f, "result.verification");
    v["meetsSpec"] = !(v["meetsSpec"] as boolean);
    const e = refused(f);
    expect(e.path).toBe("result.verification.meetsSpec");
    expect(e.message).toContain(`stored value ${String(v["meetsSpec"])}`);
    expect(e.message).toContain(`recomputed from the parts, ${String(!v["meetsSpec"])}`);
  });

  it("refuses a changed margin, a changed stability verdict and a changed curve point", () => {
    for (const [path, edit] of [
      ["result.verification.marginDb", (x: number) => x + 0.01],
      ["result.verification.stopbandAttenuationDb", (x: number) => x * (1 + 1e-6)],
      ["result.verification.curve.magnitudeDb.10", (x: number) => x - 1e-3],
      ["result.stages.0.asBuilt.q", (x: number) => x * 1.001],
    ] as const) {
      const f = file();
      const parts = path.split(".");
      const key = parts.pop() as string;
      const o = at(f, parts.join("."));
      o[key] = edit(o[key] as number);
      expect(refused(f).path).toBe(path);
    }
    const f = file();
    at(f, "result.verification")["unstableStages"] = [1];
    expect(refused(f).path).toMatch(/^result\.verification\.(stable|unstableStages)/);
  });

  it("refuses an off-series part value, an extra component and a missing one", () => {
    const f = file();
    const comps = at(f, "result.stages.0.components");
    const r = Object.keys(comps).find((k) => k.startsWith("R")) as string;
    comps[r] = (comps[r] as number) * 1.001;
    const e = refused(f);
    expect(e.path).toBe(`result.stages.0.components.${r}`);
    expect(e.message).toContain("E96");

    const g = file();
    at(g, "result.stages.0.components")["R99"] = 1000;
    expect(refused(g).path).toBe("result.stages.0.components.R99");

    const h = file();
    const st = at(h, "result.stages.0");
    const name = Object.keys(st["components"] as Json)[0] as string;
    for (const k of ["components", "localNames", "tolerances"]) delete (st[k] as Json)[name];
    expect(refused(h).path).toBe("result.stages.0.components");
  });

  it("refuses another in-series value: the stage's recomputed figures differ", () => {
    const f = file();
    const comps = at(f, "result.stages.0.components");
    const r = Object.keys(comps).find((k) => k.startsWith("R")) as string;
    const e96 = eSeries("E96");
    const v = comps[r] as number;
    const decade = 10 ** Math.floor(Math.log10(v) + 1e-12);
    const k = e96.findIndex((m) => Math.abs(m * decade - v) < 1e-9 * v);
    expect(k).toBeGreaterThanOrEqual(0);
    comps[r] = Number(((e96[(k + 1) % e96.length] as number) * (k + 1 === e96.length ? 10 * decade : decade)).toPrecision(3));
    expect(refused(f).path).toMatch(/^result\.stages\.0\.asBuilt/);
  });

  it("refuses a changed message through the checksum", () => {
    const f = file();
    at(f, "result.familyChoice")["reason"] = "edited";
    const e = refused(f);
    expect(e.path).toBe("checksum");
    expect(e.message).toContain("changed after it was written");
  });

  it("refuses a yield record that contradicts itself or the spec", () => {
    for (const [key, value] of [
      ["passed", -1],
      ["fraction", 0.5],
      ["seed", 99],
      ["target", 0.5],
    ] as const) {
      const f = file();
      at(f, "result.verification.yield")[key] = value;
      expect(refused(f).path).toMatch(/^result\.verification\.yield\./);
    }
  });

  it("refuses a single-field edit or returns the original (property)", () => {
    // Every path in the file, objects and arrays included.
    const paths: string[][] = [];
    const stack: [string[], unknown][] = [[[], JSON.parse(text)]];
    while (stack.length > 0) {
      const [p, v] = stack.pop() as [string[], unknown];
      paths.push(p);
      if (typeof v === "object" && v !== null) for (const [k, x] of Object.entries(v)) stack.push([[...p, k], x]);
    }
    const edit = fc.oneof(
      fc.constant({ kind: "delete" as const }),
      fc.constant({ kind: "add" as const }),
      fc.double({ min: -1e6, max: 1e6, noNaN: true }).map((x) => ({ kind: "set" as const, value: x as unknown })),
      fc.constantFrom<unknown>(null, true, false, "", "E24", 0, -1, 1e308, [], {}, [1], { a: 1 }).map((x) => ({ kind: "set" as const, value: x })),
      fc.double({ min: -1e-3, max: 1e-3, noNaN: true }).map((x) => ({ kind: "scale" as const, value: 1 + x })),
    );
    fc.assert(
      fc.property(fc.nat({ max: paths.length - 1 }), edit, (i, e) => {
        const f = file();
        const p = paths[i] as string[];
        const key = p[p.length - 1];
        const parent = p.length === 0 ? null : at(f, p.slice(0, -1).join("."));
        const target = p.length === 0 ? f : at(f, p.join("."));
        if (e.kind === "add") {
          fc.pre(typeof target === "object" && target !== null);
          if (Array.isArray(target)) (target as unknown[]).push(0);
          else (target as Json)["added"] = 1;
        } else if (parent === null || key === undefined) {
          fc.pre(false);
        } else if (e.kind === "delete") {
          if (Array.isArray(parent)) parent.splice(Number(key), 1);
          else delete parent[key];
        } else if (e.kind === "scale") {
          fc.pre(typeof parent[key] === "number");
          parent[key] = (parent[key] as number) * e.value;
        } else parent[key] = e.value;
        const edited = JSON.stringify(f);
        try {
          const back = fromJson(edited);
          expect(back).toEqual(result);
        } catch (err) {
          expect(err).toBeInstanceOf(ParseError);
        }
      }),
      { numRuns: 150, seed: 20261202 },
    );
  });
});

describe("fromJson stored spec", () => {
  it("refuses a stored spec that is valid but not canonical, naming the field", () => {
    const f = file();
    const s = at(f, "result.spec");
    s["capacitorTolerance"] = 0.1; // not fixed by the spec, so validation gives the default back
    const e = refused(f);
    expect(e.path).toBe("result.spec.capacitorTolerance");
    expect(e.message).toContain("canonical value");
  });
});

describe("designFilter and fromJson at the op-amp's limits", () => {
  it("refuses gbwHz = 5e-324 at validation (its design had NaN margins that toJson wrote as null)", () => {
    const e = thrownBy(() => designFilter({ ...spec, opamp: { a0: 1e5, gbwHz: 5e-324 } }), SpecError);
    expect(e.issues.map((i) => i.path)).toEqual(["opamp.gbwHz"]);
  });

  it.each([
    ["lowpass", { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 }, opamp: { a0: 1e5, gbwHz: 1001 } }],
    ["highpass, a0 = 10", { response: "highpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "300", minAttenuationDb: 40 }, opamp: { a0: 10, gbwHz: 1001 } }],
    ["bandpass", { response: "bandpass", passband: { edgeHz: [900, 1100], maxLossDb: 1 }, stopband: { edgeHz: [500, 2000], minAttenuationDb: 30 }, opamp: { a0: 1e5, gbwHz: 1101 } }],
  ] as const)("designs with the slowest accepted op-amp (%s): every number finite, and the file reads back", (_name, s) => {
    const r = designFilter(s as FilterSpec);
    expect(firstNonFinite(r)).toBeNull();
    expect(fromJson(toJson(r))).toEqual(r);
  });
});
