/**
 * Progress reports and cancellation of long runs (a design with its yield
 * ladder, a Monte Carlo run of many boards).
 *
 * The design and the Monte Carlo run are synchronous, so a run is watched
 * through checkpoints: at each step of the pipeline and after every batch of
 * boards, the caller's `onProgress` is told where the run is, and the run
 * stops with a {@link CancelledError} when the callback returns `false`, the
 * `signal` is aborted (from inside the callback, or from another thread for
 * code that shares one), or `timeLimitMs` has passed. One run is watched at a
 * time per thread; a run started inside another (the design's own boards)
 * reports to the outer run's caller.
 *
 * @module
 */
import { CancelledError, InvalidArgumentError } from "../errors.ts";

/** Where a long run is. */
export type ProgressStep = "family" | "search" | "yield" | "boards" | "realisation" | "result";

/** One progress report. */
export interface Progress {
  /** The step: the family choice, the component search, a rung of the yield ladder, a batch of Monte Carlo boards, the comparison of realisations, the result. */
  readonly step: ProgressStep;
  /** What is happening, in words ("yield: tighter parts 0.5 % R / 2 % C"). */
  readonly message: string;
  /** Milliseconds since the run started. */
  readonly elapsedMs: number;
  /** Boards built so far in this batch's run (step `"boards"`). */
  readonly boards?: number;
  /** Boards the run will build at most (step `"boards"`). */
  readonly totalBoards?: number;
}

/** How a caller watches and stops a long run. */
export interface RunControl {
  /**
   * Called at every checkpoint; return `false` to stop the run (anything else goes on).
   * @defaultValue none
   */
  readonly onProgress?: (progress: Progress) => unknown;
  /**
   * Stops the run at the next checkpoint once aborted.
   * @defaultValue none
   */
  readonly signal?: AbortSignal;
  /**
   * Stops the run at the first checkpoint after this many milliseconds (1 ms to 1 day).
   * @defaultValue no limit
   */
  readonly timeLimitMs?: number;
}

interface Watch {
  readonly fn: string;
  readonly path: string;
  readonly control: RunControl;
  readonly start: number;
}

let current: Watch | null = null;

const MAX_LIMIT_MS = 86_400_000;

/**
 * Check a run-control object at a public boundary.
 *
 * @param fn - the public function
 * @param path - the options' path, e.g. `"options"`
 * @param value - what the caller gave (undefined for none)
 * @returns the checked control
 * @throws {@link InvalidArgumentError} naming the field
 */
export function checkRunControl(fn: string, path: string, value: unknown): RunControl {
  if (value === undefined) return {};
  if (value === null || typeof value !== "object") throw new InvalidArgumentError({ fn, path, received: value, message: "expected an options object (or nothing)" });
  const o = value as Record<string, unknown>;
  const at = (k: string): string => (path === "" ? k : `${path}.${k}`);
  const on = o["onProgress"];
  if (on !== undefined && typeof on !== "function") throw new InvalidArgumentError({ fn, path: at("onProgress"), received: on, message: "expected a function (progress) => boolean | void" });
  const signal = o["signal"];
  if (signal !== undefined && (signal === null || typeof signal !== "object" || typeof (signal as { aborted?: unknown }).aborted !== "boolean")) {
    throw new InvalidArgumentError({ fn, path: at("signal"), received: signal, message: "expected an AbortSignal (new AbortController().signal)" });
  }
  const limit = o["timeLimitMs"];
  if (limit !== undefined && (typeof limit !== "number" || !Number.isFinite(limit) || limit < 1 || limit > MAX_LIMIT_MS)) {
    throw new InvalidArgumentError({ fn, path: at("timeLimitMs"), received: limit, message: `expected milliseconds from 1 to ${MAX_LIMIT_MS} (one day)` });
  }
  return {
    ...(on === undefined ? {} : { onProgress: on as RunControl["onProgress"] & object }),
    ...(signal === undefined ? {} : { signal: signal as AbortSignal }),
    ...(limit === undefined ? {} : { timeLimitMs: limit as number }),
  };
}

/**
 * Run `f` watched by `control` (a run already watched keeps its watcher).
 *
 * @param fn - the public function, named by a {@link CancelledError}
 * @param path - where the control sits in its arguments (`"control"`, `"options"`), for the error's path
 * @param control - the caller's checked control
 * @param f - the run
 * @returns what `f` returns
 * @throws {@link CancelledError} when the run is stopped
 */
export function watched<T>(fn: string, path: string, control: RunControl, f: () => T): T {
  if (current !== null || (control.onProgress === undefined && control.signal === undefined && control.timeLimitMs === undefined)) return f();
  current = { fn, path, control, start: Date.now() };
  try {
    return f();
  } finally {
    current = null;
  }
}

function stop(w: Watch, field: string, message: string): never {
  throw new CancelledError({ fn: w.fn, path: w.path === "" ? field : `${w.path}.${field}`, message });
}

/**
 * A checkpoint of the watched run (a no-op when nothing watches): report
 * where the run is, then stop it if its caller asked.
 *
 * @param step - the step
 * @param message - what is happening
 * @param boards - boards built so far and at most, for step `"boards"`
 * @throws {@link CancelledError} when the run is stopped
 */
export function checkpoint(step: ProgressStep, message: string, boards?: { readonly done: number; readonly total: number }): void {
  const w = current;
  if (w === null) return;
  const elapsedMs = Date.now() - w.start;
  const c = w.control;
  if (c.onProgress !== undefined) {
    const p: Progress = { step, message, elapsedMs, ...(boards === undefined ? {} : { boards: boards.done, totalBoards: boards.total }) };
    if (c.onProgress(p) === false) stop(w, "onProgress", `stopped by onProgress at "${message}" after ${elapsedMs} ms`);
  }
  if (c.signal?.aborted === true) stop(w, "signal", `stopped by the aborted signal at "${message}" after ${elapsedMs} ms`);
  if (c.timeLimitMs !== undefined && elapsedMs > c.timeLimitMs) stop(w, "timeLimitMs", `the time limit of ${c.timeLimitMs} ms ran out at "${message}" (${elapsedMs} ms); allow more time or relax the spec`);
}
