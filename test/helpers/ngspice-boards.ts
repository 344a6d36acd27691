/**
 * Monte Carlo boards simulated by ngspice, and their mask figures read from
 * ngspice's own AC output: an outside check of the library's board yield.
 *
 * Method: one ngspice process runs every board of a design in its `.control`
 * block. Per board, every resistor and capacitor of the design's netlist is
 * set to the board's drawn value with `alter`, each mask band is swept with
 * `ac dec` (at least {@link DECADE_POINTS} points per decade and
 * {@link BAND_POINTS} per band) and its edges and midpoint with `ac lin 3`
 * (a `dec` sweep may stop one step past the band's end; points outside the
 * band are dropped), and `v(out)` is written with `wrdata`. On that grid the band's best
 * {@link CANDIDATES} local extremes (highest and lowest level in a passband,
 * highest in a stopband) are found; a second process sweeps each candidate's
 * neighbourhood (one grid step either side) with `ac lin` at
 * {@link FINE_POINTS} points, and the extreme is read off the best fine
 * sample and the vertex of the parabola through it and its neighbours (in
 * linear frequency and log |H|^2; successive parabolic interpolation,
 * R. P. Brent, "Algorithms for Minimization without Derivatives",
 * Prentice-Hall 1973, ch. 5). The figures then follow the library's
 * definitions (src/evaluate/mask.ts): levels measured from the passband's
 * highest point; passband loss, stopband attenuation and gain error against
 * the mask's limits; the worst margin is the smallest of the three.
 *
 * Accuracy: a fine step is 1/10 of a grid step (at 100 points per decade,
 * 1e-3 decades, less in narrow bands), and the parabola's vertex is exact
 * but for the peak's cubic term over that step; measured against the
 * library's golden-section search on the boards of
 * test/analysis/ngspice-montecarlo.test.ts, the figures agree within 2e-5 dB,
 * far below the 1e-3 dB the cross-checks ask for. ngspice writes 16
 * significant digits (`option numdgt=15`).
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { MaskBands, MaskLimits } from "../../src/evaluate/mask.ts";
import { assertNgspice, withoutControl } from "./ngspice.ts";

/** One board's part values, by designator (`R1`, `C3`, ...). */
export type BoardValues = Readonly<Record<string, number>>;

/** A board's figures against the mask, from ngspice's response (the library's definitions). */
export interface SpiceBoardFigures {
  /** Largest passband loss below the passband's highest level, dB. */
  readonly passbandLossDb: number;
  /** Smallest stopband attenuation below the passband's highest level, dB. */
  readonly stopbandAttenuationDb: number;
  /** The passband's highest level, dB. */
  readonly gainDb: number;
  /** Passband margin, dB. */
  readonly passbandMarginDb: number;
  /** Stopband margin, dB. */
  readonly stopbandMarginDb: number;
  /** Gain margin, dB. */
  readonly gainMarginDb: number;
  /** Smallest of the three margins, dB (a board meets the mask when it is >= 0). */
  readonly marginDb: number;
}

/** Least points per decade of a band's first sweep. */
export const DECADE_POINTS = 100;
/** Least points of a band's first sweep (narrow bands get more per decade). */
export const BAND_POINTS = 300;
/** Points of each fine sweep around a candidate extreme. */
export const FINE_POINTS = 21;
/** Local extremes refined per band and direction. */
export const CANDIDATES = 4;

/** A band of the mask and which extremes of it count. */
interface Band {
  readonly hz: readonly [number, number];
  /** 1 to find the highest level, -1 the lowest. */
  readonly signs: readonly (1 | -1)[];
  readonly perDecade: number;
}

/** A sampled sweep: frequencies (Hz) and ln |H|^2. */
interface Sweep {
  readonly f: Float64Array;
  readonly y: Float64Array;
}

/** A candidate neighbourhood of one board: band, direction and its frequency interval. */
interface Candidate {
  readonly band: number;
  readonly sign: 1 | -1;
  readonly a: number;
  readonly b: number;
}

const num = (x: number): string => x.toExponential(16);

function planBands(bands: MaskBands): Band[] {
  const band = (hz: readonly [number, number], signs: (1 | -1)[]): Band => {
    const decades = Math.log10(hz[1] / hz[0]);
    return { hz, signs, perDecade: Math.max(DECADE_POINTS, Math.ceil(BAND_POINTS / decades)) };
  };
  return [...bands.pass.map((b) => band(b, [1, -1])), ...bands.stop.map((b) => band(b, [1]))];
}

/** The netlist's top-level resistors and capacitors (subcircuit bodies skipped). */
function topLevelParts(lines: readonly string[]): string[] {
  const names: string[] = [];
  let depth = 0;
  for (const line of lines) {
    const t = line.trim();
    if (/^\.subckt\b/i.test(t)) depth++;
    else if (/^\.ends\b/i.test(t)) depth--;
    else if (depth === 0 && /^[RC]\S*\s/i.test(t)) names.push(t.split(/\s+/)[0] as string);
  }
  return names;
}

