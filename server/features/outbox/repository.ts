import type { Knex } from "../../db/knex.ts";

export interface OutboxMessage {
  to: string;
  subject: string;
  text: string;
  date: string;
}

/** Newest first; capped, since a long-running dev database can collect many. */
export async function listDevOutbox(db: Knex, limit = 200): Promise<OutboxMessage[]> {
  const rows = await db("dev_outbox")
    .orderBy("received_at", "desc")
    .orderBy("id", "desc")
    .limit(limit)
    .select<{ to_address: string; subject: string; text_body: string; received_at: Date }[]>("to_address", "subject", "text_body", "received_at");
  return rows.map((r) => ({ to: r.to_address, subject: r.subject, text: r.text_body, date: r.received_at.toISOString() }));
}
