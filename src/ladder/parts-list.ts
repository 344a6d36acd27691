/**
 * The parts list of an as-built LC ladder: one line per distinct part
 * (kind, value, tolerance and, for inductors, the Q asked for), with every
 * designator that uses it and the quantity, in the layout the bill of
 * materials uses for a stage's parts (`report/bom.ts`).
 *
 * @module
 */
import { formatRkm, formatValue } from "../units/format.ts";
import type { AsBuiltComponent, AsBuiltLadder } from "./as-built-types.ts";
import { requireLadderNetwork } from "./check-ladder.ts";
import { InvalidArgumentError } from "../errors.ts";

/** One line of a ladder's parts list. */
export interface LadderPartLine {
  /** Reference designators, from the source end. */
  readonly designators: readonly string[];
  /** `"inductor"` or `"capacitor"`. */
  readonly part: "inductor" | "capacitor";
  /** Value in henries or farads. */
  readonly value: number;
  /** Value in engineering notation with unit, e.g. `"4.7 µH"`. */
  readonly valueText: string;
  /**
   * RKM-style code with the SI prefix letter in place of the decimal point,
   * e.g. `"4µ7"`, `"220n"` (IEC 60062 letters for capacitors; inductors are
   * written the same way in henries, with `H` for values of 1 H and more:
   * common practice, no source).
   */
  readonly rkm: string;
  /** Preferred-value series, e.g. `"E12"`. */
  readonly series: string;
  /** Tolerance as a fraction (0.1 for 10 %). */
  readonly tolerance: number;
  /** Tolerance as text, e.g. `"10%"`. */
  readonly toleranceText: string;
  /**
   * What the part must achieve beyond its value, as the as-built model
   * assumed it: `"Q >= 50 at 1 MHz"` for inductors, `"ESR <= 0.1 Ω"` for
   * capacitors with an ESR; empty otherwise.
   */
  readonly requirement: string;
  /** Number of parts. */
  readonly quantity: number;
}

function rkmOf(c: AsBuiltComponent): string {
  const code = formatRkm(c.value, { kind: "capacitor", digits: 3 });
  return c.kind === "L" ? code.replace("F", "H") : code;
}

function requirementOf(c: AsBuiltComponent, ladder: AsBuiltLadder): string {
  const { inductorQ, qFrequencyHz, capacitorEsrOhms } = ladder.losses;
  if (c.kind === "L") return `Q >= ${Number(inductorQ.toPrecision(3))} at ${formatValue(qFrequencyHz, { unit: "Hz", digits: 3 })}`;
  return capacitorEsrOhms > 0 ? `ESR <= ${formatValue(capacitorEsrOhms, { unit: "\u03a9", digits: 3 })}` : "";
}

/**
 * The parts list of an as-built ladder, one line per distinct part.
 *
 * @param ladder - from {@link asBuiltLadder}
 * @returns lines: inductors by ascending value, then capacitors
 * @throws {@link InvalidArgumentError} when `ladder` is not an as-built ladder (the path names the field)
 * @example
 * ```ts
 * const prototype = { family: "butterworth", order: 3, form: "shunt-first", // g = 1, 2, 1
 *   elements: [{ kind: "shunt-C", value: 1 }, { kind: "series-L", value: 2 }, { kind: "shunt-C", value: 1 }],
 *   sourceOhms: 1, loadOhms: 1, transfer: { ...butterworth(3), gain: 0.5 } } as const;
 * ladderParts(asBuiltLadder(scaleLadder(prototype, { edgeHz: 10e6, sourceOhms: 50 }), { inductorQ: 60 }));
 * //=> [{ designators: ["L1"], part: "inductor", value: 1.5e-6, valueText: "1.5 µH", rkm: "1µ5", series: "E12",
 * //      tolerance: 0.1, toleranceText: "10%", requirement: "Q >= 60 at 10 MHz", quantity: 1 },
 * //    { designators: ["C1", "C2"], part: "capacitor", value: 3.3e-10, valueText: "330 pF", rkm: "330p", series: "E12",
 * //      tolerance: 0.1, toleranceText: "10%", requirement: "", quantity: 2 }]
 * ```
 */
export function ladderParts(ladder: AsBuiltLadder): LadderPartLine[] {
  const fn = "ladderParts";
  requireLadderNetwork(fn, "ladder", ladder);
  const losses = (ladder as { losses?: unknown }).losses as Record<string, unknown> | undefined;
  if (losses === null || typeof losses !== "object" || typeof losses["inductorQ"] !== "number" || typeof losses["qFrequencyHz"] !== "number") {
    throw new InvalidArgumentError({ fn, path: "ladder.losses", received: losses, message: "expected an as-built ladder from asBuiltLadder" });
  }
  ladder.components.forEach((c, i) => {
    if (typeof c.series !== "string" || typeof c.tolerance !== "number" || !(c.tolerance > 0 && c.tolerance <= 0.5)) {
      throw new InvalidArgumentError({ fn, path: `ladder.components[${i}]`, received: c, message: "expected an as-built part with its series and tolerance (from asBuiltLadder)" });
    }
  });
  const groups = new Map<string, { c: AsBuiltComponent; requirement: string; designators: string[] }>();
  for (const c of ladder.components) {
    const requirement = requirementOf(c, ladder);
    const key = `${c.kind}:${c.value}:${c.tolerance}:${c.series}:${requirement}`;
    const g = groups.get(key) ?? { c, requirement, designators: [] };
    g.designators.push(c.designator);
    groups.set(key, g);
  }
  const rank = (k: string): number => (k === "L" ? 0 : 1);
  return [...groups.values()]
    .sort((x, y) => rank(x.c.kind) - rank(y.c.kind) || x.c.value - y.c.value || x.c.tolerance - y.c.tolerance)
    .map(({ c, requirement, designators }) =>
      Object.freeze({
        designators: Object.freeze(designators),
        part: c.kind === "L" ? "inductor" : "capacitor",
        value: c.value,
        valueText: formatValue(c.value, { unit: c.kind === "L" ? "H" : "F", digits: 3 }),
        rkm: rkmOf(c),
        series: c.series,
        tolerance: c.tolerance,
        toleranceText: `${Number((c.tolerance * 100).toPrecision(3))}%`,
        requirement,
        quantity: designators.length,
      }),
    );
}
