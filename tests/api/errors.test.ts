import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ConfigError, parseConfig } from "../../server/config.ts";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

describe("the error shape and client fallback", () => {
  let tdb: TestDatabase;
  let dist: string;
  beforeAll(async () => {
    tdb = await createTestDatabase();
    dist = mkdtempSync(path.join(tmpdir(), "dragoman-dist-"));
    writeFileSync(path.join(dist, "index.html"), "<!doctype html><title>Dragoman test shell</title>");
  });
  afterAll(async () => {
    await tdb.drop();
  });

  it("when an /api route does not exist, then 404 in the standard error shape", async () => {
    const res = await request(buildTestApp(tdb, { CLIENT_DIST: dist })).get("/api/v1/no-such-thing");
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ error: { code: "not_found", message: "No API route GET /api/v1/no-such-thing" } });
  });

  it("when the JSON body is malformed, then 400 naming the body", async () => {
    // Bodies are read by their route (after its access rule and rate limit), so this needs a real one.
    const res = await request(buildTestApp(tdb, { CLIENT_DIST: dist }))
      .post("/api/v1/expressions/check")
      .set("Content-Type", "application/json")
      .send("{ not json");
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("malformed_json");
    expect(res.body.error.fields).toEqual({ body: "not valid JSON" });
  });

  it("when a client route is requested, then the SPA shell is served", async () => {
    const res = await request(buildTestApp(tdb, { CLIENT_DIST: dist })).get("/catalogue/edgb");
    expect(res.status).toBe(200);
    expect(res.text).toContain("Dragoman test shell");
  });

  it("when the client is not built, then a plain sentence says how to build it", async () => {
    const res = await request(buildTestApp(tdb, { CLIENT_DIST: path.join(dist, "missing") })).get("/");
    expect(res.status).toBe(503);
    expect(res.text).toMatch(/npm run build/);
  });
});

describe("parseConfig", () => {
  it("when a variable is bad, then one sentence names it", () => {
    expect(() => parseConfig({ DATABASE_URL: "postgres://x@127.0.0.1/db", PORT: "eighty" })).toThrow(ConfigError);
    expect(() => parseConfig({ DATABASE_URL: "postgres://x@127.0.0.1/db", PORT: "eighty" })).toThrow(/PORT .*"eighty"/);
  });
  it("when DATABASE_URL is missing, then it is named", () => {
    expect(() => parseConfig({})).toThrow(/DATABASE_URL/);
  });
  it("when production lacks a session secret, then it is named", () => {
    expect(() => parseConfig({ NODE_ENV: "production", DATABASE_URL: "postgres://x@127.0.0.1/db", GITHUB_CLIENT_SECRET: "s" })).toThrow(/SESSION_SECRET is required in production/);
  });
});
