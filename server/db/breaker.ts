import { AsyncLocalStorage } from "node:async_hooks";
import type { Knex } from "knex";
import { isDatabaseUnavailable } from "../http/db-unavailable.ts";

/**
 * A circuit breaker in front of the database: once a connection to PostgreSQL fails as "cannot be
 * reached" (refused, reset, connection time-out, shutting down; server/http/db-unavailable.ts; a full
 * pool does not count), every later query fails at once with DatabaseUnavailableError, so each
 * request answers 503 with Retry-After at once instead of waiting for its own connection time-out. Meanwhile one probe at a
 * time (`select 1`, the only query let through) runs every `probeIntervalMs`; the first answer closes
 * the breaker. A probe that gets an answer other than "cannot be reached" (a refused login, say) closes
 * it too: the database is there, and requests should see the real error.
 *
 * The breaker sits in knex's connection acquisition, so only what needs the database fails: pages,
 * assets and database-free routes keep working during an outage.
 */
export class DatabaseUnavailableError extends Error {
  override readonly name = "DatabaseUnavailableError";
  readonly code = "DB_CIRCUIT_OPEN";
  constructor(readonly reason: string) {
    super(`the database could not be reached a moment ago (${reason}); not trying again until a probe answers`);
  }
}

export interface BreakerOptions {
  /** Time between probes while open (the first one runs this long after the breaker opens). */
  readonly probeIntervalMs: number;
  /** Longest a probe may take before it counts as failed. */
  readonly probeTimeoutMs?: number;
  readonly onOpen?: (reason: string) => void;
  readonly onClose?: (openForMs: number) => void;
}

export interface BreakerStats {
  readonly open: boolean;
  /** Times the breaker opened. */
  readonly trips: number;
  /** Queries refused at once while open. */
  readonly refused: number;
  /** Probes started. */
  readonly probes: number;
}

const probing = new AsyncLocalStorage<true>();

export class DbBreaker {
  private openSince: number | undefined;
  private reason = "";
  private timer: NodeJS.Timeout | undefined;
  private probeRunning = false;
  private trips = 0;
  private refused = 0;
  private probes = 0;
  private stopped = false;

  constructor(
    private readonly db: Knex,
    private readonly options: BreakerOptions,
  ) {}

  get isOpen(): boolean {
    return this.openSince !== undefined;
  }

  stats(): BreakerStats {
    return { open: this.isOpen, trips: this.trips, refused: this.refused, probes: this.probes };
  }

  /** Throws DatabaseUnavailableError while open (except for the probe's own query). */
  check(): void {
    if (this.openSince === undefined || probing.getStore() === true) return;
    this.refused += 1;
    throw new DatabaseUnavailableError(this.reason);
  }

  /** Records a failure: opens the breaker when the error means "the database cannot be reached". */
  observe(err: unknown): void {
    if (this.stopped || this.openSince !== undefined || probing.getStore() === true) return;
    if (err instanceof DatabaseUnavailableError || !isDatabaseUnavailable(err)) return;
    // A full pool (knex's acquisition time-out) is load, not an outage: that request gets its 503, the
    // others keep their turn. (An unreachable server fails the connection itself, within its 3 s.)
    if ((err as { name?: string }).name === "KnexTimeoutError") return;
    this.openSince = Date.now();
    this.reason = err instanceof Error ? err.message.slice(0, 200) : String(err);
    this.trips += 1;
    this.options.onOpen?.(this.reason);
    this.schedule();
  }

  /** Stops probing (the app's database is being closed). */
  stop(): void {
    this.stopped = true;
    if (this.timer) clearTimeout(this.timer);
    this.timer = undefined;
  }

  private schedule(): void {
    if (this.stopped || this.timer !== undefined) return;
    this.timer = setTimeout(() => {
      this.timer = undefined;
      void this.probe();
    }, this.options.probeIntervalMs);
    // A breaker must never keep a process alive.
    this.timer.unref();
  }

  private async probe(): Promise<void> {
    if (this.probeRunning || this.openSince === undefined || this.stopped) return;
    this.probeRunning = true;
    this.probes += 1;
    let answered: boolean;
    try {
      // The query is awaited inside run(): knex's builder is lazy and starts on then(), which must see the store.
      await probing.run(true, async () => {
        await this.db.raw("select 1").timeout(this.options.probeTimeoutMs ?? 3000, { cancel: false });
      });
      answered = true;
    } catch (err) {
      // A knex query time-out is a database that did not answer in time, as much as a refused connection.
      answered = !isDatabaseUnavailable(err) && (err as { name?: string }).name !== "KnexTimeoutError";
    } finally {
      this.probeRunning = false;
    }
    if (answered && this.openSince !== undefined) {
      const openFor = Date.now() - this.openSince;
      this.openSince = undefined;
      this.options.onClose?.(openFor);
    } else if (this.openSince !== undefined) {
      this.schedule();
    }
  }
}

const breakers = new WeakMap<Knex, DbBreaker>();

/**
 * The breaker of this knex instance, installed on first call (several apps on one database share it):
 * knex's connection acquisition checks it first and reports its failures to it, and so do the
 * errors of queries already running (a connection the server ended).
 */
export function attachBreaker(db: Knex, options: BreakerOptions): DbBreaker {
  const existing = breakers.get(db);
  if (existing) return existing;
  const breaker = new DbBreaker(db, options);
  breakers.set(db, breaker);
  const client = db.client as { acquireConnection: () => Promise<unknown> };
  const acquire = client.acquireConnection.bind(client);
  client.acquireConnection = async () => {
    breaker.check();
    try {
      return await acquire();
    } catch (err) {
      breaker.observe(err);
      throw err;
    }
  };
  db.on("query-error", (err: unknown) => breaker.observe(err));
  return breaker;
}
