/**
 * The worker thread of `monteCarloParallel`: reads its {@link BoardJob} from
 * `workerData`, builds its boards and posts them back once (the per-board
 * arrays transferred, not copied), or posts the error as plain data.
 *
 * @module
 */
import { parentPort, workerData } from "node:worker_threads";
import { runBoardJob, type BoardJob } from "./job.ts";
import { failureOf, type WorkerReply } from "./pool.ts";
import type { BoardRun } from "../evaluate/boards.ts";

if (parentPort !== null) {
  const port = parentPort;
  let reply: WorkerReply<BoardRun>;
  let transfer: ArrayBuffer[] = [];
  try {
    const run = runBoardJob(workerData as BoardJob);
    reply = { ok: true, value: run };
    transfer = [run.marginDb, run.passbandLossDb, run.stopbandAttenuationDb, run.gainDb, ...run.worstValues].map((a) => a.buffer as ArrayBuffer);
  } catch (e) {
    reply = { ok: false, error: failureOf(e) };
  }
  port.postMessage(reply, transfer);
}
