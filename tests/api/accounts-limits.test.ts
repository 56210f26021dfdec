import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildTestApp } from "../helpers/app.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

let tdb: TestDatabase;
beforeAll(async () => {
  tdb = await createTestDatabase();
});
afterAll(async () => {
  await tdb.drop();
});

describe("rate limit on /auth and /api/v1/tokens", () => {
  it("when an address exceeds AUTH_RATE_LIMIT_PER_MINUTE, then 429 in the standard error shape, shared across both prefixes", async () => {
    const app = buildTestApp(tdb, { AUTH_RATE_LIMIT_PER_MINUTE: "3" });
    expect((await request(app).get("/api/v1/tokens")).status).toBe(401);
    expect((await request(app).get("/auth/github/callback")).status).toBe(302);
    expect((await request(app).post("/api/v1/tokens").send({ name: "x" })).status).toBe(401);
    const limited = await request(app).get("/api/v1/tokens");
    expect(limited.status).toBe(429);
    expect(limited.body).toEqual({
      error: { code: "rate_limited", message: "Too many sign-in or token requests from your address (limit 3 a minute); wait a minute and try again." },
    });
    expect(limited.headers["ratelimit-policy"]).toMatch(/q=3/);
    expect((await request(app).get("/auth/github")).status).toBe(429);
    // Other routes are not limited by it.
    expect((await request(app).get("/api/health")).status).toBe(200);
  });

  it("when the limit is not configured, then the test default is generous", async () => {
    const app = buildTestApp(tdb);
    for (let i = 0; i < 40; i++) expect((await request(app).get("/api/v1/tokens")).status).toBe(401);
  });
});

describe("security headers", () => {
  it("when any page is served, then the CSP allows only this origin, plus inline styles for KaTeX", async () => {
    const res = await request(buildTestApp(tdb)).get("/api/health");
    const csp = String(res.headers["content-security-policy"]);
    const directives = Object.fromEntries(csp.split(";").map((d) => d.trim().split(/\s+/)).map(([k, ...v]) => [k, v]));
    expect(directives["default-src"]).toEqual(["'self'"]);
    expect(directives["script-src"]).toEqual(["'self'"]);
    expect(directives["style-src"]).toEqual(["'self'", "'unsafe-inline'"]);
    expect(directives["connect-src"]).toEqual(["'self'"]);
    expect(directives["frame-ancestors"]).toEqual(["'none'"]);
    expect(directives["upgrade-insecure-requests"]).toBeUndefined();
    expect(res.headers["x-content-type-options"]).toBe("nosniff");
    expect(res.headers["strict-transport-security"]).toBeUndefined();
  });
});
