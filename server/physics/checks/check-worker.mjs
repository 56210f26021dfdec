// Entry of a check worker. The checks are TypeScript; the server runs under tsx, which a worker
// does not inherit, so the worker registers tsx's loader itself before importing them.
import { setPriority } from "node:os";
import { workerData } from "node:worker_threads";
import { register } from "tsx/esm/api";

// On Linux a nice value belongs to one thread: this lowers this worker's priority only (before it
// compiles the checks), so the threads that answer requests get the cores first (WORKER_NICE).
const nice = Number(workerData?.nice ?? 0);
if (nice > 0) {
  try {
    setPriority(nice);
  } catch {
    // Not permitted or not supported: run at the normal priority.
  }
}
register();
await import("./check-worker-main.ts");
