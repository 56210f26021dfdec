import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDb } from "../../server/db/knex.ts";
import { TempCluster } from "../helpers/temp-cluster.ts";

describe("scripts/pg.sh", () => {
  let cluster: TempCluster;
  beforeAll(async () => {
    cluster = await TempCluster.create();
  });
  afterAll(async () => {
    await cluster.destroy();
  });

  it("when started twice, then the second start is a no-op and the database answers", async () => {
    const first = await cluster.pg("start");
    expect(first.code).toBe(0);
    expect(first.stdout.trim()).toBe(`postgres://postgres@127.0.0.1:${cluster.port}/`);
    const pid1 = readFileSync(path.join(cluster.dir, "data", "postmaster.pid"), "utf8").split("\n")[0];
    const second = await cluster.pg("start");
    expect(second.code).toBe(0);
    const pid2 = readFileSync(path.join(cluster.dir, "data", "postmaster.pid"), "utf8").split("\n")[0];
    expect(pid2).toBe(pid1);
    const db = createDb(cluster.url());
    try {
      const r = await db.raw<{ rows: { one: number }[] }>("select 1 as one");
      expect(r.rows[0]?.one).toBe(1);
      // Listens on loopback only.
      const la = await db.raw<{ rows: { listen_addresses: string }[] }>("show listen_addresses");
      expect(la.rows[0]?.listen_addresses).toBe("127.0.0.1");
    } finally {
      await db.destroy();
    }
  });

  it("when the postmaster was killed with -9, then start recovers", async () => {
    const pid = readFileSync(path.join(cluster.dir, "data", "postmaster.pid"), "utf8").split("\n")[0];
    expect(Number(pid)).toBeGreaterThan(0);
    execFileSync("kill", ["-9", String(pid)]);
    const again = await cluster.pg("start");
    expect(again.code).toBe(0);
    const db = createDb(cluster.url());
    try {
      await expect(db.raw("select 1")).resolves.toBeTruthy();
    } finally {
      await db.destroy();
    }
  });

  it("when stopped twice, then the second stop is a no-op", async () => {
    expect((await cluster.pg("stop")).code).toBe(0);
    expect((await cluster.pg("status")).code).not.toBe(0);
    expect((await cluster.pg("stop")).code).toBe(0);
  });

  it("when asked for port 5432, then it refuses with a sentence", () => {
    let stderr = "";
    try {
      execFileSync("bash", ["scripts/pg.sh", "start"], { env: { ...process.env, PGPORT: "5432" }, stdio: "pipe" });
    } catch (err) {
      stderr = String((err as { stderr?: Buffer }).stderr);
    }
    expect(stderr).toMatch(/5432 is reserved/);
  });
});
