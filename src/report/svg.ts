/**
 * SVG plots of a design's as-built response: magnitude with the spec mask,
 * and group delay. Plain SVG 1.1 text, no scripts, no external fonts.
 *
 * @module
 */
import { formatValue } from "../units/index.ts";
import type { DesignResult } from "../design/index.ts";
import { requireDesignResult } from "../design/check.ts";

/** Options of {@link toSvgPlot}. */
export interface SvgPlotOptions {
  /**
   * What to plot.
   * @defaultValue `"magnitude"`
   */
  readonly kind?: "magnitude" | "group-delay";
  /**
   * Width in pixels.
   * @defaultValue 720
   */
  readonly width?: number;
  /**
   * Height in pixels.
   * @defaultValue 420
   */
  readonly height?: number;
}

const esc = (s: string): string => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;");
const r1 = (x: number): string => (Math.round(x * 10) / 10).toString();

/**
 * Plot the as-built response stored in a design (its 256-point curve).
 *
 * The magnitude plot shades the regions the mask forbids: below the passband
 * floor (passband level minus the allowed loss) across the passband, and above
 * the stopband ceiling (passband level minus the required attenuation) across
 * the stopband.
 *
 * @param result - a design
 * @param options - plot kind and size
 * @returns SVG text
 * @throws {@link InvalidArgumentError} when `result` is not a design result (the path names the first bad field)
 * @example
 * ```ts
 * const spec = { response: "lowpass", passband: { edgeHz: "1k", maxLossDb: 1 }, stopband: { edgeHz: "4k", minAttenuationDb: 40 } };
 * toSvgPlot(designFilter(spec)).startsWith("<svg"); //=> true
 * ```
 */
export function toSvgPlot(result: DesignResult, options: SvgPlotOptions = {}): string {
  requireDesignResult("toSvgPlot", result);
  const kind = options.kind ?? "magnitude";
  const W = options.width ?? 720;
  const H = options.height ?? 420;
  const m = { l: 64, r: 16, t: 28, b: 44 };
  const c = result.verification.curve;
  const f = c.freqHz;
  const y = kind === "magnitude" ? c.magnitudeDb : c.groupDelayS;
  const s = result.spec;
  const v = result.verification;
  const fmin = f[0] as number;
  const fmax = f[f.length - 1] as number;
  let ymin: number;
  let ymax: number;
  if (kind === "magnitude") {
    ymax = v.gainDb + 10;
    ymin = Math.max(Math.min(...y), v.gainDb - s.minAttenuationDb - 40);
  } else {
    const finite = y.filter((x) => Number.isFinite(x));
    ymin = Math.min(0, ...finite);
    ymax = Math.max(...finite) * 1.1 || 1;
  }
  const X = (x: number): number => m.l + ((Math.log10(x) - Math.log10(fmin)) / (Math.log10(fmax) - Math.log10(fmin))) * (W - m.l - m.r);
  const Y = (x: number): number => m.t + (1 - (Math.min(Math.max(x, ymin), ymax) - ymin) / (ymax - ymin)) * (H - m.t - m.b);
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" font-family="sans-serif" font-size="11">`);
  out.push(`<rect x="0" y="0" width="${W}" height="${H}" fill="white"/>`);
  // Decade grid.
  for (let d = Math.ceil(Math.log10(fmin)); d <= Math.floor(Math.log10(fmax)); d++) {
    const x = X(10 ** d);
    out.push(`<line x1="${r1(x)}" y1="${m.t}" x2="${r1(x)}" y2="${H - m.b}" stroke="#ddd"/>`);
    out.push(`<text x="${r1(x)}" y="${H - m.b + 14}" text-anchor="middle">${esc(formatValue(10 ** d, { unit: "Hz" }))}</text>`);
  }
  const ticks = 6;
  for (let i = 0; i <= ticks; i++) {
    const val = ymin + ((ymax - ymin) * i) / ticks;
    const yy = Y(val);
    out.push(`<line x1="${m.l}" y1="${r1(yy)}" x2="${W - m.r}" y2="${r1(yy)}" stroke="#eee"/>`);
    const label = kind === "magnitude" ? `${val.toFixed(0)} dB` : formatValue(val, { digits: 3, unit: "s" });
    out.push(`<text x="${m.l - 4}" y="${r1(yy + 4)}" text-anchor="end">${esc(label)}</text>`);
  }
  if (kind === "magnitude") {
    const floor = v.gainDb - s.maxLossDb;
    const ceil = v.gainDb - s.minAttenuationDb;
    const band = (a: number, b: number): [number, number] => [Math.max(a, fmin), Math.min(b, fmax)];
    const passBands: [number, number][] =
      s.response === "lowpass"
        ? [band(fmin, s.passbandHz[0] as number)]
        : s.response === "highpass"
          ? [band(s.passbandHz[0] as number, fmax)]
          : s.response === "bandpass"
            ? [band(s.passbandHz[0] as number, s.passbandHz[1] as number)]
            : [band(fmin, s.passbandHz[0] as number), band(s.passbandHz[1] as number, fmax)];
    const stopBands: [number, number][] =
      s.response === "lowpass"
        ? [band(s.stopbandHz[0] as number, fmax)]
        : s.response === "highpass"
          ? [band(fmin, s.stopbandHz[0] as number)]
          : s.response === "bandpass"
            ? [band(fmin, s.stopbandHz[0] as number), band(s.stopbandHz[1] as number, fmax)]
            : [band(s.stopbandHz[0] as number, s.stopbandHz[1] as number)];
    for (const [a, b] of passBands) {
      out.push(`<rect x="${r1(X(a))}" y="${r1(Y(floor))}" width="${r1(X(b) - X(a))}" height="${r1(Y(ymin) - Y(floor))}" fill="#f4c7c3" fill-opacity="0.6"/>`);
    }
    for (const [a, b] of stopBands) {
      out.push(`<rect x="${r1(X(a))}" y="${r1(Y(ymax))}" width="${r1(X(b) - X(a))}" height="${r1(Y(ceil) - Y(ymax))}" fill="#f4c7c3" fill-opacity="0.6"/>`);
    }
  }
  const pts = f.map((x, i) => `${r1(X(x))},${r1(Y(y[i] as number))}`).join(" ");
  out.push(`<polyline points="${pts}" fill="none" stroke="#1f4e99" stroke-width="1.6"/>`);
  out.push(`<rect x="${m.l}" y="${m.t}" width="${W - m.l - m.r}" height="${H - m.t - m.b}" fill="none" stroke="#444"/>`);
  const title =
    kind === "magnitude"
      ? `${result.family} ${s.response}, ${result.filterOrder} poles: as-built magnitude and the spec mask (shaded: forbidden)`
      : `${result.family} ${s.response}, ${result.filterOrder} poles: as-built group delay`;
  out.push(`<text x="${m.l}" y="18" font-size="12">${esc(title)}</text>`);
  out.push("</svg>", "");
  return out.join("\n");
}
