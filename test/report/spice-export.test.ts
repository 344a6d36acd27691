import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { designFilter, type FilterSpec } from "../../src/design/index.ts";
import { toSpiceNetlist, type OpampSubcircuit } from "../../src/report/index.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { assertNgspice, requireNgspice, runAc } from "../helpers/ngspice.ts";
import { thrownBy } from "../helpers/throws.ts";

const haveSpice = requireNgspice();

// a 3 kHz anti-alias lowpass and a 40-400 Hz bandpass for a machine-condition logger (our own scenarios), single-pole op-amps
const lowpass: FilterSpec = {
  response: "lowpass",
  passband: { edgeHz: "3k", maxLossDb: 0.5 },
  stopband: { edgeHz: "12k", minAttenuationDb: 50 },
  opamp: { a0: 2e5, gbwHz: "3M" },
};
const bandpass: FilterSpec = {
  response: "bandpass",
  passband: { edgeHz: [40, 400], maxLossDb: 1 },
  stopband: { edgeHz: [8, 2000], minAttenuationDb: 30 },
  opamp: { a0: 2e5, gbwHz: "3M" },
};
const lp = designFilter(lowpass);
const bp = designFilter(bandpass);

/** Run a netlist as it is (its own control block) and return standard output. */
function ngspiceBatch(netlist: string, extra: Record<string, string> = {}): string {
  assertNgspice();
  const dir = mkdtempSync(join(tmpdir(), "fw-export-"));
  try {
    for (const [name, text] of Object.entries(extra)) writeFileSync(join(dir, name), text);
    writeFileSync(join(dir, "design.cir"), netlist);
    const r = spawnSync("ngspice", ["-b", "design.cir"], { cwd: dir, encoding: "utf8", timeout: 120_000 });
    if (r.status !== 0) throw new Error(`ngspice failed: ${r.stderr}\n${r.stdout}`);
    return r.stdout;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function printed(out: string, what: string): number {
  const m = new RegExp(`^${what} (\\S+) dB`, "m").exec(out);
  if (m === null) throw new Error(`"${what}" not printed:\n${out}`);
  return Number(m[1]);
}

// Our own five-pin op-amp model: the same single pole as the built-in model, with supply pins
// that draw a quiescent current through 100 kΩ (they carry no signal, so the AC response is the built-in one).
const fivePin = (name: string): string =>
  [
    `.subckt ${name} inp inn vp vn out`,
    "G1 0 n1 inp inn 1",
    "R1 n1 0 2e5",
    `C1 n1 0 ${1 / (2 * Math.PI * 3e6)}`,
    "E1 out 0 n1 0 1",
    "Rq vp vn 1e5",
    `.ends ${name}`,
  ].join("\n");

describe("toSpiceNetlist mask check", () => {
  it.skipIf(!haveSpice)("prints the passband loss, level and stopband attenuation that the design reports, from ngspice's own sweep", () => {
    for (const r of [lp, bp]) {
      const out = ngspiceBatch(toSpiceNetlist(r, { pointsPerDecade: 400 }));
      const v = r.verification;
      const loss = printed(out, "passband loss");
      const level = printed(out, "passband level");
      const atten = printed(out, "stopband attenuation");
      // ngspice reads its points, the design searches the extremes: ngspice can only see less loss and more attenuation
      expect(loss).toBeLessThanOrEqual(v.passbandLossDb + 1e-4);
      expect(loss).toBeGreaterThan(v.passbandLossDb - 0.01);
      expect(atten).toBeGreaterThanOrEqual(v.stopbandAttenuationDb - 1e-4);
      // meas starts at the first sweep point past the edge: up to one step (0.58 % at 400 points a decade) of the slope there
      expect(atten).toBeLessThan(v.stopbandAttenuationDb + 0.25);
      // the highest passband level, within the passband's ripple of the design's level
      expect(Math.abs(level - v.gainDb)).toBeLessThan(v.passbandLossDb + 0.01);
      expect(out).toContain(`(spec <= ${r.spec.maxLossDb} dB)`);
      expect(out).toContain(`(spec >= ${r.spec.minAttenuationDb} dB)`);
    }
  });

  it("is one .control block after the .ac card, and measure: false leaves it out", () => {
    const text = toSpiceNetlist(bp);
    const lines = text.split("\n");
    const ac = lines.findIndex((l) => l.startsWith(".ac "));
    expect(lines[ac + 1]).toBe(".print ac vdb(out) vp(out)");
    expect(lines[ac + 2]).toBe(".control");
    expect(lines.filter((l) => l === ".control")).toHaveLength(1);
    // a bandpass has two stopbands, both measured
    expect(text).toMatch(/meas ac fw_stop1_max max vdb\(out\)/);
    expect(text).toMatch(/meas ac fw_stop2_max max vdb\(out\)/);
    const plain = toSpiceNetlist(bp, { measure: false });
    expect(plain).not.toContain(".control");
    expect(plain).toContain(".print ac vdb(out) vp(out)");
    expect(plain.trimEnd().endsWith(".end")).toBe(true);
  });
});

describe("toSpiceNetlist opampSubcircuit", () => {
  const sub: OpampSubcircuit = {
    name: "LOGAMP5",
    pins: ["in+", "in-", "v+", "v-", "out"],
    text: fivePin("LOGAMP5"),
    supplyV: { positive: 5, negative: -5 },
  };

  it("instantiates the user's subcircuit with its pin order and rails", () => {
    const text = toSpiceNetlist(lp, { opampSubcircuit: sub });
    const instances = text.split("\n").filter((l) => /^XU\d+ /.test(l));
    expect(instances.length).toBe(lp.stages.reduce((k, s) => k + s.opamps.length, 0));
    for (const l of instances) expect(l).toMatch(/^XU\d+ \S+ \S+ vpos vneg \S+ LOGAMP5$/);
    expect(text).toContain("Vpos vpos 0 DC 5");
    expect(text).toContain("Vneg vneg 0 DC -5");
    expect(text).not.toContain("fw_opamp");
  });

  it.skipIf(!haveSpice)("gives the same response as the built-in model when it is the same op-amp (text and include)", () => {
    const ref = runAc(toSpiceNetlist(lp, { pointsPerDecade: 40 }), ["out"]);
    const own = runAc(toSpiceNetlist(lp, { pointsPerDecade: 40, opampSubcircuit: sub }), ["out"]);
    const db = (v: { re: Float64Array; im: Float64Array }, i: number): number => 10 * Math.log10((v.re[i] as number) ** 2 + (v.im[i] as number) ** 2);
    expect(own.freqHz.length).toBe(ref.freqHz.length);
    for (let i = 0; i < ref.freqHz.length; i++) expect(Math.abs(db(own.vectors["out"]!, i) - db(ref.vectors["out"]!, i))).toBeLessThan(1e-6);
    // the same model from a file next to the netlist, through .include
    const out = ngspiceBatch(toSpiceNetlist(lp, { opampSubcircuit: { name: sub.name, pins: sub.pins, supplyV: sub.supplyV!, include: "logamp5.lib" } }), {
      "logamp5.lib": `* our own test model\n${fivePin("LOGAMP5")}\n`,
    });
    expect(Math.abs(printed(out, "passband loss") - printed(ngspiceBatch(toSpiceNetlist(lp)), "passband loss"))).toBeLessThan(1e-6);
  });

  it("refuses a subcircuit it cannot wire, naming the field", () => {
    const bad = (o: unknown, path: string, text: RegExp): void => {
      const e = thrownBy(() => toSpiceNetlist(lp, { opampSubcircuit: o as OpampSubcircuit }), InvalidArgumentError);
      expect(e.path).toBe(path);
      expect((e as Error).message).toMatch(text);
    };
    const p = "options.opampSubcircuit";
    bad({ ...sub, pins: ["in+", "in-", "v+", "v-"] }, `${p}.pins`, /pin "out" is missing/);
    bad({ ...sub, pins: ["in+", "in-", "in-", "out"] }, `${p}.pins`, /listed 2 times/);
    bad({ ...sub, pins: ["in+", "in-", "v+", "out"] }, `${p}.pins`, /both supply pins/);
    bad({ ...sub, pins: ["in+", "in-", "vcc", "out"] }, `${p}.pins`, /each one of "in\+"/);
    bad({ ...sub, supplyV: undefined }, `${p}.supplyV`, /give the rails/);
    bad({ ...sub, supplyV: { positive: 5, negative: 5 } }, `${p}.supplyV.negative`, /below 0/);
    bad({ ...sub, supplyV: { positive: Number.NaN, negative: -5 } }, `${p}.supplyV.positive`, /above 0/);
    bad({ ...sub, pins: ["in+", "in-", "out"] }, `${p}.supplyV`, /leave supplyV out/);
    bad({ ...sub, text: fivePin("OTHER") }, `${p}.text`, /\.subckt LOGAMP5/);
    bad({ ...sub, include: "x.lib" }, `${p}.text`, /exactly one of text/);
    bad({ ...sub, name: "9amp" }, `${p}.name`, /subcircuit name/);
    bad({ ...sub, text: undefined, include: 'a"b.lib' }, `${p}.include`, /one line/);
    expect(() => toSpiceNetlist(lp, { measure: "yes" as unknown as boolean })).toThrow(/options.measure/);
  });
});
