/**
 * A realisation chosen by compareRealisations goes through the same netlist,
 * BOM and report functions as the cascade.
 */
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { bomLines, compareRealisations, designFilter, InvalidArgumentError, toBomCsv, toMarkdown, toSpiceNetlist, type RealisationCandidate } from "../../src/index.ts";
import { acAnalysis } from "../../src/circuit/index.ts";
import { requireNgspice, runAc, assertNgspice, worstDbGap } from "../helpers/ngspice.ts";
import { thrownBy } from "../helpers/throws.ts";
import { SHARP_LOWPASS } from "../helpers/sharp-lowpass.ts";

const spec = SHARP_LOWPASS;
const design = designFilter(spec);
const comparison = compareRealisations(design, { runs: 300, seed: 4 });
const [cascade, leapfrog, fdnr] = comparison.candidates as [RealisationCandidate, RealisationCandidate, RealisationCandidate];

describe("toSpiceNetlist(result, { realisation })", () => {
  it("writes the ladder's own circuit, with the mask check on its output node", () => {
    for (const k of [leapfrog, fdnr]) {
      const text = toSpiceNetlist(design, { realisation: k });
      const l = k?.ladder;
      expect(text).toContain(`as an active ladder (${l?.method}, ${l?.opampCount} op-amps)`);
      expect(text).toContain(`.print ac vdb(${l?.output}) vp(${l?.output})`);
      expect(text).toContain(`max vdb(${l?.output}) from=`);
      for (const p of l?.parts ?? []) expect(text).toMatch(new RegExp(`^${p.name} `, "m"));
    }
    expect(toSpiceNetlist(design, { realisation: cascade })).toBe(toSpiceNetlist(design));
  });

  it.skipIf(!requireNgspice())("agrees with the ladder's nodal analysis in ngspice to 0.01 dB and its mask check runs", () => {
    const k = leapfrog;
    const l = k?.ladder;
    if (l === undefined) throw new Error("no leapfrog ladder");
    const text = toSpiceNetlist(design, { realisation: k, pointsPerDecade: 30 });
    const sim = runAc(text, [l.output]);
    const ours = acAnalysis(l.circuit, { source: "Vin", outputs: [l.output], freqHz: sim.freqHz }).outputs[l.output] as { re: Float64Array; im: Float64Array };
    const theirs = sim.vectors[l.output.toLowerCase()] as { re: Float64Array; im: Float64Array };
    expect(worstDbGap(ours, theirs, -90).worst).toBeLessThan(0.01);
    assertNgspice();
    const dir = mkdtempSync(join(tmpdir(), "fw-ladder-netlist-"));
    writeFileSync(join(dir, "l.cir"), text);
    const run = spawnSync("ngspice", ["-b", join(dir, "l.cir")], { encoding: "utf8" });
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/passband loss [-0-9.e+]+ dB \(spec <= 0\.25 dB\)/);
    expect(run.stdout).toMatch(/stopband attenuation [-0-9.e+]+ dB \(spec >= 33 dB\)/);
  });

  it("refuses what is not a candidate, naming the option", () => {
    expect(thrownBy(() => toSpiceNetlist(design, { realisation: {} as never }), InvalidArgumentError).path).toBe("options.realisation");
    expect(thrownBy(() => toSpiceNetlist(design, { realisation: { ...leapfrog, ladder: undefined } as never }), InvalidArgumentError).path).toBe("options.realisation.ladder");
  });
});

describe("bomLines / toBomCsv(result, { realisation })", () => {
  it("lists every part of the ladder at the tolerances its boards were built at, and its op-amps", () => {
    for (const k of [leapfrog, fdnr]) {
      const lines = bomLines(design, { realisation: k });
      const l = k?.ladder;
      const parts = lines.filter((x) => x.part !== "op-amp");
      expect(parts.reduce((n, x) => n + x.quantity, 0)).toBe(l?.parts.length);
      expect(lines.find((x) => x.part === "op-amp")?.quantity).toBe(l?.opampCount);
      expect(new Set(parts.filter((x) => x.part === "resistor").map((x) => x.tolerance))).toEqual(new Set(["1%"]));
      expect(new Set(parts.filter((x) => x.part === "capacitor").map((x) => x.tolerance))).toEqual(new Set(["2%"]));
      expect(toBomCsv(design, { realisation: k }).split("\r\n")[0]).toBe("designators,part,value,rkm,series,tolerance,dielectric,quantity");
    }
    expect(bomLines(design, { realisation: cascade })).toEqual(bomLines(design));
  });
});

describe("toMarkdown(result, { realisations })", () => {
  it("adds the comparison with the choice in bold", () => {
    const md = toMarkdown(design, { realisations: comparison });
    expect(md).toContain("## Realisations compared");
    const chosen = comparison.candidates[comparison.chosen];
    expect(md).toContain(`| **${chosen?.method}** |`);
    expect(md).toContain(`Choice: ${comparison.reason}`);
    expect(thrownBy(() => toMarkdown(design, { realisations: {} as never }), InvalidArgumentError).path).toBe("options.realisations");
  });
});
