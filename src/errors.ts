/**
 * Typed errors thrown by filterwright.
 *
 * Every failure a caller can cause is a {@link FilterwrightError} with a stable
 * `code`, the function that rejected the input (`fn`), the dotted input `path`
 * that caused it (such as `stopband.edgeHz`), the value received, and a message
 * that says what to change. Failures that are a normal outcome of design (a
 * spec that a forced order cannot meet, for instance) are returned as data,
 * not thrown.
 *
 * @module
 */

/** Stable machine-readable error codes. */
export type ErrorCode =
  /** An argument has the wrong type, is not finite, or is outside its accepted range. */
  | "INVALID_ARGUMENT"
  /** A string could not be parsed (engineering notation, RKM code, JSON). */
  | "PARSE_ERROR"
  /** A design target cannot be realised by the chosen topology or parts. */
  | "UNREALISABLE"
  /** A circuit's nodal equations are singular (floating node, source loop). */
  | "SINGULAR_CIRCUIT"
  /** A filter specification has one or more problems (see `issues`). */
  | "INVALID_SPEC"
  /** An iterative method did not converge. */
  | "NOT_CONVERGED"
  /** A long run was stopped by its caller (an aborted signal, a time limit, or a progress callback that asked to stop). */
  | "CANCELLED";

/** Fields shared by every filterwright error. */
export interface ErrorDetails {
  /** The public function that rejected the input, e.g. `"parseValue"`. */
  readonly fn: string;
  /** Dotted path of the offending input, e.g. `"stopband.edgeHz"`; `""` for the whole argument. */
  readonly path: string;
  /** The value received (kept as given, for display). */
  readonly received?: unknown;
  /** What is wrong and what to change, as one or two sentences. */
  readonly message: string;
}

/**
 * Render a received value for an error message without throwing: strings are
 * quoted, `NaN` and `undefined` are named, objects are shown as JSON cut to
 * 80 characters.
 *
 * @param value - any value
 * @returns a short printable description
 * @throws never
 * @example
 * ```ts
 * describeValue("4k7k"); //=> "\"4k7k\""
 * describeValue(Number.NaN); //=> "NaN"
 * ```
 */
export function describeValue(value: unknown): string {
  if (typeof value === "string") return JSON.stringify(value);
  if (typeof value === "number") {
    if (Number.isNaN(value)) return "NaN";
    return String(value);
  }
  if (typeof value === "bigint") return `${value}n`;
  if (value === undefined) return "undefined";
  if (value === null) return "null";
  if (typeof value === "function") return "a function";
  try {
    const s = JSON.stringify(value);
    return s.length > 80 ? `${s.slice(0, 77)}...` : s;
  } catch {
    return Object.prototype.toString.call(value);
  }
}

/**
 * Base class of every error filterwright throws on purpose.
 *
 * @example
 * ```ts
 * try { parseValue("4k7k"); } catch (e) {
 *   if (e instanceof FilterwrightError) console.log(e.code, e.path);
 * }
 * //=> PARSE_ERROR value
 * ```
 */
export class FilterwrightError extends Error {
  /** Stable machine-readable code. */
  readonly code: ErrorCode;
  /** The public function that rejected the input. */
  readonly fn: string;
  /** Dotted path of the offending input (`""` for the whole argument). */
  readonly path: string;
  /** The value received, as given. */
  readonly received: unknown;
  /** The bare reason (what is wrong and what to change), without the function, path and received value. */
  readonly reason: string;

  /**
   * @param code - stable error code
   * @param details - function, path, received value and message
   */
  constructor(code: ErrorCode, details: ErrorDetails) {
    const where = details.path === "" ? details.fn : `${details.fn}: ${details.path}`;
    const got = "received" in details ? ` (received ${describeValue(details.received)})` : "";
    super(`${where}: ${details.message}${got}`);
    this.name = "FilterwrightError";
    this.code = code;
    this.fn = details.fn;
    this.path = details.path;
    this.received = details.received;
    this.reason = details.message;
  }
}

/** An argument has the wrong type, is not finite, or is out of its accepted range. */
export class InvalidArgumentError extends FilterwrightError {
  /** @param details - function, path, received value and message */
  constructor(details: ErrorDetails) {
    super("INVALID_ARGUMENT", details);
    this.name = "InvalidArgumentError";
  }
}

/** A string could not be parsed. */
export class ParseError extends FilterwrightError {
  /** @param details - function, path, received value and message */
  constructor(details: ErrorDetails) {
    super("PARSE_ERROR", details);
    this.name = "ParseError";
  }
}

/** A target cannot be realised by the chosen topology, parts or constraints. */
export class UnrealisableError extends FilterwrightError {
  /** @param details - function, path, received value and message */
  constructor(details: ErrorDetails) {
    super("UNREALISABLE", details);
    this.name = "UnrealisableError";
  }
}

/** The nodal equations of a circuit are singular. */
export class SingularCircuitError extends FilterwrightError {
  /** Nodes (or source names) implicated in the singularity. */
  readonly culprits: readonly string[];
  /**
   * @param details - function, path, received value and message
   * @param culprits - nodes or element names implicated
   */
  constructor(details: ErrorDetails, culprits: readonly string[]) {
    super("SINGULAR_CIRCUIT", details);
    this.name = "SingularCircuitError";
    this.culprits = Object.freeze([...culprits]);
  }
}

/** One problem found while validating a structured input such as a filter spec. */
export interface Issue {
  /** Dotted path of the offending field. */
  readonly path: string;
  /** What is wrong and what to change. */
  readonly message: string;
  /** The value received. */
  readonly received?: unknown;
}

/** A structured input (a filter specification) has one or more problems, all listed. */
export class SpecError extends FilterwrightError {
  /** Every problem found, each with its path. */
  readonly issues: readonly Issue[];
  /**
   * @param fn - the public function that validated the input
   * @param issues - every problem found (at least one)
   */
  constructor(fn: string, issues: readonly Issue[]) {
    const lines = issues.map(
      (i) => `  - ${i.path}: ${i.message}${"received" in i ? ` (received ${describeValue(i.received)})` : ""}`,
    );
    super("INVALID_SPEC", {
      fn,
      path: issues[0]?.path ?? "",
      message: `${issues.length} problem${issues.length === 1 ? "" : "s"} in the specification:\n${lines.join("\n")}`,
    });
    this.name = "SpecError";
    this.issues = Object.freeze([...issues]);
  }
}

/** An iterative numerical method did not converge. */
export class ConvergenceError extends FilterwrightError {
  /** @param details - function, path, received value and message */
  constructor(details: ErrorDetails) {
    super("NOT_CONVERGED", details);
    this.name = "ConvergenceError";
  }
}

/**
 * A long run (a design, a Monte Carlo run) was stopped by its caller: its
 * `signal` was aborted, its `timeLimitMs` ran out, or its `onProgress`
 * callback returned `false`. `path` names the option that stopped it.
 */
export class CancelledError extends FilterwrightError {
  /** @param details - function, path (the option that stopped the run), received value and message */
  constructor(details: ErrorDetails) {
    super("CANCELLED", details);
    this.name = "CancelledError";
  }
}
