import { writeFileSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDb, migrateLatest, type Knex } from "../../server/db/knex.ts";
import { seedSteps } from "../../seeds/index.ts";
import { TempCluster } from "../helpers/temp-cluster.ts";

/**
 * npm run db:backup / db:restore / db:reset against a cluster of their own (durable settings, as npm
 * start runs it): a seeded database (demo catalogue, submissions in every state, comments, a sheet) is
 * dumped, dropped and restored, and every application table reads back identically.
 */

/** One md5 per public table over its rows in a stable order: equal checksums, equal contents. */
async function checksums(db: Knex): Promise<Record<string, string>> {
  const tables = (await db("pg_tables").where("schemaname", "public").orderBy("tablename").pluck<string[]>("tablename")).filter((t) => !t.startsWith("knex_migrations"));
  const out: Record<string, string> = {};
  for (const t of tables) {
    const r = await db.raw<{ rows: { sum: string; n: number }[] }>(`select md5(coalesce(string_agg(x::text, E'\\n' order by x::text), '')) as sum, count(*)::int as n from "${t}" x`);
    out[t] = `${r.rows[0]?.n}:${r.rows[0]?.sum}`;
  }
  return out;
}

describe("db:backup, db:restore, db:reset", () => {
  let cluster: TempCluster;
  let before: Record<string, string>;
  let dump = "";
  const dbUrl = () => cluster.url("dragoman");
  const env = () => ({ BACKUP_DIR: path.join(cluster.dir, "backups") });

  async function withDb<T>(f: (db: Knex) => Promise<T>): Promise<T> {
    const db = createDb(dbUrl(), { max: 2 });
    try {
      return await f(db);
    } finally {
      await db.destroy();
    }
  }

  beforeAll(async () => {
    cluster = await TempCluster.create();
    expect((await cluster.pg("start")).code).toBe(0);
    const admin = createDb(cluster.url("postgres"), { max: 1 });
    await admin.raw('create database "dragoman"');
    await admin.destroy();
    before = await withDb(async (db) => {
      await migrateLatest(db);
      await seedSteps(db);
      return checksums(db);
    });
  }, 120_000);
  afterAll(async () => {
    await cluster.destroy();
  });

  it("when the seeded database is backed up, dropped and restored, then every table reads back identically", async () => {
    // The seed gave the tables the issue names something to lose.
    for (const t of ["theories", "theory_revisions", "mappings", "submissions", "submission_comments"]) {
      expect(before[t], t).toMatch(/^[1-9]\d*:/);
    }
    const backup = await cluster.script("backup.sh", [], env());
    expect(backup.code, backup.stderr).toBe(0);
    dump = backup.stdout.trim();
    expect(path.basename(dump)).toMatch(/^dragoman-\d{8}T\d{6}Z\.dump$/);
    expect(path.dirname(dump)).toBe(path.join(cluster.dir, "backups"));

    const admin = createDb(cluster.url("postgres"), { max: 1 });
    await admin.raw('drop database "dragoman" with (force)');
    await admin.destroy();

    const restore = await cluster.script("restore.sh", [dump, "--yes"], env());
    expect(restore.code, restore.stderr).toBe(0);
    expect(await withDb(checksums)).toEqual(before);
  });

  it("when the file is not a dump, then restore fails with a sentence and the database is unchanged", async () => {
    const bad = path.join(cluster.dir, "not-a-dump.dump");
    writeFileSync(bad, "this is not a pg_dump archive\n");
    const r = await cluster.script("restore.sh", [bad, "--yes"], env());
    expect(r.code).not.toBe(0);
    expect(r.stderr).toContain(`database "dragoman" is unchanged`);
    expect(await withDb(checksums)).toEqual(before);
  });

  it("when restore or reset run without --yes and without a terminal, then they refuse and change nothing", async () => {
    const restore = await cluster.script("restore.sh", [dump], env());
    expect(restore.code).not.toBe(0);
    expect(restore.stderr).toContain("add --yes");
    const reset = await cluster.script("reset.sh", [], env());
    expect(reset.code).not.toBe(0);
    expect(reset.stderr).toContain("add --yes");
    expect(await withDb(checksums)).toEqual(before);
  });

  it("when reset is given --yes, then the database is gone", async () => {
    const reset = await cluster.script("reset.sh", ["--yes"], env());
    expect(reset.code, reset.stderr).toBe(0);
    const admin = createDb(cluster.url("postgres"), { max: 1 });
    try {
      const rows = await admin("pg_database").where("datname", "dragoman").select("datname");
      expect(rows).toEqual([]);
    } finally {
      await admin.destroy();
    }
  });
});
