/**
 * filterwright: design analog active filters from a specification to a
 * verified circuit of preferred-value parts.
 *
 * The root entry re-exports every layer. Each layer is also a subpath export
 * (`filterwright/units`, `/math`, `/tf`, `/approx`, `/parts`, `/scaling`,
 * `/circuit`, `/topologies`, `/design`, `/analysis`, `/report`) for tree-shaking.
 *
 * @example
 * ```ts
 * import { designFilter, toSpiceNetlist } from "filterwright";
 * const result = designFilter({
 *   response: "lowpass",
 *   passband: { edgeHz: 2000, maxLossDb: 0.5 },
 *   stopband: { edgeHz: 8000, minAttenuationDb: 50 },
 * });
 * result.verification.meetsSpec; //=> true
 * ```
 *
 * @module
 */
export * from "./errors.ts";
export * from "./units/index.ts";
export * from "./math/index.ts";
export * from "./tf/index.ts";
export * from "./approx/index.ts";
export * from "./parts/index.ts";
export * from "./scaling/index.ts";
export * from "./circuit/index.ts";
export * from "./topologies/index.ts";
export * from "./design/index.ts";
export * from "./analysis/index.ts";
export * from "./report/index.ts";
