/**
 * The mask check written into an exported netlist: an ngspice `.control`
 * block that runs the `.ac` sweep, measures the passband's highest and lowest
 * level and each stopband's highest level with `meas ac`, and prints the
 * passband loss, the stopband attenuation and the passband level beside the
 * spec's limits, so that `ngspice -b design.cir` reports the mask figures.
 *
 * The figures are those of the sweep's points (ngspice's `meas` reads the
 * computed points): a band extreme between two points is missed by up to the
 * curve's change over one step, so they can be slightly better than the
 * design's own figures, which search the extremes. Bands are clipped to the
 * sweep.
 *
 * @module
 */
import { spiceNumber } from "../circuit/index.ts";
import type { DesignResult } from "../design/index.ts";
import { maskBands } from "../design/verify.ts";

type Band = readonly [number, number];

/** The bands clipped to the sweep; empty ones dropped. */
function clip(bands: readonly Band[], lo: number, hi: number): Band[] {
  return bands.map(([a, b]): Band => [Math.max(a, lo), Math.min(b, hi)]).filter(([a, b]) => b > a);
}

/** `let target = a` then raise/lower it to each next vector, in ngspice's control language. */
function extremeOf(target: string, names: readonly string[], sign: ">" | "<"): string[] {
  const lines = [`let ${target} = ${names[0] as string}`];
  for (const n of names.slice(1)) lines.push(`if ${n} ${sign} ${target}`, `let ${target} = ${n}`, "end");
  return lines;
}

/**
 * The `.control` block of the mask check.
 *
 * @param result - the design
 * @param sweepHz - the `.ac` sweep's start and stop, Hz
 * @param node - the output node
 * @returns the lines, from `.control` to `.endc` (empty when no band lies in the sweep)
 */
export function maskCheckCards(result: DesignResult, sweepHz: readonly [number, number], node = "out"): string[] {
  const bands = maskBands(result.spec);
  const pass = clip(bands.pass, sweepHz[0], sweepHz[1]);
  const stop = clip(bands.stop, sweepHz[0], sweepHz[1]);
  if (pass.length === 0) return [];
  const f = spiceNumber;
  const lines = [".control", "run"];
  pass.forEach(([a, b], i) => {
    lines.push(`meas ac fw_pass${i + 1}_max max vdb(${node}) from=${f(a)} to=${f(b)}`);
    lines.push(`meas ac fw_pass${i + 1}_min min vdb(${node}) from=${f(a)} to=${f(b)}`);
  });
  stop.forEach(([a, b], i) => lines.push(`meas ac fw_stop${i + 1}_max max vdb(${node}) from=${f(a)} to=${f(b)}`));
  lines.push(...extremeOf("fw_pass_max", pass.map((_, i) => `fw_pass${i + 1}_max`), ">"));
  lines.push(...extremeOf("fw_pass_min", pass.map((_, i) => `fw_pass${i + 1}_min`), "<"));
  lines.push("let fw_passband_loss_db = fw_pass_max - fw_pass_min");
  const spec = result.spec;
  const gainDb = 20 * Math.log10(spec.gain);
  lines.push(`echo "mask check over the sweep (points of the sweep, not searched extremes):"`);
  lines.push(`echo "passband loss $&fw_passband_loss_db dB (spec <= ${spec.maxLossDb} dB)"`);
  lines.push(`echo "passband level $&fw_pass_max dB (spec ${gainDb.toFixed(3)} +- ${spec.gainToleranceDb} dB)"`);
  if (stop.length > 0) {
    lines.push(...extremeOf("fw_stop_max", stop.map((_, i) => `fw_stop${i + 1}_max`), ">"));
    lines.push("let fw_stopband_attenuation_db = fw_pass_max - fw_stop_max");
    lines.push(`echo "stopband attenuation $&fw_stopband_attenuation_db dB (spec >= ${spec.minAttenuationDb} dB)"`);
  }
  lines.push(".endc");
  return lines;
}
