/**
 * The spec's `realisation` field in designFilter: the cascade by default,
 * an active ladder or the best of the realisations compared on the same
 * boards, a passive LC ladder; the choice goes through the same netlist,
 * BOM, report and JSON as the cascade.
 */
import { describe, expect, expectTypeOf, it } from "vitest";
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import {
  bomLines,
  compareRealisations,
  designFilter,
  designLcLadder,
  fromJson,
  lcLadderNetlist,
  ParseError,
  SpecError,
  toBomCsv,
  toJson,
  toMarkdown,
  toSpiceNetlist,
  UnrealisableError,
  validateSpec,
  type DesignResult,
  type FilterSpec,
  type LcLadderDesign,
  type RealisationCandidate,
} from "../../src/index.ts";
import { acAnalysis } from "../../src/circuit/index.ts";
import { assertNgspice, requireNgspice, runAc, worstDbGap } from "../helpers/ngspice.ts";
import { thrownBy } from "../helpers/throws.ts";
import { SHARP_LOWPASS } from "../helpers/sharp-lowpass.ts";

const BOARDS = { maxBoards: 1024, seed: 11 };
const auto = designFilter({ ...SHARP_LOWPASS, yieldCheck: BOARDS, realisation: "auto" });
const ladderOnly = designFilter({ ...SHARP_LOWPASS, yieldCheck: BOARDS, yieldTarget: 0.75, realisation: "active-ladder" });

const chosenOf = (r: DesignResult): RealisationCandidate => {
  const own = r.realisation;
  if (own === undefined) throw new Error("no realisation recorded");
  return own.candidates[own.chosen] as RealisationCandidate;
};

describe("validateSpec: realisation", () => {
  it("defaults to the cascade, keeps the others and refuses anything else by its path", () => {
    const base = { response: "lowpass", passband: { edgeHz: 1000, maxLossDb: 1 }, stopband: { edgeHz: 4000, minAttenuationDb: 40 } } as const;
    expect(validateSpec(base).realisation).toBe("cascade");
    for (const r of ["cascade", "active-ladder", "auto", "lc-ladder"] as const) expect(validateSpec({ ...base, realisation: r }).realisation).toBe(r);
    const bad = thrownBy(() => validateSpec({ ...base, realisation: "ladder" }), SpecError);
    expect(bad.issues.map((i) => i.path)).toEqual(["realisation"]);
    expect(bad.message).toContain('"lc-ladder"');
    const stray = thrownBy(() => validateSpec({ ...base, lcLadder: { sourceOhms: 50 } }), SpecError);
    expect(stray.issues.map((i) => i.path)).toEqual(["lcLadder"]);
  });

  it("types the field: a FilterSpec takes the active realisations, an LC ladder spec returns an LC ladder design", () => {
    const base = { response: "lowpass", passband: { edgeHz: 1000, maxLossDb: 1 }, stopband: { edgeHz: 4000, minAttenuationDb: 40 } } as const;
    // @ts-expect-error: not a realisation
    const typo: FilterSpec = { ...base, realisation: "ladder" };
    // @ts-expect-error: the LC ladder options go with realisation "lc-ladder" only
    const stray: FilterSpec = { ...base, lcLadder: {} };
    void typo;
    void stray;
    expectTypeOf(designFilter({ ...base, realisation: "lc-ladder" as const })).toEqualTypeOf<LcLadderDesign>();
    expectTypeOf(designFilter({ ...base, realisation: "auto" as const })).toEqualTypeOf<DesignResult>();
    expectTypeOf(designFilter(base)).toEqualTypeOf<DesignResult>();
  });
});

