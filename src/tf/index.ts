/**
 * Layer 2: analog transfer functions — zeros/poles/gain, first- and
 * second-order sections, frequency response, group delay, frequency
 * transforms and step/impulse responses. Frequencies are angular (rad/s).
 *
 * @module
 */
export type * from "./types.ts";
export { evalZpk, zpk, zpkToPolynomials, type ZpkPolynomials } from "./zpk.ts";
export {
  evalCascade,
  evalSection,
  fromSections,
  MAX_SECTION_FREQUENCY,
  MIN_SECTION_FREQUENCY,
  toSections,
  type SectionOrdering,
  type ToSectionsOptions,
  type OriginZeroSharing,
} from "./sections.ts";
export { MAX_GRID_POINTS, linearGrid, logGrid } from "./grid.ts";
export { frequencyResponse, type ComplexResponse } from "./response.ts";
export { MAGNITUDE_FLOOR_DB, magnitudeDb } from "./magnitude.ts";
export { groupDelay, phase } from "./phase.ts";
export {
  lowpassToBandpass,
  lowpassToBandstop,
  lowpassToHighpass,
  lowpassToLowpass,
  type BandOptions,
  type CutoffOptions,
} from "./transforms.ts";
export {
  MAX_AUTO_POINTS,
  impulseResponse,
  stepFigures,
  stepResponse,
  type StepFigures,
  type StepFiguresOptions,
} from "./time.ts";
