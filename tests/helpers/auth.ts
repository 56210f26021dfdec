import type { Server } from "node:http";
import request from "supertest";
import { startFakeGitHub, type FakeGitHub, type FakeGitHubAccount } from "../../fakes/github.ts";
import type { Knex } from "../../server/db/knex.ts";
import type { Role } from "../../server/http/identity.ts";
import { upsertUserWithRoles } from "../../server/features/accounts/accounts-service.ts";
import { tokensService } from "../../server/features/accounts/tokens-service.ts";
import { accountsSeed } from "../../seeds/accounts.ts";
import { demoAccounts } from "../../seeds/data/demo-accounts.ts";
import { buildTestApp } from "./app.ts";
import { listen } from "./browser.ts";
import type { TestDatabase } from "./db.ts";

/**
 * Helpers for tests that need a caller with roles.
 *
 *   const id = await ensureUser(tdb.db, { login: "t-editor", roles: ["editor"] });
 *   const token = await bearerFor(tdb.db, "t-editor");
 *   await request(app).post(url).set("Authorization", `Bearer ${token}`).send(body);
 *
 * Token-authenticated requests need no CSRF header. For a browser-like session use signInAgent.
 */

/** Creates the user, or sets an existing user's roles to exactly `roles`. Returns the user id. */
export async function ensureUser(db: Knex, u: { login: string; name?: string; roles: Role[] }): Promise<number> {
  const user = await upsertUserWithRoles(db, u);
  return user.id;
}

/** A fresh API token for `login` (a user with no roles is created if the login is new). */
export async function bearerFor(db: Knex, login: string): Promise<string> {
  const existing = await db("users").whereRaw("lower(login) = lower(?)", [login]).first<{ id: number } | undefined>("id");
  const id = existing ? existing.id : await ensureUser(db, { login, roles: [] });
  const { token } = await tokensService(db).create(id, `test token for ${login}`);
  return token;
}

export interface SignedInAgent {
  agent: ReturnType<typeof request.agent>;
  /** Send as X-CSRF-Token on state-changing requests. */
  csrf: string;
  baseUrl: string;
}

/**
 * Signs in through the real OAuth round trip against the fake GitHub the app is configured with
 * (startSignInStack below sets both up): the app must listen on 127.0.0.1 because the callback URL has
 * to be absolute. Accepts the listening server or its base URL.
 * The login must be one the fake knows (demo accounts, or extra accounts given to startFakeGitHub).
 */
export async function signInAgent(target: Server | string, login: string, returnTo = "/"): Promise<SignedInAgent> {
  const baseUrl = typeof target === "string" ? target : serverUrl(target);
  const agent = request.agent(baseUrl);
  const start = await agent.get(`/auth/github?login_hint=${encodeURIComponent(login)}&return_to=${encodeURIComponent(returnTo)}`);
  if (start.status !== 302) throw new Error(`GET /auth/github answered ${start.status}, expected a redirect to the provider`);
  const atProvider = await fetch(start.headers.location as string, { redirect: "manual" });
  const back = atProvider.headers.get("location");
  if (atProvider.status !== 302 || !back) throw new Error(`the fake provider answered ${atProvider.status} without a redirect`);
  const callback = new URL(back);
  const done = await agent.get(callback.pathname + callback.search);
  if (done.status !== 302 || String(done.headers.location).includes("/sign-in")) {
    throw new Error(`sign-in as ${login} failed: callback answered ${done.status} to ${String(done.headers.location)}`);
  }
  const csrf = await agent.get("/api/v1/csrf");
  if (csrf.status !== 200 || typeof csrf.body?.token !== "string") throw new Error(`GET /api/v1/csrf answered ${csrf.status}`);
  return { agent, csrf: csrf.body.token as string, baseUrl };
}

export function serverUrl(server: Server): string {
  const addr = server.address();
  if (!addr || typeof addr === "string") throw new Error("the server is not listening on a TCP port");
  return `http://127.0.0.1:${addr.port}`;
}

export interface SignInStack {
  app: ReturnType<typeof buildTestApp>;
  server: Server;
  baseUrl: string;
  fake: FakeGitHub;
  close: () => Promise<void>;
}

/**
 * The app listening on 127.0.0.1 and pointed at a fresh fake GitHub. With seedDemoAccounts (default)
 * the demo people are inserted first, so signing in as demo-editor gives the editor role.
 *
 *   const stack = await startSignInStack(tdb);
 *   const { agent, csrf } = await signInAgent(stack.baseUrl, "demo-editor");
 *   await agent.post("/api/v1/...").set("X-CSRF-Token", csrf).send(body);
 *   await stack.close();
 */
export async function startSignInStack(
  tdb: TestDatabase,
  opts: { env?: Record<string, string>; extraAccounts?: FakeGitHubAccount[]; seedDemoAccounts?: boolean } = {},
): Promise<SignInStack> {
  if (opts.seedDemoAccounts ?? true) {
    const seeded = await tdb.db("users").where({ login: "demo-admin" }).first();
    if (!seeded) await tdb.db.transaction((trx) => accountsSeed.run(trx));
  }
  const fake = await startFakeGitHub({ accounts: [...demoAccounts, ...(opts.extraAccounts ?? [])] });
  const app = buildTestApp(tdb, { ...fake.env, ...opts.env });
  const { server, url } = await listen(app);
  return {
    app,
    server,
    baseUrl: url,
    fake,
    close: async () => {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      await fake.close();
    },
  };
}
