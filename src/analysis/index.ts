/**
 * The analysis layer: what a finished design asks of its op-amps, and how
 * part tolerances spread it against the mask.
 *
 * @module
 */
export { opampRequirements, type OpampRequirementOptions, type StageOpampRequirement } from "./opamp.ts";
export { monteCarlo, type MonteCarloOptions, type MonteCarloResult, type Spread, type ToleranceFractions } from "./tolerance.ts";
export { partSensitivities, type PartSensitivity } from "./sensitivity.ts";
