/**
 * Frequency and time grids as `Float64Array`s, with exact end points.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { requireFinite, requireInteger, requirePositive } from "../validate.ts";

/** Largest number of points a grid helper will allocate. */
export const MAX_GRID_POINTS = 10_000_000;

/**
 * Logarithmically spaced points from `start` to `stop` inclusive:
 * `start * (stop/start)^(i/(count-1))`. The end points are exact.
 *
 * @param start - first point, > 0
 * @param stop - last point, > 0 (may be below `start` for a descending grid)
 * @param count - number of points, 1 to {@link MAX_GRID_POINTS} (1 gives `[start]`)
 * @returns the grid
 * @throws {@link InvalidArgumentError} when an end point is not positive and finite or `count` is not an integer in range
 * @example
 * ```ts
 * logGrid(1, 100, 3); //=> Float64Array [1, 10.000000000000002, 100]
 * ```
 */
export function logGrid(start: number, stop: number, count: number): Float64Array {
  requirePositive("logGrid", "start", start);
  requirePositive("logGrid", "stop", stop);
  requireInteger("logGrid", "count", count, { min: 1, max: MAX_GRID_POINTS });
  const out = new Float64Array(count);
  out[0] = start;
  if (count === 1) return out;
  const l0 = Math.log(start);
  const step = (Math.log(stop) - l0) / (count - 1);
  for (let i = 1; i < count - 1; i++) out[i] = Math.exp(l0 + i * step);
  out[count - 1] = stop;
  return out;
}

/**
 * Evenly spaced points from `start` to `stop` inclusive:
 * `start + i (stop - start)/(count - 1)`. The end points are exact.
 *
 * @param start - first point
 * @param stop - last point
 * @param count - number of points, 1 to {@link MAX_GRID_POINTS} (1 gives `[start]`)
 * @returns the grid
 * @throws {@link InvalidArgumentError} when an end point is not finite or `count` is not an integer in range
 * @example
 * ```ts
 * linearGrid(0, 1, 5); //=> Float64Array [0, 0.25, 0.5, 0.75, 1]
 * ```
 */
export function linearGrid(start: number, stop: number, count: number): Float64Array {
  requireFinite("linearGrid", "start", start);
  requireFinite("linearGrid", "stop", stop);
  requireInteger("linearGrid", "count", count, { min: 1, max: MAX_GRID_POINTS });
  if (!Number.isFinite(stop - start)) {
    throw new InvalidArgumentError({ fn: "linearGrid", path: "stop", received: stop, message: "the span stop - start overflows; use a smaller range" });
  }
  const out = new Float64Array(count);
  out[0] = start;
  if (count === 1) return out;
  const step = (stop - start) / (count - 1);
  for (let i = 1; i < count - 1; i++) out[i] = start + i * step;
  out[count - 1] = stop;
  return out;
}