describe("designFilter({ realisation })", () => {
  it("records nothing for the cascade, the default", () => {
    const r = designFilter({ ...SHARP_LOWPASS, yieldCheck: BOARDS });
    expect(r.realisation).toBeUndefined();
    expect(r.spec.realisation).toBe("cascade");
  });

  it('"auto" compares the cascade and the active ladders on the same seeded boards, each until its interval decides', () => {
    const own = auto.realisation;
    expect(own?.requested).toBe("auto");
    expect(own?.candidates.map((k) => k.method)).toEqual(["biquad-cascade", "leapfrog", "fdnr"]);
    for (const k of own?.candidates ?? []) {
      // blocks of 256 boards, at least two, at most the spec's cap; stopped early only once the interval decides
      expect(k.boards % 256).toBe(0);
      expect(k.boards).toBeGreaterThanOrEqual(512);
      expect(k.boards).toBeLessThanOrEqual(BOARDS.maxBoards);
      if (k.boards < BOARDS.maxBoards) expect(k.lower95 >= SHARP_LOWPASS.yieldTarget! || k.upper95 < SHARP_LOWPASS.yieldTarget!).toBe(true);
    }
    // the same boards compareRealisations builds: its first boards, at the candidate's count
    const chosen = chosenOf(auto);
    const again = compareRealisations(auto, { runs: chosen.boards, seed: BOARDS.seed });
    const same = again.candidates.find((k) => k.method === chosen.method);
    expect([same?.yield, same?.boards, same?.medianMarginDb]).toEqual([chosen.yield, chosen.boards, chosen.medianMarginDb]);
    // a ladder's boards do far better than the cascade's at the same 1 % / 2 % parts (Orchard 1966)
    const [cascade, ...ladders] = own?.candidates ?? [];
    for (const l of ladders) expect(l.yield).toBeGreaterThan((cascade?.yield ?? 1) + 0.3);
  });

  it('"auto" chooses, of the realisations meeting the target, the fewest op-amps, and says why', () => {
    const own = auto.realisation;
    const cands = own?.candidates ?? [];
    const meeting = cands.filter((k) => k.meetsTarget);
    expect(meeting.length).toBeGreaterThan(0);
    const fewest = Math.min(...meeting.map((k) => k.opamps));
    const k = chosenOf(auto);
    expect(k.meetsTarget).toBe(true);
    expect(k.opamps).toBe(fewest);
    expect(k.method).toBe("fdnr");
    expect(own?.reason).toContain("the fdnr active ladder");
    expect(own?.boardsMeetSpec).toBe(k.nominalMarginDb >= 0 && k.meetsTarget);
    expect(k.nominalMarginDb).toBeGreaterThan(0);
  });

  it('"auto" says when the cascade reaches the target only with the tighter parts its design allocated', () => {
    // tolerances left to the design: the cascade tightens its parts to reach the target, the ladders are compared
    // at the spec's default classes (1 % resistors, 5 % capacitors)
    const { parts: _, ...loose } = SHARP_LOWPASS;
    const r = designFilter({ ...loose, yieldTarget: 0.2, yieldCheck: BOARDS, realisation: "auto" });
    const own = r.realisation;
    // at 1 % / 5 % only the leapfrog ladder meets 20 % (the cascade about 0.4 %); the cascade's design reaches it
    // with 0.25 % resistors and 1 % capacitors where it needs them
    expect(chosenOf(r).method).toBe("leapfrog");
    expect(own?.candidates[0]?.meetsTarget).toBe(false);
    expect(r.verification.yield.met).toBe(true);
    expect(own?.reason).toContain("The cascade meets the target too, but only with the tighter parts its design allocated");
    expect(own?.reason).toContain(`${Number((r.verification.yield.capacitorTolerances[0]! * 100).toPrecision(3))} % C`);
    expect(own?.tolerances).toEqual({ resistor: r.spec.resistorTolerance, capacitor: r.spec.capacitorTolerance });
  });

  it('"active-ladder" chooses among the ladders only (the cascade listed for comparison)', () => {
    const own = ladderOnly.realisation;
    expect(own?.requested).toBe("active-ladder");
    expect(own?.chosen).toBeGreaterThan(0);
    // at a 75 % target only the leapfrog's interval clears it here
    const k = chosenOf(ladderOnly);
    expect(k.realisation).toBe("active-ladder");
    const best = Math.max(...(own?.candidates ?? []).slice(1).map((c) => c.lower95));
    expect(k.meetsTarget ? true : k.lower95 === best).toBe(true);
    expect(own?.reason).toMatch(/active ladder/);
  });

  it('"active-ladder" for a response no ladder is built for is an UnrealisableError naming the field', () => {
    const e = thrownBy(
      () => designFilter({ response: "bandpass", passband: { edgeHz: [900, 1100], maxLossDb: 1 }, stopband: { edgeHz: [500, 2000], minAttenuationDb: 30 }, yieldCheck: { maxBoards: 256 }, realisation: "active-ladder" }),
      UnrealisableError,
    );
    expect(e.path).toBe("realisation");
    expect(e.message).toContain('ask for realisation "auto" or "cascade"');
  });

  it('"lc-ladder" returns the passive ladder designLcLadder makes, with the spec\'s lcLadder options', () => {
    const spec = {
      response: "lowpass",
      passband: { edgeHz: 21.4e6, maxLossDb: 1 },
      stopband: { edgeHz: 40e6, minAttenuationDb: 40 },
      parts: { capacitorSeries: "E24", capacitorTolerance: 0.01 },
      realisation: "lc-ladder",
      lcLadder: { inductorSeries: "E24", inductorTolerance: 0.02, inductorQ: 80, boards: 400, seed: 5 },
    } as const;
    const lc = designFilter(spec);
    const direct = designLcLadder(spec, spec.lcLadder);
    expect(lc.spec.realisation).toBe("lc-ladder");
    expect(lc.parts).toEqual(direct.parts);
    expect(lc.verification).toEqual(direct.verification);
    expect(lc.options).toEqual(direct.options);
    expect(lcLadderNetlist(lc)).toContain(".print ac vdb(");
    expect(lc.circuit.elements.some((e) => e.kind === "L")).toBe(true);
  });
});

