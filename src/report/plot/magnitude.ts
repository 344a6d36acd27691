/**
 * The magnitude plot: the as-built |H| in dB over frequency against the
 * regions the spec forbids, optionally with the Monte Carlo spread of the
 * boards (src/analysis/envelope.ts) as a band and its outer lines.
 *
 * @module
 */
import type { DesignResult } from "../../design/index.ts";
import type { MonteCarloEnvelope } from "../../analysis/envelope.ts";
import { drawing, band, line } from "./draw.ts";
import type { Frame } from "./frame.ts";
import type { LegendEntry } from "./legend.ts";
import { maskRegions } from "./mask-regions.ts";
import { FORBIDDEN, MAIN, SPREAD } from "./palette.ts";
import { sampleResponse } from "./response-curves.ts";
import { px } from "./text.ts";
import type { PlotSettings } from "./settings.ts";

/** The largest finite value of some arrays within a frequency span. */
function extreme(sign: 1 | -1, freqHz: Float64Array, arrays: readonly Float64Array[], lo: number, hi: number): number {
  let best = -Infinity;
  for (const a of arrays) {
    for (let i = 0; i < freqHz.length; i++) {
      const f = freqHz[i] as number;
      const v = a[i] as number;
      if (f >= lo && f <= hi && Number.isFinite(v)) best = Math.max(best, sign * v);
    }
  }
  return sign * best;
}

/** The shaded regions as rectangles on the frame. */
function maskRects(f: Frame, result: DesignResult): string[] {
  const out: string[] = [];
  for (const r of maskRegions(result)) {
    const x0 = f.X(Math.max(r.lowHz, f.x.min));
    const x1 = f.X(Math.min(r.highHz, f.x.max));
    const yTop = Number.isFinite(r.highDb) ? Math.max(f.top, f.Y(r.highDb)) : f.top;
    const yBottom = Number.isFinite(r.lowDb) ? Math.min(f.top + f.plotHeight, f.Y(r.lowDb)) : f.top + f.plotHeight;
    if (!(x1 > x0) || !(yBottom > yTop)) continue;
    out.push(`<rect x="${px(x0)}" y="${px(yTop)}" width="${px(x1 - x0)}" height="${px(yBottom - yTop)}" fill="${FORBIDDEN}" fill-opacity="0.22"/>`);
  }
  return out;
}

/**
 * Draw the magnitude plot.
 *
 * @param result - a design (checked by the caller)
 * @param o - size, title, span, envelope, mask
 * @returns SVG text
 */
export function magnitudePlot(result: DesignResult, o: PlotSettings): string {
  const v = result.verification;
  const s = result.spec;
  const env = o.envelope;
  const floorLimit = v.gainDb - s.minAttenuationDb - 30;
  const provisionalTop = v.gainDb + 10;
  const { freqHz, curves } = sampleResponse(result, ["magnitude"], { startHz: o.startHz, stopHz: o.stopHz, heightPx: Math.max(100, o.height - 140), ranges: [[floorLimit, provisionalTop]] });
  const db = curves[0] as Float64Array;
  let top = extreme(1, freqHz, [db], o.startHz, o.stopHz);
  let bottom = extreme(-1, freqHz, [db], o.startHz, o.stopHz);
  if (env !== undefined) {
    top = Math.max(top, extreme(1, env.freqHz, [env.maxDb], o.startHz, o.stopHz));
    bottom = Math.min(bottom, extreme(-1, env.freqHz, [env.minDb], o.startHz, o.stopHz));
  }
  const yMax = Math.max(top, v.gainDb) + 3;
  const yMin = Math.min(Math.max(bottom - 3, floorLimit), v.gainDb - s.maxLossDb - 3);
  const legend: LegendEntry[] = [{ label: "as built (nominal parts)", stroke: MAIN, strokeWidth: 1.8 }];
  if (env !== undefined) {
    legend.push(
      { label: `${Math.round(env.coverage * 100)} % of ${env.runs - env.leftOut} boards`, fill: SPREAD, fillOpacity: 0.45 },
      { label: "lowest and highest board", stroke: SPREAD, strokeWidth: 1 },
    );
  }
  if (o.mask) legend.push({ label: "forbidden by the spec", fill: FORBIDDEN, fillOpacity: 0.22 });
  const title = o.title ?? `${result.family} ${s.response}, ${result.filterOrder} poles: magnitude as built${o.mask ? " against the spec" : ""}${env === undefined ? "" : `, ${env.runs} Monte Carlo boards`}`;
  return drawing(
    {
      width: o.width,
      height: o.height,
      title,
      x: { scale: "log", min: o.startHz, max: o.stopHz, title: "Frequency", unit: "Hz", exact: true },
      y: { scale: "linear", min: yMin, max: yMax, title: "Magnitude", unit: "dB" },
      legend,
      idSeed: `magnitude|${db.length}|${db[0]}|${db[db.length - 1]}|${env?.runs ?? 0}`,
    },
    title,
    (f) => [
      ...(o.mask ? maskRects(f, result) : []),
      ...(env === undefined
        ? []
        : [
            band(f, env.freqHz, env.lowerDb, env.upperDb, SPREAD, 0.45),
            line(f, env.freqHz, env.minDb, { stroke: SPREAD, width: 1 }),
            line(f, env.freqHz, env.maxDb, { stroke: SPREAD, width: 1 }),
          ]),
      line(f, freqHz, db, { stroke: MAIN, width: 1.8 }),
    ],
  );
}
