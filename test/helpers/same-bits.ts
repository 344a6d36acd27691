/**
 * Bit-for-bit equality of two results: every number (typed-array entries
 * included) compared by its IEEE 754 bits, so -0 differs from 0 and two NaNs
 * are equal only with the same bits; keys and lengths must match.
 */
import { expect } from "vitest";

function bits(x: number): string {
  const b = new DataView(new ArrayBuffer(8));
  b.setFloat64(0, x);
  return b.getBigUint64(0).toString(16);
}

/** Every number of `x` replaced by its bits, typed arrays by arrays of bits. */
export function asBits(x: unknown): unknown {
  if (typeof x === "number") return bits(x);
  if (ArrayBuffer.isView(x) && !(x instanceof DataView)) return Array.from(x as unknown as ArrayLike<number>, bits);
  if (Array.isArray(x)) return x.map(asBits);
  if (x !== null && typeof x === "object") return Object.fromEntries(Object.entries(x).map(([k, v]) => [k, asBits(v)]));
  return x;
}

/** Require `actual` to equal `expected` bit for bit. */
export function expectSameBits(actual: unknown, expected: unknown): void {
  expect(asBits(actual)).toEqual(asBits(expected));
}
