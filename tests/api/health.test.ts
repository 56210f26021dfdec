import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDb } from "../../server/db/knex.ts";
import { APP_VERSION } from "../../server/version.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";
import { TempCluster } from "../helpers/temp-cluster.ts";
import pkg from "../../package.json" with { type: "json" };

describe("GET /api/health", () => {
  let tdb: TestDatabase;
  beforeAll(async () => {
    tdb = await createTestDatabase();
  });
  afterAll(async () => {
    await tdb.drop();
  });

  it("when the database is up, then 200 with db up and the package version", async () => {
    const res = await request(buildTestApp(tdb)).get("/api/health");
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: "ok", db: "up", version: pkg.version });
    expect(APP_VERSION).toBe(pkg.version);
  });
});

describe("GET /api/health while PostgreSQL goes away and comes back", () => {
  let cluster: TempCluster;
  beforeAll(async () => {
    cluster = await TempCluster.create();
    expect((await cluster.pg("start")).code).toBe(0);
  });
  afterAll(async () => {
    await cluster.destroy();
  });

  it("when PostgreSQL stops, then 503 db down; when it restarts, then the server recovers by itself", async () => {
    const db = createDb(cluster.url());
    const app = buildTestApp({ db, url: cluster.url(), name: "probe", drop: async () => {} });
    try {
      const up = await request(app).get("/api/health");
      expect(up.status).toBe(200);
      expect(up.body.db).toBe("up");

      expect((await cluster.pg("stop")).code).toBe(0);
      const down = await request(app).get("/api/health");
      expect(down.status).toBe(503);
      expect(down.body).toEqual({ status: "degraded", db: "down", version: pkg.version });

      expect((await cluster.pg("start")).code).toBe(0);
      let back = await request(app).get("/api/health");
      for (let i = 0; i < 20 && back.status !== 200; i++) {
        await new Promise((r) => setTimeout(r, 250));
        back = await request(app).get("/api/health");
      }
      expect(back.status).toBe(200);
      expect(back.body.db).toBe("up");
    } finally {
      await db.destroy();
    }
  });
});
