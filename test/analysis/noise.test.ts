import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { designFilter, designCircuit, type DesignResult, type FilterSpec } from "../../src/design/index.ts";
import { BOLTZMANN_J_PER_K, noiseAnalysis } from "../../src/analysis/index.ts";
import { circuitToSpice } from "../../src/circuit/spice.ts";
import type { Circuit, Element } from "../../src/circuit/types.ts";
import { InvalidArgumentError } from "../../src/errors.ts";
import { assertNgspice, requireNgspice } from "../helpers/ngspice.ts";
import { relErr } from "../helpers/tolerance.ts";

const haveSpice = requireNgspice();

/** ngspice's nominal temperature, 27 °C. */
const T_SPICE = 300.15;

interface SpiceNoise {
  readonly freqHz: Float64Array;
  /** Vector name (lower case) to values. */
  readonly vectors: Record<string, Float64Array>;
}

/**
 * Run a `.noise` analysis in ngspice batch mode: output noise density at
 * v(out) driven by `Vin`, 20 points per decade from `startHz` to `stopHz`, and
 * read back the named vectors of the `noise1` plot (`onoise_spectrum`, and per
 * device `onoise_r1` ... when a summary interval is set).
 */
function runNoise(circuit: Circuit, band: { startHz: number; stopHz: number }, vectors: readonly string[]): SpiceNoise {
  assertNgspice();
  const dir = mkdtempSync(join(tmpdir(), "fw-noise-"));
  try {
    const cir = join(dir, "noise.cir");
    const out = join(dir, "noise.txt");
    const body = circuitToSpice(circuit, { ac: false }).replace(/\n\.end\s*$/i, "\n");
    const deck = [
      body,
      `.noise v(out) Vin dec 20 ${band.startHz} ${band.stopHz} 1`,
      ".control",
      "set wr_singlescale",
      "set wr_vecnames",
      "option numdgt=15",
      "run",
      "setplot noise1",
      `wrdata ${out} ${vectors.join(" ")}`,
      "quit",
      ".endc",
      ".end",
      "",
    ].join("\n");
    writeFileSync(cir, deck);
    const r = spawnSync("ngspice", ["-b", cir], { encoding: "utf8", timeout: 120_000 });
    if (r.status !== 0) throw new Error(`ngspice failed (${r.status}): ${r.stderr}\n${r.stdout}`);
    const lines = readFileSync(out, "utf8").trim().split("\n");
    const rows = lines.slice(1).map((l) => l.trim().split(/\s+/).map(Number));
    const freqHz = Float64Array.from(rows, (row) => row[0] as number);
    const vecs: Record<string, Float64Array> = {};
    vectors.forEach((v, k) => {
      vecs[v.toLowerCase()] = Float64Array.from(rows, (row) => row[1 + k] as number);
    });
    return { freqHz, vectors: vecs };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const designs: Record<string, FilterSpec> = {
  "lowpass (Sallen-Key, hydrophone anti-alias)": {
    response: "lowpass",
    passband: { edgeHz: 20000, maxLossDb: 0.5 },
    stopband: { edgeHz: 60000, minAttenuationDb: 50 },
    gain: { db: 6 },
  },
  "lowpass (multiple feedback, vibration sensor)": {
    response: "lowpass",
    passband: { edgeHz: 2000, maxLossDb: 0.5 },
    stopband: { edgeHz: 8000, minAttenuationDb: 45 },
    family: "chebyshev1",
    topology: "mfb-lowpass",
  },
  "highpass (geophone drift removal)": {
    response: "highpass",
    passband: { edgeHz: 40, maxLossDb: 1 },
    stopband: { edgeHz: 8, minAttenuationDb: 40 },
  },
  "bandpass (pulse oximeter band)": {
    response: "bandpass",
    passband: { edgeHz: [0.5, 5], maxLossDb: 1 },
    stopband: { edgeHz: [0.1, 25], minAttenuationDb: 30 },
  },
  "bandstop (mains hum on a strain gauge)": {
    response: "bandstop",
    passband: { edgeHz: [40, 62.5], maxLossDb: 1 },
    stopband: { edgeHz: [48, 52], minAttenuationDb: 20 },
  },
};

/** Log-spaced band of whole decades around the design, so our grid and ngspice's `dec 20` coincide. */
function decadeBand(r: DesignResult): { startHz: number; stopHz: number; points: number } {
  const edges = [...r.spec.passbandHz, ...r.spec.stopbandHz];
  const lo = 10 ** Math.floor(Math.log10(Math.min(...edges)) - 1);
  const hi = 10 ** Math.ceil(Math.log10(Math.max(...edges)) + 1);
  return { startHz: lo, stopHz: hi, points: 20 * Math.round(Math.log10(hi / lo)) + 1 };
}

/** Same design with part values changed by a function of the designator and value. */
function mapValues(r: DesignResult, f: (name: string, v: number) => number): DesignResult {
  return {
    ...r,
    stages: r.stages.map((s) => ({
      ...s,
      components: Object.fromEntries(Object.entries(s.components).map(([k, v]) => [k, f(k, v)])),
    })),
  };
}

describe("noiseAnalysis against ngspice .noise (resistor thermal noise, ideal op-amps)", () => {
  for (const [label, spec] of Object.entries(designs)) {
    it.skipIf(!haveSpice)(`matches the output density and per-resistor spectra: ${label}`, () => {
      const r = designFilter(spec);
      expect(r.spec.opamp.kind).toBe("ideal");
      const band = decadeBand(r);
      const ours = noiseAnalysis(r, { bandHz: [band.startHz, band.stopHz], points: band.points, temperatureK: T_SPICE });
      const circuit = designCircuit(r);
      const resistors = circuit.elements.filter((e) => e.kind === "R").map((e) => e.name);
      const sim = runNoise(circuit, band, ["onoise_spectrum", ...resistors.map((n) => `onoise_${n.toLowerCase()}`)]);
      expect(sim.freqHz.length).toBe(ours.freqHz.length);
      let worst = 0;
      let worstPart = 0;
      for (let i = 0; i < sim.freqHz.length; i++) {
        expect(relErr(ours.freqHz[i] as number, sim.freqHz[i] as number)).toBeLessThan(1e-9);
        worst = Math.max(worst, relErr(ours.outputDensity[i] as number, sim.vectors["onoise_spectrum"]?.[i] as number));
        // Per-resistor spectra: ngspice's onoise_<device> vectors are densities (V/sqrt(Hz)) at the output.
        const top = ours.outputDensity[i] as number;
        for (const name of resistors) {
          const ref = sim.vectors[`onoise_${name.toLowerCase()}`]?.[i] as number;
          const got = ours.contributions[name]?.[i] as number;
          // Relative to the total, so tiny contributions near a transmission zero do not dominate.
          worstPart = Math.max(worstPart, Math.abs(got - ref) / top);
        }
      }
      // Measured 2e-7 (1.2e-5 for the 0.5-5 Hz bandpass): ngspice 39 uses k = 1.38064852e-23 (CODATA 2014),
      // 3.5e-7 below the exact SI value, and its ideal op-amp is a VCVS of gain 1e9.
      expect(worst, `${label}: worst relative error of the output density`).toBeLessThan(1e-4);
      expect(worstPart, `${label}: worst per-resistor error relative to the total`).toBeLessThan(1e-4);
    });
  }
});

/** The circuit with every op-amp's noise drawn as resistors ngspice knows: en as a series resistor, in by a resistor-driven VCCS. */
function withOpampNoiseAsResistors(circuit: Circuit, en: number, inoise: number, temperatureK: number): { circuit: Circuit; extra: string[] } {
  const kT4 = 4 * BOLTZMANN_J_PER_K * temperatureK;
  const elements: Element[] = [];
  const extra: string[] = [];
  for (const e of circuit.elements) {
    if (e.kind !== "OA") {
      elements.push(e);
      continue;
    }
    // en: a resistor of en^2 / (4kT) in series with the non-inverting input (no input current flows, so it only adds noise).
    const p = `${e.name}_enp`;
    elements.push({ kind: "R", name: `Ren_${e.name}`, a: e.inP, b: p, value: (en * en) / kT4 });
    elements.push({ ...e, inP: p });
    // in: an isolated resistor of in^2 / (4kT) whose open-circuit noise voltage drives a 1 S VCCS into the input.
    for (const [tag, node] of [["p", e.inP], ["n", e.inN]] as const) {
      if (node === "0") continue;
      const x = `${e.name}_in${tag}`;
      extra.push(`Rin${tag}_${e.name} ${x} 0 ${(inoise * inoise) / kT4}`, `Gin${tag}_${e.name} 0 ${node} ${x} 0 1`);
    }
  }
  return { circuit: { title: circuit.title, elements }, extra };
}

describe("noiseAnalysis op-amp noise against ngspice", () => {
  const spec = designs["lowpass (multiple feedback, vibration sensor)"] as FilterSpec;
  const en = 7e-9;
  const inoise = 2e-12;
  function withOpampNoise(): { r: DesignResult; band: ReturnType<typeof decadeBand>; ours: ReturnType<typeof noiseAnalysis> } {
    const r = designFilter({ ...spec, gain: { db: 10 } });
    const band = decadeBand(r);
    const ours = noiseAnalysis(r, { bandHz: [band.startHz, band.stopHz], points: band.points, opampVoltageNoise: en, opampCurrentNoise: inoise });
    return { r, band, ours };
  }

  it("lists each op-amp's en and in as contributions", () => {
    const names = Object.keys(withOpampNoise().ours.contributions);
    expect(names).toContain("U1.en");
    expect(names.some((n) => n.endsWith(".in-"))).toBe(true);
  });

  it.skipIf(!haveSpice)("matches en and in drawn as equivalent noisy resistors", () => {
    const { r, band, ours } = withOpampNoise();
    const { circuit, extra } = withOpampNoiseAsResistors(designCircuit(r), en, inoise, T_SPICE);
    const sim = runNoiseWithExtra(circuit, extra, band);
    let worst = 0;
    for (let i = 0; i < sim.length; i++) worst = Math.max(worst, relErr(ours.outputDensity[i] as number, sim[i] as number));
    // Measured 3e-7.
    expect(worst).toBeLessThan(1e-5);
  });

  it("gives en times the noise gain 1 + Rf/Rg for a first-order non-inverting stage at low frequency", () => {
    const r = designFilter({
      response: "lowpass",
      passband: { edgeHz: 1000, maxLossDb: 3 },
      stopband: { edgeHz: 10000, minAttenuationDb: 15 },
      order: 1,
      gain: { db: 12 },
    });
    const c = designCircuit(r);
    const en = 10e-9;
    const ours = noiseAnalysis(r, { opampVoltageNoise: en, bandHz: [0.1, 1000], points: 64 });
    const oa = c.elements.find((e) => e.kind === "OA");
    if (oa?.kind !== "OA") throw new Error("no op-amp");
    expect(r.stages[0]?.topology).toBe("first-order-lowpass-noninverting");
    // Feedback resistor from the output to the inverting input, and the one from there to ground.
    const rs = c.elements.filter((e) => e.kind === "R");
    const rf = rs.find((e) => [e.a, e.b].includes(oa.out) && [e.a, e.b].includes(oa.inN));
    const rg = rs.find((e) => [e.a, e.b].includes("0") && [e.a, e.b].includes(oa.inN));
    if (rf === undefined || rg === undefined) throw new Error(`no Rf/Rg around ${oa.name}`);
    // At 0.1 Hz, four decades below the corner, the noise gain is 1 + Rf/Rg to about 1e-8.
    expect(relErr(ours.contributions[`${oa.name}.en`]?.[0] as number, en * (1 + rf.value / rg.value))).toBeLessThan(1e-6);
  });
});

function runNoiseWithExtra(circuit: Circuit, extra: readonly string[], band: { startHz: number; stopHz: number }): Float64Array {
  assertNgspice();
  const dir = mkdtempSync(join(tmpdir(), "fw-noise-"));
  try {
    const cir = join(dir, "noise.cir");
    const out = join(dir, "noise.txt");
    const body = circuitToSpice(circuit, { ac: false }).replace(/\n\.end\s*$/i, "\n");
    const deck = [body, ...extra, `.noise v(out) Vin dec 20 ${band.startHz} ${band.stopHz}`, ".control", "set wr_singlescale", "option numdgt=15", "run", "setplot noise1", `wrdata ${out} onoise_spectrum`, "quit", ".endc", ".end", ""].join("\n");
    writeFileSync(cir, deck);
    const r = spawnSync("ngspice", ["-b", cir], { encoding: "utf8", timeout: 120_000 });
    if (r.status !== 0) throw new Error(`ngspice failed (${r.status}): ${r.stderr}\n${r.stdout}`);
    const rows = readFileSync(out, "utf8").trim().split("\n").map((l) => l.trim().split(/\s+/).map(Number));
    return Float64Array.from(rows, (row) => row[1] as number);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

describe("noiseAnalysis properties", () => {
  const r = designFilter(designs["bandpass (pulse oximeter band)"] as FilterSpec);
  const opts = { opampVoltageNoise: 4e-9, opampCurrentNoise: 1e-12 } as const;

  it("splits the output power exactly into the contributions", () => {
    const n = noiseAnalysis(r, opts);
    for (let i = 0; i < n.freqHz.length; i++) {
      let sum = 0;
      for (const d of Object.values(n.contributions)) sum += (d[i] as number) ** 2;
      expect(relErr(sum, (n.outputDensity[i] as number) ** 2)).toBeLessThan(1e-12);
    }
    const fractions = n.topContributors.reduce((a, c) => a + c.powerFraction, 0);
    expect(Math.abs(fractions - 1)).toBeLessThan(1e-12);
    const rss = Math.sqrt(n.topContributors.reduce((a, c) => a + c.rmsV ** 2, 0));
    expect(relErr(rss, n.totalRmsV)).toBeLessThan(1e-12);
    for (let k = 1; k < n.topContributors.length; k++) {
      expect(n.topContributors[k - 1]?.powerFraction).toBeGreaterThanOrEqual(n.topContributors[k]?.powerFraction as number);
    }
    for (let i = 0; i < n.freqHz.length; i++) {
      expect(n.inputReferredDensity[i]).toBeCloseTo((n.outputDensity[i] as number) / r.spec.gain, 20);
    }
  });

  it("scales resistor noise by sqrt(k), current noise by k and leaves en unchanged under impedance scaling", () => {
    const k = 7.5;
    const scaled = mapValues(r, (name, v) => (name.startsWith("R") ? v * k : name.startsWith("C") ? v / k : v));
    const a = noiseAnalysis(r, opts);
    const b = noiseAnalysis(scaled, opts);
    let checked = 0;
    for (const [name, da] of Object.entries(a.contributions)) {
      const db = b.contributions[name] as Float64Array;
      const factor = name.startsWith("R") ? Math.sqrt(k) : name.includes(".in") ? k : 1;
      for (let i = 0; i < da.length; i += 17) {
        expect(relErr(db[i] as number, factor * (da[i] as number))).toBeLessThan(1e-9);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(50);
  });

  it("scales every resistor's density by sqrt(T)", () => {
    const a = noiseAnalysis(r, { temperatureK: 250 });
    const b = noiseAnalysis(r, { temperatureK: 1000 });
    for (let i = 0; i < a.freqHz.length; i += 13) expect(relErr(b.outputDensity[i] as number, 2 * (a.outputDensity[i] as number))).toBeLessThan(1e-12);
  });

  it("integrates a flat density over the band to the trapezoid accuracy", () => {
    // The RMS of the en contribution of a DC-coupled lowpass equals en * gain * sqrt(band) when the band sits far below the corner.
    const lp = designFilter(designs["lowpass (Sallen-Key, hydrophone anti-alias)"] as FilterSpec);
    const n = noiseAnalysis(lp, { bandHz: [1, 11], opampVoltageNoise: 1e-8, points: 400 });
    const en = n.topContributors.find((c) => c.name.endsWith(".en"));
    expect(en).toBeDefined();
    const flat = Object.entries(n.contributions).filter(([name]) => name.endsWith(".en"));
    let p = 0;
    for (const [, d] of flat) p += (d[0] as number) ** 2 * 10;
    const enTotal = Math.sqrt(n.topContributors.filter((c) => c.name.endsWith(".en")).reduce((a, c) => a + c.rmsV ** 2, 0));
    expect(relErr(enTotal, Math.sqrt(p))).toBeLessThan(1e-5);
  });

  it("tends to the ideal op-amp's noise as the op-amp model's gain and bandwidth grow (to the largest accepted, 1e9 and 100 GHz)", () => {
    const spec = designs["lowpass (multiple feedback, vibration sensor)"] as FilterSpec;
    const ideal = noiseAnalysis(designFilter(spec), opts);
    const fast = noiseAnalysis(designFilter({ ...spec, opamp: { a0: 1e9, gbwHz: 1e11 } }), opts);
    expect(Object.keys(fast.contributions).sort()).toEqual(Object.keys(ideal.contributions).sort());
    for (const [name, d] of Object.entries(ideal.contributions)) {
      const f = fast.contributions[name] as Float64Array;
      for (let i = 0; i < d.length; i += 11) expect(Math.abs((f[i] as number) - (d[i] as number)) / (ideal.outputDensity[i] as number), name).toBeLessThan(1e-6);
    }
  });

  it("rejects bad options with typed errors naming the field", () => {
    const bad: [unknown, string][] = [
      [{ temperatureK: -1 }, "options.temperatureK"],
      [{ temperatureK: Number.NaN }, "options.temperatureK"],
      [{ opampVoltageNoise: -1e-9 }, "options.opampVoltageNoise"],
      [{ opampCurrentNoise: "1p" }, "options.opampCurrentNoise"],
      [{ bandHz: [100, 10] }, "options.bandHz"],
      [{ bandHz: [0, 10] }, "options.bandHz[0]"],
      [{ bandHz: 10 }, "options.bandHz"],
      [{ points: 3.5 }, "options.points"],
      ["fast", "options"],
    ];
    for (const [o, path] of bad) {
      let err: unknown;
      try {
        noiseAnalysis(r, o as never);
      } catch (e) {
        err = e;
      }
      expect(err, path).toBeInstanceOf(InvalidArgumentError);
      expect((err as InvalidArgumentError).path, path).toBe(path);
    }
    expect(() => noiseAnalysis({} as DesignResult)).toThrow(InvalidArgumentError);
  });
});
