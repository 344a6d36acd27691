/**
 * The first non-finite number in a result, for the bad-input tests: they
 * accept a call that throws a typed error or returns data with no NaN and no
 * ±Infinity at any depth.
 */

/** The path of the first NaN or ±Infinity in a value (nested objects, arrays, typed arrays), or null. */
export function firstNonFinite(value: unknown, path = "result", seen = new Set<unknown>()): string | null {
  if (typeof value === "number") return Number.isFinite(value) ? null : `${path} = ${value}`;
  if (typeof value !== "object" || value === null || seen.has(value)) return null;
  seen.add(value);
  if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
    const a = value as unknown as ArrayLike<number>;
    for (let i = 0; i < a.length; i++) if (!Number.isFinite(a[i])) return `${path}[${i}] = ${a[i]}`;
    return null;
  }
  for (const [k, v] of Object.entries(value)) {
    const found = firstNonFinite(v, `${path}.${k}`, seen);
    if (found !== null) return found;
  }
  return null;
}
