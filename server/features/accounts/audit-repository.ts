import type { Knex } from "../../db/knex.ts";

export interface AuditEntry {
  id: number;
  at: Date;
  actorLogin: string | null;
  action: string;
  subject: string;
  before: unknown;
  after: unknown;
}

export interface NewAuditEntry {
  actorId: number | null;
  actorLogin: string | null;
  action: string;
  subject: string;
  before: unknown;
  after: unknown;
}

interface AuditRow {
  id: string | number;
  at: Date;
  actor_id: number | null;
  actor_login: string | null;
  action: string;
  subject: string;
  before: unknown;
  after: unknown;
}

/** Append-only: the audit log has no update or delete here on purpose. */
export function auditRepository(db: Knex | Knex.Transaction) {
  return {
    async append(e: NewAuditEntry): Promise<void> {
      await db("audit_log").insert({
        actor_id: e.actorId,
        actor_login: e.actorLogin,
        action: e.action,
        subject: e.subject,
        // jsonb columns: pass JSON text so arrays are not read as Postgres arrays.
        before: JSON.stringify(e.before ?? null),
        after: JSON.stringify(e.after ?? null),
      });
    },

    async list(opts: { limit: number; subject?: string | undefined }): Promise<AuditEntry[]> {
      const q = db<AuditRow>("audit_log").select("*").orderBy("id", "desc").limit(opts.limit);
      if (opts.subject) q.whereRaw("lower(subject) = lower(?)", [opts.subject]);
      const rows = await q;
      return rows.map((r) => ({
        id: Number(r.id),
        at: r.at,
        actorLogin: r.actor_login,
        action: r.action,
        subject: r.subject,
        before: r.before,
        after: r.after,
      }));
    },
  };
}
