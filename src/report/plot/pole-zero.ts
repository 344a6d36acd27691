/**
 * The pole-zero map: the as-built poles (crosses) and zeros (rings) of the
 * cascade (src/analysis/poles-zeros.ts), in hertz (`s / 2 pi`), with equal
 * scales on both axes so that a pole's angle from the negative real axis
 * reads its Q (`Q = 1 / (2 cos(angle))`). Coincident roots carry their count.
 * Roots beyond ten times the highest band edge (an op-amp's own poles, or
 * the far zero of a single-amplifier section) would shrink the filter's
 * roots to a dot; they are left out of the frame and counted in the legend.
 *
 * @module
 */
import type { DesignResult } from "../../design/index.ts";
import { designPolesZeros } from "../../analysis/poles-zeros.ts";
import type { Complex } from "../../math/complex.ts";
import { formatValue } from "../../units/index.ts";
import { TWO_PI } from "../../units/constants.ts";
import { drawing } from "./draw.ts";
import type { Frame } from "./frame.ts";
import type { LegendEntry } from "./legend.ts";
import { FORBIDDEN, MAIN } from "./palette.ts";
import { esc, px } from "./text.ts";
import type { PlotSettings } from "./settings.ts";

/** Roots grouped where they coincide (within 1e-6 of the frame's size), with their count. */
function grouped(roots: readonly Complex[], size: number): { re: number; im: number; count: number }[] {
  const out: { re: number; im: number; count: number }[] = [];
  for (const r of roots) {
    const g = out.find((q) => Math.hypot(q.re - r.re, q.im - r.im) <= 1e-6 * size);
    if (g === undefined) out.push({ re: r.re, im: r.im, count: 1 });
    else g.count++;
  }
  return out;
}

/** Markers of one kind of root. */
function markers(f: Frame, roots: readonly { re: number; im: number; count: number }[], kind: "pole" | "zero"): string[] {
  const out: string[] = [];
  const d: string[] = [];
  for (const r of roots) {
    const x = f.X(r.re);
    const y = f.Y(r.im);
    if (kind === "pole") d.push(`M${px(x - 5)},${px(y - 5)}L${px(x + 5)},${px(y + 5)}M${px(x - 5)},${px(y + 5)}L${px(x + 5)},${px(y - 5)}`);
    else out.push(`<circle cx="${px(x)}" cy="${px(y)}" r="5" fill="none" stroke="${FORBIDDEN}" stroke-width="1.6"/>`);
    if (r.count > 1) out.push(`<text x="${px(x + 7)}" y="${px(y - 6)}" font-size="11">${esc(String(r.count))}</text>`);
  }
  if (d.length > 0) out.unshift(`<path d="${d.join("")}" stroke="${MAIN}" stroke-width="1.8" fill="none"/>`);
  return out;
}

/**
 * Draw the pole-zero map.
 *
 * @param result - a design (checked by the caller)
 * @param o - size and title
 * @returns SVG text
 */
export function poleZeroPlot(result: DesignResult, o: PlotSettings): string {
  const { zpk } = designPolesZeros(result);
  const hz = (r: Complex): Complex => ({ re: r.re / TWO_PI, im: r.im / TWO_PI });
  const limit = 10 * Math.max(...result.spec.passbandHz, ...result.spec.stopbandHz);
  const near = (r: Complex): boolean => Math.hypot(r.re, r.im) <= limit;
  const poles = zpk.poles.map(hz);
  const zeros = zpk.zeros.map(hz);
  const shownPoles = poles.filter(near);
  const shownZeros = zeros.filter(near);
  const far = [...poles.filter((r) => !near(r)), ...zeros.filter((r) => !near(r))];
  const shown = [...shownPoles, ...shownZeros];
  const reach = Math.max(...shown.map((r) => Math.max(Math.abs(r.re), Math.abs(r.im))), 1e-300);
  const xMin = Math.min(0, ...shown.map((r) => r.re)) - 0.15 * reach;
  const xMax = Math.max(0, ...shown.map((r) => r.re)) + 0.15 * reach;
  const yReach = Math.max(...shown.map((r) => Math.abs(r.im)), 0.3 * reach) * 1.15;
  const legend: LegendEntry[] = [
    { label: `poles (${shownPoles.length})`, stroke: MAIN, marker: "cross" },
    { label: `zeros (${shownZeros.length})`, stroke: FORBIDDEN, marker: "ring" },
  ];
  if (far.length > 0) {
    const nearest = Math.min(...far.map((r) => Math.hypot(r.re, r.im)));
    legend.push({ label: `${far.length} more beyond ${formatValue(limit, { digits: 3, unit: "Hz" })} (nearest at ${formatValue(nearest, { digits: 3, unit: "Hz" })}), not shown`, stroke: "#777777", dash: "2 3" });
  }
  const s = result.spec;
  const title = o.title ?? `${result.family} ${s.response}, ${result.filterOrder} poles: poles and zeros as built`;
  return drawing(
    {
      width: o.width,
      height: o.height,
      title,
      x: { scale: "linear", min: xMin, max: xMax, title: "Real part \u03c3/2\u03c0", unit: "Hz", prefixed: true },
      y: { scale: "linear", min: -yReach, max: yReach, title: "Imaginary part \u03c9/2\u03c0", unit: "Hz", prefixed: true },
      legend,
      equalScales: true,
      idSeed: `pole-zero|${poles.map((p) => `${p.re},${p.im}`).join(";")}`,
    },
    title,
    (f) => [
      `<path d="M${px(f.left)},${px(f.Y(0))}H${px(f.left + f.plotWidth)}M${px(f.X(0))},${px(f.top)}V${px(f.top + f.plotHeight)}" stroke="#666666" stroke-width="1" fill="none"/>`,
      ...markers(f, grouped(shownZeros, reach), "zero"),
      ...markers(f, grouped(shownPoles, reach), "pole"),
    ],
  );
}
