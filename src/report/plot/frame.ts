/**
 * The frame of a plot: margins sized from the text they must hold, the plot
 * area, its clip path, the major and minor grid, the tick labels, the axis
 * titles, the title and the legend.
 *
 * Every margin is computed from the conservative text widths of
 * src/report/plot/text.ts: the left margin holds the widest y label and the
 * rotated y title, the bottom margin the x labels, the x title and the
 * legend rows, the top margin the title (wrapped to the width), and the side
 * margins half of the first and last x label, which are centred on their
 * tick. So no text leaves the drawing; the data inside the frame are clipped
 * to it by a `clipPath` (never flattened onto its edge).
 *
 * @module
 */
import { buildAxis, widestLabel, type Axis, type AxisSpec } from "./axes.ts";
import { fittedLegendRows, legendSvg, type LegendEntry, type LegendItem } from "./legend.ts";
import { esc, hashText, px, textWidth, wrapText } from "./text.ts";

/** What a frame holds. */
export interface FrameSpec {
  /** Drawing width, pixels. */
  readonly width: number;
  /** Drawing height, pixels. */
  readonly height: number;
  /** Title above the plot (wrapped to the width). */
  readonly title: string;
  /** The horizontal axis. */
  readonly x: AxisSpec;
  /** The vertical axis. */
  readonly y: AxisSpec;
  /** Legend entries (none: no legend). */
  readonly legend: readonly LegendEntry[];
  /** Equal scales on both axes (a pole-zero map): the shorter range is widened about its centre. */
  readonly equalScales?: boolean;
  /** Text that makes the clip path's id unique to this drawing (e.g. the data). */
  readonly idSeed: string;
}

/** A laid-out frame. */
export interface Frame {
  /** Drawing width, pixels. */
  readonly width: number;
  /** Drawing height, pixels. */
  readonly height: number;
  /** Plot area left edge, pixels. */
  readonly left: number;
  /** Plot area top edge, pixels. */
  readonly top: number;
  /** Plot area width, pixels. */
  readonly plotWidth: number;
  /** Plot area height, pixels. */
  readonly plotHeight: number;
  /** The horizontal axis. */
  readonly x: Axis;
  /** The vertical axis. */
  readonly y: Axis;
  /** Pixel column of an x value. */
  readonly X: (v: number) => number;
  /** Pixel row of a y value. */
  readonly Y: (v: number) => number;
  /** Id of the plot area's clip path. */
  readonly clipId: string;
  /** The title's lines. */
  readonly titleLines: readonly string[];
  /** The legend's rows. */
  readonly legendRows: readonly (readonly LegendItem[])[];
  /** The x title's lines (wrapped to the plot's width). */
  readonly xTitleLines: readonly string[];
  /** The y title's lines (wrapped to the plot's height). */
  readonly yTitleLines: readonly string[];
}

/** Label font size, pixels. */
export const FONT_SIZE = 12;
/** Title font size, pixels. */
const TITLE_SIZE = 13;
/** Height of a line of label text, pixels (DejaVu Sans ascent + descent is 1.17 em). */
const LINE = Math.ceil(FONT_SIZE * 1.3);
const TITLE_LINE = Math.ceil(TITLE_SIZE * 1.3);
/** Outer padding, pixels. */
const PAD = 8;
/** Gap between the frame and the tick labels, pixels. */
const GAP = 6;

/** The axes on a plot area of the given size (x labels spaced by their width, y labels about every 45 pixels). */
function axesFor(spec: FrameSpec, plotWidth: number, plotHeight: number): { x: Axis; y: Axis } {
  let xs = spec.x;
  let ys = spec.y;
  if (spec.equalScales === true) {
    const ux = (xs.max - xs.min) / plotWidth;
    const uy = (ys.max - ys.min) / plotHeight;
    const u = Math.max(ux, uy);
    const cx = (xs.max + xs.min) / 2;
    const cy = (ys.max + ys.min) / 2;
    xs = { ...xs, min: cx - (u * plotWidth) / 2, max: cx + (u * plotWidth) / 2, exact: true };
    ys = { ...ys, min: cy - (u * plotHeight) / 2, max: cy + (u * plotHeight) / 2, exact: true };
  }
  const y = buildAxis(ys, plotHeight, FONT_SIZE, 45);
  // x labels: about 2.2 label widths apart on a linear axis
  const probe = buildAxis(xs, plotWidth, FONT_SIZE, 80);
  const x = xs.scale === "log" ? probe : buildAxis(xs, plotWidth, FONT_SIZE, Math.max(60, 2.2 * widestLabel(probe, FONT_SIZE)));
  return { x, y };
}

