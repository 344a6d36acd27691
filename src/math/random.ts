/**
 * A small seeded pseudo-random number generator, so that Monte Carlo runs and
 * random test corpora repeat exactly from their seed.
 *
 * Method: Mulberry32 (T. Ettinger, 2017, public domain): a 32-bit Weyl
 * sequence (increment 0x6D2B79F5) passed through a multiply-xorshift output
 * mix. Quality: period 2^32; it passes the usual statistical batteries well
 * enough for Monte Carlo yield estimates and test data, not for cryptography.
 * Each call returns a multiple of 2^-32 in [0, 1). The seed is checked once,
 * when the generator is made; drawing numbers is unchecked and fast.
 *
 * @module
 */
import { requireFinite } from "../validate.ts";

/**
 * A Mulberry32 generator seeded with `seed` (taken modulo 2^32).
 *
 * @param seed - any finite number; its unsigned 32-bit value is the state
 * @returns a function that gives the next number in [0, 1) on each call
 * @throws `InvalidArgumentError` at `seed` when the seed is not a finite number
 * @example
 * ```ts
 * const next = mulberry32(1);
 * next(); //=> 0.6270739405881613
 * ```
 */
export function mulberry32(seed: number): () => number {
  let a = requireFinite("mulberry32", "seed", seed) >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
