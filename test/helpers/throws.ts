/**
 * The error a call throws, checked to be of the expected class, so that a
 * test can go on to inspect its fields (path, fn, culprits, message).
 */
import { expect } from "vitest";

/**
 * Call `f`, require that it throws an instance of `type`, and return the error.
 *
 * @param f - the call expected to throw
 * @param type - the expected error class
 * @returns the thrown error, typed
 */
export function thrownBy<E extends Error>(f: () => unknown, type: abstract new (...args: never[]) => E): E {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(type);
    return e as E;
  }
  return expect.unreachable("expected the call to throw");
}
