import { execFileSync } from "node:child_process";
import type { Server } from "node:http";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.ts";
import { createDb, migrateLatest, type Knex } from "../../server/db/knex.ts";
import { createLogger } from "../../server/logger.ts";
import { testConfig } from "../helpers/app.ts";
import { bearerFor } from "../helpers/auth.ts";
import { listen } from "../helpers/browser.ts";
import { TempCluster } from "../helpers/temp-cluster.ts";

/**
 * The cluster of npm start keeps PostgreSQL's durable settings (scripts/pg.sh without PG_THROWAWAY):
 * once the API has answered 2xx to a write, a crash of PostgreSQL (kill -9 of the postmaster and every
 * backend, mid-traffic) must not lose it. With synchronous_commit=off, as the cluster ran before, the
 * last few hundred milliseconds of acknowledged commits are lost and this test fails.
 */
describe("durability of acknowledged writes", () => {
  let cluster: TempCluster;
  let db: Knex;
  let server: Server;
  let url = "";
  let token = "";

  beforeAll(async () => {
    cluster = await TempCluster.create();
    expect((await cluster.pg("start")).code).toBe(0);
    const admin = createDb(cluster.url("postgres"), { max: 1 });
    await admin.raw('create database "dragoman"');
    await admin.destroy();
    db = createDb(cluster.url("dragoman"), { max: 8 });
    await migrateLatest(db);
    token = await bearerFor(db, "durable-writer");
    const config = testConfig(cluster.url("dragoman"));
    ({ server, url } = await listen(createApp({ db, config, logger: createLogger(config) })));
  }, 120_000);
  afterAll(async () => {
    await new Promise<void>((resolve) => {
      server.close(() => resolve());
      server.closeAllConnections();
    });
    await db.destroy().catch(() => undefined);
    await cluster.destroy();
  });

  it("when the cluster runs as npm start runs it, then fsync, synchronous_commit and full_page_writes are on", async () => {
    for (const setting of ["fsync", "synchronous_commit", "full_page_writes"]) {
      const r = await db.raw<{ rows: Record<string, string>[] }>(`show ${setting}`);
      expect(r.rows[0]?.[setting], setting).toBe("on");
    }
  });

  it("when PostgreSQL is killed with -9 during writes, then every write answered 2xx is there after restart", async () => {
    const acknowledged: number[] = [];
    let killed = false;
    const failuresAfterKill = new Set<number>();
    const writer = async (w: number) => {
      for (let i = 0; ; i++) {
        if (killed && failuresAfterKill.has(w)) return;
        try {
          const res = await fetch(`${url}/api/v1/tokens`, {
            method: "POST",
            headers: { "content-type": "application/json", authorization: `Bearer ${token}` },
            body: JSON.stringify({ name: `w${w}-${i}` }),
          });
          if (res.status >= 200 && res.status < 300) acknowledged.push(((await res.json()) as { id: number }).id);
          else if (killed) failuresAfterKill.add(w);
        } catch {
          if (killed) failuresAfterKill.add(w);
        }
      }
    };
    const writers = [0, 1, 2, 3].map(writer);
    // Let writes flow, then kill the postmaster and every process it started, with no warning.
    while (acknowledged.length < 40) await new Promise((r) => setTimeout(r, 10));
    const pids = cluster.postgresPids();
    killed = true;
    for (const pid of pids) {
      try {
        execFileSync("kill", ["-9", String(pid)]);
      } catch {
        // already gone (a backend that exited with the postmaster)
      }
    }
    await Promise.all(writers);
    expect(acknowledged.length).toBeGreaterThanOrEqual(40);

    expect((await cluster.pg("start")).code).toBe(0);
    const check = createDb(cluster.url("dragoman"), { max: 1 });
    try {
      const present = new Set(await check("api_tokens").whereIn("id", acknowledged).pluck<number[]>("id"));
      const lost = acknowledged.filter((id) => !present.has(id));
      expect(lost, `${lost.length} of ${acknowledged.length} acknowledged writes lost`).toEqual([]);
    } finally {
      await check.destroy();
    }
  });
});
