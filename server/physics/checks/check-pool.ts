import { Worker } from "node:worker_threads";
import { getSymbolicPool, SymbolicError, SymbolicTimeoutError, type SymbolicPool } from "../expr/pool.ts";
import type { CheckJob, JobOutcome } from "./check-job.ts";
import type { FromWorker, ToWorker } from "./check-protocol.ts";
import type { CheckResult } from "./types.ts";

/**
 * Every check of untrusted expressions runs here, off the main thread: a few warm worker threads,
 * one job each at a time, each job with a hard time limit (the worker is terminated and replaced).
 * Admission is fair and never waits: a client (an address or an account) may have only
 * `perClient` requests in flight, and the queue holds at most `maxQueue` jobs; beyond either the
 * caller is refused at once with a CheckBusyError that says when to retry. Queued jobs are taken
 * round-robin across clients, so one client's many jobs do not delay another's.
 */
export interface CheckPoolOptions {
  /** Worker threads (default 2). */
  readonly size?: number;
  /** Hard limit per job once a worker runs it (default 8000 ms). */
  readonly timeoutMs?: number;
  /** Requests one client may have in flight (running or queued, default 2). */
  readonly perClient?: number;
  /** Jobs that may wait for a worker (default 32). */
  readonly maxQueue?: number;
  /** The CAS that the workers' symbolic steps run on (default: the shared pool). */
  readonly symbolic?: () => SymbolicPool;
  /** Linux nice value (0-19) each worker thread gives itself (default 0). */
  readonly nice?: number;
}

/** What one job gave: its outcome, or, when the time limit stopped it, the checks it had finished. */
export type JobRun =
  | { readonly kind: "done"; readonly outcome: JobOutcome }
  | { readonly kind: "stopped"; readonly checks: readonly CheckResult[]; readonly reason: string };

export class CheckBusyError extends Error {
  override readonly name = "CheckBusyError";
  constructor(
    /** "client": this client has too much in flight (429); "server": the queue is full (503). */
    readonly scope: "client" | "server",
    message: string,
    readonly retryAfterSeconds: number,
  ) {
    super(message);
  }
}

interface Task {
  readonly id: number;
  readonly client: string;
  readonly job: CheckJob;
  readonly checks: CheckResult[];
  readonly resolve: (r: JobRun) => void;
  timer?: NodeJS.Timeout;
}

interface Slot {
  worker: Worker;
  ready: boolean;
  task: Task | undefined;
  retired: boolean;
}

const WORKER_URL = new URL("./check-worker.mjs", import.meta.url);
const MAX_START_FAILURES = 3;

export class CheckPool {
  readonly size: number;
  readonly timeoutMs: number;
  readonly perClient: number;
  readonly maxQueue: number;
  private readonly symbolic: () => SymbolicPool;
  private readonly nice: number;
  private readonly slots: Slot[] = [];
  /** Waiting tasks per client, and the order in which clients are served. */
  private readonly waiting = new Map<string, Task[]>();
  private readonly inFlight = new Map<string, number>();
  private queued = 0;
  private nextId = 1;
  private closed = false;
  private startFailures = 0;

  constructor(options: CheckPoolOptions = {}) {
    this.size = Math.max(1, Math.floor(options.size ?? 2));
    this.timeoutMs = options.timeoutMs ?? 8000;
    this.perClient = Math.max(1, options.perClient ?? 2);
    this.maxQueue = Math.max(1, options.maxQueue ?? 32);
    this.symbolic = options.symbolic ?? getSymbolicPool;
    this.nice = options.nice ?? 0;
  }

  /** Starts the workers (the first job would otherwise wait for a cold start of about a second). */
  async warm(): Promise<void> {
    this.ensureWorkers();
    await Promise.all(this.slots.map((s) => (s.ready ? undefined : new Promise<void>((resolve) => s.worker.once("message", () => resolve())))));
  }

