import type { Knex } from "../db/knex.ts";
import type { MailMessage } from "./mailer.ts";

export interface QueuedMail extends MailMessage {
  /** What the message is about, e.g. "submission.submitted". */
  topic: string;
}

/**
 * Writes messages to the outbox inside the caller's transaction: they exist only if the change that
 * caused them commits, and a mail relay that is down never rolls the change back.
 */
export async function enqueueMail(trx: Knex | Knex.Transaction, messages: QueuedMail[]): Promise<void> {
  if (!messages.length) return;
  await trx("mail_queue").insert(messages.map((m) => ({ to_address: m.to, subject: m.subject, text_body: m.text, topic: m.topic })));
}

export interface MailQueueRow {
  id: number;
  to: string;
  subject: string;
  text: string;
  topic: string;
  status: "pending" | "sent" | "failed";
  attempts: number;
  last_error: string | null;
  created_at: Date;
  sent_at: Date | null;
}

/** Outbox rows, newest first (for tests and operators). */
export async function listMailQueue(db: Knex, filter: { status?: MailQueueRow["status"]; topic?: string } = {}): Promise<MailQueueRow[]> {
  const q = db("mail_queue").orderBy("id", "desc");
  if (filter.status) q.where("status", filter.status);
  if (filter.topic) q.where("topic", filter.topic);
  const rows = await q.select<
    { id: string; to_address: string; subject: string; text_body: string; topic: string; status: MailQueueRow["status"]; attempts: number; last_error: string | null; created_at: Date; sent_at: Date | null }[]
  >("*");
  return rows.map((r) => ({
    id: Number(r.id),
    to: r.to_address,
    subject: r.subject,
    text: r.text_body,
    topic: r.topic,
    status: r.status,
    attempts: r.attempts,
    last_error: r.last_error,
    created_at: r.created_at,
    sent_at: r.sent_at,
  }));
}
