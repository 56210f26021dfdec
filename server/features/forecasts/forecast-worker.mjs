// @ts-check
// The forecast worker thread (see pool.ts). A full forecast, with its translation into every theory,
// is tens of milliseconds of arithmetic, too long for the server's event loop. The engine is
// TypeScript, so the thread registers the tsx loader once when it starts and then stays warm; it
// compiles the catalogue snapshot it is sent and keeps it until the revision changes.
import { lowerThisThread } from "../../threads/lower-priority.mjs";
import { parentPort, workerData } from "node:worker_threads";
import { register } from "tsx/esm/api";

// The forecast thread only (WORKER_NICE).
lowerThisThread(workerData?.nice);
register();
const { forecastWithTranslations } = await import("./run.ts");
const { compileCatalogue } = await import("../convert/compiled-catalogue.ts");
const { inspiralRemnantWidths } = await import("../../physics/ringdown/forecast-widths.ts");

if (!parentPort) throw new Error("forecast-worker must run as a worker thread");
const port = parentPort;
/** @type {{ revision: string, compiled: unknown } | null} */
let catalogue = null;
port.on("message", (/** @type {{ id: number, kind: "forecast" | "widths", input?: any, request: any, curves: unknown[], revision: string | null, snapshot: any }} */ job) => {
  try {
    if (job.kind === "widths") {
      port.postMessage({ id: job.id, ok: true, result: inspiralRemnantWidths(job.input) });
      return;
    }
    if (job.snapshot) catalogue = { revision: job.snapshot.revision, compiled: compileCatalogue(job.snapshot) };
    if (job.revision !== null && catalogue?.revision !== job.revision) throw new Error(`the forecast worker lacks catalogue revision ${job.revision}`);
    const compiled = job.revision === null ? null : catalogue?.compiled ?? null;
    // @ts-expect-error - the request was validated and the catalogue compiled by the same code on both sides
    port.postMessage({ id: job.id, ok: true, result: forecastWithTranslations(job.request, job.curves, compiled) });
  } catch (err) {
    const e = /** @type {{ name?: string, fields?: Record<string, string>, field?: string, message?: string }} */ (err);
    port.postMessage({ id: job.id, ok: false, name: e?.name ?? "Error", fields: e?.fields ?? null, field: typeof e?.field === "string" ? e.field : null, message: e?.message ?? String(err) });
  }
});
port.postMessage({ ready: true });
