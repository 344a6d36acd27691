/**
 * The circuit layer: element types, validation, modified nodal analysis and
 * SPICE netlist text.
 *
 * @module
 */
export type {
  Capacitor,
  Circuit,
  Element,
  IdealOpAmpModel,
  Inductor,
  OpAmp,
  OpAmpModel,
  Resistor,
  SinglePoleOpAmpModel,
  SinglePoleRoutOpAmpModel,
  Vcvs,
  VoltageSource,
} from "./types.ts";
export { validateCircuit } from "./validate.ts";
export {
  acAnalysis,
  assembleMna,
  mnaDeterminant,
  transfer,
  type AcAnalysisOptions,
  type AcAnalysisResult,
  type MnaSystem,
  type TransferOptions,
} from "./mna.ts";
export {
  circuitToSpice,
  spiceNumber,
  SPICE_IDEAL_OPAMP_GAIN,
  type CircuitToSpiceOptions,
  type SpiceAcSweep,
} from "./spice.ts";
export { OPAMP_PINS, type OpampPin, type OpampSubcircuit, type OpampSupply } from "./spice-opamp.ts";
export { ladderCircuit, LADDER_SOURCE, type LadderCircuitOptions } from "./ladder.ts";
