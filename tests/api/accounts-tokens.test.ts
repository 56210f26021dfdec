import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hashToken } from "../../server/features/accounts/tokens-service.ts";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

let tdb: TestDatabase;
let app: ReturnType<typeof buildTestApp>;
beforeAll(async () => {
  tdb = await createTestDatabase();
  app = buildTestApp(tdb);
});
afterAll(async () => {
  await tdb.drop();
});

const bearer = (t: string) => ({ Authorization: `Bearer ${t}` });

describe("POST /api/v1/tokens", () => {
  it("when an analyst names a token, then 201 with the secret once, and only its hash is stored", async () => {
    await ensureUser(tdb.db, { login: "t-analyst", name: "Test Analyst", roles: ["analyst"] });
    const auth = await bearerFor(tdb.db, "t-analyst");
    const res = await request(app).post("/api/v1/tokens").set(bearer(auth)).send({ name: "  laptop script  " });
    expect(res.status).toBe(201);
    expect(res.body).toEqual({ id: expect.any(Number), name: "laptop script", created_at: expect.any(String), token: expect.stringMatching(/^drg_[A-Za-z0-9_-]{43}$/) });
    const row = await tdb.db("api_tokens").where({ id: res.body.id }).first();
    expect(row.name).toBe("laptop script");
    expect(row.token_hash).toBe(hashToken(res.body.token));
    expect(JSON.stringify(row)).not.toContain(res.body.token);
  });

  it("when the name is missing or blank, then 400 naming the field", async () => {
    const auth = await bearerFor(tdb.db, "t-analyst");
    const before = await tdb.db("api_tokens").count<{ count: string }[]>("* as count");
    for (const body of [{}, { name: "   " }, { name: 7 }]) {
      const res = await request(app).post("/api/v1/tokens").set(bearer(auth)).send(body);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe("validation_failed");
      expect(Object.keys(res.body.error.fields)).toEqual(["name"]);
    }
    const after = await tdb.db("api_tokens").count<{ count: string }[]>("* as count");
    expect(after[0]?.count).toBe(before[0]?.count);
  });

  it("when nobody is signed in, then 401", async () => {
    const res = await request(app).post("/api/v1/tokens").send({ name: "x" });
    expect(res.status).toBe(401);
    expect(res.body).toEqual({ error: { code: "unauthorized", message: "Sign in to do this." } });
  });
});

describe("GET /api/v1/tokens and the token life cycle", () => {
  it("when a token is created, used, listed and revoked, then the list never shows secrets and the revoked token answers 401", async () => {
    await ensureUser(tdb.db, { login: "t-cycle", roles: ["analyst"] });
    const boot = await bearerFor(tdb.db, "t-cycle");
    const created = await request(app).post("/api/v1/tokens").set(bearer(boot)).send({ name: "pipeline" });
    expect(created.status).toBe(201);
    const token: string = created.body.token;

    const me = await request(app).get("/api/v1/me").set(bearer(token));
    expect(me.status).toBe(200);
    expect(me.body).toEqual({ user: { login: "t-cycle", name: "t-cycle", roles: ["analyst"] } });
    const used = await tdb.db("api_tokens").where({ id: created.body.id }).first();
    expect(used.last_used_at).toBeInstanceOf(Date);

    const list = await request(app).get("/api/v1/tokens").set(bearer(token));
    expect(list.status).toBe(200);
    const names = list.body.tokens.map((t: { name: string }) => t.name);
    expect(names).toContain("pipeline");
    const entry = list.body.tokens.find((t: { id: number }) => t.id === created.body.id);
    expect(entry).toEqual({ id: created.body.id, name: "pipeline", token_start: token.slice(0, 8), created_at: expect.any(String), last_used_at: expect.any(String) });
    expect(JSON.stringify(list.body)).not.toContain(token);
    expect(JSON.stringify(list.body)).not.toContain(hashToken(token));

    const del = await request(app).delete(`/api/v1/tokens/${created.body.id}`).set(bearer(boot));
    expect(del.status).toBe(204);
    expect(await tdb.db("api_tokens").where({ id: created.body.id }).first()).toBeUndefined();

    const after = await request(app).get("/api/v1/me").set(bearer(token));
    expect(after.status).toBe(401);
    expect(after.body.error.message).toMatch(/unknown or has been revoked/);
  });

  it("when roles change after a token was made, then the token acts with the current roles", async () => {
    await ensureUser(tdb.db, { login: "t-promoted", roles: [] });
    const token = await bearerFor(tdb.db, "t-promoted");
    expect((await request(app).get("/api/v1/admin/users").set(bearer(token))).status).toBe(403);
    await ensureUser(tdb.db, { login: "t-promoted", roles: ["admin"] });
    const res = await request(app).get("/api/v1/admin/users").set(bearer(token));
    expect(res.status).toBe(200);
    expect(res.body.users.map((u: { login: string }) => u.login)).toContain("t-promoted");
  });
});

describe("DELETE /api/v1/tokens/:id", () => {
  it("when the token belongs to someone else, then 404 and it still works for its owner", async () => {
    const owner = await bearerFor(tdb.db, "t-owner");
    const other = await bearerFor(tdb.db, "t-other");
    const created = await request(app).post("/api/v1/tokens").set(bearer(owner)).send({ name: "mine" });
    const res = await request(app).delete(`/api/v1/tokens/${created.body.id}`).set(bearer(other));
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ error: { code: "not_found", message: `You have no API token with id ${created.body.id}.` } });
    expect((await request(app).get("/api/v1/me").set(bearer(created.body.token))).status).toBe(200);
  });

  it("when the id is not a number, then 400 naming id", async () => {
    const owner = await bearerFor(tdb.db, "t-owner");
    const res = await request(app).delete("/api/v1/tokens/abc").set(bearer(owner));
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["id"]);
  });
});

describe("Authorization: Bearer with a bad token", () => {
  it.each([
    ["malformed", "Bearer not-a-token", /Malformed API token/],
    ["well formed but unknown", `Bearer drg_${"A".repeat(43)}`, /unknown or has been revoked/],
    ["another scheme", "Basic dXNlcjpwdw==", /must read "Bearer <API token>"/],
  ])("when the token is %s, then 401 with a sentence saying so, even on a public route", async (_what, header, message) => {
    for (const url of ["/api/v1/me", "/api/v1/csrf"]) {
      const res = await request(app).get(url).set("Authorization", header);
      expect(res.status).toBe(401);
      expect(res.body.error.code).toBe("unauthorized");
      expect(res.body.error.message).toMatch(message);
    }
  });
});

describe("tests/helpers/auth.ts", () => {
  it("when ensureUser is called twice, then one row with the latest roles", async () => {
    const a = await ensureUser(tdb.db, { login: "t-twice", roles: ["contributor"] });
    const b = await ensureUser(tdb.db, { login: "T-Twice", roles: ["editor", "contributor"] });
    expect(b).toBe(a);
    const rows = await tdb.db("users").whereRaw("lower(login) = 't-twice'");
    expect(rows).toHaveLength(1);
    expect(rows[0].roles).toEqual(["contributor", "editor"]);
  });
});
