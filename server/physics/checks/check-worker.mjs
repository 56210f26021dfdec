// Entry of a check worker. The checks are TypeScript; the server runs under tsx, which a worker
// does not inherit, so the worker registers tsx's loader itself before importing them.
import { lowerThisThread } from "../../threads/lower-priority.mjs";
import { workerData } from "node:worker_threads";
import { register } from "tsx/esm/api";

// Lowered before it compiles the checks, so the threads that answer requests get the cores first (WORKER_NICE).
lowerThisThread(workerData?.nice);
register();
await import("./check-worker-main.ts");
