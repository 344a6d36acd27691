/**
 * Approximation families (normalised lowpass prototypes), minimum order
 * selection and section tables. Frequencies are angular (rad/s).
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
export { chebyshev1, CHEBYSHEV1_MAX_ORDER, MAX_RIPPLE_DB } from "./chebyshev1.ts";
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
export { besselOrderForDelay, minimumOrder, ORDER_SEARCH_LIMIT } from "./order.ts";
export type {
  BesselDelayResult,
  BesselDelaySpec,
  MinimumOrderResult,
  MinimumOrderSpec,
  OrderResponse,
} from "./order.ts";
export { formatSectionTable, sectionTable } from "./sectionTable.ts";
export type { FormatSectionTableOptions, SectionRow, SectionTableOptions } from "./sectionTable.ts";