  /** Running and waiting work, for tests and the benchmark. */
  stats(): { running: number; queued: number; clients: number } {
    return { running: this.slots.filter((s) => s.task !== undefined).length, queued: this.queued, clients: this.inFlight.size };
  }

  /**
   * Runs the jobs of one request for `client`. Throws CheckBusyError at once when the client
   * already has `perClient` requests in flight or the queue has no room for the jobs.
   */
  async run(client: string, jobs: readonly CheckJob[]): Promise<JobRun[]> {
    if (this.closed) throw new CheckBusyError("server", "the check workers are shutting down", 5);
    if (this.startFailures >= MAX_START_FAILURES) throw new CheckBusyError("server", "the check workers failed to start", 30);
    const mine = this.inFlight.get(client) ?? 0;
    if (mine >= this.perClient) {
      throw new CheckBusyError(
        "client",
        `You already have ${mine} expression check${mine === 1 ? "" : "s"} running (the limit is ${this.perClient} at a time); wait for ${mine === 1 ? "it" : "them"} to finish.`,
        Math.max(1, Math.ceil(this.timeoutMs / 4000)),
      );
    }
    const free = this.slots.length === 0 ? this.size : this.slots.filter((s) => s.ready && s.task === undefined).length;
    if (this.queued + jobs.length - free > this.maxQueue) {
      throw new CheckBusyError("server", `The expression checker is busy (${this.queued} checks waiting); try again shortly.`, Math.max(2, Math.ceil(this.timeoutMs / 1000)));
    }
    this.inFlight.set(client, mine + 1);
    try {
      return await Promise.all(jobs.map((job) => this.enqueue(client, job)));
    } finally {
      const left = (this.inFlight.get(client) ?? 1) - 1;
      if (left <= 0) this.inFlight.delete(client);
      else this.inFlight.set(client, left);
    }
  }

