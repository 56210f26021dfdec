// @ts-check
// The body worker thread (see body-pool.ts): large JSON bodies are decoded, parsed, guarded and
// validated here, so a 4 MiB samples body never blocks the server's event loop. The code is
// TypeScript, so the thread registers the tsx loader once when it starts and then stays warm.
import { lowerThisThread } from "../threads/lower-priority.mjs";
import { parentPort, workerData } from "node:worker_threads";
import { register } from "tsx/esm/api";

// The body thread only (WORKER_NICE).
lowerThisThread(workerData?.nice);
register();
const { readBodyBytes } = await import("./body-kinds.ts");

if (!parentPort) throw new Error("body-worker must run as a worker thread");
const port = parentPort;
port.on("message", (/** @type {{ id: number, kind: "convert-samples", bytes: ArrayBuffer }} */ job) => {
  try {
    const { value, transfer } = readBodyBytes(job.kind, new Uint8Array(job.bytes));
    port.postMessage({ id: job.id, ok: true, value }, transfer);
  } catch (err) {
    const e = /** @type {{ status?: number, code?: string, fields?: Record<string, string>, message?: string }} */ (err);
    const known = typeof e?.status === "number" && typeof e?.code === "string";
    port.postMessage({ id: job.id, ok: false, status: known ? e.status : 500, code: known ? e.code : "internal", fields: e?.fields ?? null, message: e?.message ?? String(err) });
  }
});
port.postMessage({ ready: true });
