import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { SESSION_COOKIE } from "../../server/auth/session.ts";
import { normaliseRoles } from "../../server/features/accounts/users-repository.ts";
import { demoAccounts } from "../../seeds/data/demo-accounts.ts";
import { signInAgent, startSignInStack, type SignInStack } from "../helpers/auth.ts";
import { createTestDatabase, type TestDatabase } from "../helpers/db.ts";

let tdb: TestDatabase;
let stack: SignInStack;
beforeAll(async () => {
  tdb = await createTestDatabase();
  stack = await startSignInStack(tdb, {
    env: { ADMIN_LOGINS: "fresh-boss" },
    extraAccounts: [
      { githubId: 920001, login: "fresh-boss", name: "Fresh Boss", email: "boss@demo.dragoman.invalid" },
      { githubId: 920002, login: "fresh-face", name: "Fresh Face", email: "face@demo.dragoman.invalid" },
    ],
  });
});
afterAll(async () => {
  await stack?.close();
  await tdb?.drop();
});

/** The session cookie's value from a Set-Cookie list, if any. */
function sessionCookie(setCookie: string | string[] | undefined): string | undefined {
  const list = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  const c = list.find((s) => s.startsWith(`${SESSION_COOKIE}=`));
  return c?.split(";")[0]?.slice(SESSION_COOKIE.length + 1);
}

/** Starts sign-in and follows the fake's redirect; returns the callback path the browser would request. */
async function throughProvider(agent: ReturnType<typeof request.agent>, query: string) {
  const start = await agent.get(`/auth/github${query}`);
  expect(start.status).toBe(302);
  const provider = await fetch(start.headers.location as string, { redirect: "manual" });
  expect(provider.status).toBe(302);
  const back = new URL(provider.headers.get("location") ?? "");
  return { start, back, callbackPath: back.pathname + back.search };
}

async function signedInSessions(): Promise<number> {
  const rows = await tdb.db("user_sessions").select("sess");
  return rows.filter((r: { sess: { passport?: { user?: number } } }) => r.sess.passport?.user !== undefined).length;
}

