/**
 * Traces in pixel space: polylines and filled bands cut to a rectangle a
 * little larger than the plot area, so their coordinates stay small while
 * the part inside the frame is exact (the frame's clip path then trims the
 * rest). A point that is not finite (a magnitude of exactly zero, -Infinity
 * dB) breaks the line.
 *
 * Method: each segment of a polyline is clipped by the Liang-Barsky
 * parametric test (Y.-D. Liang & B. A. Barsky, "A new concept and method for
 * line clipping", ACM Trans. Graphics 3(1):1-22, 1984); a band's polygon by
 * Sutherland-Hodgman re-entrant clipping against each edge in turn
 * (I. E. Sutherland & G. W. Hodgman, "Reentrant polygon clipping",
 * Comm. ACM 17(1):32-42, 1974). Both are exact up to rounding.
 *
 * @module
 */
import { px } from "./text.ts";

/** An axis-aligned rectangle, pixels. */
export interface Rect {
  /** Left edge. */
  readonly x0: number;
  /** Top edge. */
  readonly y0: number;
  /** Right edge. */
  readonly x1: number;
  /** Bottom edge. */
  readonly y1: number;
}

/** The segment from (ax, ay) to (bx, by) clipped to r, or null when it misses. */
function clipSegment(ax: number, ay: number, bx: number, by: number, r: Rect): [number, number, number, number] | null {
  const dx = bx - ax;
  const dy = by - ay;
  let t0 = 0;
  let t1 = 1;
  const edges: [number, number][] = [
    [-dx, ax - r.x0],
    [dx, r.x1 - ax],
    [-dy, ay - r.y0],
    [dy, r.y1 - ay],
  ];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return null;
      continue;
    }
    const t = q / p;
    if (p < 0) {
      if (t > t1) return null;
      if (t > t0) t0 = t;
    } else {
      if (t < t0) return null;
      if (t < t1) t1 = t;
    }
  }
  return [ax + t0 * dx, ay + t0 * dy, ax + t1 * dx, ay + t1 * dy];
}

/**
 * Path data of a polyline clipped to a rectangle (see the module header).
 *
 * @param xs - x pixels
 * @param ys - y pixels (same length); a non-finite entry breaks the line
 * @param r - the rectangle
 * @returns SVG path data (empty when nothing is inside)
 */
export function clippedPolyline(xs: ArrayLike<number>, ys: ArrayLike<number>, r: Rect): string {
  const parts: string[] = [];
  let penX = NaN;
  let penY = NaN;
  for (let i = 1; i < xs.length; i++) {
    const ax = xs[i - 1] as number;
    const ay = ys[i - 1] as number;
    const bx = xs[i] as number;
    const by = ys[i] as number;
    if (!Number.isFinite(ax) || !Number.isFinite(ay) || !Number.isFinite(bx) || !Number.isFinite(by)) continue;
    const c = clipSegment(ax, ay, bx, by, r);
    if (c === null) continue;
    const [sx, sy, ex, ey] = c;
    const start = `${px(sx)},${px(sy)}`;
    if (px(sx) !== px(penX) || px(sy) !== px(penY)) parts.push(`M${start}`);
    parts.push(`L${px(ex)},${px(ey)}`);
    penX = ex;
    penY = ey;
  }
  return parts.join("");
}

type Point = readonly [number, number];

/** One Sutherland-Hodgman pass: keep the side where inside(p) holds. */
function clipAgainst(poly: readonly Point[], inside: (p: Point) => boolean, cross: (a: Point, b: Point) => Point): Point[] {
  const out: Point[] = [];
  for (let i = 0; i < poly.length; i++) {
    const cur = poly[i] as Point;
    const prev = poly[(i + poly.length - 1) % poly.length] as Point;
    if (inside(cur)) {
      if (!inside(prev)) out.push(cross(prev, cur));
      out.push(cur);
    } else if (inside(prev)) out.push(cross(prev, cur));
  }
  return out;
}

/**
 * Path data of a closed polygon clipped to a rectangle.
 *
 * @param points - the vertices, pixels (all finite)
 * @param r - the rectangle
 * @returns SVG path data (empty when nothing is inside)
 */
export function clippedPolygon(points: readonly Point[], r: Rect): string {
  const atX = (x: number) => (a: Point, b: Point): Point => [x, a[1] + ((b[1] - a[1]) * (x - a[0])) / (b[0] - a[0])];
  const atY = (y: number) => (a: Point, b: Point): Point => [a[0] + ((b[0] - a[0]) * (y - a[1])) / (b[1] - a[1]), y];
  let poly: Point[] = points.slice();
  poly = clipAgainst(poly, (p) => p[0] >= r.x0, atX(r.x0));
  poly = clipAgainst(poly, (p) => p[0] <= r.x1, atX(r.x1));
  poly = clipAgainst(poly, (p) => p[1] >= r.y0, atY(r.y0));
  poly = clipAgainst(poly, (p) => p[1] <= r.y1, atY(r.y1));
  if (poly.length < 3) return "";
  return `M${poly.map((p) => `${px(p[0])},${px(p[1])}`).join("L")}Z`;
}

/**
 * Path data of the band between two curves on the same x pixels, cut into
 * pieces where either curve is not finite, each piece clipped to the rectangle.
 *
 * @param xs - x pixels
 * @param lo - one edge, y pixels
 * @param hi - the other edge, y pixels
 * @param r - the rectangle
 * @returns SVG path data
 */
export function clippedBand(xs: ArrayLike<number>, lo: ArrayLike<number>, hi: ArrayLike<number>, r: Rect): string {
  const pieces: string[] = [];
  let run: number[] = [];
  const flush = (): void => {
    if (run.length >= 2) {
      const top: Point[] = run.map((i) => [xs[i] as number, hi[i] as number]);
      const bottom: Point[] = run.map((i) => [xs[i] as number, lo[i] as number] as Point).reverse();
      pieces.push(clippedPolygon([...top, ...bottom], r));
    }
    run = [];
  };
  for (let i = 0; i < xs.length; i++) {
    if (Number.isFinite(lo[i] as number) && Number.isFinite(hi[i] as number) && Number.isFinite(xs[i] as number)) run.push(i);
    else flush();
  }
  flush();
  return pieces.join("");
}

/**
 * The rectangle the traces are cut to: the plot area grown by `grow` pixels
 * on every side (so line ends and joins at the frame are drawn in full
 * before the clip path trims them).
 *
 * @param left - plot area left, pixels
 * @param top - plot area top, pixels
 * @param width - plot area width, pixels
 * @param height - plot area height, pixels
 * @param grow - margin, pixels
 * @returns the rectangle
 */
export function grownRect(left: number, top: number, width: number, height: number, grow = 4): Rect {
  return { x0: left - grow, y0: top - grow, x1: left + width + grow, y1: top + height + grow };
}
