import type { OpAmpModel } from "../../src/circuit/types.ts";
import type { ComponentValues, Topology } from "../../src/topologies/types.ts";

/**
 * |H(j 2 pi f)| from a topology's as-built polynomials (descending
 * coefficients in z = s / scale, by Horner's rule), for checking them against
 * nodal analysis. Throws when the topology has no polynomials for the model.
 */
export function polyMagnitude(topo: Topology, v: ComponentValues, f: number, opamp: OpAmpModel): number {
  const p = topo.polynomials?.(v, opamp);
  if (p === null || p === undefined) throw new Error(`${topo.id}: no polynomials for this op-amp model`);
  const zi = (2 * Math.PI * f) / p.scale;
  const ev = (c: Float64Array): number => {
    let re = 0;
    let im = 0;
    for (const k of c) {
      const nr = -im * zi + k;
      im = re * zi;
      re = nr;
    }
    return Math.hypot(re, im);
  };
  return ev(p.num) / ev(p.den);
}
