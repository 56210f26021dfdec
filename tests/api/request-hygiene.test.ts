import { Writable } from "node:stream";
import { pino } from "pino";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildTestApp } from "../helpers/app.ts";
import { bearerFor, ensureUser } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

let tdb: TestDatabase;
beforeAll(async () => {
  tdb = await createTestDatabase();
});
afterAll(async () => {
  await tdb.drop();
});

describe("text no column can hold", () => {
  it("when a JSON body carries a NUL character, then 400 naming the field (not a database 500)", async () => {
    await ensureUser(tdb.db, { login: "hygiene-analyst", roles: ["analyst"] });
    const token = await bearerFor(tdb.db, "hygiene-analyst");
    const res = await request(buildTestApp(tdb)).post("/api/v1/tokens").set("Authorization", `Bearer ${token}`).send({ name: "a\u0000b" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ name: "contains a NUL character (U+0000)" });
  });

  it("when a nested field carries a lone surrogate, then 400 naming its path", async () => {
    const res = await request(buildTestApp(tdb))
      .post("/api/v1/expressions/check")
      .set("Content-Type", "application/json")
      .send('{"expression":"alpha","target":"ppe_phase","couplings":[{"symbol":"\\ud800","dimension":2}]}');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ "couplings.0.symbol": "contains a lone UTF-16 surrogate (not valid Unicode)" });
  });

  it("when the path carries %00, then 400 naming the path", async () => {
    const res = await request(buildTestApp(tdb)).get("/api/v1/theories/a%00b");
    expect(res.status).toBe(400);
    expect(res.body.error.fields.path).toMatch(/NUL/);
  });
});

describe("malformed uploads", () => {
  it("when a multipart body has no boundary or ends early, then 400 bad_upload (not a 500)", async () => {
    const app = buildTestApp(tdb);
    const noBoundary = await request(app).post("/api/v1/convert/table").set("Content-Type", "multipart/form-data").send("x");
    expect(noBoundary.status).toBe(400);
    expect(noBoundary.body.error.code).toBe("bad_upload");
    const cut = await request(app).post("/api/v1/convert/table").set("Content-Type", "multipart/form-data; boundary=X").send("--X\r\nbroken");
    expect(cut.status).toBe(400);
    expect(cut.body.error.fields).toHaveProperty("file");
  });
});

describe("ids beyond a database integer", () => {
  it("when an id exceeds 2^31 - 1, then 400 naming it, for submissions, tokens and revisions", async () => {
    await ensureUser(tdb.db, { login: "hygiene-editor", roles: ["editor", "contributor"] });
    const token = await bearerFor(tdb.db, "hygiene-editor");
    const app = buildTestApp(tdb);
    const sub = await request(app).get("/api/v1/submissions/99999999999").set("Authorization", `Bearer ${token}`);
    expect(sub.status).toBe(400);
    expect(sub.body.error.fields.id).toMatch(/1 to 2147483647/);
    const tok = await request(app).delete("/api/v1/tokens/99999999999").set("Authorization", `Bearer ${token}`);
    expect(tok.status).toBe(400);
    const rev = await request(app).get("/api/v1/theories/edgb/revisions/1e1");
    expect(rev.status).toBe(400);
    expect(rev.body.error.fields.n).toMatch(/whole number/);
  });
});

describe("request logging", () => {
  it("when a request carries a cookie and a token and the answer sets a cookie, then none of them is logged", async () => {
    const lines: string[] = [];
    const sink = new Writable({
      write(chunk, _enc, cb) {
        lines.push(String(chunk));
        cb();
      },
    });
    const logger = pino({ level: "info" }, sink);
    const app = buildTestApp(tdb, {}, { logger });
    await request(app).get("/api/v1/session").set("Cookie", "dragoman.sid=secret-session-value").set("Authorization", "Bearer drg_secret");
    await request(app).get("/auth/github/callback?code=secret-code&state=secret-state");
    const all = lines.join("");
    expect(lines.length).toBeGreaterThan(0);
    expect(all).not.toMatch(/secret-session-value|drg_secret|secret-code|secret-state|set-cookie/);
    expect(all).toContain("/auth/github/callback");
  });
});
