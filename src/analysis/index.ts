/**
 * The analysis layer: what a finished design asks of its op-amps, how
 * part tolerances spread it against the mask (and its magnitude response
 * over frequency), its output noise, and its poles and zeros as built.
 *
 * @module
 */
export { opampRequirements, type OpampRequirementOptions, type StageOpampRequirement } from "./opamp.ts";
export { monteCarlo, type MonteCarloOptions, type MonteCarloResult, type Spread, type ToleranceFractions } from "./tolerance.ts";
export type { PartDistribution } from "../evaluate/boards.ts";
export { partSensitivities, type PartSensitivity } from "./sensitivity.ts";
export { noiseAnalysis, BOLTZMANN_J_PER_K, type NoiseAnalysisOptions, type NoiseAnalysisResult, type NoiseContributor } from "./noise.ts";
export { activeLadderMonteCarlo } from "./ladder-yield.ts";
export {
  compareRealisations,
  type CompareRealisationsOptions,
  type RealisationCandidate,
  type RealisationComparison,
  type RealisationMethod,
  type RealisationSkipped,
} from "./realisations.ts";
export { monteCarloEnvelope, ENVELOPE_MAX_SAMPLES, type MonteCarloEnvelope, type MonteCarloEnvelopeOptions } from "./envelope.ts";
export { designPolesZeros, type DesignPolesZeros, type DesignPolesZerosOptions, type StagePolesZeros } from "./poles-zeros.ts";
