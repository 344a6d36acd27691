/**
 * Op-amp counts on notch, bandstop and wide-band specs of our own, against
 * the op-amps the library used before the one-op-amp finite-zero sections,
 * the twin-T and two-op-amp notches and the band split existed; every design
 * must still meet its mask when its own netlist is simulated in ngspice, and
 * its yield target wherever it met it before (the specs that missed it before
 * still miss it and say so: the tightest of them need parts or a centring
 * this library does not reach yet).
 *
 * Measured: 229 op-amps before, 137 now (59.8 %; 143, 62.4 %, before a
 * one-op-amp stage with a bounded gain could take 90 % of its ceiling and
 * the sturdier stages of the yield ladder could trade one topology at a
 * time). What is left are the bandstops whose lowpass-notch and
 * highpass-notch pair must carry a high-frequency gain of one between them:
 * both one-op-amp notch sections pass at most unity at high frequency (each
 * is a follower of its input divider there), so one of the pair still takes
 * a four-op-amp stage.
 */
import { describe, expect, it } from "vitest";
import { designFilter, type DesignResult } from "../../src/design/index.ts";
import { maskBands } from "../../src/design/verify.ts";
import { toSpiceNetlist } from "../../src/report/index.ts";
import { requireNgspice, runAc } from "../helpers/ngspice.ts";
import { fewerOpampSpecs } from "./fewer-opamps-specs.ts";

const haveSpice = requireNgspice();

/**
 * Op-amps per spec as built by commit d2d4e57 (before single-amplifier
 * notch sections and the band split), measured with `designFilter` on the
 * same specs: 229 in all.
 */
const BEFORE: Readonly<Record<string, number>> = {
  "hum50-narrow": 12, "hum60-narrow": 12, "hum50-elliptic": 12, tone400: 12, "tone400-cheb2": 12, pilot19k: 12,
  ultra40k: 8, "ecg-hum": 8, "pwm-carrier": 12, "cal-tone1k": 12, "wide-stop-vib": 12, "lp-elliptic-adc": 13,
  "lp-cheb2-sensor": 9, "hp-elliptic-rumble": 8, "hp-cheb2-subsonic": 8, "bp-eeg": 4, "bp-voice": 5, "bp-audio": 8,
  "bp-ultrasonic": 5, "bp-pulse": 6, "bp-elliptic-wide": 16, "bp-gyro": 3, "bs-cheb2-interferer": 12, "hum-real-opamp": 8,
};

const designs = new Map<string, DesignResult>();
function designOf(id: string): DesignResult {
  let r = designs.get(id);
  if (r === undefined) {
    const e = fewerOpampSpecs.find((x) => x.id === id);
    if (e === undefined) throw new Error(`no spec ${id}`);
    r = designFilter(e.spec);
    designs.set(id, r);
  }
  return r;
}
const opampsOf = (r: DesignResult): number => r.stages.reduce((n, s) => n + s.opamps.length, 0);

/** Specs whose yield target was missed before as well (commit d2d4e57), with the lower 95 % end it had then. */
const MISSED_BEFORE: ReadonlySet<string> = new Set(["hum50-elliptic", "cal-tone1k", "lp-elliptic-adc", "bp-elliptic-wide", "bp-gyro", "hum-real-opamp"]);

/** The mask's margins read off ngspice's own response of the design's netlist (dense log sweep over the bands), dB. */
function ngspiceMarginDb(r: DesignResult): { marginDb: number; points: number } {
  const bands = maskBands(r.spec);
  const edges = [...bands.pass, ...bands.stop].flat();
  const lo = Math.min(...edges);
  const hi = Math.max(...edges);
  const sim = runAc(toSpiceNetlist(r, { pointsPerDecade: 400, startHz: lo, stopHz: hi }), ["out"]);
  const out = sim.vectors["out"] as { re: Float64Array; im: Float64Array };
  let peak = 0;
  let low = Infinity;
  let stop = 0;
  let points = 0;
  const inside = (f: number, list: readonly (readonly [number, number])[]): boolean => list.some(([a, b]) => f >= a && f <= b);
  for (let i = 0; i < sim.freqHz.length; i++) {
    const f = sim.freqHz[i] as number;
    const m = Math.hypot(out.re[i] as number, out.im[i] as number);
    if (inside(f, bands.pass)) {
      peak = Math.max(peak, m);
      low = Math.min(low, m);
      points++;
    } else if (inside(f, bands.stop)) {
      stop = Math.max(stop, m);
      points++;
    }
  }
  const db = (x: number): number => 20 * Math.log10(x);
  const spec = r.spec;
  const pass = spec.maxLossDb - (db(peak) - db(low));
  const att = db(peak) - db(stop) - spec.minAttenuationDb;
  const gain = spec.gainToleranceDb - Math.abs(db(peak) - db(spec.gain));
  return { marginDb: Math.min(pass, att, gain), points };
}

describe("fewer op-amps on notch, bandstop and wide-band specs (our own scenarios)", () => {
  it("has at least 20 specs, each with its count before", () => {
    expect(fewerOpampSpecs.length).toBeGreaterThanOrEqual(20);
    for (const e of fewerOpampSpecs) expect(BEFORE[e.id], e.id).toBeGreaterThan(0);
  });

  it("builds them with at most 60 % of the op-amps used before (measured 59.8 %: 137 of 229)", () => {
    let before = 0;
    let after = 0;
    const rows: string[] = [];
    for (const e of fewerOpampSpecs) {
      const r = designOf(e.id);
      const n = opampsOf(r);
      before += BEFORE[e.id] as number;
      after += n;
      rows.push(`${e.id}: ${BEFORE[e.id]} -> ${n} (${r.stages.map((s) => s.topology).join(", ")})`);
    }
    console.log(`op-amps: ${before} before, ${after} now (${((100 * after) / before).toFixed(1)} %)\n  ${rows.join("\n  ")}`);
    expect(after, rows.join("\n")).toBeLessThanOrEqual(0.6 * before);
  });

  for (const e of fewerOpampSpecs) {
    it(`${e.id}: meets its mask nominally, and its yield target${MISSED_BEFORE.has(e.id) ? " (missed before too: the result must say so)" : ""}`, () => {
      const r = designOf(e.id);
      const y = r.verification.yield;
      const why = `${e.id}: ${r.family} ${r.order}, margin ${r.verification.marginDb.toFixed(3)} dB, yield ${y?.fraction} [${y?.lower95}, ${y?.upper95}] of ${y?.boards}; ${r.stages.map((s) => s.topology).join(", ")}`;
      expect(r.verification.meetsSpec, why).toBe(true);
      if (!MISSED_BEFORE.has(e.id) || r.verification.boardsMeetSpec) expect(r.verification.boardsMeetSpec, why).toBe(true);
      else expect(r.warnings.some((w) => w.code === "yield-not-met"), why).toBe(true);
    });

    it.skipIf(!haveSpice)(`${e.id}: its netlist meets the mask in ngspice`, () => {
      const r = designOf(e.id);
      const m = ngspiceMarginDb(r);
      expect(m.points).toBeGreaterThan(100);
      // The sampled margin can only be larger than the refined one; ngspice and
      // the as-built model agree to about 1e-6 dB.
      expect(m.marginDb, `${e.id}: ngspice margin`).toBeGreaterThanOrEqual(Math.min(0, r.verification.marginDb) - 1e-3);
    });
  }
});
