/**
 * Normalised LC ladder prototypes built by hand for the ladder tests, with
 * their transfer functions from src/approx (not from any synthesis):
 *
 * - Butterworth: g_k = 2 sin((2k - 1) pi / (2n)), 1-ohm terminations.
 * - Chebyshev I: the closed-form recurrence, beta = ln coth(Rp / 17.37),
 *   gamma = sinh(beta / 2n), a_k = sin((2k - 1) pi / 2n),
 *   b_k = gamma^2 + sin^2(k pi / n), g_1 = 2 a_1 / gamma,
 *   g_k = 4 a_(k-1) a_k / (b_(k-1) g_(k-1)); the load g_(n+1) = 1 (n odd) or
 *   coth^2(beta / 4) (n even), a resistance after a shunt capacitor and a
 *   conductance after a series inductor (G. L. Matthaei, L. Young,
 *   E. M. T. Jones, "Microwave Filters, Impedance-Matching Networks, and
 *   Coupling Structures", McGraw-Hill, 1964, eqs. (4.05-1) to (4.05-3), from
 *   memory).
 * - Elliptic, order 3, 0.5 dB / 40 dB: test/fixtures/ladder-elliptic3.json
 *   (scripts/reference/ladder_elliptic3.py, mpmath).
 *
 * The series-first form is the dual of the shunt-first one: the same numbers,
 * each shunt capacitor read as a series inductor and a tank L || C as a shunt
 * resonator of capacitance L and inductance C; its load is the reciprocal.
 * Both forms have the same voltage transfer, which with unequal terminations
 * peaks at (1/2) sqrt(R_L / R_S) (maximum power transfer), so the transfer
 * is that factor times the family's normalised prototype (peak 1).
 */
import { butterworth, chebyshev1, elliptic } from "../../src/approx/index.ts";
import type { FamilyName } from "../../src/approx/types.ts";
import type { LadderElement, LadderForm, LadderPrototype } from "../../src/ladder/index.ts";
import type { Zpk } from "../../src/tf/types.ts";
import { loadFixture } from "../helpers/fixtures.ts";

/** g_k of the Butterworth ladder (k = 1..n). */
export function butterworthG(n: number): number[] {
  return Array.from({ length: n }, (_, i) => 2 * Math.sin(((2 * i + 1) * Math.PI) / (2 * n)));
}

/** g_1..g_n and the load g_(n+1) of the Chebyshev I ladder. */
export function chebyshevG(n: number, rippleDb: number): { g: number[]; load: number } {
  const beta = Math.log(1 / Math.tanh(rippleDb / (40 / Math.LN10)));
  const gamma = Math.sinh(beta / (2 * n));
  const a = (k: number): number => Math.sin(((2 * k - 1) * Math.PI) / (2 * n));
  const b = (k: number): number => gamma ** 2 + Math.sin((k * Math.PI) / n) ** 2;
  const g = [(2 * a(1)) / gamma];
  for (let k = 2; k <= n; k++) g.push((4 * a(k - 1) * a(k)) / (b(k - 1) * (g[k - 2] as number)));
  const load = n % 2 === 1 ? 1 : 1 / Math.tanh(beta / 4) ** 2;
  return { g, load };
}

function scaleGain(t: Zpk, factor: number): Zpk {
  return { zeros: t.zeros, poles: t.poles, gain: t.gain * factor };
}

/**
 * A shunt-first ladder description (arms as shunt C / series L with optional
 * tanks, load g_(n+1) by Matthaei's rule) turned into either form.
 */
function build(
  family: FamilyName,
  shuntFirst: readonly LadderElement[],
  lastIsLoadResistance: boolean,
  load: number,
  form: LadderForm,
  normalised: Zpk,
): LadderPrototype {
  // shunt-first: the load is a resistance after a shunt C, a conductance after a series L
  const rlShunt = lastIsLoadResistance ? load : 1 / load;
  const elements: LadderElement[] =
    form === "shunt-first"
      ? [...shuntFirst]
      : shuntFirst.map((e) =>
          e.kind === "shunt-C"
            ? { kind: "series-L", value: e.value }
            : e.parallelC === undefined
              ? { kind: "shunt-C", value: e.value }
              : { kind: "shunt-C", value: e.value, seriesL: e.parallelC },
        );
  // the dual's load resistance is the shunt-first ladder's load conductance
  const loadOhms = form === "shunt-first" ? rlShunt : 1 / rlShunt;
  const transfer = scaleGain(normalised, 0.5 * Math.sqrt(loadOhms));
  return { family, order: elements.length, form, elements, sourceOhms: 1, loadOhms, transfer };
}

function alternate(g: readonly number[]): LadderElement[] {
  return g.map((value, i) => (i % 2 === 0 ? { kind: "shunt-C", value } : { kind: "series-L", value }));
}

/** The Butterworth ladder of order n in the given form. */
export function butterworthLadder(n: number, form: LadderForm): LadderPrototype {
  return build("butterworth", alternate(butterworthG(n)), true, 1, form, butterworth(n));
}

/** The Chebyshev I ladder of order n and ripple (dB) in the given form. */
export function chebyshevLadder(n: number, rippleDb: number, form: LadderForm): LadderPrototype {
  const { g, load } = chebyshevG(n, rippleDb);
  return build("chebyshev1", alternate(g), n % 2 === 1, load, form, chebyshev1(n, { rippleDb }));
}

interface EllipticFixture {
  readonly rippleDb: number;
  readonly attenuationDb: number;
  readonly elements: readonly LadderElement[];
  readonly transmissionZero: number;
}

/** The fixture's third-order elliptic ladder (0.5 dB, 40 dB) in the given form. */
export function ellipticLadder(form: LadderForm): LadderPrototype {
  const f = loadFixture<EllipticFixture>("ladder-elliptic3.json");
  return build("elliptic", f.elements, true, 1, form, elliptic(3, { rippleDb: f.rippleDb, attenuationDb: f.attenuationDb }));
}

/** The fixture's transmission zero (rad/s) of the elliptic ladder. */
export function ellipticZero(): number {
  return loadFixture<EllipticFixture>("ladder-elliptic3.json").transmissionZero;
}
