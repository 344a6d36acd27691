/**
 * A small ladder evaluator for the scaling tests (ABCD chain matrices), kept
 * local to the tests so they do not depend on src/circuit.
 */
import { cadd, cdiv, cmul, complex } from "../../src/math/complex.ts";
import type { Complex } from "../../src/math/complex.ts";
import type { ScalableElement } from "../../src/scaling/index.ts";

// --- A small ladder evaluator local to this test (ABCD chain matrices) -------
// Each rung is a series impedance or a shunt admittance; the last element is
// the load resistor. H = V_load / V_source = 1 / (A + B / R_load).
export type Rung = { readonly el: string; readonly shunt: boolean };

interface Abcd {
  a: Complex;
  b: Complex;
  c: Complex;
  d: Complex;
}

function impedance(el: ScalableElement, s: Complex): Complex {
  const v = el.value as number;
  if (el.kind === "R") return complex(v);
  if (el.kind === "L") return cmul(s, complex(v));
  return cdiv(complex(1), cmul(s, complex(v)));
}

function mul(x: Abcd, y: Abcd): Abcd {
  return {
    a: cadd(cmul(x.a, y.a), cmul(x.b, y.c)),
    b: cadd(cmul(x.a, y.b), cmul(x.b, y.d)),
    c: cadd(cmul(x.c, y.a), cmul(x.d, y.c)),
    d: cadd(cmul(x.c, y.b), cmul(x.d, y.d)),
  };
}

export function ladderResponse(elements: readonly ScalableElement[], rungs: readonly Rung[], load: string, w: number): Complex {
  const s = complex(0, w);
  const byName = new Map(elements.map((e) => [e.name, e]));
  let m: Abcd = { a: complex(1), b: complex(0), c: complex(0), d: complex(1) };
  for (const r of rungs) {
    const z = impedance(byName.get(r.el) as ScalableElement, s);
    const step: Abcd = r.shunt
      ? { a: complex(1), b: complex(0), c: cdiv(complex(1), z), d: complex(1) }
      : { a: complex(1), b: z, c: complex(0), d: complex(1) };
    m = mul(m, step);
  }
  const rl = (byName.get(load) as ScalableElement).value as number;
  return cdiv(complex(1), cadd(m.a, cdiv(m.b, complex(rl))));
}

// Normalised doubly terminated 3rd-order Butterworth LC ladder: g = 1, 2, 1
// (g_k = 2 sin((2k - 1) pi / 2n); G. Matthaei, L. Young, E. M. T. Jones,
// "Microwave Filters, Impedance-Matching Networks, and Coupling Structures",
// McGraw-Hill, 1964, eq. (4.05-2)). |H(jw)| = 0.5 / sqrt(1 + w^6).
export const g = (k: number, n: number): number => 2 * Math.sin(((2 * k - 1) * Math.PI) / (2 * n));
export const butterworth3: ScalableElement[] = [
  { name: "Rs", kind: "R", value: 1 },
  { name: "C1", kind: "C", value: g(1, 3) },
  { name: "L2", kind: "L", value: g(2, 3) },
  { name: "C3", kind: "C", value: g(3, 3) },
  { name: "RL", kind: "R", value: 1 },
  { name: "U1", kind: "OA" }, // not part of the ladder; must pass through untouched
];
export const ladderRungs: Rung[] = [
  { el: "Rs", shunt: false },
  { el: "C1", shunt: true },
  { el: "L2", shunt: false },
  { el: "C3", shunt: true },
];

// An RC ladder (three sections) with unequal values.
export const rc3: ScalableElement[] = [
  { name: "R1", kind: "R", value: 1 },
  { name: "C1", kind: "C", value: 0.5 },
  { name: "R2", kind: "R", value: 2.2 },
  { name: "C2", kind: "C", value: 0.15 },
  { name: "R3", kind: "R", value: 4.7 },
  { name: "C3", kind: "C", value: 0.033 },
  { name: "RL", kind: "R", value: 1e3 },
];
export const rcRungs: Rung[] = [
  { el: "R1", shunt: false },
  { el: "C1", shunt: true },
  { el: "R2", shunt: false },
  { el: "C2", shunt: true },
  { el: "R3", shunt: false },
  { el: "C3", shunt: true },
];

