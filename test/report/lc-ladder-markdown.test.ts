/**
 * lcLadderMarkdown on the passive ladder scenarios of the designLcLadder
 * tests (a 30 MHz anti-alias lowpass and a 10.7 MHz IF bandpass): the
 * headline follows the verdict on the boards, every part appears once in
 * the ladder table with its design and built values, the BOM rows are the
 * parts list's, the figures are the verification's, and the cautions are
 * there; a non-design is refused with a typed error.
 */
import { describe, expect, it } from "vitest";
import { designLcLadder } from "../../src/design/lc-ladder.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { lcLadderMarkdown, LADDER_CAUTIONS } from "../../src/report/index.ts";
import { DESIGN_CAUTIONS } from "../../src/report/markdown.ts";
import { formatValue } from "../../src/units/index.ts";
import { ADC_SPEC, IF_SPEC, TIGHT } from "../design/lc-ladder-scenarios.ts";

const LOOSE = { ...TIGHT, inductorTolerance: 0.1, capacitorTolerance: 0.05 } as const;

describe("lcLadderMarkdown", () => {
  const cases = [
    { name: "30 MHz lowpass, tight parts", d: designLcLadder(ADC_SPEC, TIGHT) },
    { name: "10.7 MHz IF bandpass, loose parts", d: designLcLadder(IF_SPEC, LOOSE) },
  ];

  for (const { name, d } of cases) {
    const md = lcLadderMarkdown(d);
    const lines = md.split("\n");

    it(`${name}: the headline names the family and order and follows the verdict on the boards`, () => {
      expect(lines[0]).toBe(`# ${d.spec.response[0]?.toUpperCase()}${d.spec.response.slice(1)} LC ladder: ${d.family}, order ${d.order}`);
      const works = d.verification.meetsSpec && d.verification.yield.met;
      expect(lines[2]?.startsWith(works ? "**Meets the spec**" : "**Does NOT meet the spec**")).toBe(true);
      const m = d.verification.marginDb;
      expect(lines[2]).toContain(d.verification.meetsSpec ? `margin ${m.toFixed(3)} dB` : `misses the mask as built by ${(-m).toFixed(3)} dB`);
      expect(lines[2]).toContain(`of ${d.verification.yield.boards} boards`);
    });

    it(`${name}: every part once in the ladder table, with its design and built values, arms in order from the source`, () => {
      const start = lines.indexOf("## Ladder (from the source end)");
      const rows = lines.slice(start + 4).filter((l, i, all) => all.slice(0, i + 1).every((x) => x.startsWith("|")));
      expect(rows).toHaveLength(d.asBuilt.components.length);
      const arms = rows.map((r) => Number(r.split("|")[1]));
      expect([...arms].sort((a, b) => a - b)).toEqual(arms);
      for (const c of d.asBuilt.components) {
        const row = rows.find((r) => r.split("|")[3]?.trim() === c.designator);
        expect(row, c.designator).toBeDefined();
        const unit = c.kind === "L" ? "H" : "F";
        expect(row).toContain(`| ${formatValue(c.value, { digits: 4, unit })} |`);
        expect(row).toContain(`| ${formatValue(c.designValue, { digits: 4, unit })} |`);
      }
    });

    it(`${name}: the verification and yield figures are the design's own`, () => {
      const v = d.verification;
      expect(md).toContain(`| passband loss | ${v.passbandLossDb.toFixed(3)} dB`);
      expect(md).toContain(`| ${v.passbandMarginDb.toFixed(3)} dB |`);
      expect(md).toContain(`| stopband attenuation | ${v.stopbandAttenuationDb.toFixed(2)} dB`);
      expect(md).toContain(`${v.exactMarginDb.toFixed(3)} dB.`);
      expect(md).toContain(`Target ${Number((v.yield.target * 100).toPrecision(3))} %: **${v.yield.met ? "met" : "NOT met"}**`);
    });

    it(`${name}: the bill of materials has the parts list's rows, then the cautions`, () => {
      const start = lines.indexOf("## Bill of materials");
      const rows = lines.slice(start + 4).filter((l, i, all) => all.slice(0, i + 1).every((x) => x.startsWith("|")));
      expect(rows).toHaveLength(d.parts.length);
      rows.forEach((r, i) => expect(r.startsWith(`| ${d.parts[i]?.designators.join(", ")} |`)).toBe(true));
      for (const c of [...LADDER_CAUTIONS, ...DESIGN_CAUTIONS.slice(1)]) expect(md).toContain(`- ${c}`);
      // the op-amp caution does not apply to a passive ladder
      expect(md).not.toContain(DESIGN_CAUTIONS[0] as string);
    });
  }

  it("refuses what is not a ladder design, naming the argument", () => {
    for (const bad of [null, {}, { spec: {}, asBuilt: {} }, "ladder"]) {
      expect(() => lcLadderMarkdown(bad as never)).toThrow(InvalidArgumentError);
    }
    let caught: unknown;
    try {
      lcLadderMarkdown({} as never);
    } catch (e) {
      caught = e;
    }
    expect((caught as InvalidArgumentError).path).toBe("design");
  });
});

describe("a passive ladder's boards (regression)", () => {
  it("counts no board of a low-loss IF ladder as unstable: the worst board has a finite margin", () => {
    // With the Routh test on its boards, 5 of these 512 boards were called unstable and failed (margin -Infinity).
    const d = designLcLadder(IF_SPEC, TIGHT);
    expect(Number.isFinite(d.verification.yield.worstBoard.marginDb)).toBe(true);
    expect(lcLadderMarkdown(d)).not.toMatch(/Infinity|NaN/);
  });
});
