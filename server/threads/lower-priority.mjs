// @ts-check
import { setPriority } from "node:os";

/**
 * Lowers the calling worker thread to the nice value `nice` (WORKER_NICE, passed as workerData.nice).
 * A nice value belongs to one thread on Linux, so this lowers this thread only (and threads it starts
 * later); not permitted or not supported: it runs at the normal priority.
 * @param {unknown} nice
 */
export function lowerThisThread(nice) {
  const n = Number(nice ?? 0);
  if (!(n > 0)) return;
  try {
    setPriority(n);
  } catch {
    // Not permitted or not supported: run at the normal priority.
  }
}
