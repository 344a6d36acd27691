/**
 * What an impossible spec would take: the order each family needs, and the
 * nearest relaxations of the mask that make it feasible at the highest order
 * the design may use.
 *
 * Each relaxation moves one figure of the mask and leaves the others as they
 * are: the stopband attenuation down, the passband loss up, the stopband
 * edge(s) away from the passband, or the passband edge(s) away from the
 * stopband (band edges move by one common factor on a log scale, keeping a
 * band's centre). The figure is found by bisection on the closed-form order
 * formulas of the approximation layer (`minimumOrder`, the standard
 * discrimination/selectivity formulas, e.g. A. V. Oppenheim & R. W. Schafer,
 * "Discrete-Time Signal Processing", 3rd ed., 2010, sec. 7.3, from memory, and
 * for Bessel and Legendre a direct search of the magnitude), to 0.1 % of the
 * figure (0.1 % of the dB value, or of the frequency ratio's logarithm), and
 * then confirmed on the family's actual prototype against the mask (the same
 * check the family choice makes); a relaxation the prototype does not confirm
 * is moved a further 1 % at a time, at most ten times, and dropped if it still
 * fails.
 *
 * @module
 */
import type { FamilyName } from "../approx/index.ts";
import type { DesignSpec } from "./spec.ts";
import { familyMinimumOrder, orderFormula } from "./family.ts";
import { hertz, significant } from "./text.ts";
import type { Feasibility, NeededOrder, Relaxation } from "./types.ts";

const FAMILIES: readonly FamilyName[] = ["butterworth", "chebyshev1", "chebyshev2", "elliptic", "bessel", "legendre"];

/** The order formula's order for a (possibly relaxed) spec, or Infinity when the formula refuses it. */
function formulaOrder(spec: DesignSpec, family: FamilyName): number {
  try {
    const r = orderFormula(spec, family);
    return Number.isFinite(r.order) ? r.order : Infinity;
  } catch {
    return Infinity;
  }
}

/** One way to move a figure: the spec at relaxation `t` in [0, 1] (0 = as given), and how to describe it. */
interface Move {
  readonly field: Relaxation["field"];
  readonly at: (t: number) => DesignSpec;
  readonly value: (s: DesignSpec) => number | readonly number[];
  readonly text: (s: DesignSpec) => string;
}

const hz = (f: number): string => hertz(f, 3);

/** The moves of a spec's mask, each with the furthest relaxation it may take (t = 1). */
function movesOf(spec: DesignSpec): Move[] {
  const moves: Move[] = [];
  const lossFloor = spec.maxLossDb;
  // attenuation down to a little above the passband loss
  const aMin = Math.max(lossFloor + 1, 3);
  if (spec.minAttenuationDb > aMin) {
    moves.push({
      field: "stopband.minAttenuationDb",
      at: (t) => ({ ...spec, minAttenuationDb: spec.minAttenuationDb - t * (spec.minAttenuationDb - aMin) }),
      value: (s) => s.minAttenuationDb,
      text: (s) => `stopband attenuation at most ${significant(s.minAttenuationDb, 3)} dB`,
    });
  }
  // passband loss up to 3 dB (or the spec's own, if larger), below the attenuation
  const lMax = Math.min(Math.max(3, spec.maxLossDb), spec.minAttenuationDb - 1);
  if (lMax > spec.maxLossDb) {
    moves.push({
      field: "passband.maxLossDb",
      at: (t) => ({ ...spec, maxLossDb: spec.maxLossDb + t * (lMax - spec.maxLossDb) }),
      value: (s) => s.maxLossDb,
      text: (s) => `passband loss up to ${significant(s.maxLossDb, 3)} dB`,
    });
  }
  const [p1, p2] = [spec.passbandHz[0] as number, spec.passbandHz[1] as number];
  const [s1, s2] = [spec.stopbandHz[0] as number, spec.stopbandHz[1] as number];
  // Edges move apart by a factor k = (furthest)^t: the stopband away from the passband, or the passband away from the stopband.
  switch (spec.response) {
    case "lowpass":
      moves.push({ field: "stopband.edgeHz", at: (t) => ({ ...spec, stopbandHz: [s1 * 100 ** t] }), value: (s) => s.stopbandHz[0] as number, text: (s) => `stopband edge at ${hz(s.stopbandHz[0] as number)} or above` });
      moves.push({ field: "passband.edgeHz", at: (t) => ({ ...spec, passbandHz: [p1 / 100 ** t] }), value: (s) => s.passbandHz[0] as number, text: (s) => `passband edge at ${hz(s.passbandHz[0] as number)} or below` });
      break;
    case "highpass":
      moves.push({ field: "stopband.edgeHz", at: (t) => ({ ...spec, stopbandHz: [s1 / 100 ** t] }), value: (s) => s.stopbandHz[0] as number, text: (s) => `stopband edge at ${hz(s.stopbandHz[0] as number)} or below` });
      moves.push({ field: "passband.edgeHz", at: (t) => ({ ...spec, passbandHz: [p1 * 100 ** t] }), value: (s) => s.passbandHz[0] as number, text: (s) => `passband edge at ${hz(s.passbandHz[0] as number)} or above` });
      break;
    case "bandpass":
      moves.push({
        field: "stopband.edgeHz",
        at: (t) => ({ ...spec, stopbandHz: [s1 / 100 ** t, s2 * 100 ** t] }),
        value: (s) => s.stopbandHz,
        text: (s) => `stopband edges at ${hz(s.stopbandHz[0] as number)} and ${hz(s.stopbandHz[1] as number)} or further out`,
      });
      {
        // the passband narrows about its centre, at most to a tenth of its log width
        const k = Math.sqrt(p2 / p1) ** 0.9;
        moves.push({
          field: "passband.edgeHz",
          at: (t) => ({ ...spec, passbandHz: [p1 * k ** t, p2 / k ** t] }),
          value: (s) => s.passbandHz,
          text: (s) => `passband edges at ${hz(s.passbandHz[0] as number)} and ${hz(s.passbandHz[1] as number)} or further in`,
        });
      }
      break;
    case "bandstop": {
      const k = Math.sqrt(s2 / s1) ** 0.9;
      moves.push({
        field: "stopband.edgeHz",
        at: (t) => ({ ...spec, stopbandHz: [s1 * k ** t, s2 / k ** t] }),
        value: (s) => s.stopbandHz,
        text: (s) => `stopband edges at ${hz(s.stopbandHz[0] as number)} and ${hz(s.stopbandHz[1] as number)} or further in`,
      });
      moves.push({
        field: "passband.edgeHz",
        at: (t) => ({ ...spec, passbandHz: [p1 / 10 ** t, p2 * 10 ** t] }),
        value: (s) => s.passbandHz,
        text: (s) => `passband edges at ${hz(s.passbandHz[0] as number)} and ${hz(s.passbandHz[1] as number)} or further out`,
      });
      break;
    }
  }
  return moves;
}