describe("GET /auth/github → fake GitHub → GET /auth/github/callback", () => {
  it.each(demoAccounts.map((a) => [a.login, a] as const))("when %s signs in, then /api/v1/me names them with their seeded roles", async (_login, account) => {
    const { agent } = await signInAgent(stack.baseUrl, account.login);
    const me = await agent.get("/api/v1/me");
    expect(me.status).toBe(200);
    expect(me.body).toEqual({ user: { login: account.login, name: account.name, roles: normaliseRoles(account.roles) } });
    const row = await tdb.db("users").where({ login: account.login }).first();
    expect(Number(row.github_id)).toBe(account.githubId);
    expect(row.email).toBe(account.email);
    expect(row.last_sign_in_at).toBeInstanceOf(Date);
  });

  it("when the sign-in starts, then the provider is asked with state, scope, login_hint and an absolute callback", async () => {
    const agent = request.agent(stack.baseUrl);
    const start = await agent.get("/auth/github?login_hint=demo-editor");
    const to = new URL(start.headers.location as string);
    expect(to.origin + to.pathname).toBe(stack.fake.env.GITHUB_AUTHORIZE_URL);
    expect(to.searchParams.get("login_hint")).toBe("demo-editor");
    expect(to.searchParams.get("state")).toMatch(/^\S{16,}$/);
    expect(to.searchParams.get("scope")).toBe("read:user,user:email");
    expect(to.searchParams.get("redirect_uri")).toBe(`${stack.baseUrl}/auth/github/callback`);
  });

  it("when the sign-in completes, then the session id is a new one and the row is in PostgreSQL", async () => {
    const agent = request.agent(stack.baseUrl);
    const { start, callbackPath } = await throughProvider(agent, "?login_hint=demo-analyst");
    const before = sessionCookie(start.headers["set-cookie"]);
    expect(before).toBeDefined();
    const done = await agent.get(callbackPath);
    expect(done.status).toBe(302);
    expect(done.headers.location).toBe("/");
    const after = sessionCookie(done.headers["set-cookie"]);
    expect(after).toBeDefined();
    expect(after).not.toBe(before);
    // Signed cookie: "s:" + sid + "." + signature.
    const sid = (v: string): string => decodeURIComponent(v).slice(2).split(".")[0] ?? "";
    const rows = await tdb.db("user_sessions").whereIn("sid", [sid(before!), sid(after!)]);
    expect(rows.map((r: { sid: string }) => r.sid)).toEqual([sid(after!)]);
    expect(rows[0].sess.passport.user).toBe((await tdb.db("users").where({ login: "demo-analyst" }).first()).id);
  });

  it("when return_to is a path here, then sign-in ends there; when it points elsewhere, then at /", async () => {
    for (const [asked, expected] of [
      ["/catalogue/edgb?tab=mapping#beta", "/catalogue/edgb?tab=mapping#beta"],
      ["//evil.example/steal", "/"],
      ["https://evil.example/", "/"],
      ["/\\evil.example", "/"],
      ["javascript:alert(1)", "/"],
    ] as const) {
      const agent = request.agent(stack.baseUrl);
      const { callbackPath } = await throughProvider(agent, `?login_hint=demo-reader&return_to=${encodeURIComponent(asked)}`);
      const done = await agent.get(callbackPath);
      expect(done.status, asked).toBe(302);
      expect(done.headers.location, asked).toBe(expected);
    }
  });

  it("when a login in ADMIN_LOGINS signs in for the first time, then they are admin and the audit log says the configuration did it", async () => {
    const { agent } = await signInAgent(stack.baseUrl, "fresh-boss");
    expect((await agent.get("/api/v1/me")).body.user.roles).toEqual(["admin"]);
    const audit = await tdb.db("audit_log").where({ subject: "fresh-boss" });
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ actor_id: null, action: "roles.granted_by_config", before: [], after: ["admin"] });
  });

  it("when someone new signs in, then they get an account with no role beyond reader", async () => {
    const { agent } = await signInAgent(stack.baseUrl, "fresh-face");
    expect((await agent.get("/api/v1/me")).body).toEqual({ user: { login: "fresh-face", name: "Fresh Face", roles: [] } });
  });
});

describe("GET /auth/github/callback when something is wrong", () => {
  it("when the state is forged, then /sign-in?error=state_mismatch and no session", async () => {
    const before = await signedInSessions();
    const agent = request.agent(stack.baseUrl);
    const { back } = await throughProvider(agent, "?login_hint=demo-admin");
    back.searchParams.set("state", "forged-state-value-0123456789");
    const done = await agent.get(back.pathname + back.search);
    expect(done.status).toBe(302);
    expect(done.headers.location).toBe("/sign-in?error=state_mismatch");
    expect((await agent.get("/api/v1/me")).status).toBe(401);
    expect(await signedInSessions()).toBe(before);
  });

  it("when the callback is replayed after a successful sign-in, then state_mismatch and the replaying browser gets no session", async () => {
    const agent = request.agent(stack.baseUrl);
    const { callbackPath } = await throughProvider(agent, "?login_hint=demo-editor");
    expect((await agent.get(callbackPath)).headers.location).toBe("/");
    const stranger = request.agent(stack.baseUrl);
    const replay = await stranger.get(callbackPath);
    expect(replay.headers.location).toBe("/sign-in?error=state_mismatch");
    expect((await stranger.get("/api/v1/me")).status).toBe(401);
    const again = await agent.get(callbackPath);
    expect(again.headers.location).toBe("/sign-in?error=state_mismatch");
  });

  it("when the login_hint is unknown to GitHub, then the fake denies access and the app says so without a session", async () => {
    const before = await signedInSessions();
    const agent = request.agent(stack.baseUrl);
    const { back, callbackPath } = await throughProvider(agent, "?login_hint=nobody-here");
    expect(back.searchParams.get("error")).toBe("access_denied");
    const done = await agent.get(callbackPath);
    expect(done.status).toBe(302);
    expect(done.headers.location).toBe("/sign-in?error=access_denied");
    expect((await agent.get("/api/v1/me")).status).toBe(401);
    expect(await signedInSessions()).toBe(before);
  });

  it("when the provider reports an error, then provider_error, never a 500", async () => {
    const agent = request.agent(stack.baseUrl);
    const res = await agent.get("/auth/github/callback?error=temporarily_unavailable&error_description=down&state=x");
    expect(res.status).toBe(302);
    expect(res.headers.location).toBe("/sign-in?error=provider_error");
  });

  it("when the code is bad at the token endpoint, then provider_error and no session", async () => {
    const agent = request.agent(stack.baseUrl);
    const { back } = await throughProvider(agent, "?login_hint=demo-editor");
    back.searchParams.set("code", "not-a-code-the-fake-issued");
    const done = await agent.get(back.pathname + back.search);
    expect(done.headers.location).toBe("/sign-in?error=provider_error");
    expect((await agent.get("/api/v1/me")).status).toBe(401);
  });

  it("when the callback has neither code nor error, then no_code", async () => {
    const res = await request(stack.baseUrl).get("/auth/github/callback");
    expect(res.status).toBe(302);
    expect(res.headers.location).toBe("/sign-in?error=no_code");
  });

  it("when login_hint is not a GitHub login, then bad_login_hint and the provider is not contacted", async () => {
    const res = await request(stack.baseUrl).get("/auth/github?login_hint=%3Cscript%3E");
    expect(res.status).toBe(302);
    expect(res.headers.location).toBe("/sign-in?error=bad_login_hint");
  });
});