/** An axis title with its unit, before the axis picks a prefix (for a first guess of its length). */
const titleOf = (a: AxisSpec): string => (a.unit === "" ? a.title : `${a.title} (${a.unit})`);

/** How far the first and last x labels reach beyond the plot area's sides, pixels. */
function xOverhang(x: Axis, plotWidth: number): { left: number; right: number } {
  let left = 0;
  let right = 0;
  for (const t of x.major) {
    if (t.label === null) continue;
    const at = x.fraction(t.value) * plotWidth;
    const half = textWidth(t.label, FONT_SIZE) / 2;
    left = Math.max(left, half - at);
    right = Math.max(right, at + half - plotWidth);
  }
  return { left, right };
}

/**
 * Lay out a frame (see the module header).
 *
 * @param spec - size, title, axes and legend
 * @returns the frame
 */
export function layoutFrame(spec: FrameSpec): Frame {
  const { width, height } = spec;
  const titleLines = spec.title === "" ? [] : wrapText(spec.title, TITLE_SIZE, width - 2 * PAD);
  const top = PAD + titleLines.length * TITLE_LINE + (titleLines.length > 0 ? 6 : 4) + Math.ceil(FONT_SIZE / 2);
  // the legend may take the height the plot does not need: the plot keeps at least 60 pixels or 45 % of the height
  const fixedBottom = GAP + LINE + 4 + 2 * LINE + 6 + PAD;
  const maxRows = Math.max(1, Math.floor((height - top - Math.max(60, 0.45 * height) - fixedBottom) / LINE));
  const rows = fittedLegendRows(spec.legend, FONT_SIZE, width - 2 * PAD, maxRows);
  // the axis titles' line counts depend on the plot's size, which depends on them: settle in a few passes
  let xTitleLines = [titleOf(spec.x)];
  let yTitleLines = [titleOf(spec.y)];
  let left = PAD + LINE + 6 + 40 + GAP;
  let right = PAD + 8;
  let plotHeight = 40;
  let axes = axesFor(spec, Math.max(40, width - left - right), Math.max(40, height - top - 80));
  for (let pass = 0; pass < 4; pass++) {
    const bottomMargin = GAP + LINE + 4 + xTitleLines.length * LINE + (rows.length > 0 ? 6 + rows.length * LINE : 0) + PAD;
    plotHeight = Math.max(40, height - top - bottomMargin);
    const yLabels = widestLabel(axes.y, FONT_SIZE);
    const plotWidth0 = Math.max(40, width - left - right);
    const over = xOverhang(axes.x, plotWidth0);
    left = Math.max(PAD + yTitleLines.length * LINE + 6 + yLabels + GAP, PAD + over.left);
    right = Math.max(PAD + 8, PAD + over.right);
    axes = axesFor(spec, Math.max(40, width - left - right), plotHeight);
    xTitleLines = wrapText(axes.x.title, FONT_SIZE, Math.max(40, width - left - right));
    yTitleLines = wrapText(axes.y.title, FONT_SIZE, plotHeight);
  }
  const plotWidth = Math.max(40, width - left - right);
  const { x, y } = axes;
  const clipId = `fw-clip-${hashText(`${spec.idSeed}|${width}x${height}|${spec.title}`)}`;
  return {
    width,
    height,
    left,
    top,
    plotWidth,
    plotHeight,
    x,
    y,
    X: (v) => left + x.fraction(v) * plotWidth,
    Y: (v) => top + (1 - y.fraction(v)) * plotHeight,
    clipId,
    titleLines,
    legendRows: rows,
    xTitleLines,
    yTitleLines,
  };
}

