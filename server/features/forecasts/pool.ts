import type { ForecastRequest, ForecastResponse } from "../../../common/forecasts.ts";
import { ValidationError } from "../../errors.ts";
import type { CustomCurveData } from "../../physics/forecast/forecast.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import type { InspiralForecastInput, InspiralWidths } from "../../physics/ringdown/forecast-widths.ts";
import type { CompiledCatalogue } from "../convert/compiled-catalogue.ts";
import type { CatalogueSnapshot } from "../convert/catalogue-snapshot.ts";
import { OneThreadPool } from "../../threads/one-thread-pool.ts";

/**
 * One warm worker thread runs the forecasts, one at a time (server/threads/one-thread-pool.ts), so
 * the event loop never does the arithmetic: the Fisher computation and the translation into every
 * theory (run.ts). The thread compiles the catalogue itself and keeps it per revision; the snapshot
 * crosses only when the revision changes.
 */
export interface ForecastPoolOptions {
  readonly timeoutMs?: number;
  readonly maxQueue?: number;
  /** Linux nice value (0-19) the worker thread gives itself, so request threads get the cores first. */
  readonly nice?: number;
}

type Reply =
  | { id: number; ok: true; result: ForecastResponse | InspiralWidths }
  | { id: number; ok: false; name: string; fields: Record<string, string> | null; field: string | null; message: string };

function settle<T>(resolve: (r: T) => void, reject: (e: Error) => void) {
  return (reply: { id: number } & Record<string, unknown>) => {
    const msg = reply as Reply;
    if (msg.ok) resolve(msg.result as T);
    else if (msg.name === "PhysicsInputError" && msg.field !== null) reject(new PhysicsInputError(msg.field, msg.message));
    else if (msg.name === "ValidationError") reject(new ValidationError(msg.message, msg.fields ?? undefined));
    else reject(new Error(msg.message));
  };
}

export class ForecastPool {
  private readonly thread: OneThreadPool;
  /** The catalogue revision the current thread holds (null: none yet). */
  private workerRevision: string | null = null;

  constructor(options: ForecastPoolOptions = {}) {
    this.thread = new OneThreadPool({
      url: new URL("./forecast-worker.mjs", import.meta.url),
      what: "the forecast engine",
      waiting: "forecasts",
      timeoutMs: options.timeoutMs ?? 30_000,
      maxQueue: options.maxQueue ?? 20,
      nice: options.nice ?? 0,
      onStart: () => {
        this.workerRevision = null;
      },
    });
  }

  run(request: ForecastRequest, curves: readonly CustomCurveData[], catalogue: CompiledCatalogue | null): Promise<ForecastResponse> {
    return new Promise((resolve, reject) => {
      this.thread.submit({
        send: (worker, id) => {
          const revision = catalogue?.revision ?? null;
          const snapshot: CatalogueSnapshot | null = catalogue && revision !== this.workerRevision ? { revision: catalogue.revision, theories: catalogue.theories.map((t) => t.theory) } : null;
          worker.postMessage({ id, kind: "forecast", request, curves, revision, snapshot });
          this.workerRevision = revision ?? this.workerRevision;
        },
        settle: settle(resolve, reject),
        reject,
      });
    });
  }

  /** The inspiral side of an IMR consistency forecast (a Fisher matrix on f_low .. split frequency), off the event loop. */
  inspiralWidths(input: InspiralForecastInput): Promise<InspiralWidths> {
    return new Promise((resolve, reject) => {
      this.thread.submit({ send: (worker, id) => worker.postMessage({ id, kind: "widths", input }), settle: settle(resolve, reject), reject });
    });
  }

  close(): Promise<void> {
    return this.thread.close();
  }
}

let shared: ForecastPool | undefined;

/** The process-wide pool (its thread starts on the first forecast and is unref'd); options apply when it is created. */
export function getForecastPool(options: ForecastPoolOptions = {}): ForecastPool {
  if (shared === undefined) shared = new ForecastPool(options);
  return shared;
}

/** Ends the shared pool (server shutdown, test teardown); a later getForecastPool() starts a new one. */
export async function closeForecastPool(): Promise<void> {
  const pool = shared;
  shared = undefined;
  if (pool !== undefined) await pool.close();
}
