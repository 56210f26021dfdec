import { Worker } from "node:worker_threads";
import { DERIVED_LIMITS, type Node } from "./ast.ts";
import { guardExpression } from "./guard.ts";
import { printExpression } from "./print.ts";
import type { SymbolicOp, SymbolicRequest, SymbolicResponse, SymbolicResult } from "./symbolic-protocol.ts";

/**
 * nerdamer is synchronous and some inputs take minutes (expand((a+b+c+d)^20)), so every symbolic
 * job runs in a worker thread with a memory cap and a hard deadline. A worker that overruns is
 * terminated and replaced; the caller gets SymbolicTimeoutError, never a hang.
 */
export interface SymbolicPoolOptions {
  /** Number of warm workers (default 2). */
  readonly size?: number;
  /** Hard limit per job once it runs (default 2000 ms). */
  readonly timeoutMs?: number;
  /** How long a job may wait for a free worker (default 10 000 ms). */
  readonly queueTimeoutMs?: number;
  /** Jobs waiting beyond this are refused at once (default 100). */
  readonly maxQueue?: number;
  /**
   * Runs each op elsewhere instead of in this pool's own workers (none are started): a check
   * worker hands its CAS jobs to the main thread's pool this way, so every check shares the same
   * two CAS workers, their queue and their deadlines.
   */
  readonly transport?: (op: SymbolicOp, options: { timeoutMs?: number }) => Promise<SymbolicResult>;
  /** Linux nice value (0-19) each worker thread gives itself (default 0; the server sets WORKER_NICE). */
  readonly nice?: number;
}

export type SymbolicErrorCode = "timeout" | "failed" | "worker_lost" | "busy" | "closed" | "unavailable" | "unrepresentable";

export class SymbolicError extends Error {
  override readonly name: string = "SymbolicError";
  constructor(
    readonly code: SymbolicErrorCode,
    message: string,
  ) {
    super(message);
  }
}

export class SymbolicTimeoutError extends SymbolicError {
  override readonly name = "SymbolicTimeoutError";
  constructor(readonly timeoutMs: number) {
    super("timeout", `symbolic computation did not finish within ${timeoutMs} ms and was stopped`);
  }
}

interface Job {
  readonly id: number;
  readonly op: SymbolicOp;
  readonly timeoutMs: number;
  readonly resolve: (r: SymbolicResult) => void;
  readonly reject: (e: Error) => void;
  queueTimer?: NodeJS.Timeout;
  runTimer?: NodeJS.Timeout;
}

interface Slot {
  worker: Worker;
  ready: boolean;
  job: Job | undefined;
  retired: boolean;
}

const WORKER_URL = new URL("./symbolic-worker.mjs", import.meta.url);
const MAX_START_FAILURES = 3;

export class SymbolicPool {
  private readonly size: number;
  private readonly timeoutMs: number;
  private readonly queueTimeoutMs: number;
  private readonly maxQueue: number;
  private readonly slots: Slot[] = [];
  private readonly queue: Job[] = [];
  private nextId = 1;
  private closed = false;
  private startFailures = 0;
  private readonly transport: SymbolicPoolOptions["transport"];
  private readonly nice: number;

  constructor(options: SymbolicPoolOptions = {}) {
    this.transport = options.transport;
    this.nice = options.nice ?? 0;
    this.size = this.transport === undefined ? Math.max(1, Math.floor(options.size ?? 2)) : 0;
    this.timeoutMs = options.timeoutMs ?? 2000;
    this.queueTimeoutMs = options.queueTimeoutMs ?? 10_000;
    this.maxQueue = options.maxQueue ?? 100;
    for (let k = 0; k < this.size; k += 1) this.slots.push(this.spawn());
  }

  /** Resolves once every worker has loaded nerdamer (a cold worker costs ~150 ms). */
  async warm(): Promise<void> {
    await Promise.all(Array.from({ length: this.size }, () => this.run({ op: "ping" })));
  }

  /** nerdamer simplify of a guarded expression in `symbols`; the result is in the same names. */
  async simplify(expression: string, symbols: readonly string[], options: { timeoutMs?: number } = {}): Promise<string> {
    return this.textJob("simplify", expression, symbols, options);
  }

  async expand(expression: string, symbols: readonly string[], options: { timeoutMs?: number } = {}): Promise<string> {
    return this.textJob("expand", expression, symbols, options);
  }