/**
 * The opening of the drawing: the `svg` element, a white background, the
 * clip path and the grid (minor lines, then major).
 *
 * @param f - the frame
 * @param description - a one-line description for the `title` element (what a screen reader says)
 * @returns the SVG lines
 */
export function frameOpen(f: Frame, description: string): string[] {
  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${f.width}" height="${f.height}" viewBox="0 0 ${f.width} ${f.height}" font-family="DejaVu Sans, Verdana, Arial, Helvetica, sans-serif" font-size="${FONT_SIZE}">`,
    `<title>${esc(description)}</title>`,
    `<rect x="0" y="0" width="${f.width}" height="${f.height}" fill="#ffffff"/>`,
    `<defs><clipPath id="${f.clipId}"><rect x="${px(f.left)}" y="${px(f.top)}" width="${px(f.plotWidth)}" height="${px(f.plotHeight)}"/></clipPath></defs>`,
  );
  const x0 = px(f.left);
  const x1 = px(f.left + f.plotWidth);
  const y0 = px(f.top);
  const y1 = px(f.top + f.plotHeight);
  const vertical = (v: number): string => `M${px(f.X(v))},${y0}V${y1}`;
  const horizontal = (v: number): string => `M${x0},${px(f.Y(v))}H${x1}`;
  const minor = [...f.x.minor.map(vertical), ...f.y.minor.map(horizontal)];
  if (minor.length > 0) out.push(`<path d="${minor.join("")}" stroke="#ececec" stroke-width="1" fill="none"/>`);
  const major = [...f.x.major.map((t) => vertical(t.value)), ...f.y.major.map((t) => horizontal(t.value))];
  if (major.length > 0) out.push(`<path d="${major.join("")}" stroke="#c8c8c8" stroke-width="1" fill="none"/>`);
  return out;
}

/**
 * The close of the drawing: the frame's border, tick labels, axis titles,
 * title, legend and the `svg` end tag.
 *
 * @param f - the frame
 * @returns the SVG lines
 */
export function frameClose(f: Frame): string[] {
  const out: string[] = [];
  out.push(`<rect x="${px(f.left)}" y="${px(f.top)}" width="${px(f.plotWidth)}" height="${px(f.plotHeight)}" fill="none" stroke="#333333" stroke-width="1"/>`);
  const bottom = f.top + f.plotHeight;
  const xLabelBaseline = bottom + GAP + FONT_SIZE * 0.95;
  for (const t of f.x.major) {
    if (t.label === null) continue;
    out.push(`<text x="${px(f.X(t.value))}" y="${px(xLabelBaseline)}" text-anchor="middle">${esc(t.label)}</text>`);
  }
  for (const t of f.y.major) {
    if (t.label === null) continue;
    out.push(`<text x="${px(f.left - GAP)}" y="${px(f.Y(t.value) + FONT_SIZE * 0.35)}" text-anchor="end">${esc(t.label)}</text>`);
  }
  const xTitleTop = bottom + GAP + LINE + 4;
  f.xTitleLines.forEach((l, i) => {
    out.push(`<text x="${px(f.left + f.plotWidth / 2)}" y="${px(xTitleTop + i * LINE + FONT_SIZE * 0.95)}" text-anchor="middle">${esc(l)}</text>`);
  });
  const yMid = f.top + f.plotHeight / 2;
  f.yTitleLines.forEach((l, i) => {
    const at = PAD + i * LINE + FONT_SIZE * 0.95;
    out.push(`<text x="${px(at)}" y="${px(yMid)}" text-anchor="middle" transform="rotate(-90 ${px(at)} ${px(yMid)})">${esc(l)}</text>`);
  });
  f.titleLines.forEach((line, i) => {
    out.push(`<text x="${PAD}" y="${px(PAD + i * TITLE_LINE + TITLE_SIZE * 0.95)}" font-size="${TITLE_SIZE}" fill="#111111">${esc(line)}</text>`);
  });
  if (f.legendRows.length > 0) out.push(...legendSvg(f.legendRows, PAD, bottom + GAP + (1 + f.xTitleLines.length) * LINE + 4 + 6, FONT_SIZE, LINE));
  out.push("</svg>", "");
  return out;
}