describe("the chosen realisation through the exports", () => {
  it("toSpiceNetlist, bomLines and toBomCsv default to the chosen ladder; the cascade on request", () => {
    const k = chosenOf(auto);
    const cascade = auto.realisation?.candidates[0] as RealisationCandidate;
    expect(toSpiceNetlist(auto)).toBe(toSpiceNetlist(auto, { realisation: k }));
    expect(toSpiceNetlist(auto)).toContain(`as an active ladder (${k.method}, ${k.opamps} op-amps)`);
    expect(toSpiceNetlist(auto, { realisation: cascade })).not.toContain("active ladder");
    expect(bomLines(auto)).toEqual(bomLines(auto, { realisation: k }));
    expect(bomLines(auto).find((x) => x.part === "op-amp")?.quantity).toBe(k.opamps);
    expect(toBomCsv(auto)).toBe(toBomCsv(auto, { realisation: k }));
  });

  it("toMarkdown leads with the ladder's verdict and lists the comparison", () => {
    const md = toMarkdown(auto);
    const k = chosenOf(auto);
    expect(md).toContain(`realised as the ${k.method} active ladder (${k.opamps} op-amps)`);
    expect(md).toContain("## Realisations compared");
    expect(md).toContain(`| **${k.method}** |`);
    expect(md).toContain("| realisation | auto |");
  });

  it.skipIf(!requireNgspice())("the default netlist is the ladder's, and ngspice agrees with its nodal analysis to 0.01 dB", () => {
    const l = chosenOf(auto).ladder;
    if (l === undefined) throw new Error("no ladder chosen");
    const text = toSpiceNetlist(auto, { pointsPerDecade: 30 });
    const sim = runAc(text, [l.output]);
    const ours = acAnalysis(l.circuit, { source: "Vin", outputs: [l.output], freqHz: sim.freqHz }).outputs[l.output] as { re: Float64Array; im: Float64Array };
    const theirs = sim.vectors[l.output.toLowerCase()] as { re: Float64Array; im: Float64Array };
    expect(worstDbGap(ours, theirs, -90).worst).toBeLessThan(0.01);
    assertNgspice();
    const dir = mkdtempSync(join(tmpdir(), "fw-realisation-"));
    writeFileSync(join(dir, "r.cir"), text);
    const run = spawnSync("ngspice", ["-b", join(dir, "r.cir")], { encoding: "utf8" });
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/passband loss [-0-9.e+]+ dB \(spec <= 0\.25 dB\)/);
  });
});

describe("toJson / fromJson with a realisation", () => {
  it("round-trips, the comparison recomputed on import", () => {
    const back = fromJson(toJson(auto));
    expect(back.realisation).toEqual(auto.realisation);
    expect(toJson(back)).toBe(toJson(auto));
  });

  it("refuses an edited choice or figure, naming the field", () => {
    const file = JSON.parse(toJson(auto)) as { result: { realisation: { chosen: number; candidates: { yield: number }[] } } };
    const edit = (f: (x: typeof file) => void): string => {
      const copy = structuredClone(file);
      f(copy);
      return JSON.stringify(copy);
    };
    expect(thrownBy(() => fromJson(edit((x) => void (x.result.realisation.chosen = 1))), ParseError).path).toBe("result.realisation.chosen");
    expect(thrownBy(() => fromJson(edit((x) => void ((x.result.realisation.candidates[2] as { yield: number }).yield = 0.99))), ParseError).path).toBe("result.realisation.candidates.2.yield");
    expect(thrownBy(() => fromJson(edit((x) => void delete (x.result as { realisation?: unknown }).realisation)), ParseError).path).toBe("result.realisation");
  });

  it("reads a cascade file written before specs had a realisation", () => {
    const r = designFilter({ response: "lowpass", passband: { edgeHz: 1000, maxLossDb: 1 }, stopband: { edgeHz: 4000, minAttenuationDb: 40 }, yieldCheck: { maxBoards: 256 } });
    const file = JSON.parse(toJson(r)) as { formatVersion: number; checksum?: string; result: { spec: { realisation?: string } } };
    delete file.result.spec.realisation;
    delete file.checksum;
    file.formatVersion = 2;
    expect(fromJson(JSON.stringify(file)).spec.realisation).toBe("cascade");
  });
});
