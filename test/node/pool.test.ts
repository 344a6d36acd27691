/**
 * The worker-thread runner of filterwright/node (src/node/pool.ts), with
 * small plain-JavaScript test workers (test/node/workers/): replies in job
 * order, every kind of worker failure as a rejection, the other workers
 * ended when one fails, and errors carried across the thread boundary as
 * their own classes.
 */
import { describe, expect, it } from "vitest";
import { errorOf, failureOf, runInWorkers } from "../../src/node/pool.ts";
import {
  ConvergenceError,
  FilterwrightError,
  InvalidArgumentError,
  ParseError,
  SingularCircuitError,
  SpecError,
  UnrealisableError,
} from "../../src/errors.ts";

const echo = new URL("./workers/echo.mjs", import.meta.url);
const fail = new URL("./workers/fail.mjs", import.meta.url);
const label = (i: number): string => `worker ${i}`;

async function rejection(p: Promise<unknown>): Promise<Error> {
  try {
    await p;
  } catch (e) {
    expect(e).toBeInstanceOf(Error);
    return e as Error;
  }
  return expect.unreachable("expected the promise to reject");
}

describe("runInWorkers", () => {
  it("gives the replies in job order, whatever order the workers finish in", async () => {
    const jobs = [
      { x: 1, delayMs: 150 },
      { x: 2, delayMs: 0 },
      { x: 3, delayMs: 60 },
    ];
    expect(await runInWorkers(echo, jobs, label)).toEqual([2, 4, 6]);
  });

  it("rejects with a reported filterwright error as its own class and fields", async () => {
    const e = await rejection(runInWorkers(fail, [{ how: "reply" }], label));
    expect(e).toBeInstanceOf(InvalidArgumentError);
    const f = e as InvalidArgumentError;
    expect([f.code, f.fn, f.path, f.reason, f.received]).toEqual(["INVALID_ARGUMENT", "someFunction", "some.path", "expected a number", "x"]);
    expect(f.message).toBe('someFunction: some.path: expected a number (received "x")');
  });

  it("rejects with a reported plain error as an Error naming the worker, the worker's error as its cause", async () => {
    const e = await rejection(runInWorkers(fail, [{ how: "reply-plain" }], label));
    expect(e).not.toBeInstanceOf(FilterwrightError);
    expect(e.message).toBe("worker 0 failed: RangeError: out of range");
    expect((e.cause as Error).name).toBe("RangeError");
  });

  it("rejects when a worker throws, and when it exits before replying", async () => {
    const thrown = await rejection(runInWorkers(fail, [{ how: "throw" }], label));
    expect(thrown.message).toBe("worker 0 failed: thrown at the top of the worker");
    expect((thrown.cause as Error).name).toBe("TypeError");
    const exited = await rejection(runInWorkers(fail, [{ how: "exit" }], label));
    expect(exited.message).toBe("worker 0 stopped (exit code 3) before it replied");
  });

  it("rejects when the worker's module cannot be loaded", async () => {
    const e = await rejection(runInWorkers(new URL("./workers/no-such-worker.mjs", import.meta.url), [{}], label));
    expect(e.message).toMatch(/^worker 0 failed: /);
  });

  it("ends the other workers when one fails", async () => {
    const shared = new SharedArrayBuffer(4);
    const count = new Int32Array(shared);
    const e = await rejection(runInWorkers(fail, [{ how: "hang", shared }, { how: "throw-later", delayMs: 200 }], label));
    expect(e.message).toMatch(/^worker 1 failed: thrown later/);
    // the hanging worker ran until then, and stops counting once it is ended
    await new Promise((r) => setTimeout(r, 100));
    const atEnd = Atomics.load(count, 0);
    expect(atEnd).toBeGreaterThan(0);
    await new Promise((r) => setTimeout(r, 150));
    expect(Atomics.load(count, 0)).toBe(atEnd);
  });

  it("resolves at once with no jobs", async () => {
    expect(await runInWorkers(echo, [], label)).toEqual([]);
  });
});

describe("failureOf and errorOf", () => {
  const cases: [string, FilterwrightError][] = [
    ["InvalidArgumentError", new InvalidArgumentError({ fn: "f", path: "a.b", received: [1, 2], message: "expected a number" })],
    ["ParseError", new ParseError({ fn: "parseValue", path: "text", received: "4k7k", message: "cannot read it" })],
    ["UnrealisableError", new UnrealisableError({ fn: "design", path: "q", message: "too high" })],
    ["SingularCircuitError", new SingularCircuitError({ fn: "acAnalysis", path: "circuit", message: "floating node" }, ["n1", "n2"])],
    ["SpecError", new SpecError("validateSpec", [{ path: "passband.edgeHz", message: "expected a frequency", received: -1 }])],
    ["ConvergenceError", new ConvergenceError({ fn: "roots", path: "", message: "no convergence" })],
  ];

  it.each(cases)("carry a %s across as the same class with the same fields", (name, error) => {
    const back = errorOf(structuredClone(failureOf(error)), "w") as FilterwrightError;
    expect(back.constructor.name).toBe(name);
    expect(back).toBeInstanceOf(error.constructor as typeof FilterwrightError);
    expect([back.name, back.code, back.fn, back.path, back.reason, back.message]).toEqual([error.name, error.code, error.fn, error.path, error.reason, error.message]);
    expect(back.received).toEqual(error.received);
    if (error instanceof SingularCircuitError) expect((back as SingularCircuitError).culprits).toEqual(["n1", "n2"]);
    if (error instanceof SpecError) expect((back as SpecError).issues).toEqual(error.issues);
  });

  it("leave out a received value that cannot be posted", () => {
    const f = failureOf(new InvalidArgumentError({ fn: "f", path: "p", received: () => 1, message: "expected a number" }));
    expect(() => structuredClone(f)).not.toThrow();
    expect(f.filterwright && "received" in f.filterwright).toBe(false);
  });

  it("turn anything else into an Error naming the worker, the original as its cause", () => {
    const back = errorOf(failureOf(new TypeError("x is not a function")), "the worker of boards 0-255");
    expect(back).not.toBeInstanceOf(FilterwrightError);
    expect(back.message).toBe("the worker of boards 0-255 failed: TypeError: x is not a function");
    expect((back.cause as Error).name).toBe("TypeError");
    expect(errorOf(failureOf("a string"), "w").message).toBe("w failed: Error: a string");
  });
});
