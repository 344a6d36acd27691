// Test worker for src/node/pool.ts: fails in the way workerData.how names.
import { parentPort, workerData } from "node:worker_threads";

if (workerData.how === "reply") {
  // a reported filterwright error, as src/node/pool.ts failureOf writes one
  parentPort.postMessage({
    ok: false,
    error: {
      name: "InvalidArgumentError",
      message: "someFunction: some.path: expected a number (received \"x\")",
      filterwright: { code: "INVALID_ARGUMENT", fn: "someFunction", path: "some.path", reason: "expected a number", received: "x" },
    },
  });
} else if (workerData.how === "reply-plain") {
  parentPort.postMessage({ ok: false, error: { name: "RangeError", message: "out of range" } });
} else if (workerData.how === "throw") {
  throw new TypeError("thrown at the top of the worker");
} else if (workerData.how === "throw-later") {
  setTimeout(() => {
    throw new TypeError("thrown later");
  }, workerData.delayMs);
} else if (workerData.how === "exit") {
  process.exit(3);
} else if (workerData.how === "hang") {
  // never replies; counts in shared memory every 5 ms while it runs
  const count = new Int32Array(workerData.shared);
  setInterval(() => Atomics.add(count, 0, 1), 5);
}
