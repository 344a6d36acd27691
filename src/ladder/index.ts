/**
 * Doubly terminated LC ladders: the normalised lowpass ladder of every
 * approximation family (closed forms for Butterworth and Chebyshev I,
 * synthesis from the transfer function for every family), element-level
 * scaling to lowpass, highpass, bandpass and bandstop ladders between the
 * user's terminations, the ladder as built from preferred-value lossy parts,
 * and its parts list. The circuit of a ladder for nodal analysis and SPICE is
 * `ladderCircuit` in `filterwright/circuit`.
 *
 * @module
 */
export { LADDER_FORMS, type LadderElement, type LadderElementKind, type LadderForm, type LadderPrototype } from "./types.ts";
export { LADDER_MAX_ARMS } from "./check-prototype.ts";
export {
  LADDER_RESPONSES,
  type LadderArm,
  type LadderBand,
  type LadderComponent,
  type LadderEdge,
  type LadderPlacement,
  type LadderResponse,
  type ScaledLadder,
} from "./scaled-types.ts";
export { TERMINATION_RATIO_TOLERANCE, type ScaleLadderOptions } from "./scale-options.ts";
export { scaleLadder } from "./scale.ts";
export { INDUCTOR_SERIES, type AsBuiltComponent, type AsBuiltLadder, type AsBuiltLosses, type InductorSeries } from "./as-built-types.ts";
export { asBuiltLadder, DEFAULT_INDUCTOR_Q, MAX_INDUCTOR_Q, type AsBuiltLadderOptions } from "./as-built.ts";
export { ladderParts, type LadderPartLine } from "./parts-list.ts";
export { RESERVED_LADDER_NODES } from "./check-ladder.ts";
export {
  LADDER_METHODS,
  LADDER_SYNTHESIS_MAX_ORDER,
  ladderPrototype,
  MAX_TERMINATION_RATIO,
  type LadderMethod,
  type LadderPrototypeSpec,
} from "./ladder-prototype.ts";
