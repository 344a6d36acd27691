/**
 * filterwright: design analog active filters from a specification to a
 * verified circuit of preferred-value parts.
 *
 * The root entry is the design API: {@link designFilter} and the spec it
 * validates, the result types, the reports of a finished design (SPICE
 * netlist, BOM, JSON, Markdown, SVG plots and schematics), its analyses
 * (Monte Carlo yield and envelope, part sensitivities, noise, op-amp
 * requirements, poles and zeros as built), the typed errors, and
 * {@link parseValue} / {@link formatValue} for the values in a spec and a
 * result. The layers underneath are subpath exports (`filterwright/units`,
 * `/math`, `/tf`, `/approx`, `/parts`, `/scaling`, `/circuit`, `/topologies`,
 * `/design`, `/analysis`, `/report`), each with its full API.
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
export {
  FilterwrightError,
  InvalidArgumentError,
  ParseError,
  UnrealisableError,
  SingularCircuitError,
  SpecError,
  ConvergenceError,
  CancelledError,
  type ErrorCode,
  type ErrorDetails,
  type Issue,
} from "./errors.ts";
export { parseValue, formatValue, type ParseValueOptions, type FormatValueOptions } from "./units/index.ts";
export type { FamilyName } from "./approx/index.ts";
export type { SeriesName } from "./parts/index.ts";
export {
  designFilter,
  validateSpec,
  checkSpec,
  type FilterSpec,
  type LcLadderFilterSpec,
  type Realisation,
  type ActiveRealisation,
  type DesignRealisation,
  type DesignSpec,
  type ResponseType,
  type FamilyPriority,
  type Polarity,
  type SpecQuantity,
  type EdgeInput,
  type PassbandSpec,
  type StopbandSpec,
  type GainSpec,
  type PartsSpec,
  type OpAmpSpec,
  type ValueWindow,
  type DesignResult,
  type DesignStage,
  type AsBuiltPole,
  type StagePredistortion,
  type StageFigures,
  type StageErrors,
  type FamilyCandidate,
  type FamilyBuilt,
  type FamilyChoice,
  type Feasibility,
  type NeededOrder,
  type Relaxation,
  type Placement,
  type ResponseCurve,
  type Verification,
  type BoardYield,
  type YieldAlternative,
  type YieldCheckSpec,
  type DesignWarning,
  type DesignAction,
  type Progress,
  type ProgressStep,
  type RunControl,
  designLcLadder,
  lcLadderNetlist,
  type LcLadderBoard,
  type LcLadderDesign,
  type LcLadderNetlistOptions,
  type LcLadderOptions,
  type LcLadderPlacement,
  type LcLadderVerification,
  type LcLadderYield,
} from "./design/index.ts";
export type { LadderPartLine } from "./ladder/index.ts";
export {
  monteCarlo,
  monteCarloEnvelope,
  designPolesZeros,
  partSensitivities,
  noiseAnalysis,
  opampRequirements,
  compareRealisations,
  type CompareRealisationsOptions,
  type RealisationCandidate,
  type RealisationComparison,
  type RealisationMethod,
  type RealisationSkipped,
  type MonteCarloOptions,
  type MonteCarloResult,
  type MonteCarloEnvelope,
  type MonteCarloEnvelopeOptions,
  type DesignPolesZeros,
  type DesignPolesZerosOptions,
  type StagePolesZeros,
  type PartDistribution,
  type Spread,
  type ToleranceFractions,
  type PartSensitivity,
  type NoiseAnalysisOptions,
  type NoiseAnalysisResult,
  type NoiseContributor,
  type OpampRequirementOptions,
  type StageOpampRequirement,
} from "./analysis/index.ts";
export {
  toSpiceNetlist,
  toBomCsv,
  toLcLadderBomCsv,
  lcLadderMarkdown,
  lcLadderToJson,
  lcLadderFromJson,
  bomLines,
  toJson,
  fromJson,
  toMarkdown,
  toSvgPlot,
  svgFigure,
  plotFigure,
  toSvgSchematic,
  sectionRows,
  toSectionsCsv,
  toSectionsJson,
  toCurveCsv,
  type SectionRow,
  type CurveCsvOptions,
  type SpiceNetlistOptions,
  type OpampSubcircuit,
  type OpampPin,
  type OpampSupply,
  type BomLine,
  type BomOptions,
  type RealisationChoice,
  type SvgPlotOptions,
  type Figure,
  type SvgFigureOptions,
  type MediaBundle,
  type Displayable,
  type PlotKind,
  type SvgSchematicOptions,
  type MarkdownOptions,
  type MarkdownSchematics,
} from "./report/index.ts";
