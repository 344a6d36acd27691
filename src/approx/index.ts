/**
 * Approximation families (normalised lowpass prototypes), minimum order
 * selection and section tables. Frequencies are angular (rad/s).
 *
 * | family | orders | 1 rad/s is | same placement as |
 * |---|---|---|---|
 * | `butterworth(n)` | 1-64 | the -3.0103 dB point | scipy.signal.buttap |
 * | `chebyshev1(n, { rippleDb })` | 1-64 | the passband (ripple) edge: loss = rippleDb | scipy.signal.cheb1ap |
 * | `chebyshev2(n, { attenuationDb })` | 1-64 | the stopband edge: loss = attenuationDb | scipy.signal.cheb2ap |
 * | `elliptic(n, { rippleDb, attenuationDb })` | 1-24 | the passband edge (stopband edge from `ellipticStopbandEdge`) | scipy.signal.ellipap |
 * | `bessel(n, { normalization })` | 1-30 | "phase" (default): asymptotes meet as Butterworth's; "delay": 1 s DC delay; "magnitude": -3 dB | scipy.signal.besselap |
 * | `legendre(n)` | 1-20 | the -3.0103 dB point | (no scipy equivalent) |
 *
 * `unitFrequencyMeaning(family, normalization?)` returns the same statement as
 * data; `rescaleToAttenuation(zpk, { attenuationDb })` moves any prototype so
 * that it is a chosen number of dB down at 1 rad/s (e.g. every family at its
 * -3 dB point, for a fair comparison). `minimumOrder(spec)` picks the order
 * and natural frequency for lowpass, highpass, bandpass and bandstop masks
 * (`naturalW` as scipy's `*ord` functions); `besselOrderForDelay` sizes a
 * Bessel filter for group-delay flatness; `sectionTable` / `formatSectionTable`
 * give the per-section pole frequency, Q and zero frequency.
 *
 * @module
 */
export { FAMILY_NAMES } from "./types.ts";
export type {
  BesselNormalization,
  BesselOptions,
  Chebyshev1Options,
  Chebyshev2Options,
  EllipticOptions,
  FamilyName,
  UnitFrequencyMeaning,
} from "./types.ts";
export { butterworth, BUTTERWORTH_MAX_ORDER } from "./butterworth.ts";
export { chebyshev1, CHEBYSHEV1_MAX_ORDER, MAX_RIPPLE_DB, MIN_RIPPLE_DB } from "./chebyshev1.ts";
export { chebyshev2, CHEBYSHEV2_MAX_ORDER, MAX_ATTENUATION_DB } from "./chebyshev2.ts";
export { elliptic, ellipticStopbandEdge, ELLIPTIC_MAX_ORDER } from "./elliptic.ts";
export { bessel, BESSEL_MAX_ORDER, BESSEL_NORMALIZATIONS } from "./bessel.ts";
export { legendre, LEGENDRE_MAX_ORDER, legendreLCoefficientStrings } from "./legendre.ts";
export {
  attenuationFrequency,
  familyMaxOrder,
  prototype,
  rescaleToAttenuation,
  unitFrequencyMeaning,
} from "./prototype.ts";
export type { AttenuationPointOptions, PrototypeSpec } from "./prototype.ts";
export { besselOrderForDelay, minimumOrder, ORDER_RANGES, ORDER_SEARCH_LIMIT } from "./order.ts";
export type { AcceptedRange, OrderRanges } from "./order.ts";
export type {
  BesselDelayResult,
  BesselDelaySpec,
  MinimumOrderResult,
  MinimumOrderSpec,
  OrderResponse,
} from "./order.ts";
export { formatSectionTable, sectionTable } from "./section-table.ts";
export type { FormatSectionTableOptions, SectionRow, SectionTableOptions } from "./section-table.ts";
