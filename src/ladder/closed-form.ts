/**
 * Closed-form element values (g-values) of doubly terminated Butterworth and
 * Chebyshev I lowpass ladders, for equal or unequal terminations.
 *
 * Method: with the power transfer |S21(jw)|^2 = (1 - rho2) / (1 + eps^2 T_n(w)^2)
 * (rho2 = |S11|^2 at the peaks of transmission, 0 for a matched design),
 * a = asinh(1/eps) / n, b = asinh(sqrt(rho2)/eps) / n, A = sinh a, B = sinh b,
 * gamma_m = m pi / (2n):
 *   g_1 = 2 sin(gamma_1) / (A - B),
 *   g_k g_(k+1) = 4 sin(gamma_(2k-1)) sin(gamma_(2k+1)) / (A^2 + B^2 + sin^2(k pi/n) - 2 A B cos(k pi/n)).
 * Butterworth (|S21|^2 = (1 - rho2) / (1 + w^2n)) is the limit eps -> 0 after
 * dividing by A^2: A = 1, B = rho2^(1/2n) and no sin^2 term. For rho2 = 0 these
 * are the familiar g_k = 2 sin(gamma_(2k-1)) (Butterworth) and the Chebyshev
 * recurrence g_k g_(k-1) = 4 a_(k-1) a_k / b_(k-1).
 * The values start with a series inductor from a 1 ohm source and end in a
 * load r >= 1 (the same values shunt-first end in 1/r): see
 * {@link closedFormLoadRatio}.
 * Accuracy: a few ulp per value (products and quotients of sines; no
 * cancellation except A - B, which the caller keeps away from 0 by bounding r).
 * References: L. Weinberg, "Network Analysis and Synthesis", McGraw-Hill, 1962,
 * ch. 13 (explicit formulas of Takahasi); L. Weinberg and P. Slepian,
 * "Takahasi's results on Tchebycheff and Butterworth ladder networks", IRE
 * Trans. Circuit Theory 7(2):88-101, 1960; G. L. Matthaei, L. Young,
 * E. M. T. Jones, "Microwave Filters, Impedance-Matching Networks, and Coupling
 * Structures", McGraw-Hill, 1964, sec. 4.05, eqs. (4.05-1) to (4.05-6).
 *
 * @module
 */

/**
 * g-values g_1..g_n of the Butterworth (`eps === null`) or Chebyshev I
 * (ripple factor `eps`) doubly terminated ladder with reflection `rho2` at the
 * transmission peaks, series-first from a 1 ohm source (unchecked core).
 *
 * @param order - ladder order n >= 1
 * @param eps - Chebyshev ripple factor sqrt(10^(Rp/10) - 1), or null for Butterworth
 * @param rho2 - |S11|^2 at the transmission peaks, in [0, 1)
 * @returns g_1..g_n
 * @throws never (unchecked)
 * @example
 * ```ts
 * closedFormValues(3, null, 0); //=> [0.9999999999999999, 2, 0.9999999999999999]
 * ```
 */
export function closedFormValues(order: number, eps: number | null, rho2: number): number[] {
  const n = order;
  let a: number;
  let b: number;
  if (eps === null) {
    a = 1;
    b = rho2 === 0 ? 0 : rho2 ** (1 / (2 * n));
  } else {
    a = Math.sinh(Math.asinh(1 / eps) / n);
    b = rho2 === 0 ? 0 : Math.sinh(Math.asinh(Math.sqrt(rho2) / eps) / n);
  }
  const sinGamma = (m: number): number => Math.sin((m * Math.PI) / (2 * n));
  const g: number[] = [(2 * sinGamma(1)) / (a - b)];
  for (let k = 1; k < n; k++) {
    const c = Math.cos((k * Math.PI) / n);
    const s2 = eps === null ? 0 : Math.sin((k * Math.PI) / n) ** 2;
    const f = a * a + b * b + s2 - 2 * a * b * c;
    g.push((4 * sinGamma(2 * k - 1) * sinGamma(2 * k + 1)) / (f * (g[k - 1] as number)));
  }
  return g;
}

/**
 * The load ratio r = R_load / R_source >= 1 that {@link closedFormValues}
 * ends in (series-first), from the reflection at DC: r = (1 + |rho(0)|) / (1 - |rho(0)|),
 * with |rho(0)|^2 = rho2 for Butterworth and odd Chebyshev orders and
 * 1 - (1 - rho2) / (1 + eps^2) for even Chebyshev orders (T_n(0)^2 = 1).
 *
 * @param order - ladder order
 * @param eps - ripple factor or null for Butterworth
 * @param rho2 - |S11|^2 at the transmission peaks
 * @returns r >= 1
 * @throws never (unchecked)
 * @example
 * ```ts
 * closedFormLoadRatio(3, null, 0); //=> 1
 * ```
 */
export function closedFormLoadRatio(order: number, eps: number | null, rho2: number): number {
  const dc2 = eps === null || order % 2 === 1 ? rho2 : (rho2 + eps * eps) / (1 + eps * eps);
  const rho0 = Math.sqrt(dc2);
  return (1 + rho0) / (1 - rho0);
}

/**
 * The reflection rho2 at the transmission peaks that a load ratio r >= 1
 * needs (the inverse of {@link closedFormLoadRatio}):
 * |rho(0)| = (r - 1) / (r + 1); rho2 = |rho(0)|^2 (Butterworth, odd Chebyshev)
 * or (|rho(0)|^2 (1 + eps^2) - eps^2) (even Chebyshev). A negative result means
 * that r is too close to 1 for an even-order Chebyshev ladder.
 *
 * @param order - ladder order
 * @param eps - ripple factor or null for Butterworth
 * @param r - load ratio, >= 1
 * @returns rho2 (negative when r is not realisable)
 * @throws never (unchecked)
 * @example
 * ```ts
 * closedFormReflection(3, null, 1); //=> 0
 * ```
 */
export function closedFormReflection(order: number, eps: number | null, r: number): number {
  const rho0 = (r - 1) / (r + 1);
  const dc2 = rho0 * rho0;
  if (eps === null || order % 2 === 1) return dc2;
  // (1 + eps^2) rho0^2 - eps^2, written to keep its digits near the matched ratio
  return dc2 - eps * eps * (1 - dc2);
}
