import { randomBytes } from "node:crypto";
import { inject } from "vitest";
import { createDb, type Knex } from "../../server/db/knex.ts";

export interface TestDatabase {
  db: Knex;
  url: string;
  name: string;
  drop: () => Promise<void>;
}

/**
 * A fresh, migrated database for one test file: a clone of the template that global setup migrated.
 * Test files never share tables, so they run in parallel safely.
 */
export async function createTestDatabase(): Promise<TestDatabase> {
  const base = inject("pgBaseUrl");
  const template = inject("templateDb");
  const name = `dragoman_t_${randomBytes(5).toString("hex")}`;
  const admin = createDb(`${base}postgres`, { max: 1 });
  try {
    for (let attempt = 0; ; attempt++) {
      try {
        await admin.raw(`create database "${name}" template "${template}"`);
        break;
      } catch (err) {
        // Another run may be migrating the template this instant; wait and try again.
        if (attempt < 20 && /being accessed by other users/.test(String(err))) {
          await new Promise((r) => setTimeout(r, 250));
          continue;
        }
        throw err;
      }
    }
  } finally {
    await admin.destroy();
  }
  const url = `${base}${name}`;
  const db = createDb(url, { max: 5 });
  return {
    db,
    url,
    name,
    drop: async () => {
      await db.destroy();
      const a = createDb(`${base}postgres`, { max: 1 });
      try {
        await a.raw(`drop database if exists "${name}" with (force)`);
      } finally {
        await a.destroy();
      }
    },
  };
}

/** Empties every application table (not the migration bookkeeping) between tests. */
export async function truncateAll(db: Knex): Promise<void> {
  const rows = await db
    .select<{ tablename: string }[]>("tablename")
    .from("pg_tables")
    .where("schemaname", "public")
    .whereNotIn("tablename", ["knex_migrations", "knex_migrations_lock"]);
  if (rows.length) await db.raw(`truncate ${rows.map((r) => `"${r.tablename}"`).join(", ")} restart identity cascade`);
}
