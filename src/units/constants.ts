/**
 * Numerical constants used across filterwright, at full double precision.
 *
 * @module
 */

/**
 * 2 pi, the number of radians in one cycle (converts hertz to rad/s).
 *
 * Correctly rounded double of 6.283185307179586476925286766559...
 * (computed with mpmath to 30 digits).
 *
 * @example
 * ```ts
 * TWO_PI * 1000; //=> 6283.185307179586
 * ```
 */
export const TWO_PI = 6.283185307179586;

