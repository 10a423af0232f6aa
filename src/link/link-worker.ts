/**
 * A linking thread of the worker pool (src/link/parallel.ts): opens the KB, makes a linker with
 * the pool's options, then links the batches of units it is sent, replying with their rows in
 * the order they came. Replies: `ready` once the linker is made (with the KB's in-memory store,
 * shared), `rows` per batch (with the failure of a unit, if one failed), `failed` with the
 * error of the opening. The labels are counted by the pool, not here.
 */
import { parentPort, workerData } from "node:worker_threads";
import { Kb } from "../kb/kb.js";
import type { SharedHotArrays } from "../kb/hot.js";
import { LabelMap } from "../labels/label-map.js";
import { errorToMessage } from "../util/errors.js";
import { createLinker, type Linker } from "./linker.js";
import type { LinkRow } from "../types.js";
import type { WorkerReply, WorkerRequest, WorkerSetup } from "./parallel.js";

const port = parentPort;
if (port === null) throw new Error("link-worker.js runs as a worker thread of src/link/parallel.ts");
const reply = (m: WorkerReply) => port.postMessage(m);

const setup = workerData as WorkerSetup;
let linker: Linker | undefined;
try {
  const labels = new LabelMap(new Map(setup.labels));
  // The first thread loads the in-memory store into shared memory; the others are given it.
  const shared: SharedHotArrays = setup.shared ?? new Map();
  linker = createLinker(new Kb(setup.kb, shared), { ...setup.options, labels });
  // The KB's near-name rate is measured on first use (a few hundred milliseconds at a million
  // entities): measured now, every thread pays it while starting, side by side, not mid-run.
  void linker.nearNameRate;
  reply({ kind: "ready", shared });
} catch (e) {
  reply({ kind: "failed", error: errorToMessage(e) });
}

port.on("message", (request: WorkerRequest) => {
  if (linker === undefined) return;
  const rows: LinkRow[] = [];
  for (const unit of request.units) {
    try {
      rows.push(...linker.linkUnit(unit));
    } catch (e) {
      // The rows before the failed unit, then its failure: what linkAll gives on one thread.
      reply({ kind: "rows", seq: request.seq, rows, failure: errorToMessage(e) });
      return;
    }
  }
  reply({ kind: "rows", seq: request.seq, rows });
});
