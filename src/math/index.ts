/**
 * Layer 1: complex arithmetic, real polynomials, polynomial roots and the
 * reverse Bessel polynomials, a seeded pseudo-random generator, small dense
 * complex linear solves, and the real matrix exponential.
 *
 * @module
 */
export * from "./complex.ts";
export { polyAdd, polyDerivative, polyEval, polyEvalReal, polyFromRoots, polyMul } from "./polynomial.ts";
export { polyRoots, type PolyRootsOptions } from "./roots.ts";
export { mulberry32 } from "./random.ts";
export { REVERSE_BESSEL_MAX_ORDER, reverseBesselCoefficients, reverseBesselRoots } from "./bessel.ts";
export { expm, type RealMatrix } from "./expm.ts";
export {
  complexLuFactor,
  complexLuSolve,
  type ComplexLu,
  type ComplexMatrix,
  type ComplexVector,
} from "./linear.ts";
