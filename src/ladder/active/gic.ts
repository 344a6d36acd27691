/**
 * The generalised impedance converter (GIC) of two op-amps: a grounded
 * simulated inductor or frequency-dependent negative resistance (FDNR).
 *
 * Method: five impedances in a chain from the input node 1 through nodes
 * 2, 3, 4, 5 to ground; op-amp A has its inputs at nodes 1 and 3 and its
 * output at node 2, op-amp B its inputs at nodes 3 and 5 and its output at
 * node 4. With ideal op-amps nodes 1, 3 and 5 sit at one voltage
 * and no current enters the inputs, so the input impedance is
 * `Zin = Z1 Z3 Z5 / (Z2 Z4)` (A. Antoniou, "Realisation of gyrators using
 * operational amplifiers, and their use in RC-active-network synthesis",
 * Proc. IEE 116(11):1838-1850, 1969). With a capacitor at Z4 and resistors
 * elsewhere, `Zin = s C4 R1 R3 R5 / R2`, a grounded inductor; with
 * capacitors at Z1 and Z5, `Zin = R3 / (s^2 C1 C5 R2 R4)`, a grounded FDNR
 * `D = C1 C5 R2 R4 / R3` (L. T. Bruton, "Network transfer functions using
 * the concept of frequency-dependent negative resistance", IEEE Trans.
 * Circuit Theory 16(3):406-408, 1969).
 *
 * Which input of each op-amp goes where decides stability with a real
 * op-amp: for the inductor A's non-inverting input is at node 1 and B's at
 * node 3; for the FDNR both the other way round (A's at node 3, B's at
 * node 5). Of the four ways, each is the only one that leaves the op-amps'
 * own poles in the left half-plane with a single-pole op-amp; and of the
 * places for the capacitors, Z4 (inductor) and Z1 with Z5 (FDNR) give
 * the smallest error from the op-amps' finite gain-bandwidth (0.64 % of
 * the element's impedance, against 0.96 % for Z2, or Z1 with Z3, at the
 * frequency where the GIC's resistors and capacitors have equal impedances
 * and a 628 times higher GBW): both found by this project's nodal analysis
 * of every placement (common practice, no source beyond the two papers).
 *
 * Accuracy: with ideal op-amps exact; the realised element is
 * `C4 R1 R3 R5 / R2` or `C1 C5 R2 R4 / R3` of the parts as built.
 *
 * @module
 */
import { addCapacitor, addOpamp, addResistor, type Builder } from "./build.ts";
import { CAPACITOR_LIMITS_F } from "./options.ts";

/**
 * The pre-distortion's capacitor across a GIC resistor (none for 0). A
 * single-pole op-amp's finite gain-bandwidth adds to the GIC's element an
 * error of relative size about s / GBW, a loss (of either sign); a capacitor
 * Cx across the inductor's R5 multiplies its impedance by 1 / (1 + s R5 Cx),
 * across the FDNR's R2 by 1 + s R2 Cx: an error of the same form, whose size
 * the pre-distortion chooses (common practice, no source). A value below
 * the smallest capacitor placeable is left out: its effect is below the
 * other parts' rounding.
 */
function addCompensation(b: Builder, a: string, c: string, farads: number, role: string): void {
  if (farads === 0 || (b.options.probing !== true && farads < CAPACITOR_LIMITS_F.min)) return;
  addCapacitor(b, a, c, farads, role);
}

/** A simulated grounded inductor: its value and the GIC's resistor level. */
export interface GicInductorTarget {
  /** Inductance, henries. */
  readonly henries: number;
  /** Resistance of R2, R3 and R5 (before rounding), ohms: 1 / (2 pi f C4) at the filter's edge. */
  readonly levelOhms: number;
  /** The pre-distortion's capacitor across R5, as a fraction of C4 (0: none). @defaultValue 0 */
  readonly compensation?: number;
}

/** A simulated grounded FDNR: its value and the GIC's resistor level. */
export interface GicFdnrTarget {
  /** D, farad-seconds (`Zin = 1 / (s^2 D)`). */
  readonly d: number;
  /** Resistance of R2 and R3 (before rounding), ohms. */
  readonly levelOhms: number;
  /** The pre-distortion's capacitor across R2, as a fraction of C1 (0: none). @defaultValue 0 */
  readonly compensation?: number;
}

/**
 * Place a GIC grounded inductor at `node`: C4 the shared capacitor, R2 = R3
 * = R5 at the level, R1 = L R2 / (C4 R3 R5) from the rounded values.
 *
 * @param b - the builder
 * @param node - the node the inductor connects to ground
 * @param prefix - prefix of the GIC's internal nodes, e.g. `"g1_"`
 * @param target - inductance and resistor level
 * @param label - what the inductor is, for the parts' roles
 * @returns the inductance as built
 */
export function addGicInductor(b: Builder, node: string, prefix: string, target: GicInductorTarget, label: string): number {
  const [n2, n3, n4, n5] = [2, 3, 4, 5].map((k) => `${prefix}${k}`) as [string, string, string, string];
  const c4 = b.options.capacitorF;
  const r2 = addResistor(b, n2, n3, target.levelOhms, `${label}: GIC Z2`);
  const r3 = addResistor(b, n3, n4, target.levelOhms, `${label}: GIC Z3`);
  const r5 = addResistor(b, n5, "0", target.levelOhms, `${label}: GIC Z5`);
  const r1 = addResistor(b, node, n2, (target.henries * r2) / (c4 * r3 * r5), `${label}: GIC Z1`);
  addCapacitor(b, n4, n5, c4, `${label}: GIC Z4`);
  addCompensation(b, n5, "0", (target.compensation ?? 0) * c4, `${label}: op-amp compensation across Z5`);
  addOpamp(b, node, n3, n2);
  addOpamp(b, n3, n5, n4);
  return (c4 * r1 * r3 * r5) / r2;
}

/**
 * Place a GIC grounded FDNR at `node`: C1 = C5 the shared capacitor, R2 = R3
 * at the level, R4 = D R3 / (C1 C5 R2) from the rounded values.
 *
 * @param b - the builder
 * @param node - the node the FDNR connects to ground
 * @param prefix - prefix of the GIC's internal nodes, e.g. `"d1_"`
 * @param target - D and resistor level
 * @param label - what the element is, for the parts' roles
 * @returns D as built
 */
export function addGicFdnr(b: Builder, node: string, prefix: string, target: GicFdnrTarget, label: string): number {
  const [n2, n3, n4, n5] = [2, 3, 4, 5].map((k) => `${prefix}${k}`) as [string, string, string, string];
  const c = b.options.capacitorF;
  const c1 = addCapacitor(b, node, n2, c, `${label}: GIC Z1`);
  const r2 = addResistor(b, n2, n3, target.levelOhms, `${label}: GIC Z2`);
  const r3 = addResistor(b, n3, n4, target.levelOhms, `${label}: GIC Z3`);
  const c5 = addCapacitor(b, n5, "0", c, `${label}: GIC Z5`);
  const r4 = addResistor(b, n4, n5, (target.d * r3) / (c1 * c5 * r2), `${label}: GIC Z4`);
  addCompensation(b, n4, n5, (target.compensation ?? 0) * c, `${label}: op-amp compensation across Z4`);
  // the inputs the other way round from the inductor's: the only stable way for the FDNR
  addOpamp(b, n3, node, n2);
  addOpamp(b, n5, n3, n4);
  return (c1 * c5 * r2 * r4) / r3;
}
