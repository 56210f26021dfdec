import { readdirSync } from "node:fs";
import { setPriority } from "node:os";

/**
 * Lowers the whole worker process to the nice value `nice` (WORKER_NICE), so the web process and
 * PostgreSQL get the cores first while jobs keep them busy. On Linux a nice value belongs to one
 * thread and a new thread inherits its creator's: the calling thread is lowered first (threads it
 * starts later follow), then every thread already running (libuv's pool, V8's helpers), read from
 * /proc/self/task. Elsewhere the process priority is set once. Returns the threads that could not be
 * lowered (not permitted, or gone meanwhile); the caller logs them and goes on at the normal priority.
 */
export function lowerProcessPriority(nice: number): string[] {
  if (nice <= 0) return [];
  const failed: string[] = [];
  try {
    setPriority(nice);
  } catch (err) {
    failed.push(`main thread: ${err instanceof Error ? err.message : String(err)}`);
  }
  if (process.platform !== "linux") return failed;
  let tids: string[];
  try {
    tids = readdirSync("/proc/self/task");
  } catch {
    return failed;
  }
  for (const tid of tids) {
    if (Number(tid) === process.pid) continue;
    try {
      setPriority(Number(tid), nice);
    } catch (err) {
      failed.push(`thread ${tid}: ${err instanceof Error ? err.message : String(err)}`);
    }
  }
  return failed;
}
