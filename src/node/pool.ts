/**
 * Jobs on worker threads (node:worker_threads): one worker per job, the job
 * given as the worker's `workerData`, one reply per worker, the replies in
 * job order. A worker's failure (an error it reports, an uncaught error, an
 * exit before replying) rejects the whole run and ends every worker still
 * running; every worker is ended when the run settles either way.
 *
 * A reply is `{ ok: true, value }` or `{ ok: false, error }` with the error
 * as plain data ({@link failureOf}); a filterwright error comes back as the
 * same class with the same code, function, path, received value and reason
 * ({@link errorOf}).
 *
 * @module
 */
import { Worker } from "node:worker_threads";
import {
  ConvergenceError,
  CancelledError,
  FilterwrightError,
  InvalidArgumentError,
  ParseError,
  SingularCircuitError,
  SpecError,
  UnrealisableError,
  type ErrorCode,
  type ErrorDetails,
  type Issue,
} from "../errors.ts";

/** An error as plain data, as a worker posts it. */
export interface WorkerFailure {
  /** The error's class name. */
  readonly name: string;
  /** Its message. */
  readonly message: string;
  /** Its stack, where it had one. */
  readonly stack?: string;
  /** For a filterwright error: its fields. */
  readonly filterwright?: {
    readonly code: ErrorCode;
    readonly fn: string;
    readonly path: string;
    readonly reason: string;
    readonly received?: unknown;
    readonly culprits?: readonly string[];
    readonly issues?: readonly Issue[];
  };
}

/** A worker's one reply. */
export type WorkerReply<T> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly error: WorkerFailure };

/**
 * An error as plain data. The received value is kept only when it can be
 * posted (structured clone); otherwise it is left out.
 *
 * @param e - anything thrown
 * @returns the failure
 */
export function failureOf(e: unknown): WorkerFailure {
  if (e instanceof FilterwrightError) {
    const fields: Record<string, unknown> = { code: e.code, fn: e.fn, path: e.path, reason: e.reason };
    if (e.received !== undefined && cloneable(e.received)) fields["received"] = e.received;
    if (e instanceof SingularCircuitError) fields["culprits"] = [...e.culprits];
    if (e instanceof SpecError && cloneable(e.issues)) fields["issues"] = [...e.issues];
    return withStack({ name: e.name, message: e.message, filterwright: fields as NonNullable<WorkerFailure["filterwright"]> }, e);
  }
  if (e instanceof Error) return withStack({ name: e.name, message: e.message }, e);
  return { name: "Error", message: String(e) };
}

function withStack(f: WorkerFailure, e: Error): WorkerFailure {
  return e.stack === undefined ? f : { ...f, stack: e.stack };
}

function cloneable(x: unknown): boolean {
  try {
    structuredClone(x);
    return true;
  } catch {
    return false;
  }
}

/**
 * The error a failure stands for: a filterwright error as its own class with
 * its own fields, anything else as an `Error` whose message says which
 * worker failed, with the worker's error as its `cause`.
 *
 * @param f - the failure
 * @param where - which worker, for the message of a plain error
 * @returns the error
 */
export function errorOf(f: WorkerFailure, where: string): Error {
  const w = f.filterwright;
  if (w !== undefined) {
    const details: ErrorDetails = "received" in w ? { fn: w.fn, path: w.path, received: w.received, message: w.reason } : { fn: w.fn, path: w.path, message: w.reason };
    switch (w.code) {
      case "INVALID_ARGUMENT":
        return new InvalidArgumentError(details);
      case "PARSE_ERROR":
        return new ParseError(details);
      case "UNREALISABLE":
        return new UnrealisableError(details);
      case "SINGULAR_CIRCUIT":
        return new SingularCircuitError(details, w.culprits ?? []);
      case "INVALID_SPEC":
        if (w.issues !== undefined && w.issues.length > 0) return new SpecError(w.fn, w.issues);
        return new FilterwrightError(w.code, details);
      case "NOT_CONVERGED":
        return new ConvergenceError(details);
      case "CANCELLED":
        return new CancelledError(details);
      default:
        return new FilterwrightError(w.code, details);
    }
  }
  const cause = new Error(f.message);
  cause.name = f.name;
  if (f.stack !== undefined) cause.stack = f.stack;
  return new Error(`${where} failed: ${f.name}: ${f.message}`, { cause });
}

/** How the caller watches and stops a pool run. */
export interface PoolWatch {
  /** Terminates every worker once aborted. */
  readonly signal?: AbortSignal;
  /** Terminates every worker after this many milliseconds. */
  readonly timeLimitMs?: number;
  /** Called when worker `i` has replied (and others still run); `false` stops the run. */
  readonly onDone?: (i: number) => unknown;
  /** The error a stop rejects with, given the option that stopped it. */
  readonly cancelled?: (field: "signal" | "timeLimitMs" | "onProgress") => Error;
}

/**
 * Run each job on its own worker thread.
 *
 * @param script - the worker's module (it reads `workerData` and posts one {@link WorkerReply})
 * @param jobs - one per worker, posted as `workerData` (structured clone)
 * @param label - names worker `i` in the message of a failure
 * @param watch - abort signal, time limit and a callback per finished worker
 * @returns the workers' values, in job order
 */
export function runInWorkers<J, T>(script: URL, jobs: readonly J[], label: (i: number) => string, watch: PoolWatch = {}): Promise<T[]> {
  return new Promise<T[]>((resolve, reject) => {
    const values: (T | undefined)[] = jobs.map(() => undefined);
    const workers: Worker[] = [];
    let pending = jobs.length;
    let settled = false;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const onAbort = (): void => finish(watch.cancelled?.("signal") ?? new Error("aborted"));
    const finish = (error: Error | undefined): void => {
      if (settled) return;
      settled = true;
      if (timer !== undefined) clearTimeout(timer);
      watch.signal?.removeEventListener("abort", onAbort);
      for (const w of workers) void w.terminate();
      if (error === undefined) resolve(values as T[]);
      else reject(error);
    };
    if (watch.signal?.aborted === true) {
      onAbort();
      return;
    }
    watch.signal?.addEventListener("abort", onAbort);
    if (watch.timeLimitMs !== undefined) timer = setTimeout(() => finish(watch.cancelled?.("timeLimitMs") ?? new Error("time limit")), watch.timeLimitMs);
    jobs.forEach((job, i) => {
      if (settled) return;
      let replied = false;
      let w: Worker;
      try {
        w = new Worker(script, { workerData: job });
      } catch (e) {
        finish(e instanceof Error ? e : new Error(String(e)));
        return;
      }
      workers.push(w);
      w.once("message", (reply: WorkerReply<T>) => {
        replied = true;
        if (reply.ok) {
          values[i] = reply.value;
          if (--pending === 0) finish(undefined);
          else if (!settled && watch.onDone?.(i) === false) finish(watch.cancelled?.("onProgress") ?? new Error("stopped"));
        } else {
          finish(errorOf(reply.error, label(i)));
        }
      });
      w.once("messageerror", (e) => finish(new Error(`${label(i)}: its reply could not be read`, { cause: e })));
      w.once("error", (e) => finish(new Error(`${label(i)} failed: ${e.message}`, { cause: e })));
      w.once("exit", (code) => {
        if (!replied) finish(new Error(`${label(i)} stopped (exit code ${code}) before it replied`));
      });
    });
    if (jobs.length === 0) finish(undefined);
  });
}
