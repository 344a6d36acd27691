/**
 * The registry of every topology, and look-ups by id and by what a stage must do.
 * Each family file exports its list; adding a topology is one file (or one
 * entry in its family's list) and, for a new family, one line here.
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { boctorTopologies } from "./boctor.ts";
import { deliyannisFriendTopologies } from "./deliyannis-friend.ts";
import { firstOrderTopologies } from "./first-order.ts";
import { fliegeTopologies } from "./fliege.ts";
import { multipleFeedbackTopologies } from "./multiple-feedback.ts";
import { sallenKeyTopologies } from "./sallen-key.ts";
import { stateVariableTopologies } from "./state-variable.ts";
import { towThomasTopologies } from "./tow-thomas.ts";
import { twinTTopologies } from "./twin-t.ts";
import { thirdOrderTopologies } from "./sallen-key-third.ts";
import type { StageKind, Topology } from "./types.ts";

/** Every topology, first order first, then by family (each family file lists its own). */
export const topologies: readonly Topology[] = Object.freeze([
  ...firstOrderTopologies,
  ...sallenKeyTopologies,
  ...thirdOrderTopologies,
  ...multipleFeedbackTopologies,
  ...stateVariableTopologies,
  ...towThomasTopologies,
  ...boctorTopologies,
  ...twinTTopologies,
  ...fliegeTopologies,
  ...deliyannisFriendTopologies,
]);

/**
 * Find a topology by its id.
 *
 * @param id - e.g. `"sallen-key-lowpass-unity"`
 * @returns the topology
 * @throws {@link InvalidArgumentError} when no topology has that id (the message lists them)
 * @example
 * ```ts
 * getTopology("mfb-lowpass").opampCount; //=> 1
 * ```
 */
export function getTopology(id: string): Topology {
  const t = topologies.find((x) => x.id === id);
  if (t === undefined) {
    throw new InvalidArgumentError({
      fn: "getTopology",
      path: "id",
      received: id,
      message: `expected one of ${topologies.map((x) => `"${x.id}"`).join(", ")}`,
    });
  }
  return t;
}

/** What a stage must do, for {@link topologiesFor}. */
export interface TopologyQuery {
  /** Section kind. */
  readonly kind: StageKind;
  /** Section order (3: a real pole and a pole pair in one stage). */
  readonly order: 1 | 2 | 3;
}

/**
 * Every topology that realises a section kind of a given order, in registry order.
 *
 * @param query - kind and order
 * @returns the matching topologies (possibly none)
 * @throws {@link InvalidArgumentError} for an unknown kind or an order other than 1, 2 or 3
 * @example
 * ```ts
 * topologiesFor({ kind: "allpass", order: 2 }).map((t) => t.id);
 * //=> ["state-variable-allpass", "tow-thomas-allpass"]
 * ```
 */
export function topologiesFor(query: TopologyQuery): readonly Topology[] {
  const kinds: readonly StageKind[] = ["lowpass", "highpass", "bandpass", "lowpass-notch", "highpass-notch", "notch", "allpass"];
  if (query === null || typeof query !== "object" || !kinds.includes(query.kind)) {
    throw new InvalidArgumentError({
      fn: "topologiesFor",
      path: "query.kind",
      received: query?.kind,
      message: `expected one of ${kinds.map((k) => `"${k}"`).join(", ")}`,
    });
  }
  if (query.order !== 1 && query.order !== 2 && query.order !== 3) {
    throw new InvalidArgumentError({ fn: "topologiesFor", path: "query.order", received: query.order, message: "expected 1, 2 or 3" });
  }
  return topologies.filter((t) => t.order === query.order && t.kinds.includes(query.kind));
}
