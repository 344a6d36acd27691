/**
 * The topology layer: one file per circuit family, each exporting
 * {@link Topology} objects, and a registry.
 *
 * @module
 */
export type {
  ComponentValues,
  StageChoices,
  StageFigures,
  StageKind,
  StagePlacement,
  StageTarget,
  Topology,
} from "./types.ts";
export { DEFAULT_LEVEL_OHMS, GBW_DEMAND_A0, type DefinedTopology } from "./common.ts";
export {
  firstOrderAllpass,
  firstOrderHighpassBuffer,
  firstOrderHighpassInverting,
  firstOrderHighpassNoninverting,
  firstOrderLowpassBuffer,
  firstOrderLowpassInverting,
  firstOrderLowpassNoninverting,
} from "./first-order.ts";
export {
  EQUAL_COMPONENT_MAX_Q,
  sallenKeyHighpassEqual,
  sallenKeyHighpassGain,
  sallenKeyHighpassUnity,
  sallenKeyLowpassEqual,
  sallenKeyLowpassGain,
  sallenKeyLowpassMinRatio,
  sallenKeyLowpassUnity,
} from "./sallen-key.ts";
export { mfbBandpass, mfbBandpassAttenuated, mfbHighpass, mfbLowpass, mfbLowpassMinRatio } from "./multiple-feedback.ts";
export {
  stateVariableAllpass,
  stateVariableBandpass,
  stateVariableHighpass,
  stateVariableLowpass,
  stateVariableNotch,
} from "./state-variable.ts";
export {
  towThomasAllpass,
  towThomasBandpass,
  towThomasHighpassNotch,
  towThomasLowpass,
  towThomasLowpassNotch,
  towThomasNotch,
} from "./tow-thomas.ts";
export { getTopology, topologies, topologiesFor, type TopologyQuery } from "./registry.ts";
export { asBuiltPole, type AsBuiltPole } from "./as-built.ts";
