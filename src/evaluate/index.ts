/**
 * The evaluation layer: stages as real polynomials (closed form where the
 * topology derives it, else from the stage's nodal equations), cascades on a
 * jω grid, mask figures and Monte Carlo boards. Internal for now: built into
 * dist/ for the benchmarks, not a published subpath export.
 *
 * @module
 */
export * from "./types.ts";
export * from "./stage-polynomials.ts";
export * from "./cascade.ts";
export * from "./mask.ts";
export * from "./boards.ts";
export * from "./stability.ts";
export * from "./yield.ts";
export * from "./spread.ts";
export * from "./allocate.ts";
export * from "./sensitivity.ts";
export * from "./progress.ts";
export * from "./opamp-outputs.ts";
export * from "./peak-gain.ts";
export * from "./circuit-boards.ts";
