import { Worker } from "node:worker_threads";
import type { ForecastRequest, ForecastResponse } from "../../../common/forecasts.ts";
import { ServiceUnavailableError, ValidationError } from "../../errors.ts";
import type { CustomCurveData } from "../../physics/forecast/forecast.ts";
import { PhysicsInputError } from "../../physics/input-error.ts";
import type { InspiralForecastInput, InspiralWidths } from "../../physics/ringdown/forecast-widths.ts";
import type { CompiledCatalogue } from "../convert/compiled-catalogue.ts";
import type { CatalogueSnapshot } from "../convert/catalogue-snapshot.ts";

/**
 * One warm worker thread runs the forecasts, one at a time, so the event loop never does the
 * arithmetic: the Fisher computation and the translation into every theory (run.ts). The thread
 * compiles the catalogue itself and keeps it per revision; the snapshot crosses only when the
 * revision changes. A job that overruns its deadline has the worker terminated and replaced; a queue
 * that grows too long is refused with 503 rather than letting requests pile up.
 */
export interface ForecastPoolOptions {
  readonly timeoutMs?: number;
  readonly maxQueue?: number;
  /** Linux nice value (0-19) the worker thread gives itself, so request threads get the cores first. */
  readonly nice?: number;
}

/** A forecast with its translations, or the inspiral widths of an IMR consistency test (forecast-widths.ts). */
type Job =
  | {
      readonly kind: "forecast";
      readonly id: number;
      readonly request: ForecastRequest;
      readonly curves: readonly CustomCurveData[];
      readonly catalogue: CompiledCatalogue | null;
      readonly resolve: (r: ForecastResponse) => void;
      readonly reject: (e: Error) => void;
    }
  | {
      readonly kind: "widths";
      readonly id: number;
      readonly input: InspiralForecastInput;
      readonly catalogue: null;
      readonly resolve: (r: InspiralWidths) => void;
      readonly reject: (e: Error) => void;
    };

type WorkerMessage =
  | { ready: true }
  | { id: number; ok: true; result: ForecastResponse | InspiralWidths }
  | { id: number; ok: false; name: string; fields: Record<string, string> | null; field: string | null; message: string };

const WORKER_URL = new URL("./forecast-worker.mjs", import.meta.url);

export class ForecastPool {
  private worker: Worker | undefined;
  private ready: Promise<void> | undefined;
  private readonly queue: Job[] = [];
  private running: { job: Job; timer: NodeJS.Timeout } | undefined;
  private nextId = 1;
  /** The catalogue revision the current thread holds (null: none yet). */
  private workerRevision: string | null = null;
  private closed = false;
  private readonly timeoutMs: number;
  private readonly maxQueue: number;
  private readonly nice: number;

  constructor(options: ForecastPoolOptions = {}) {
    this.timeoutMs = options.timeoutMs ?? 30_000;
    this.maxQueue = options.maxQueue ?? 20;
    this.nice = options.nice ?? 0;
  }

  run(request: ForecastRequest, curves: readonly CustomCurveData[], catalogue: CompiledCatalogue | null): Promise<ForecastResponse> {
    const refused = this.refusal();
    if (refused) return Promise.reject(refused);
    return new Promise((resolve, reject) => {
      this.queue.push({ kind: "forecast", id: this.nextId++, request, curves, catalogue, resolve, reject });
      void this.pump();
    });
  }

  /** The inspiral side of an IMR consistency forecast (a Fisher matrix on f_low .. split frequency), off the event loop. */
  inspiralWidths(input: InspiralForecastInput): Promise<InspiralWidths> {
    const refused = this.refusal();
    if (refused) return Promise.reject(refused);
    return new Promise((resolve, reject) => {
      this.queue.push({ kind: "widths", id: this.nextId++, input, catalogue: null, resolve, reject });
      void this.pump();
    });
  }

