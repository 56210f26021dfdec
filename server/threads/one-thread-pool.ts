import { Worker } from "node:worker_threads";
import { ServiceUnavailableError } from "../errors.ts";

/**
 * One warm worker thread that takes jobs one at a time, for work too long for the event loop: the
 * forecasts (server/features/forecasts/pool.ts) and large JSON bodies (server/http/body-pool.ts).
 * The thread starts on first use (or warm()), is unref'd, and answers `{ ready: true }` once loaded,
 * then `{ id, ... }` per job. A job that overruns its deadline has the thread terminated and
 * replaced; a queue that grows too long is refused with 503 rather than letting jobs pile up.
 */
export interface OneThreadPoolOptions {
  /** The worker script. */
  readonly url: URL;
  /** What the thread does, for messages: "the forecast engine", "the body reader". */
  readonly what: string;
  /** What waits, for the 503 when too many do: "forecasts", "large request bodies". */
  readonly waiting: string;
  readonly timeoutMs: number;
  readonly maxQueue: number;
  /** Linux nice value (0-19) the worker thread gives itself (workerData.nice), so request threads get the cores first. */
  readonly nice: number;
  readonly maxOldGenerationSizeMb?: number;
  /** Retry-After of the 503s, when set. */
  readonly retryAfterSeconds?: number;
  /** Called when a new thread starts (state the thread holds is gone). */
  readonly onStart?: () => void;
}

export interface ThreadJob {
  /** Posts the job to the thread, when it is the job's turn and the thread is ready. */
  send(worker: Worker, id: number): void;
  /** The thread's answer to this job. */
  settle(reply: { id: number } & Record<string, unknown>): void;
  reject(err: Error): void;
}

export class OneThreadPool {
  private worker: Worker | undefined;
  private ready: Promise<void> | undefined;
  private readonly queue: { id: number; job: ThreadJob }[] = [];
  private running: { id: number; job: ThreadJob; timer: NodeJS.Timeout } | undefined;
  private nextId = 1;
  private closed = false;

  constructor(private readonly options: OneThreadPoolOptions) {}

  private unavailable(message: string): ServiceUnavailableError {
    return new ServiceUnavailableError(message, this.options.retryAfterSeconds);
  }

  /** Queues the job, or rejects it at once (closing, or too many waiting). */
  submit(job: ThreadJob): void {
    if (this.closed) return job.reject(this.unavailable(`${this.options.what} is shutting down`));
    if (this.queue.length >= this.options.maxQueue) return job.reject(this.unavailable(`too many ${this.options.waiting} are waiting; try again shortly`));
    this.queue.push({ id: this.nextId++, job });
    void this.pump();
  }

  /** Starts the thread now (server start), so the first job does not wait for it to load. */
  warm(): Promise<void> {
    return this.start();
  }

  async close(): Promise<void> {
    this.closed = true;
    for (const { job } of this.queue.splice(0)) job.reject(this.unavailable(`${this.options.what} is shutting down`));
    if (this.running) {
      clearTimeout(this.running.timer);
      this.running.job.reject(this.unavailable(`${this.options.what} is shutting down`));
      this.running = undefined;
    }
    const w = this.worker;
    this.worker = undefined;
    if (w) await w.terminate();
  }

  private start(): Promise<void> {
    if (this.ready) return this.ready;
    const worker = new Worker(this.options.url, { resourceLimits: { maxOldGenerationSizeMb: this.options.maxOldGenerationSizeMb ?? 256 }, workerData: { nice: this.options.nice } });
    this.worker = worker;
    this.options.onStart?.();
    worker.unref();
    this.ready = new Promise<void>((resolve, reject) => {
      worker.on("message", (msg: { ready: true } | ({ id: number } & Record<string, unknown>)) => {
        if ("ready" in msg) return resolve();
        this.finish(msg);
      });
      worker.on("error", (err) => {
        reject(err);
        this.lost(err);
      });
      worker.on("exit", (code) => {
        if (this.worker === worker) this.lost(new Error(`${this.options.what} exited with code ${code}`));
      });
    });
    return this.ready;
  }

  private lost(err: Error): void {
    this.worker = undefined;
    this.ready = undefined;
    if (this.running) {
      clearTimeout(this.running.timer);
      this.running.job.reject(this.unavailable(`${this.options.what} failed: ${err.message}`));
      this.running = undefined;
    }
    if (!this.closed) void this.pump();
  }

  private finish(msg: { id: number } & Record<string, unknown>): void {
    const current = this.running;
    if (!current || current.id !== msg.id) return;
    clearTimeout(current.timer);
    this.running = undefined;
    current.job.settle(msg);
    void this.pump();
  }

  private async pump(): Promise<void> {
    if (this.running || this.queue.length === 0 || this.closed) return;
    const { id, job } = this.queue.shift()!;
    const timer = setTimeout(() => {
      const w = this.worker;
      this.worker = undefined;
      this.ready = undefined;
      this.running = undefined;
      job.reject(this.unavailable(`${this.options.what} did not finish within ${this.options.timeoutMs} ms and was stopped`));
      void w?.terminate();
      void this.pump();
    }, this.options.timeoutMs);
    this.running = { id, job, timer };
    try {
      await this.start();
      if (this.worker) job.send(this.worker, id);
    } catch (err) {
      if (this.running?.id === id) {
        clearTimeout(timer);
        this.running = undefined;
        job.reject(this.unavailable(`${this.options.what} could not start: ${err instanceof Error ? err.message : String(err)}`));
      }
    }
  }
}
