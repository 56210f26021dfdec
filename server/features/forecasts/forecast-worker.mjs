// @ts-check
// The forecast worker thread (see pool.ts). A full forecast is tens of milliseconds of arithmetic,
// too long for the server's event loop. The engine is TypeScript, so the thread registers the tsx
// loader once when it starts and then stays warm for every later job.
import { parentPort } from "node:worker_threads";
import { register } from "tsx/esm/api";

register();
const { runForecast } = await import("../../physics/forecast/forecast.ts");

if (!parentPort) throw new Error("forecast-worker must run as a worker thread");
const port = parentPort;
port.on("message", (/** @type {{ id: number, input: unknown, curves: unknown[] }} */ job) => {
  try {
    // @ts-expect-error - the job was built from a validated request by pool.ts
    port.postMessage({ id: job.id, ok: true, result: runForecast(job.input, job.curves) });
  } catch (err) {
    const e = /** @type {{ name?: string, field?: string, message?: string }} */ (err);
    port.postMessage({ id: job.id, ok: false, name: e?.name ?? "Error", field: e?.field ?? null, message: e?.message ?? String(err) });
  }
});
port.postMessage({ ready: true });