describe("POST /auth/signout", () => {
  it("when signed in, then without the CSRF header 403; with it 204, the session row is gone and /api/v1/me is 401", async () => {
    const { agent, csrf } = await signInAgent(stack.baseUrl, "demo-theorist");
    const refused = await agent.post("/auth/signout");
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe("csrf_failed");
    expect((await agent.get("/api/v1/me")).status).toBe(200);

    const sessionsBefore = await signedInSessions();
    const res = await agent.post("/auth/signout").set("X-CSRF-Token", csrf);
    expect(res.status).toBe(204);
    expect((await agent.get("/api/v1/me")).status).toBe(401);
    expect(await signedInSessions()).toBe(sessionsBefore - 1);
  });
});

describe("GET /auth/github/callback when GitHub's API answers badly", () => {
  it("when /user/emails answers something that is not JSON, then the sign-in still works, without an e-mail", async () => {
    const db = await createTestDatabase();
    const first = await startSignInStack(db);
    // A second app on the first app's fake (codes are only valid where they were issued), whose
    // e-mail URL answers an empty 204 instead of JSON.
    const app2 = await startSignInStack(db, { env: { ...first.fake.env, GITHUB_EMAILS_URL: `${first.fake.url}/favicon.ico` } });
    try {
      const { agent } = await signInAgent(app2.baseUrl, "demo-theorist");
      expect((await agent.get("/api/v1/me")).body.user.login).toBe("demo-theorist");
      expect((await db.db("users").where({ login: "demo-theorist" }).first()).email).toBeNull();
    } finally {
      await app2.close();
      await first.close();
      await db.drop();
    }
  });

  it("when /user fails, then provider_error and no session, never a 500", async () => {
    const db = await createTestDatabase();
    const first = await startSignInStack(db);
    const app2 = await startSignInStack(db, { env: { ...first.fake.env, GITHUB_USER_URL: `${first.fake.url}/no-such-endpoint` } });
    try {
      const agent = request.agent(app2.baseUrl);
      const start = await agent.get("/auth/github?login_hint=demo-editor");
      const provider = await fetch(start.headers.location as string, { redirect: "manual" });
      const back = new URL(provider.headers.get("location") ?? "");
      const done = await agent.get(back.pathname + back.search);
      expect(done.status).toBe(302);
      expect(done.headers.location).toBe("/sign-in?error=provider_error");
      expect((await agent.get("/api/v1/me")).status).toBe(401);
    } finally {
      await app2.close();
      await first.close();
      await db.drop();
    }
  });
});
