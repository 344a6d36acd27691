/**
 * Drawing helpers shared by the plot kinds: a traced line in data units,
 * clipped to the frame, and the drawing assembled from its frame and body.
 *
 * @module
 */
import { frameClose, frameOpen, layoutFrame, type Frame, type FrameSpec } from "./frame.ts";
import { clippedBand, clippedPolyline, grownRect } from "./trace.ts";

/** How a line is drawn. */
export interface LineStyle {
  /** Colour. */
  readonly stroke: string;
  /** Width, pixels. @defaultValue 1.6 */
  readonly width?: number;
  /** Dash pattern. */
  readonly dash?: string | undefined;
}

/**
 * A curve in data units as an SVG path, clipped to the frame.
 *
 * @param f - the frame
 * @param xs - x values
 * @param ys - y values (a non-finite value breaks the line)
 * @param style - colour, width, dash
 * @returns the path element, or "" when nothing is inside
 */
export function line(f: Frame, xs: ArrayLike<number>, ys: ArrayLike<number>, style: LineStyle): string {
  const px = Array.from(xs, (v) => f.X(v));
  const py = Array.from(ys, (v) => f.Y(v));
  const d = clippedPolyline(px, py, grownRect(f.left, f.top, f.plotWidth, f.plotHeight));
  if (d === "") return "";
  return `<path d="${d}" fill="none" stroke="${style.stroke}" stroke-width="${style.width ?? 1.6}" stroke-linejoin="round"${style.dash === undefined ? "" : ` stroke-dasharray="${style.dash}"`}/>`;
}

/**
 * The band between two curves in data units, filled and clipped to the frame.
 *
 * @param f - the frame
 * @param xs - x values
 * @param lo - one edge
 * @param hi - the other edge
 * @param fill - colour
 * @param opacity - fill opacity
 * @returns the path element, or "" when nothing is inside
 */
export function band(f: Frame, xs: ArrayLike<number>, lo: ArrayLike<number>, hi: ArrayLike<number>, fill: string, opacity: number): string {
  const px = Array.from(xs, (v) => f.X(v));
  const d = clippedBand(px, Array.from(lo, (v) => f.Y(v)), Array.from(hi, (v) => f.Y(v)), grownRect(f.left, f.top, f.plotWidth, f.plotHeight));
  if (d === "") return "";
  return `<path d="${d}" fill="${fill}" fill-opacity="${opacity}" stroke="none"/>`;
}

/**
 * The whole drawing: the frame laid out, the body drawn inside its clip
 * path, then the frame's labels.
 *
 * @param spec - the frame
 * @param description - one line for the `title` element
 * @param body - the data, drawn on the laid-out frame
 * @returns SVG text
 */
export function drawing(spec: FrameSpec, description: string, body: (f: Frame) => readonly string[]): string {
  const f = layoutFrame(spec);
  const inner = body(f).filter((s) => s !== "");
  return [...frameOpen(f, description), `<g clip-path="url(#${f.clipId})">`, ...inner, "</g>", ...frameClose(f)].join("\n");
}
