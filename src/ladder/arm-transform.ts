/**
 * The frequency transforms of a lowpass ladder at element level, and the
 * layout of the transformed arms between named nodes.
 *
 * Method: the lowpass-to-X maps are reactance substitutions s -> p(s), so
 * every prototype inductor (impedance p L) and capacitor (admittance p C) is
 * replaced by the one-port with that impedance or admittance, and series and
 * parallel connections are kept:
 *
 * | map, p(s) | inductor L becomes | capacitor C becomes |
 * |---|---|---|
 * | lowpass, s / w0 | L / w0 | C / w0 |
 * | highpass, w0 / s | a capacitor 1 / (w0 L) | an inductor 1 / (w0 C) |
 * | bandpass, (s^2 + w0^2) / (B s) | L / B in series with B / (w0^2 L) farads | C / B in parallel with B / (w0^2 C) henries |
 * | bandstop, B s / (s^2 + w0^2) | 1 / (B L) farads in parallel with B L / w0^2 henries | 1 / (B C) henries in series with B C / w0^2 farads |
 *
 * so a series tank (prototype L in parallel with C, a transmission zero)
 * becomes under the band maps a series resonator in parallel with a parallel
 * one, and a shunt series resonator becomes two resonators in series. Then
 * every impedance is multiplied by the impedance scale R0 (L' = R0 L,
 * C' = C / R0). The transformed network's transfer is exactly the
 * prototype's at p(s); each value costs two or three roundings (a few ulp).
 * Reference: G. L. Matthaei, L. Young, E. M. T. Jones, "Microwave Filters,
 * Impedance-Matching Networks, and Coupling Structures", McGraw-Hill, 1964,
 * on the lowpass prototype, its impedance and frequency scaling and its
 * mappings to highpass, bandpass and bandstop (cited from memory, without a
 * section number).
 *
 * @module
 */
import type { LadderResponse } from "./scaled-types.ts";
import type { LadderElement } from "./types.ts";

/** A two-terminal network of inductors and capacitors. */
export type ArmNetwork =
  | { readonly kind: "L" | "C"; readonly value: number }
  | { readonly join: "series" | "parallel"; readonly parts: readonly ArmNetwork[] };

/** The frequency map and impedance scale applied to every arm. */
export interface ArmMap {
  /** Response. */
  readonly response: LadderResponse;
  /** Cut-off or centre (rad/s). */
  readonly w0: number;
  /** Bandwidth (rad/s), band maps only. */
  readonly bandwidth: number;
  /** Ohms per prototype ohm. */
  readonly impedance: number;
}

/** One placed inductor or capacitor, before designators. */
export interface PlacedPart {
  /** Kind. */
  readonly kind: "L" | "C";
  /** Value (H or F). */
  readonly value: number;
  /** Node. */
  readonly a: string;
  /** Other node. */
  readonly b: string;
}

function join(how: "series" | "parallel", parts: readonly ArmNetwork[]): ArmNetwork {
  const flat: ArmNetwork[] = [];
  for (const p of parts) {
    if ("join" in p && p.join === how) flat.push(...p.parts);
    else flat.push(p);
  }
  return flat.length === 1 ? (flat[0] as ArmNetwork) : { join: how, parts: flat };
}

/**
 * The prototype arm as a network (a tank is an inductor in parallel with a
 * capacitor; a shunt resonator an inductor in series with a capacitor).
 *
 * @param element - a checked prototype arm
 * @returns the arm's network at the prototype's level
 * @example
 * ```ts
 * prototypeArm({ kind: "series-L", value: 1, parallelC: 0.2 }).join; //=> "parallel"
 * ```
 */
export function prototypeArm(element: LadderElement): ArmNetwork {
  if (element.kind === "series-L") {
    const l: ArmNetwork = { kind: "L", value: element.value };
    return element.parallelC === undefined ? l : { join: "parallel", parts: [l, { kind: "C", value: element.parallelC }] };
  }
  const c: ArmNetwork = { kind: "C", value: element.value };
  return element.seriesL === undefined ? c : { join: "series", parts: [{ kind: "L", value: element.seriesL }, c] };
}

function reactance(kind: "L" | "C", v: number, m: ArmMap): ArmNetwork {
  const { w0, bandwidth: b, impedance: r } = m;
  const l = (h: number): ArmNetwork => ({ kind: "L", value: r * h });
  const c = (f: number): ArmNetwork => ({ kind: "C", value: f / r });
  switch (m.response) {
    case "lowpass":
      return kind === "L" ? l(v / w0) : c(v / w0);
    case "highpass":
      return kind === "L" ? c(1 / (w0 * v)) : l(1 / (w0 * v));
    case "bandpass":
      return kind === "L" ? join("series", [l(v / b), c(b / (w0 * w0 * v))]) : join("parallel", [l(b / (w0 * w0 * v)), c(v / b)]);
    default:
      return kind === "L" ? join("parallel", [l((b * v) / (w0 * w0)), c(1 / (b * v))]) : join("series", [l(1 / (b * v)), c((b * v) / (w0 * w0))]);
  }
}

/**
 * Transform and scale an arm's network (the numerical core; no checks).
 *
 * @param net - the arm at the prototype's level
 * @param map - frequency map and impedance scale
 * @returns the arm with the transformed, scaled elements, same-kind joins merged
 * @example
 * ```ts
 * transformArm({ kind: "C", value: 2 }, { response: "highpass", w0: 1, bandwidth: 1, impedance: 1 });
 * //=> { kind: "L", value: 0.5 }
 * ```
 */
export function transformArm(net: ArmNetwork, map: ArmMap): ArmNetwork {
  if ("join" in net) return join(net.join, net.parts.map((p) => transformArm(p, map)));
  return reactance(net.kind, net.value, map);
}

/**
 * Lay a network out between two nodes, naming the nodes inside it.
 *
 * @param net - the network
 * @param a - first node
 * @param b - second node
 * @param fresh - gives a new node name on each call
 * @returns the placed parts, in the network's order
 * @example
 * ```ts
 * let k = 0;
 * layoutArm({ join: "series", parts: [{ kind: "L", value: 1 }, { kind: "C", value: 1 }] }, "n1", "0", () => `x${++k}`);
 * //=> [{ kind: "L", value: 1, a: "n1", b: "x1" }, { kind: "C", value: 1, a: "x1", b: "0" }]
 * ```
 */
export function layoutArm(net: ArmNetwork, a: string, b: string, fresh: () => string): PlacedPart[] {
  if (!("join" in net)) return [{ kind: net.kind, value: net.value, a, b }];
  if (net.join === "parallel") return net.parts.flatMap((p) => layoutArm(p, a, b, fresh));
  const out: PlacedPart[] = [];
  let from = a;
  net.parts.forEach((p, i) => {
    const to = i === net.parts.length - 1 ? b : fresh();
    out.push(...layoutArm(p, from, to, fresh));
    from = to;
  });
  return out;
}
