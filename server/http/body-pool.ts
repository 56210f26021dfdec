import { Worker } from "node:worker_threads";
import { AppError, ServiceUnavailableError, ValidationError } from "../errors.ts";
import type { BodyKind, BodyValue } from "./body-kinds.ts";

/**
 * One warm worker thread reads large JSON bodies (decode, JSON.parse, text guard, schema) one at a
 * time, the pattern of the forecast pool (server/features/forecasts/pool.ts): the bytes are handed
 * over without a copy, the validated value comes back with its number columns handed over too, and
 * a 400 comes back as the same 400. A body that overruns its deadline has the worker terminated and
 * replaced; a queue that grows too long is refused with 503 rather than letting bodies pile up.
 */
export interface BodyPoolOptions {
  readonly timeoutMs?: number;
  readonly maxQueue?: number;
  /** Linux nice value (0-19) the worker thread gives itself, so the request thread gets the cores first. */
  readonly nice?: number;
}

interface Job {
  readonly id: number;
  readonly kind: BodyKind;
  readonly bytes: ArrayBuffer;
  readonly resolve: (value: unknown) => void;
  readonly reject: (e: Error) => void;
}

type WorkerMessage =
  | { ready: true }
  | { id: number; ok: true; value: unknown }
  | { id: number; ok: false; status: number; code: string; fields: Record<string, string> | null; message: string };

const WORKER_URL = new URL("./body-worker.mjs", import.meta.url);
const RETRY_AFTER_SECONDS = 2;

export class BodyPool {
  private worker: Worker | undefined;
  private ready: Promise<void> | undefined;
  private readonly queue: Job[] = [];
  private running: { job: Job; timer: NodeJS.Timeout } | undefined;
  private nextId = 1;
  private closed = false;
  private readonly timeoutMs: number;
  private readonly maxQueue: number;
  private readonly nice: number;

  constructor(options: BodyPoolOptions = {}) {
    this.timeoutMs = options.timeoutMs ?? 10_000;
    this.maxQueue = options.maxQueue ?? 16;
    this.nice = options.nice ?? 0;
  }

  /** The bytes (handed over: the caller must not use them afterwards) to the validated value of `kind`. */
  read<K extends BodyKind>(kind: K, bytes: ArrayBuffer): Promise<BodyValue<K>> {
    if (this.closed) return Promise.reject(new ServiceUnavailableError("the server is shutting down", RETRY_AFTER_SECONDS));
    if (this.queue.length >= this.maxQueue) return Promise.reject(new ServiceUnavailableError("too many large request bodies are waiting to be read; try again shortly", RETRY_AFTER_SECONDS));
    return new Promise((resolve, reject) => {
      this.queue.push({ id: this.nextId++, kind, bytes, resolve: resolve as (value: unknown) => void, reject });
      void this.pump();
    });
  }

  /** Starts the thread now (server start), so the first large body does not wait for the loader. */
  warm(): Promise<void> {
    return this.start();
  }

  async close(): Promise<void> {
    this.closed = true;
    for (const job of this.queue.splice(0)) job.reject(new ServiceUnavailableError("the server is shutting down", RETRY_AFTER_SECONDS));
    if (this.running) {
      clearTimeout(this.running.timer);
      this.running.job.reject(new ServiceUnavailableError("the server is shutting down", RETRY_AFTER_SECONDS));
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
        if (this.worker === worker) this.lost(new Error(`body worker exited with code ${code}`));
      });
    });
    return this.ready;
  }

  private lost(err: Error): void {
    this.worker = undefined;
    this.ready = undefined;
    if (this.running) {
      clearTimeout(this.running.timer);
      this.running.job.reject(new ServiceUnavailableError(`the request body could not be read: ${err.message}`, RETRY_AFTER_SECONDS));
      this.running = undefined;
    }
    if (!this.closed) void this.pump();
  }

  private finish(msg: Exclude<WorkerMessage, { ready: true }>): void {
    const current = this.running;
    if (!current || current.job.id !== msg.id) return;
    clearTimeout(current.timer);
    this.running = undefined;
    if (msg.ok) current.job.resolve(msg.value);
    else if (msg.code === "validation_failed") current.job.reject(new ValidationError(msg.message, msg.fields ?? undefined));
    else if (msg.status < 500) current.job.reject(new AppError(msg.status, msg.code, msg.message, msg.fields ?? undefined));
    else current.job.reject(new Error(`reading the request body failed: ${msg.message}`));
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
      job.reject(new ServiceUnavailableError(`the request body was not read within ${this.timeoutMs} ms`, RETRY_AFTER_SECONDS));
      void w?.terminate();
      void this.pump();
    }, this.timeoutMs);
    this.running = { job, timer };
    try {
      await this.start();
      this.worker?.postMessage({ id: job.id, kind: job.kind, bytes: job.bytes }, [job.bytes]);
    } catch (err) {
      if (this.running?.job === job) {
        clearTimeout(timer);
        this.running = undefined;
        job.reject(new ServiceUnavailableError(`the body reader could not start: ${err instanceof Error ? err.message : String(err)}`, RETRY_AFTER_SECONDS));
      }
    }
  }
}

let shared: BodyPool | undefined;
let sharedOptions: BodyPoolOptions = {};

/** Options of the process-wide pool (the server passes WORKER_NICE); used when it is next created. */
export function configureBodyPool(options: BodyPoolOptions): void {
  sharedOptions = { ...options };
}

/** The process-wide pool (its thread starts on first use, or at server start, and is unref'd). */
export function getBodyPool(): BodyPool {
  if (shared === undefined) shared = new BodyPool(sharedOptions);
  return shared;
}

/** Ends the shared pool (server shutdown, test teardown); a later getBodyPool() starts a new one. */
export async function closeBodyPool(): Promise<void> {
  const pool = shared;
  shared = undefined;
  if (pool !== undefined) await pool.close();
}
