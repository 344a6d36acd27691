/**
 * Active simulations of doubly terminated LC ladders: grounded inductors by
 * the Antoniou GIC (highpass ladders), the lowpass ladder by Bruton's FDNR
 * transformation, and leapfrog (operational) simulation. Each returns a
 * circuit of preferred-value parts for the nodal analysis and the SPICE
 * netlist of `filterwright/circuit`.
 *
 * @module
 */
export type { ActiveLadder, ActiveLadderMethod, ActiveLadderOptions, ActiveLadderPart, ActiveLadderPredistortion, ActiveLadderRetune, DcPath, DcPathOptions, PartWindow } from "./types.ts";
export { PREDISTORT_ACCEPT_POLE_ERROR, PREDISTORT_MAX_STEPS, PREDISTORT_POLE_TOLERANCE } from "./predistort.ts";
export { RETUNE_PENALTY, RETUNE_ROUNDS, RETUNE_STEPS } from "./retune.ts";
export { T_NETWORK_ABOVE_OHMS } from "./leapfrog.ts";
export type { LadderElement, LadderElementKind, LadderForm, LadderPrototype } from "../types.ts";
export { gicHighpassLadder, type GicHighpassOptions } from "./gic-highpass.ts";
export { fdnrLowpassLadder, type FdnrLadderOptions } from "./fdnr-lowpass.ts";
export { leapfrogLowpassLadder } from "./leapfrog.ts";
export { PAIR_ABOVE } from "./build.ts";
export { CAPACITOR_LIMITS_F, DC_PATH_LEVEL_OHMS, DEFAULT_DC_PATH_RATIO, DEFAULT_LEVEL_OHMS, MAX_LADDER_ORDER, RESISTOR_LIMITS_OHMS } from "./options.ts";
