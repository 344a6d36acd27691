/**
 * Layer 1: complex arithmetic, real polynomials, polynomial roots and the
 * reverse Bessel polynomials.
 *
 * @module
 */
export * from "./complex.ts";
export { polyAdd, polyDerivative, polyEval, polyEvalReal, polyFromRoots, polyMul } from "./polynomial.ts";
export { polyRoots, type PolyRootsOptions } from "./roots.ts";
export { MAX_BESSEL_ORDER, reverseBesselCoefficients, reverseBesselRoots } from "./bessel.ts";
