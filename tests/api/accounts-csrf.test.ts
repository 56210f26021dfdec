import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { bearerFor, signInAgent, startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

let tdb: TestDatabase;
let stack: SignInStack;
beforeAll(async () => {
  tdb = await createTestDatabase();
  stack = await startSignInStack(tdb);
});
afterAll(async () => {
  await stack?.close();
  await tdb?.drop();
});

const tokenCount = async (login: string) =>
  Number((await tdb.db("api_tokens as t").join("users as u", "u.id", "t.user_id").where("u.login", login).count<{ n: string }[]>("* as n"))[0]?.n);

describe("GET /api/v1/csrf", () => {
  it("when asked, then 200 with a token and a CSRF cookie, not cacheable", async () => {
    const res = await request(stack.baseUrl).get("/api/v1/csrf");
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ token: expect.stringMatching(/^[0-9a-f]{64}\.[0-9a-f]{64}$/) });
    expect(res.headers["cache-control"]).toBe("no-store");
    expect(String(res.headers["set-cookie"])).toMatch(/dragoman\.csrf=.*HttpOnly.*SameSite=Strict/);
  });
});

describe("GET /api/v1/session", () => {
  it("when a visitor asks, then 200 with user null and no CSRF token", async () => {
    const res = await request(stack.baseUrl).get("/api/v1/session");
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ user: null, csrf_token: null });
  });

  it("when signed in, then the person and a CSRF token that works for this session", async () => {
    const { agent } = await signInAgent(stack.baseUrl, "demo-theorist");
    const res = await agent.get("/api/v1/session");
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ user: { login: "demo-theorist", name: "Amara Venn", roles: ["contributor"] }, csrf_token: expect.any(String) });
    const before = await tokenCount("demo-theorist");
    const write = await agent.post("/api/v1/tokens").set("X-CSRF-Token", res.body.csrf_token).send({ name: "via session token" });
    expect(write.status).toBe(201);
    expect(await tokenCount("demo-theorist")).toBe(before + 1);
  });

  it("when called with an API token, then the person and no CSRF token (none is needed)", async () => {
    const token = await bearerFor(tdb.db, "demo-reader");
    const res = await request(stack.baseUrl).get("/api/v1/session").set("Authorization", `Bearer ${token}`);
    expect(res.body).toEqual({ user: { login: "demo-reader", name: "Noor Halvorsen", roles: [] }, csrf_token: null });
  });
});

describe("CSRF on writes authenticated by the session cookie (POST /api/v1/tokens)", () => {
  it("when the X-CSRF-Token header is missing, then 403 csrf_failed and nothing is written", async () => {
    const { agent } = await signInAgent(stack.baseUrl, "demo-analyst");
    const before = await tokenCount("demo-analyst");
    const res = await agent.post("/api/v1/tokens").send({ name: "from a forged form" });
    expect(res.status).toBe(403);
    expect(res.body).toEqual({ error: { code: "csrf_failed", message: "Missing or wrong X-CSRF-Token header; fetch one from GET /api/v1/csrf." } });
    expect(await tokenCount("demo-analyst")).toBe(before);
  });

  it("when the header is wrong, or a token from another session, then 403", async () => {
    const { agent } = await signInAgent(stack.baseUrl, "demo-analyst");
    const other = await signInAgent(stack.baseUrl, "demo-editor");
    for (const header of ["nonsense", other.csrf]) {
      const res = await agent.post("/api/v1/tokens").set("X-CSRF-Token", header).send({ name: "x" });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe("csrf_failed");
    }
  });

  it("when a token fetched before sign-in is sent after it, then 403 (tokens are bound to the session id)", async () => {
    const agent = request.agent(stack.baseUrl);
    const early = (await agent.get("/api/v1/csrf")).body.token as string;
    const start = await agent.get("/auth/github?login_hint=demo-analyst");
    const provider = await fetch(start.headers.location as string, { redirect: "manual" });
    const back = new URL(provider.headers.get("location") ?? "");
    await agent.get(back.pathname + back.search);
    expect((await agent.get("/api/v1/me")).status).toBe(200);
    const res = await agent.post("/api/v1/tokens").set("X-CSRF-Token", early).send({ name: "x" });
    expect(res.status).toBe(403);
  });

  it("when the header carries the session's token, then 201 and the token is stored", async () => {
    const { agent, csrf } = await signInAgent(stack.baseUrl, "demo-analyst");
    const before = await tokenCount("demo-analyst");
    const res = await agent.post("/api/v1/tokens").set("X-CSRF-Token", csrf).send({ name: "notebook" });
    expect(res.status).toBe(201);
    expect(res.body.name).toBe("notebook");
    expect(await tokenCount("demo-analyst")).toBe(before + 1);
  });
});

describe("requests CSRF does not apply to", () => {
  it("when a script authenticates with a Bearer token, then no CSRF header is needed", async () => {
    const token = await bearerFor(tdb.db, "demo-analyst");
    const res = await request(stack.baseUrl).post("/api/v1/tokens").set("Authorization", `Bearer ${token}`).send({ name: "ci job" });
    expect(res.status).toBe(201);
  });

  it("when an anonymous script POSTs without cookies, then it is not blocked by CSRF", async () => {
    const signout = await request(stack.baseUrl).post("/auth/signout");
    expect(signout.status).toBe(204);
    const unknown = await request(stack.baseUrl).post("/api/v1/no-such-route").send({});
    expect(unknown.status).toBe(404);
  });

  it("when the session cookie belongs to a signed-out session, then the request is anonymous (401), not a CSRF failure", async () => {
    const agent = request.agent(stack.baseUrl);
    const start = await agent.get("/auth/github?login_hint=demo-analyst");
    const provider = await fetch(start.headers.location as string, { redirect: "manual" });
    const back = new URL(provider.headers.get("location") ?? "");
    const done = await agent.get(back.pathname + back.search);
    // What a stale browser tab would still send after signing out elsewhere.
    const sid = ([] as string[]).concat(done.headers["set-cookie"] ?? []).find((c) => c.startsWith("dragoman.sid="))?.split(";")[0];
    expect(sid).toBeDefined();
    expect((await request(stack.baseUrl).get("/api/v1/me").set("Cookie", sid!)).status).toBe(200);
    const csrf = (await agent.get("/api/v1/csrf")).body.token as string;
    expect((await agent.post("/auth/signout").set("X-CSRF-Token", csrf)).status).toBe(204);
    const res = await request(stack.baseUrl).post("/api/v1/tokens").set("Cookie", sid!).send({ name: "x" });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe("unauthorized");
  });
});
