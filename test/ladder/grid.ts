/**
 * The comparison the ladder tests share: a ladder's circuit analysed by
 * nodal analysis (src/circuit/mna.ts) against a transfer function, on a
 * dense log grid, where the transfer stands above a floor.
 */
import { acAnalysis, ladderCircuit } from "../../src/circuit/index.ts";
import type { AsBuiltLadder, ScaledLadder } from "../../src/ladder/index.ts";
import { frequencyResponse } from "../../src/tf/index.ts";
import type { Zpk } from "../../src/tf/types.ts";

/** n log-spaced frequencies (Hz) over `decades` centred on fHz. */
export function logGridHz(fHz: number, decades: number, n: number): Float64Array {
  const f = new Float64Array(n);
  for (let i = 0; i < n; i++) f[i] = fHz * 10 ** (decades * (i / (n - 1) - 0.5));
  return f;
}

/**
 * The dense grid of a ladder's tests: 1500 log points over four decades about
 * its edge or centre and, for a band ladder, 1000 linear points over five
 * bandwidths either side of the centre, sorted.
 */
export function ladderGridHz(l: ScaledLadder | AsBuiltLadder): Float64Array {
  const log = logGridHz(ladderHz(l), 4, 1500);
  if (!("bandwidthHz" in l.placement)) return log;
  const { centreHz, bandwidthHz } = l.placement;
  const lo = Math.max(centreHz - 5 * bandwidthHz, centreHz / 100);
  const hi = centreHz + 5 * bandwidthHz;
  const lin = Array.from({ length: 1000 }, (_, i) => lo + ((hi - lo) * i) / 999);
  return Float64Array.from([...log, ...lin].sort((a, b) => a - b));
}

/** The ladder's reference frequency: its edge or centre (Hz). */
export function ladderHz(l: ScaledLadder | AsBuiltLadder): number {
  return "edgeHz" in l.placement ? l.placement.edgeHz : l.placement.centreHz;
}

/** v(out) / ac(VS) of the ladder's circuit, by nodal analysis. */
export function nodalResponse(l: ScaledLadder | AsBuiltLadder, freqHz: Float64Array): { re: Float64Array; im: Float64Array } {
  return acAnalysis(ladderCircuit(l), { source: "VS", outputs: [l.outputNode], freqHz }).outputs[l.outputNode] as {
    re: Float64Array;
    im: Float64Array;
  };
}

/** Gain in dB of a complex response. */
export function db(r: { re: Float64Array; im: Float64Array }): Float64Array {
  return r.re.map((x, i) => 10 * Math.log10(x * x + (r.im[i] as number) ** 2));
}

/** Largest |dB difference| and largest |ratio - 1| between the nodal response and the transfer, where the transfer is above floorDb. */
export function worstAgainst(l: ScaledLadder, t: Zpk, freqHz: Float64Array, floorDb: number): { db: number; complex: number; points: number } {
  const r = nodalResponse(l, freqHz);
  const h = frequencyResponse(t, freqHz.map((f) => 2 * Math.PI * f));
  const a = db(r);
  const b = db(h);
  let worstDb = 0;
  let worstComplex = 0;
  let points = 0;
  for (let i = 0; i < freqHz.length; i++) {
    if (!((b[i] as number) > floorDb)) continue;
    points++;
    worstDb = Math.max(worstDb, Math.abs((a[i] as number) - (b[i] as number)));
    const hr = h.re[i] as number;
    const hi = h.im[i] as number;
    const m = hr * hr + hi * hi;
    // r / h - 1
    const qr = ((r.re[i] as number) * hr + (r.im[i] as number) * hi) / m - 1;
    const qi = ((r.im[i] as number) * hr - (r.re[i] as number) * hi) / m;
    worstComplex = Math.max(worstComplex, Math.hypot(qr, qi));
  }
  return { db: worstDb, complex: worstComplex, points };
}
