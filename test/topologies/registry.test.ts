import { describe, expect, it } from "vitest";
import { getTopology, topologies, topologiesFor } from "../../src/topologies/registry.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import type { StageKind } from "../../src/topologies/types.ts";

describe("topologies", () => {
  it("have unique ids, documented references and component names matching their parts", () => {
    const ids = new Set(topologies.map((t) => t.id));
    expect(ids.size).toBe(topologies.length);
    for (const t of topologies) {
      expect(t.id).toMatch(/^[a-z0-9-]+$/);
      expect(t.reference.length).toBeGreaterThan(20);
      expect(t.opampCount).toBeGreaterThanOrEqual(1);
      const els = t.elements(
        Object.fromEntries(t.componentNames.map((n) => [n, 1])),
        { input: "a", output: "b", nodePrefix: "p_", opamp: { kind: "ideal" } },
      );
      expect(els.filter((e) => e.kind === "OA")).toHaveLength(t.opampCount);
      expect(els.filter((e) => e.kind !== "OA").map((e) => e.name)).toEqual([...t.componentNames]);
    }
  });

  it("cover every section kind needed by the cascades", () => {
    const need: [StageKind, 1 | 2][] = [
      ["lowpass", 1],
      ["highpass", 1],
      ["lowpass", 2],
      ["highpass", 2],
      ["bandpass", 2],
      ["lowpass-notch", 2],
      ["highpass-notch", 2],
      ["notch", 2],
      ["allpass", 2],
    ];
    for (const [kind, order] of need) expect(topologiesFor({ kind, order }).length).toBeGreaterThan(0);
  });
});

describe("getTopology", () => {
  it("finds by id and lists the ids when unknown", () => {
    expect(getTopology("mfb-lowpass").opampCount).toBe(1);
    expect(() => getTopology("nope")).toThrow(/sallen-key-lowpass-unity/);
  });
});

describe("topologiesFor", () => {
  it("filters by kind and order", () => {
    expect(topologiesFor({ kind: "allpass", order: 2 }).map((t) => t.id)).toEqual(["state-variable-allpass", "tow-thomas-allpass"]);
    expect(topologiesFor({ kind: "bandpass", order: 1 })).toEqual([]);
    expect(topologiesFor({ kind: "lowpass", order: 3 }).map((t) => t.id)).toEqual(["sallen-key-lowpass-third-order"]);
    expect(() => topologiesFor({ kind: "bandstop" as StageKind, order: 2 })).toThrow(InvalidArgumentError);
    expect(() => topologiesFor({ kind: "lowpass", order: 4 as 1 })).toThrow(/query\.order/);
  });
});

describe("Topology.elements", () => {
  it("maps external nodes, prefixes internal ones and renames designators", () => {
    const t = getTopology("sallen-key-lowpass-gain");
    const v = t.design({ order: 2, kind: "lowpass", f0Hz: 1000, q: 0.8, gain: 2 }, { capacitor: 10e-9 });
    const els = t.elements(v, {
      input: "s0",
      output: "s1",
      nodePrefix: "st1_",
      rename: (n) => (n.startsWith("U") ? `U${Number(n.slice(1)) + 4}` : `${n[0]}${Number(n.slice(1)) + 10}`),
      opamp: { kind: "single-pole", a0: 1e5, gbwHz: 1e6 },
    });
    const r1 = els.find((e) => e.name === "R11");
    expect(r1).toMatchObject({ kind: "R", a: "s0", b: "st1_a", value: v["R1"] });
    const u = els.find((e) => e.kind === "OA");
    expect(u).toMatchObject({ name: "U5", inP: "st1_b", inN: "st1_fb", out: "s1", model: { kind: "single-pole" } });
    expect(els.find((e) => e.name === "C12")).toMatchObject({ a: "st1_b", b: "0", value: 10e-9 });
  });

  it("rejects a negative value with its path", () => {
    const t = getTopology("mfb-highpass");
    const v = { ...t.design({ order: 2, kind: "highpass", f0Hz: 100, q: 1, gain: -1 }, {}), R2: -5 };
    expect(() => t.elements(v, { input: "i", output: "o", nodePrefix: "x", opamp: { kind: "ideal" } })).toThrow(/values\.R2/);
  });
});