  /** Stops every worker; waiting and running jobs end as stopped. */
  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    for (const tasks of this.waiting.values()) for (const t of tasks) t.resolve({ kind: "stopped", checks: t.checks, reason: "the server is shutting down" });
    this.waiting.clear();
    this.queued = 0;
    await Promise.all(
      this.slots.map(async (slot) => {
        slot.retired = true;
        if (slot.task !== undefined) this.finish(slot, { kind: "stopped", checks: slot.task.checks, reason: "the server is shutting down" });
        await slot.worker.terminate();
      }),
    );
  }

  private enqueue(client: string, job: CheckJob): Promise<JobRun> {
    this.ensureWorkers();
    return new Promise<JobRun>((resolve) => {
      const task: Task = { id: this.nextId++, client, job, checks: [], resolve };
      const list = this.waiting.get(client);
      if (list === undefined) this.waiting.set(client, [task]);
      else list.push(task);
      this.queued += 1;
      this.dispatch();
    });
  }

  private ensureWorkers(): void {
    if (this.closed) return;
    while (this.slots.length < this.size) this.slots.push(this.spawn());
  }

  /** The next task, round-robin: the first waiting client is served, then moves to the back. */
  private take(): Task | undefined {
    for (const [client, tasks] of this.waiting) {
      const task = tasks.shift();
      this.waiting.delete(client);
      if (tasks.length > 0) this.waiting.set(client, tasks);
      if (task !== undefined) {
        this.queued -= 1;
        return task;
      }
    }
    return undefined;
  }

  private dispatch(): void {
    for (const slot of this.slots) {
      if (this.queued === 0) return;
      if (!slot.ready || slot.retired || slot.task !== undefined) continue;
      const task = this.take();
      if (task === undefined) return;
      slot.task = task;
      task.timer = setTimeout(() => this.timeout(slot, task), this.timeoutMs);
      const msg: ToWorker = { type: "job", id: task.id, job: task.job };
      slot.worker.postMessage(msg);
    }
  }

  private spawn(): Slot {
    const worker = new Worker(WORKER_URL, {
      execArgv: [],
      resourceLimits: { maxOldGenerationSizeMb: 512, stackSizeMb: 4 },
      workerData: { nice: this.nice },
    });
    worker.unref();
    const slot: Slot = { worker, ready: false, task: undefined, retired: false };
    worker.on("message", (msg: FromWorker) => this.onMessage(slot, msg));
    worker.on("error", (err: Error) => this.lost(slot, err.message));
    worker.on("exit", (code) => this.lost(slot, `exited with code ${code}`));
    return slot;
  }

  private onMessage(slot: Slot, msg: FromWorker): void {
    if (msg.type === "ready") {
      slot.ready = true;
      this.startFailures = 0;
      this.dispatch();
      return;
    }
    const task = slot.task;
    if (task === undefined || task.id !== msg.id) return;
    switch (msg.type) {
      case "check":
        task.checks.push(msg.check);
        return;
      case "done":
        this.finish(slot, { kind: "done", outcome: msg.outcome });
        this.dispatch();
        return;
      case "crashed":
        // An engine bug, not the input's fault: report it like a stop, so nothing reads it as a verdict.
        this.finish(slot, { kind: "stopped", checks: task.checks, reason: `the check failed unexpectedly (${msg.message.slice(0, 200)})` });
        this.dispatch();
        return;
      case "cas":
        this.forwardCas(slot, task, msg);
        return;
    }
  }

  private forwardCas(slot: Slot, task: Task, msg: Extract<FromWorker, { type: "cas" }>): void {
    const reply = (answer: ToWorker) => {
      if (slot.task === task && !slot.retired) slot.worker.postMessage(answer);
    };
    let pool: SymbolicPool;
    try {
      pool = this.symbolic();
    } catch (err) {
      reply({ type: "cas_result", callId: msg.callId, ok: false, code: "unavailable", message: err instanceof Error ? err.message : String(err) });
      return;
    }
    pool.run(msg.op, msg.timeoutMs === undefined ? {} : { timeoutMs: msg.timeoutMs }).then(
      (result) => reply({ type: "cas_result", callId: msg.callId, ok: true, result }),
      (err: unknown) => {
        const code = err instanceof SymbolicError ? err.code : "failed";
        const message = err instanceof Error ? err.message : String(err);
        reply({ type: "cas_result", callId: msg.callId, ok: false, code, message, ...(err instanceof SymbolicTimeoutError ? { timeoutMs: err.timeoutMs } : {}) });
      },
    );
  }

  private finish(slot: Slot, run: JobRun): void {
    const task = slot.task;
    if (task === undefined) return;
    slot.task = undefined;
    clearTimeout(task.timer);
    task.resolve(run);
  }

  private timeout(slot: Slot, task: Task): void {
    if (slot.task !== task) return;
    slot.retired = true;
    this.finish(slot, { kind: "stopped", checks: task.checks, reason: `did not finish within the time limit of ${this.timeoutMs} ms` });
    void slot.worker.terminate();
    this.replace(slot);
    this.dispatch();
  }

  private lost(slot: Slot, reason: string): void {
    if (slot.retired) return;
    slot.retired = true;
    if (!slot.ready) this.startFailures += 1;
    if (slot.task !== undefined) this.finish(slot, { kind: "stopped", checks: slot.task.checks, reason: `the check worker stopped (${reason})` });
    this.replace(slot);
    this.dispatch();
  }

  private replace(slot: Slot): void {
    const at = this.slots.indexOf(slot);
    if (at < 0 || this.closed) return;
    if (this.startFailures >= MAX_START_FAILURES) {
      this.slots.splice(at, 1);
      if (this.slots.length === 0) {
        for (const tasks of this.waiting.values()) for (const t of tasks) t.resolve({ kind: "stopped", checks: t.checks, reason: "the check workers failed to start" });
        this.waiting.clear();
        this.queued = 0;
      }
      return;
    }
    this.slots[at] = this.spawn();
  }
}
