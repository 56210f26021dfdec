import { AppError, ValidationError } from "../errors.ts";
import { OneThreadPool } from "../threads/one-thread-pool.ts";
import type { BodyKind, BodyValue } from "./body-kinds.ts";

/**
 * One warm worker thread reads large JSON bodies (decode, JSON.parse, text guard, schema) one at a
 * time (server/threads/one-thread-pool.ts): the bytes are handed over without a copy, the validated
 * value comes back with its number columns handed over too, and a 400 comes back as the same 400.
 */
export interface BodyPoolOptions {
  readonly timeoutMs?: number;
  readonly maxQueue?: number;
  /** Linux nice value (0-19) the worker thread gives itself, so the request thread gets the cores first. */
  readonly nice?: number;
}

type Reply = { id: number; ok: true; value: unknown } | { id: number; ok: false; status: number; code: string; fields: Record<string, string> | null; message: string };

export class BodyPool {
  private readonly thread: OneThreadPool;

  constructor(options: BodyPoolOptions = {}) {
    this.thread = new OneThreadPool({
      url: new URL("./body-worker.mjs", import.meta.url),
      what: "the body reader",
      waiting: "large request bodies",
      timeoutMs: options.timeoutMs ?? 10_000,
      maxQueue: options.maxQueue ?? 16,
      nice: options.nice ?? 0,
      retryAfterSeconds: 2,
    });
  }

  /** The bytes (handed over: the caller must not use them afterwards) to the validated value of `kind`. */
  read<K extends BodyKind>(kind: K, bytes: ArrayBuffer): Promise<BodyValue<K>> {
    return new Promise((resolve, reject) => {
      this.thread.submit({
        send: (worker, id) => worker.postMessage({ id, kind, bytes }, [bytes]),
        settle: (reply) => {
          const msg = reply as Reply;
          if (msg.ok) resolve(msg.value as BodyValue<K>);
          else if (msg.code === "validation_failed") reject(new ValidationError(msg.message, msg.fields ?? undefined));
          else if (msg.status < 500) reject(new AppError(msg.status, msg.code, msg.message, msg.fields ?? undefined));
          else reject(new Error(`reading the request body failed: ${msg.message}`));
        },
        reject,
      });
    });
  }

  /** Starts the thread now (server start), so the first large body does not wait for the loader. */
  warm(): Promise<void> {
    return this.thread.warm();
  }

  close(): Promise<void> {
    return this.thread.close();
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
