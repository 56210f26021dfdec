import { parentPort } from "node:worker_threads";
import { SymbolicError, SymbolicPool, SymbolicTimeoutError } from "../expr/pool.ts";
import type { SymbolicOp, SymbolicResult } from "../expr/symbolic-protocol.ts";
import { runCheckJob } from "./check-job.ts";
import type { ToWorker } from "./check-protocol.ts";

/**
 * A check worker: runs one job at a time (check-pool.ts never sends a second before the first is
 * done) and hands its CAS work to the main thread's symbolic pool.
 */
const port = parentPort;
if (port === null) throw new Error("check-worker-main.ts runs only as a worker thread");

let nextCall = 1;
const calls = new Map<number, { resolve: (r: SymbolicResult) => void; reject: (e: Error) => void }>();
let currentJob = 0;

const pool = new SymbolicPool({
  transport: (op: SymbolicOp, options) =>
    new Promise<SymbolicResult>((resolve, reject) => {
      const callId = nextCall++;
      calls.set(callId, { resolve, reject });
      port.postMessage({ type: "cas", id: currentJob, callId, op, ...(options.timeoutMs === undefined ? {} : { timeoutMs: options.timeoutMs }) });
    }),
});

port.on("message", (msg: ToWorker) => {
  if (msg.type === "cas_result") {
    const call = calls.get(msg.callId);
    if (call === undefined) return;
    calls.delete(msg.callId);
    if (msg.ok) call.resolve(msg.result);
    else call.reject(msg.code === "timeout" ? new SymbolicTimeoutError(msg.timeoutMs ?? 0) : new SymbolicError(msg.code, msg.message));
    return;
  }
  const { id, job } = msg;
  currentJob = id;
  const crashed = (err: unknown) => port.postMessage({ type: "crashed", id, message: err instanceof Error ? err.message : String(err) });
  runCheckJob(job, { pool, onCheck: (check) => port.postMessage({ type: "check", id, check }) })
    .then((outcome) => port.postMessage({ type: "done", id, outcome }))
    .catch(crashed);
});

port.postMessage({ type: "ready" });