  private refusal(): Error | null {
    if (this.closed) return new ServiceUnavailableError("the forecast engine is shutting down");
    if (this.queue.length >= this.maxQueue) return new ServiceUnavailableError("too many forecasts are waiting; try again shortly");
    return null;
  }

  async close(): Promise<void> {
    this.closed = true;
    for (const job of this.queue.splice(0)) job.reject(new ServiceUnavailableError("the forecast engine is shutting down"));
    if (this.running) {
      clearTimeout(this.running.timer);
      this.running.job.reject(new ServiceUnavailableError("the forecast engine is shutting down"));
      this.running = undefined;
    }
    const w = this.worker;
    this.worker = undefined;
    if (w) await w.terminate();
  }

  private start(): Promise<void> {
    if (this.ready) return this.ready;
    const worker = new Worker(WORKER_URL, { resourceLimits: { maxOldGenerationSizeMb: 256 }, workerData: { nice: this.nice } });
    this.worker = worker;
    this.workerRevision = null;
    worker.unref();
    this.ready = new Promise<void>((resolve, reject) => {
      worker.on("message", (msg: WorkerMessage) => {
        if ("ready" in msg) return resolve();
        this.finish(msg);
      });
      worker.on("error", (err) => {
        reject(err);
        this.lost(err);
      });
      worker.on("exit", (code) => {
        if (this.worker === worker) this.lost(new Error(`forecast worker exited with code ${code}`));
      });
    });
    return this.ready;
  }

  private lost(err: Error): void {
    this.worker = undefined;
    this.ready = undefined;
    if (this.running) {
      clearTimeout(this.running.timer);
      this.running.job.reject(new ServiceUnavailableError(`the forecast engine failed: ${err.message}`));
      this.running = undefined;
    }
    if (!this.closed) void this.pump();
  }

  private finish(msg: Exclude<WorkerMessage, { ready: true }>): void {
    const current = this.running;
    if (!current || current.job.id !== msg.id) return;
    clearTimeout(current.timer);
    this.running = undefined;
    if (msg.ok) (current.job.resolve as (r: ForecastResponse | InspiralWidths) => void)(msg.result);
    else if (msg.name === "PhysicsInputError" && msg.field !== null) current.job.reject(new PhysicsInputError(msg.field, msg.message));
    else if (msg.name === "ValidationError") current.job.reject(new ValidationError(msg.message, msg.fields ?? undefined));
    else current.job.reject(new Error(msg.message));
    void this.pump();
  }

  private async pump(): Promise<void> {
    if (this.running || this.queue.length === 0 || this.closed) return;
    const job = this.queue.shift()!;
    const timer = setTimeout(() => {
      const w = this.worker;
      this.worker = undefined;
      this.ready = undefined;
      this.running = undefined;
      job.reject(new ServiceUnavailableError(`the forecast did not finish within ${this.timeoutMs} ms and was stopped`));
      void w?.terminate();
      void this.pump();
    }, this.timeoutMs);
    this.running = { job, timer };
    try {
      await this.start();
      const revision = job.kind === "forecast" ? (job.catalogue?.revision ?? null) : this.workerRevision;
      const snapshot: CatalogueSnapshot | null =
        job.catalogue && revision !== this.workerRevision ? { revision: job.catalogue.revision, theories: job.catalogue.theories.map((t) => t.theory) } : null;
      if (job.kind === "widths") this.worker?.postMessage({ id: job.id, kind: "widths", input: job.input });
      else this.worker?.postMessage({ id: job.id, kind: "forecast", request: job.request, curves: job.curves, revision, snapshot });
      this.workerRevision = revision ?? this.workerRevision;
    } catch (err) {
      if (this.running?.job === job) {
        clearTimeout(timer);
        this.running = undefined;
        job.reject(new ServiceUnavailableError(`the forecast engine could not start: ${err instanceof Error ? err.message : String(err)}`));
      }
    }
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
