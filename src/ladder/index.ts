/**
 * Doubly terminated LC ladders: the normalised lowpass ladder of every
 * approximation family (closed forms for Butterworth and Chebyshev I,
 * synthesis from the transfer function for every family).
 *
 * @module
 */
export type { LadderElement, LadderElementKind, LadderForm, LadderPrototype } from "./types.ts";
export { LADDER_FORMS } from "./types.ts";
export {
  LADDER_METHODS,
  LADDER_SYNTHESIS_MAX_ORDER,
  ladderPrototype,
  MAX_TERMINATION_RATIO,
  type LadderMethod,
  type LadderPrototypeSpec,
} from "./ladder-prototype.ts";
