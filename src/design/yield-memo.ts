/**
 * The board runs already made during a design, kept per attempt: the yield
 * ladder confirms some candidates twice (a candidate picked again at a later
 * class or phase, the chosen one confirmed again with the spec's own seed),
 * and a run is a pure function of the attempt, the tolerances, the cap, the
 * seed and the target, so a kept estimate is the one new boards would give,
 * bit for bit. Kept with the attempt (a weak map), so nothing outlives it.
 *
 * @module
 */
import type { YieldEstimate } from "../evaluate/yield.ts";
import type { DesignSpec } from "./spec.ts";

const runs = new WeakMap<object, { readonly spec: DesignSpec; readonly byKey: Map<string, YieldEstimate> }>();

/**
 * The estimate kept for these arguments, else `run()`'s, kept.
 *
 * @param spec - canonical spec (a run for another spec object is never reused)
 * @param attempt - the attempt (its identity)
 * @param tolerances - per stage, per part
 * @param maxBoards - cap
 * @param seed - seed
 * @param target - the target the run decides against
 * @param run - the board run
 * @returns the estimate
 * @internal
 */
export function keptYield(
  spec: DesignSpec,
  attempt: object,
  tolerances: readonly Float64Array[],
  maxBoards: number,
  seed: number,
  target: number,
  run: () => YieldEstimate,
): YieldEstimate {
  let entry = runs.get(attempt);
  if (entry === undefined || entry.spec !== spec) {
    entry = { spec, byKey: new Map() };
    runs.set(attempt, entry);
  }
  const key = `${maxBoards} ${seed} ${target} ${tolerances.map((t) => Array.prototype.join.call(t, ",")).join(";")}`;
  const hit = entry.byKey.get(key);
  if (hit !== undefined) return hit;
  const estimate = run();
  entry.byKey.set(key, estimate);
  return estimate;
}
