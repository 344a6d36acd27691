// Test worker for src/node/pool.ts: replies { ok: true, value: 2 x } for workerData { x, delayMs },
// after the delay (so that workers finish out of job order).
import { parentPort, workerData } from "node:worker_threads";

setTimeout(() => parentPort.postMessage({ ok: true, value: 2 * workerData.x }), workerData.delayMs);
