/**
 * The design layer: the filter specification, the design pipeline and the
 * circuit of a finished design, and the passive LC ladder designed from the
 * same specification (`designLcLadder`).
 *
 * @module
 */
export {
  validateSpec,
  checkSpec,
  specToInput,
  MAX_SPEC_ORDER,
  type FilterSpec,
  type DesignSpec,
  type ResponseType,
  type FamilyPriority,
  type Polarity,
  type Quantity as SpecQuantity,
  type EdgeInput,
  type PassbandSpec,
  type StopbandSpec,
  type GainSpec,
  type PartsSpec,
  type OpAmpSpec,
  type ValueWindow,
  type LevelsSpec,
  type SignalLevels,
  type YieldCheckSpec,
  type Realisation,
  type ActiveRealisation,
  type LcLadderFilterSpec,
} from "./spec.ts";
export type { DesignRealisation, RealisationCandidate, RealisationComparison, RealisationMethod, RealisationSkipped, ToleranceFractions } from "./realisation.ts";
export { designFilter, LARGE_CAPACITOR_RATIO, CURVE_POINTS } from "./pipeline.ts";
export { responseSpanHz } from "./verify.ts";
export { designResponse, type DesignResponseOptions } from "./response.ts";
export { designCircuit, type DesignCircuitOptions } from "./circuit.ts";
export type { StageFigures } from "../topologies/types.ts";
export type { AsBuiltPole } from "../topologies/as-built.ts";
export type {
  DesignResult,
  DesignStage,
  StagePredistortion,
  StageErrors,
  FamilyCandidate,
  FamilyBuilt,
  FamilyChoice,
  Feasibility,
  NeededOrder,
  Relaxation,
  Placement,
  ResponseCurve,
  Verification,
  DesignWarning,
  DesignAction,
  OpampPeak,
  Headroom,
  HeadroomOpamp,
  DynamicRange,
  BoardYield,
  YieldAlternative,
} from "./types.ts";
export {
  designLcLadder,
  lcLadderNetlist,
  type LcLadderBoard,
  type LcLadderDesign,
  type LcLadderNetlistOptions,
  type LcLadderOptions,
  type LcLadderPlacement,
  type LcLadderVerification,
  type LcLadderYield,
} from "./lc-ladder.ts";
export { LC_LADDER_MAX_ORDER, LC_PLACEMENT_POSITIONS } from "./lc-ladder-choice.ts";
export { DEFAULT_LC_BOARDS, MAX_LC_BOARDS } from "./lc-ladder-options.ts";
export type { Progress, ProgressStep, RunControl } from "../evaluate/progress.ts";
