import type { Knex } from "../db/knex.ts";
import type { Logger } from "../logger.ts";
import type { Mailer } from "./mailer.ts";

export interface DispatcherOptions {
  db: Knex;
  mailer: Mailer;
  logger: Logger;
  retryBaseMs: number;
  retryMaxMs: number;
  maxAttempts: number;
  /** How often pending rows are looked for without a kick (another process wrote them, or a retry is due). */
  sweepMs: number;
}

export interface DrainResult {
  sent: number;
  retried: number;
  failed: number;
}

export interface MailDispatcher {
  /** Sends what is due, soon, in the background. Services call it after their transaction commits. */
  kick: () => void;
  /** Sends what is due now and resolves when done (tests, shutdown). */
  drain: () => Promise<DrainResult>;
  stop: () => void;
}

interface ClaimedRow {
  id: string;
  to_address: string;
  subject: string;
  text_body: string;
  attempts: number;
}

const BATCH = 20;
/** A claimed row is left alone by other dispatchers for this long, then considered abandoned. */
const LEASE_SECONDS = 120;

/** Delay before attempt n + 1 after n failed attempts: base, 2 base, 4 base ... capped. */
export function retryDelayMs(failedAttempts: number, baseMs: number, maxMs: number): number {
  return Math.min(maxMs, baseMs * 2 ** Math.max(0, failedAttempts - 1));
}

/**
 * The in-process sender of the mail outbox. Rows are claimed with FOR UPDATE SKIP LOCKED and a lease,
 * so several app processes (or test apps) sharing one database never send a message twice.
 */
export function createMailDispatcher(o: DispatcherOptions): MailDispatcher {
  let stopped = false;
  let running: Promise<DrainResult> | undefined;
  let again = false;
  const timers = new Set<NodeJS.Timeout>();

  const later = (ms: number) => {
    if (stopped) return;
    const t = setTimeout(() => {
      timers.delete(t);
      kick();
    }, ms);
    t.unref();
    timers.add(t);
  };

  const claim = async (): Promise<ClaimedRow[]> => {
    const result = await o.db.raw<{ rows: ClaimedRow[] }>(
      `update mail_queue set locked_until = now() + make_interval(secs => ?)
        where id in (select id from mail_queue
                      where status = 'pending' and next_attempt_at <= now() and (locked_until is null or locked_until < now())
                      order by id limit ? for update skip locked)
        returning id, to_address, subject, text_body, attempts`,
      [LEASE_SECONDS, BATCH],
    );
    // RETURNING keeps no order: send oldest first, as queued.
    return result.rows.sort((a, b) => Number(a.id) - Number(b.id));
  };

  const sendOne = async (row: ClaimedRow, tally: DrainResult) => {
    try {
      await o.mailer.send({ to: row.to_address, subject: row.subject, text: row.text_body });
      await o.db("mail_queue").where({ id: row.id }).update({ status: "sent", sent_at: o.db.fn.now(), attempts: row.attempts + 1, locked_until: null, last_error: null });
      tally.sent++;
    } catch (err) {
      const attempts = row.attempts + 1;
      const message = err instanceof Error ? err.message : String(err);
      if (attempts >= o.maxAttempts) {
        await o.db("mail_queue").where({ id: row.id }).update({ status: "failed", attempts, locked_until: null, last_error: message });
        o.logger.error({ mailId: row.id, attempts, err: message }, "mail: giving up on a message");
        tally.failed++;
        return;
      }
      const delay = retryDelayMs(attempts, o.retryBaseMs, o.retryMaxMs);
      await o.db("mail_queue")
        .where({ id: row.id })
        .update({ attempts, locked_until: null, last_error: message, next_attempt_at: o.db.raw("now() + make_interval(secs => ?)", [delay / 1000]) });
      o.logger.warn({ mailId: row.id, attempts, retryInMs: delay, err: message }, "mail: send failed, will retry");
      tally.retried++;
      later(delay);
    }
  };

  const drainOnce = async (): Promise<DrainResult> => {
    const tally: DrainResult = { sent: 0, retried: 0, failed: 0 };
    for (;;) {
      const rows = await claim();
      for (const row of rows) await sendOne(row, tally);
      if (rows.length < BATCH) return tally;
    }
  };

  const drain = async (): Promise<DrainResult> => {
    while (running) await running.catch(() => undefined);
    running = drainOnce();
    try {
      return await running;
    } finally {
      running = undefined;
    }
  };

  function kick(): void {
    if (stopped) return;
    if (running) {
      again = true;
      return;
    }
    drain()
      .catch((err: unknown) => o.logger.error({ err }, "mail: dispatch failed"))
      .finally(() => {
        if (again) {
          again = false;
          kick();
        }
      });
  }

  const sweep = setInterval(kick, o.sweepMs);
  sweep.unref();
  // Mail queued before this process started (a seed, a crash) goes out soon, not a whole sweep later.
  later(1000);

  return {
    kick,
    drain,
    stop: () => {
      stopped = true;
      clearInterval(sweep);
      for (const t of timers) clearTimeout(t);
      timers.clear();
    },
  };
}