  /** Solutions of expression = 0 for `variable`, as nerdamer prints them ([a,b,...]). */
  async solve(
    expression: string,
    variable: string,
    symbols: readonly string[],
    options: { timeoutMs?: number } = {},
  ): Promise<string> {
    const guarded = guardExpression(expression, { symbols });
    guardExpression(variable, { symbols });
    const names = new Neutral([...guarded.symbols.keys(), variable]);
    const result = await this.run(
      { op: "solve", expression: names.print(guarded.ast), variable: names.out(variable) },
      options,
    );
    if (result.kind !== "text") throw new SymbolicError("failed", "unexpected worker answer");
    return names.back(result.text);
  }

  /**
   * Whether a difference is identically zero. `candidates` are the same difference with more and
   * more definitions substituted; the first that simplifies to 0 decides. `false` means "not
   * shown to be zero", which is inconclusive for non-polynomial expressions.
   */
  async isZero(candidates: readonly Node[], options: { timeoutMs?: number } = {}): Promise<{ zero: boolean; level: number }> {
    const names = new Neutral(candidates.flatMap((c) => [...collectNames(c)]));
    const result = await this.run({ op: "is_zero", candidates: candidates.map((c) => names.print(c)) }, options);
    if (result.kind !== "zero") throw new SymbolicError("failed", "unexpected worker answer");
    return { zero: result.zero, level: result.level };
  }

  /** Low-level entry: the op must already hold printer output (never raw user text). */
  run(op: SymbolicOp, options: { timeoutMs?: number } = {}): Promise<SymbolicResult> {
    if (this.closed) return Promise.reject(new SymbolicError("closed", "the symbolic pool is closed"));
    if (this.transport !== undefined) return this.transport(op, options);
    if (this.startFailures >= MAX_START_FAILURES) {
      return Promise.reject(new SymbolicError("unavailable", "symbolic workers failed to start"));
    }
    if (this.queue.length >= this.maxQueue) {
      return Promise.reject(new SymbolicError("busy", "too many symbolic jobs are waiting; try again shortly"));
    }
    return new Promise<SymbolicResult>((resolve, reject) => {
      const job: Job = { id: this.nextId++, op, timeoutMs: options.timeoutMs ?? this.timeoutMs, resolve, reject };
      job.queueTimer = setTimeout(() => {
        const at = this.queue.indexOf(job);
        if (at >= 0) {
          this.queue.splice(at, 1);
          reject(new SymbolicError("busy", `no symbolic worker became free within ${this.queueTimeoutMs} ms`));
        }
      }, this.queueTimeoutMs);
      this.queue.push(job);
      this.dispatch();
    });
  }

  /** Stops every worker; pending and queued jobs are rejected with code "closed". */
  async close(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    for (const job of this.queue.splice(0)) {
      clearTimeout(job.queueTimer);
      job.reject(new SymbolicError("closed", "the symbolic pool was closed"));
    }
    await Promise.all(
      this.slots.map(async (slot) => {
        slot.retired = true;
        if (slot.job !== undefined) this.finish(slot, new SymbolicError("closed", "the symbolic pool was closed"));
        await slot.worker.terminate();
      }),
    );
  }

  private async textJob(
    op: "simplify" | "expand",
    expression: string,
    symbols: readonly string[],
    options: { timeoutMs?: number },
  ): Promise<string> {
    const guarded = guardExpression(expression, { symbols });
    const names = new Neutral([...guarded.symbols.keys()]);
    const result = await this.run({ op, expression: names.print(guarded.ast) }, options);
    if (result.kind !== "text") throw new SymbolicError("failed", "unexpected worker answer");
    const text = names.back(result.text);
    try {
      return printExpression(guardExpression(text, { symbols, limits: DERIVED_LIMITS }).ast);
    } catch {
      throw new SymbolicError("unrepresentable", `the result "${text.slice(0, 200)}" uses functions or values outside the expression language`);
    }
  }

  private spawn(): Slot {
    const worker = new Worker(WORKER_URL, {
      // The worker is plain JS: don't inherit the parent's TypeScript loader (tsx), which
      // would triple the cold-start time.
      execArgv: [],
      resourceLimits: { maxOldGenerationSizeMb: 256, stackSizeMb: 4 },
      workerData: { nice: this.nice },
    });
    // Idle workers must not keep the process alive; a running job's timer does.
    worker.unref();
    const slot: Slot = { worker, ready: false, job: undefined, retired: false };
    worker.on("message", (msg: SymbolicResponse | { ready: true }) => {
      if ("ready" in msg) {
        slot.ready = true;
        this.startFailures = 0;
        this.dispatch();
        return;
      }
      const job = slot.job;
      if (job === undefined || job.id !== msg.id) return;
      if (msg.ok) this.finish(slot, undefined, msg.result);
      else this.finish(slot, new SymbolicError("failed", `symbolic computation failed: ${msg.error}`));
      this.dispatch();
    });
    worker.on("error", (err: Error) => this.lost(slot, err.message));
    worker.on("exit", (code) => this.lost(slot, `worker exited with code ${code}`));
    return slot;
  }

