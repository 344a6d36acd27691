/**
 * A normalised lowpass ladder scaled to the user's band and terminations:
 * the element-level lowpass, highpass, bandpass or bandstop transform
 * (`arm-transform.ts`), impedance scaling to the source and load resistances
 * and frequency scaling to the edges in hertz, with designators and nodes,
 * and the transfer function under the same map (`tf/transforms.ts`).
 *
 * Accuracy: each value a few ulp from the exact transform; the transfer is
 * the prototype's under the same map, so the ladder's nodal response equals
 * it to the accuracy of the prototype's own values (test/ladder: 1e-9 dB).
 *
 * @module
 */
import { InvalidArgumentError } from "../errors.ts";
import { PART_VALUE_MAX, PART_VALUE_MIN } from "../parts/snap.ts";
import { lowpassToBandpass, lowpassToBandstop, lowpassToHighpass, lowpassToLowpass } from "../tf/transforms.ts";
import type { Zpk } from "../tf/types.ts";
import { layoutArm, prototypeArm, transformArm, type ArmMap, type PlacedPart } from "./arm-transform.ts";
import { requireLadderPrototype } from "./check-prototype.ts";
import { readScaleOptions, type ScaleLadderOptions, type ScaleTarget } from "./scale-options.ts";
import type { LadderArm, LadderComponent, ScaledLadder } from "./scaled-types.ts";
import type { LadderPrototype } from "./types.ts";

function scaledTransfer(t: Zpk, target: ScaleTarget): Zpk {
  const { w0, bandwidth } = target;
  switch (target.response) {
    case "lowpass":
      return lowpassToLowpass(t, { w0 });
    case "highpass":
      return lowpassToHighpass(t, { w0 });
    case "bandpass":
      return lowpassToBandpass(t, { w0, bandwidth });
    default:
      return lowpassToBandstop(t, { w0, bandwidth });
  }
}

/** The main node names: "in", "n1", ..., "out" (one node "out" when there is no series arm). */
function mainNodes(prototype: LadderPrototype): string[] {
  const series = prototype.elements.filter((e) => e.kind === "series-L").length;
  return Array.from({ length: series + 1 }, (_, m) => (m === series ? "out" : m === 0 ? "in" : `n${m}`));
}

function layout(prototype: LadderPrototype, map: ArmMap): { arms: LadderArm[]; components: LadderComponent[] } {
  const nodes = mainNodes(prototype);
  const count = { L: 0, C: 0 };
  const arms: LadderArm[] = [];
  const components: LadderComponent[] = [];
  let m = 0;
  prototype.elements.forEach((e, i) => {
    const index = i + 1;
    const series = e.kind === "series-L";
    const a = nodes[m] as string;
    const b = series ? (nodes[m + 1] as string) : "0";
    if (series) m++;
    let inner = 0;
    const parts: PlacedPart[] = layoutArm(transformArm(prototypeArm(e), map), a, b, () => `a${index}_${++inner}`);
    const designators = parts.map((p) => {
      const designator = `${p.kind}${++count[p.kind]}`;
      components.push(Object.freeze({ designator, kind: p.kind, value: p.value, a: p.a, b: p.b, arm: index }));
      return designator;
    });
    arms.push(Object.freeze({ index, position: series ? "series" : "shunt", a, b, designators: Object.freeze(designators) }));
  });
  return { arms, components };
}

function requireSaneValues(fn: string, components: readonly LadderComponent[], target: ScaleTarget): void {
  for (const c of components) {
    if (!(c.value >= PART_VALUE_MIN && c.value <= PART_VALUE_MAX)) {
      const field = target.placement.response === "lowpass" || target.placement.response === "highpass" ? "options.edgeHz" : "options.centreHz";
      throw new InvalidArgumentError({
        fn,
        path: field,
        received: "edgeHz" in target.placement ? target.placement.edgeHz : target.placement.centreHz,
        message: `${c.designator} would be ${c.value} ${c.kind === "L" ? "H" : "F"}, outside ${PART_VALUE_MIN} to ${PART_VALUE_MAX}; choose frequencies and terminations nearer each other`,
      });
    }
  }
}

/**
 * Scale a normalised lowpass ladder to a lowpass, highpass, bandpass or
 * bandstop ladder between the user's terminations: every arm transformed at
 * element level (a lowpass inductor becomes a highpass capacitor, a series
 * resonator of the bandpass, a parallel resonator of the bandstop; tanks of
 * transmission zeros become resonator pairs), the impedances scaled to the
 * source and load resistances, the frequencies to the edges in hertz.
 *
 * @param prototype - a normalised ladder (from `ladderPrototype`, or built by hand)
 * @param options - response, edge(s) in Hz, terminations in ohms
 * @returns the scaled ladder as plain data: arms, components with designators,
 *   values (H, F) and nodes, and its transfer function (rad/s)
 * @throws {@link InvalidArgumentError} naming the field: a malformed prototype
 *   (`prototype.elements[2].value`), a missing or mixed band, terminations whose
 *   ratio is not the prototype's, or values that would over- or underflow
 * @example
 * ```ts
 * const prototype = { family: "butterworth", order: 3, form: "shunt-first", // g = 1, 2, 1
 *   elements: [{ kind: "shunt-C", value: 1 }, { kind: "series-L", value: 2 }, { kind: "shunt-C", value: 1 }],
 *   sourceOhms: 1, loadOhms: 1, transfer: { ...butterworth(3), gain: 0.5 } } as const;
 * const ladder = scaleLadder(prototype, { response: "highpass", edgeHz: 1e6, sourceOhms: 50 });
 * ladder.components.map((c) => `${c.designator} ${c.a}-${c.b}`);
 * //=> ["L1 in-0", "C1 in-out", "L2 out-0"]
 * ```
 */
export function scaleLadder(prototype: LadderPrototype, options: ScaleLadderOptions): ScaledLadder {
  const fn = "scaleLadder";
  const proto = requireLadderPrototype(fn, "prototype", prototype);
  const target = readScaleOptions(fn, options, proto);
  const { arms, components } = layout(proto, target);
  requireSaneValues(fn, components, target);
  const nodes = mainNodes(proto);
  return Object.freeze({
    family: proto.family,
    order: proto.order,
    form: proto.form,
    placement: Object.freeze(target.placement),
    sourceOhms: target.sourceOhms,
    loadOhms: target.loadOhms,
    inputNode: nodes[0] as string,
    outputNode: nodes[nodes.length - 1] as string,
    arms: Object.freeze(arms),
    components: Object.freeze(components),
    transfer: scaledTransfer(proto.transfer, target),
  });
}
