import { describe, expect, it } from "vitest";
import { designFilter, type FilterSpec } from "../../src/design/index.ts";
import { validateSpec } from "../../src/design/spec.ts";
import { familyMinimumOrder } from "../../src/design/family.ts";
import { minimumOrder } from "../../src/approx/index.ts";

/** A 1 kHz lowpass for a vibration channel asked to reach 120 dB by 1.05 kHz: no order up to 12 does. */
const impossible: FilterSpec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 0.1 }, stopband: { edgeHz: "1.05k", minAttenuationDb: 120 } };

function relaxed(spec: FilterSpec, field: string, value: number | readonly number[]): FilterSpec {
  const s = JSON.parse(JSON.stringify(spec)) as Record<string, Record<string, unknown>>;
  const [group, key] = field.split(".") as [string, string];
  (s[group] as Record<string, unknown>)[key] = Array.isArray(value) ? [...value] : value;
  return s as unknown as FilterSpec;
}

describe("an impossible spec says what it would take", () => {
  const r = designFilter(impossible);
  const f = r.familyChoice.feasibility;

  it("gives each family's order and at least one relaxation, in the result and the warning", () => {
    expect(r.verification.meetsSpec).toBe(false);
    expect(f).toBeDefined();
    if (f === undefined) throw new Error("no feasibility record");
    expect(f.family).toBe("elliptic");
    expect(f.order).toBe(12);
    const elliptic = f.neededOrders.find((n) => n.family === "elliptic");
    const want = minimumOrder({ family: "elliptic", response: "lowpass", passbandW: 2 * Math.PI * 1000, stopbandW: 2 * Math.PI * 1050, passbandLossDb: 0.1, stopbandAttenuationDb: 120 }).order;
    expect(elliptic?.order).toBe(want);
    expect(want).toBeGreaterThan(12);
    expect(f.relaxations.length).toBeGreaterThanOrEqual(2);
    const warning = r.warnings.find((w) => w.code === "spec-not-met");
    expect(warning?.message).toMatch(/elliptic order \d+/);
    for (const x of f.relaxations) expect(warning?.message).toContain(x.text);
  });

  it("each relaxation alone makes the mask feasible at order 12, and is near the edge of feasibility", () => {
    if (f === undefined) throw new Error("no feasibility record");
    for (const x of f.relaxations) {
      const spec = validateSpec(relaxed(impossible, x.field, x.value));
      const n = familyMinimumOrder(spec, "elliptic", 12);
      expect(n, `${x.field} = ${String(x.value)}`).not.toBeNull();
      expect(n as number).toBeLessThanOrEqual(12);
      // halfway back towards the original, it is not feasible by the order formula (nearest relaxation)
      const v = x.value as number;
      const orig = x.field === "stopband.minAttenuationDb" ? 120 : x.field === "stopband.edgeHz" ? 1050 : 1000;
      const tenthBack = x.field === "stopband.minAttenuationDb" ? orig - 0.9 * (orig - v) : orig * (v / orig) ** 0.9;
      const worse = validateSpec(relaxed(impossible, x.field, tenthBack));
      expect(familyMinimumOrder(worse, "elliptic", 12), `${x.field} at 90 % of the relaxation`).toBeNull();
    }
  });

  it("a feasible spec carries no feasibility record", () => {
    const ok = designFilter({ response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } });
    expect(ok.familyChoice.feasibility).toBeUndefined();
  });
});