  private lost(slot: Slot, reason: string): void {
    if (slot.retired) return;
    slot.retired = true;
    if (!slot.ready) this.startFailures += 1;
    if (slot.job !== undefined) this.finish(slot, new SymbolicError("worker_lost", `symbolic worker stopped: ${reason}`));
    this.replace(slot);
  }

  private replace(slot: Slot): void {
    const at = this.slots.indexOf(slot);
    if (at < 0 || this.closed) return;
    if (this.startFailures >= MAX_START_FAILURES) {
      this.slots.splice(at, 1);
      for (const job of this.queue.splice(0)) {
        clearTimeout(job.queueTimer);
        job.reject(new SymbolicError("unavailable", "symbolic workers failed to start"));
      }
      return;
    }
    this.slots[at] = this.spawn();
  }

  private finish(slot: Slot, error: Error | undefined, result?: SymbolicResult): void {
    const job = slot.job;
    if (job === undefined) return;
    slot.job = undefined;
    clearTimeout(job.runTimer);
    if (error !== undefined) job.reject(error);
    else job.resolve(result as SymbolicResult);
  }

  private dispatch(): void {
    for (const slot of this.slots) {
      if (this.queue.length === 0) return;
      if (!slot.ready || slot.retired || slot.job !== undefined) continue;
      const job = this.queue.shift() as Job;
      clearTimeout(job.queueTimer);
      slot.job = job;
      job.runTimer = setTimeout(() => this.timeout(slot, job), job.timeoutMs);
      const request: SymbolicRequest = { ...job.op, id: job.id };
      slot.worker.postMessage(request);
    }
  }

  private timeout(slot: Slot, job: Job): void {
    if (slot.job !== job) return;
    slot.retired = true;
    this.finish(slot, new SymbolicTimeoutError(job.timeoutMs));
    void slot.worker.terminate();
    this.replace(slot);
    this.dispatch();
  }
}

function collectNames(root: Node): Set<string> {
  const out = new Set<string>();
  const stack: Node[] = [root];
  while (stack.length > 0) {
    const n = stack.pop() as Node;
    switch (n.kind) {
      case "sym":
        out.add(n.name);
        break;
      case "neg":
      case "call":
        stack.push(n.arg);
        break;
      case "add":
        for (const t of n.terms) stack.push(t.node);
        break;
      case "mul":
        for (const f of n.factors) stack.push(f.node);
        break;
      case "pow":
        stack.push(n.base, n.exp);
        break;
      default:
        break;
    }
  }
  return out;
}

/**
 * Neutral names v0, v1, ... for the CAS: user symbols such as e, i, gamma or beta mean something
 * else to nerdamer (Euler's number, the imaginary unit, functions).
 */
class Neutral {
  private readonly forward = new Map<string, string>();
  private readonly backward = new Map<string, string>();

  constructor(names: Iterable<string>) {
    for (const n of [...new Set(names)].sort()) {
      const v = `v${this.forward.size}`;
      this.forward.set(n, v);
      this.backward.set(v, n);
    }
  }

  out(name: string): string {
    return this.forward.get(name) ?? name;
  }

  print(node: Node): string {
    return printExpression(node, { rename: (n) => this.out(n), exactNumbers: true, fullParens: true });
  }

  back(text: string): string {
    return text.replace(/\bv(\d+)\b/g, (m) => this.backward.get(m) ?? m);
  }
}

let shared: SymbolicPool | undefined;
let sharedOptions: SymbolicPoolOptions = {};

/** Options of the process-wide pool (the server passes WORKER_NICE); used when it is next created. */
export function configureSymbolicPool(options: Pick<SymbolicPoolOptions, "nice">): void {
  sharedOptions = { ...options };
}

/** The process-wide pool, created (and warmed) on first use. */
export function getSymbolicPool(): SymbolicPool {
  if (shared === undefined) shared = new SymbolicPool(sharedOptions);
  return shared;
}

/** Ends the shared pool (server shutdown, test teardown). A later getSymbolicPool() starts a new one. */
export async function closeSymbolicPool(): Promise<void> {
  const pool = shared;
  shared = undefined;
  if (pool !== undefined) await pool.close();
}
