/**
 * The topology layer: one file per circuit family, each exporting its
 * {@link Topology} objects and their list, the registry, and the as-built
 * pole of a stage.
 *
 * @module
 */
export type {
  AsBuiltPolynomials,
  ComponentValues,
  PolynomialsInto,
  StageChoices,
  StageFigures,
  StageKind,
  StagePlacement,
  StageTarget,
  Topology,
} from "./types.ts";
export { DEFAULT_LEVEL_OHMS } from "./define.ts";
export { GBW_DEMAND_A0, asBuiltPole, type AsBuiltPole } from "./as-built.ts";
export * from "./first-order.ts";
export * from "./sallen-key.ts";
export * from "./sallen-key-third.ts";
export * from "./multiple-feedback.ts";
export * from "./state-variable.ts";
export * from "./tow-thomas.ts";
export * from "./boctor.ts";
export * from "./twin-t.ts";
export * from "./fliege.ts";
export * from "./deliyannis-friend.ts";
export { getTopology, topologies, topologiesFor, type TopologyQuery } from "./registry.ts";