/** The smallest relaxation of one move that the family meets at `order`, or null. */
function relaxOne(spec: DesignSpec, family: FamilyName, order: number, move: Move): Relaxation | null {
  const fits = (t: number): boolean => formulaOrder(move.at(t), family) <= order;
  if (!fits(1)) return null;
  let lo = 0;
  let hi = 1;
  while (hi - lo > 1e-3) {
    const mid = (lo + hi) / 2;
    if (fits(mid)) hi = mid;
    else lo = mid;
  }
  // confirm on the prototype, moving a further 1 % of the range at a time
  for (let k = 0; k <= 10; k++) {
    const t = Math.min(1, hi + k * 0.01);
    const s = move.at(t);
    if (familyMinimumOrder(s, family, order) !== null) return { field: move.field, value: move.value(s), text: move.text(s) };
    if (t === 1) break;
  }
  return null;
}

/**
 * The order each family needs for a spec, and the nearest relaxations that
 * make it feasible for a family at an order.
 *
 * @param spec - canonical spec
 * @param family - the family the design uses
 * @param order - the highest order the design may use
 * @returns the orders and the relaxations (each alone enough)
 */
export function feasibility(spec: DesignSpec, family: FamilyName, order: number): Feasibility {
  const needed: NeededOrder[] = FAMILIES.map((f) => {
    const n = formulaOrder(spec, f);
    return { family: f, order: Number.isFinite(n) ? n : null };
  });
  const relaxations: Relaxation[] = [];
  for (const move of movesOf(spec)) {
    const r = relaxOne(spec, family, order, move);
    if (r !== null) relaxations.push(r);
  }
  return { family, order, neededOrders: needed, relaxations };
}

/**
 * One sentence: the orders the families need and the relaxations, for the
 * spec-not-met warning.
 *
 * @param f - the feasibility record
 * @returns the sentence
 */
export function feasibilityText(f: Feasibility): string {
  const orders = f.neededOrders
    .filter((n) => n.order !== null)
    .sort((a, b) => (a.order as number) - (b.order as number))
    .map((n) => `${n.family} order ${n.order}`)
    .join(", ");
  const need = orders.length > 0 ? `The mask needs ${orders} (by the order formulas)` : "No family's order formula reaches the mask";
  const relax = f.relaxations.length > 0 ? `; at ${f.family} order ${f.order} any one of these would do: ${f.relaxations.map((r) => r.text).join(", or ")}` : `; no single relaxation makes it feasible at ${f.family} order ${f.order}`;
  return `${need}${relax}.`;
}