/**
 * Run one ngspice process over all boards: per board the `alter` lines, then
 * the board's analyses, each followed by a `wrdata` of `v(out)`; returns the
 * sweeps in the order written.
 */
function runBoardsInNgspice(netlist: string, boards: readonly BoardValues[], analyses: (board: number) => readonly string[]): Sweep[] {
  assertNgspice();
  const lines = withoutControl(netlist).split("\n").filter((l) => !/^\.(ac\s|end\s*$)/i.test(l.trim()));
  const parts = topLevelParts(lines);
  const dir = mkdtempSync(join(tmpdir(), "fw-ngspice-mc-"));
  try {
    const out = join(dir, "out.txt");
    const control = [".control", "set wr_singlescale", "set wr_vecnames", "set appendwrite", "option numdgt=15"];
    boards.forEach((values, k) => {
      const names = Object.keys(values);
      if (names.length !== parts.length || parts.some((p) => values[p] === undefined)) {
        throw new Error(`board ${k}: parts ${names.sort().join(" ")} do not match the netlist's ${parts.sort().join(" ")}`);
      }
      for (const p of parts) control.push(`alter ${p} = ${num(values[p] as number)}`);
      for (const a of analyses(k)) control.push(a, `wrdata ${out} v(out)`);
      control.push("destroy all");
    });
    control.push("quit", ".endc", ".end", "");
    const cir = join(dir, "boards.cir");
    writeFileSync(cir, [...lines, ...control].join("\n"));
    const r = spawnSync("ngspice", ["-b", cir], { encoding: "utf8", timeout: 300_000, maxBuffer: 64 * 1024 * 1024 });
    const log = `${r.stderr ?? ""}\n${r.stdout ?? ""}`;
    if (r.status !== 0 || /^\s*error\b/im.test(log)) throw new Error(`ngspice failed (${r.status}): ${log.slice(-2000)}`);
    return parseSweeps(readFileSync(out, "utf8"));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Split appended `wrdata` output (a header line before each sweep; frequency, Re, Im per row) into sweeps. */
function parseSweeps(text: string): Sweep[] {
  const sweeps: Sweep[] = [];
  let rows: number[][] = [];
  const flush = (): void => {
    if (rows.length === 0) return;
    const f = Float64Array.from(rows, (r) => r[0] as number);
    const y = Float64Array.from(rows, (r) => Math.log((r[1] as number) ** 2 + (r[2] as number) ** 2));
    sweeps.push({ f, y });
    rows = [];
  };
  for (const line of text.split("\n")) {
    const t = line.trim();
    if (t === "") continue;
    if (/^frequency\b/i.test(t)) flush();
    else rows.push(t.split(/\s+/).map(Number));
  }
  flush();
  return sweeps;
}

/** Indices of the sweep's local extremes in direction `sign` (ends included), best first, at most {@link CANDIDATES}. */
function localExtremes(s: Sweep, sign: number): number[] {
  const n = s.y.length;
  const v = (i: number): number => sign * (s.y[i] as number);
  const found: number[] = [];
  for (let i = 0; i < n; i++) {
    if ((i === 0 || v(i - 1) <= v(i)) && (i === n - 1 || v(i + 1) <= v(i))) found.push(i);
  }
  return found.sort((a, b) => v(b) - v(a)).slice(0, CANDIDATES);
}

/** The best level (sign * ln|H|^2, larger is better) of a fine sweep: its best sample or the vertex of the parabola there. */
function fineExtreme(s: Sweep, sign: number): number {
  const n = s.y.length;
  let i = 0;
  for (let k = 1; k < n; k++) if (sign * (s.y[k] as number) > sign * (s.y[i] as number)) i = k;
  const y1 = sign * (s.y[i] as number);
  if (i === 0 || i === n - 1) return y1;
  const y0 = sign * (s.y[i - 1] as number);
  const y2 = sign * (s.y[i + 1] as number);
  const curvature = y0 - 2 * y1 + y2;
  // equally spaced samples (ac lin): the vertex of the parabola through them
  return curvature < 0 ? y1 - (y2 - y0) ** 2 / (8 * curvature) : y1;
}

/**
 * A band's first sweep: the `ac dec` points inside the band (ngspice may end
 * a logarithmic sweep one step past its stop frequency) merged with the
 * band's two edges and midpoint from an `ac lin 3` sweep, in frequency order.
 */
function mergeBandSweep(dec: Sweep, edges: Sweep, band: Band, board: number): Sweep {
  const [a, b] = band.hz;
  if (edges.f.length !== 3 || Math.abs((edges.f[0] as number) / a - 1) > 1e-12 || Math.abs((edges.f[2] as number) / b - 1) > 1e-12) {
    throw new Error(`board ${board}: ngspice's edge sweep ${Array.from(edges.f).join(" ")} Hz does not span the band ${a}..${b} Hz`);
  }
  const points: [number, number][] = [];
  const push = (f: number, y: number): void => {
    if (f >= a * (1 - 1e-12) && f <= b * (1 + 1e-12)) points.push([f, y]);
  };
  dec.f.forEach((f, i) => push(f, dec.y[i] as number));
  edges.f.forEach((f, i) => push(f, edges.y[i] as number));
  points.sort((p, q) => p[0] - q[0]);
  const kept = points.filter((p, i) => i === 0 || p[0] > (points[i - 1] as [number, number])[0] * (1 + 1e-12));
  return { f: Float64Array.from(kept, (p) => p[0]), y: Float64Array.from(kept, (p) => p[1]) };
}

/**
 * Simulate boards in ngspice and compute each board's mask figures from the
 * simulated `v(out)` (input `Vin` at AC 1 V), as the library defines them.
 *
 * @param netlist - the design's netlist (src/report/spice.ts; its `.ac` card is replaced)
 * @param boards - each board's values for every top-level resistor and capacitor of the netlist
 * @param bands - the mask's bands (src/design/verify.ts `maskBands`)
 * @param limits - the mask's limits
 * @returns one set of figures per board
 */
export function ngspiceBoardFigures(
  netlist: string,
  boards: readonly BoardValues[],
  bands: MaskBands,
  limits: MaskLimits,
): SpiceBoardFigures[] {
  const plan = planBands(bands);
  const first = runBoardsInNgspice(netlist, boards, () =>
    plan.flatMap((b) => [`ac dec ${b.perDecade} ${num(b.hz[0])} ${num(b.hz[1])}`, `ac lin 3 ${num(b.hz[0])} ${num(b.hz[1])}`]),
  );
  if (first.length !== 2 * boards.length * plan.length) throw new Error(`ngspice wrote ${first.length} sweeps, expected ${2 * boards.length * plan.length}`);
  const coarse = boards.flatMap((_, k) =>
    plan.map((band, j) => mergeBandSweep(first[2 * (k * plan.length + j)] as Sweep, first[2 * (k * plan.length + j) + 1] as Sweep, band, k)),
  );
  const candidates: Candidate[][] = boards.map((_, k) =>
    plan.flatMap((band, j) => {
      const s = coarse[k * plan.length + j] as Sweep;
      const n = s.f.length;
      return band.signs.flatMap((sign) =>
        localExtremes(s, sign).map((i) => ({ band: j, sign, a: s.f[Math.max(0, i - 1)] as number, b: s.f[Math.min(n - 1, i + 1)] as number })),
      );
    }),
  );
  const fine = runBoardsInNgspice(netlist, boards, (k) => (candidates[k] as Candidate[]).map((c) => `ac lin ${FINE_POINTS} ${num(c.a)} ${num(c.b)}`));
  const expected = candidates.reduce((t, c) => t + c.length, 0);
  if (fine.length !== expected) throw new Error(`ngspice wrote ${fine.length} fine sweeps, expected ${expected}`);
  let at = 0;
  return boards.map((_, k) => {
    // best sign * ln|H|^2 per band and direction: the coarse grid's, improved by the fine sweeps
    const best = plan.map((band, j) => {
      const s = coarse[k * plan.length + j] as Sweep;
      return new Map(band.signs.map((sign) => [sign, Math.max(...Array.from(s.y, (y) => sign * y))]));
    });
    for (const c of candidates[k] as Candidate[]) {
      const m = best[c.band] as Map<number, number>;
      m.set(c.sign, Math.max(m.get(c.sign) as number, fineExtreme(fine[at++] as Sweep, c.sign)));
    }
    return figures(plan, best, limits);
  });
}

const DB_PER_NEPER2 = 10 / Math.LN10; // dB per unit of ln |H|^2

/** The mask figures from each band's extremes (ln |H|^2 times the direction). */
function figures(plan: readonly Band[], best: readonly Map<number, number>[], limits: MaskLimits): SpiceBoardFigures {
  let peak = -Infinity;
  let low = Infinity;
  let stop = -Infinity;
  plan.forEach((band, j) => {
    const m = best[j] as Map<number, number>;
    if (band.signs.length === 2) {
      peak = Math.max(peak, m.get(1) as number);
      low = Math.min(low, -(m.get(-1) as number));
    } else stop = Math.max(stop, m.get(1) as number);
  });
  const passbandLossDb = DB_PER_NEPER2 * (peak - low);
  const stopbandAttenuationDb = DB_PER_NEPER2 * (peak - stop);
  const gainDb = DB_PER_NEPER2 * peak;
  const passbandMarginDb = limits.maxLossDb - passbandLossDb;
  const stopbandMarginDb = stopbandAttenuationDb - limits.minAttenuationDb;
  const gainMarginDb = limits.gainToleranceDb - Math.abs(gainDb - 20 * Math.log10(limits.gain));
  return {
    passbandLossDb,
    stopbandAttenuationDb,
    gainDb,
    passbandMarginDb,
    stopbandMarginDb,
    gainMarginDb,
    marginDb: Math.min(passbandMarginDb, stopbandMarginDb, gainMarginDb),
  };
}
