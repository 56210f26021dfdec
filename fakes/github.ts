import { createServer, type Server } from "node:http";
import express, { type Request, type Response } from "express";
import { OAuth2Issuer, OAuth2Service } from "oauth2-mock-server";
import { demoAccounts } from "../seeds/data/demo-accounts.ts";

/**
 * A stand-in for GitHub's OAuth app flow on 127.0.0.1, for npm start and the tests. The OAuth
 * mechanics (codes, signed access tokens) come from oauth2-mock-server; this file adds what GitHub
 * does on top: a page to choose who you are, `login_hint` to choose directly, and GitHub-shaped
 * `/user` and `/user/emails` answers for the chosen account. Paths mirror github.com's so the app's
 * configuration has the same shape against the fake and the real thing.
 */
export interface FakeGitHubAccount {
  githubId: number;
  login: string;
  name: string;
  email: string;
  blurb?: string;
}

export interface FakeGitHub {
  url: string;
  /** Environment overrides pointing the app at this fake. */
  env: Record<string, string>;
  close: () => Promise<void>;
}

export const FAKE_PATHS = {
  authorize: "/login/oauth/authorize",
  token: "/login/oauth/access_token",
  user: "/user",
  emails: "/user/emails",
} as const;

interface Grant {
  login: string;
  redirectUri: string;
}

export async function startFakeGitHub(
  opts: { accounts?: readonly FakeGitHubAccount[]; clientId?: string; port?: number; host?: string } = {},
): Promise<FakeGitHub> {
  const accounts = new Map((opts.accounts ?? demoAccounts).map((a) => [a.login.toLowerCase(), a]));
  const clientId = opts.clientId ?? "dragoman-local";
  const grants = new Map<string, Grant>();
  const tokens = new Map<string, string>();

  const issuer = new OAuth2Issuer();
  await issuer.keys.generate("RS256");
  const service = new OAuth2Service(issuer, { authorize: FAKE_PATHS.authorize, token: FAKE_PATHS.token, userinfo: FAKE_PATHS.user });
  let base = "";

  // The mock issues the code; remember whose it is and where it may be redeemed.
  service.on("beforeAuthorizeRedirect", (redirect: { url: URL }, req: Request) => {
    const code = redirect.url.searchParams.get("code");
    const login = String(req.query.login_hint ?? "").toLowerCase();
    if (code) grants.set(code, { login, redirectUri: String(req.query.redirect_uri) });
  });

  // Codes are single use and bound to the client and redirect URI, as on GitHub.
  service.on("beforeResponse", (resp: { statusCode: number; body: Record<string, unknown> }, req: Request) => {
    const body = req.body as Record<string, unknown>;
    const grant = typeof body.code === "string" ? grants.get(body.code) : undefined;
    if (typeof body.code === "string") grants.delete(body.code);
    if (body.client_id !== undefined && body.client_id !== clientId) {
      resp.statusCode = 401;
      resp.body = { error: "incorrect_client_credentials", error_description: "The client_id is not the one this fake was started with." };
      return;
    }
    if (!grant || (body.redirect_uri !== undefined && body.redirect_uri !== grant.redirectUri)) {
      resp.statusCode = 400;
      resp.body = { error: "bad_verification_code", error_description: "The code passed is incorrect or expired." };
      return;
    }
    if (typeof resp.body.access_token === "string") tokens.set(resp.body.access_token, grant.login);
  });

  const accountFor = (req: Request): FakeGitHubAccount | undefined => {
    const m = /^(?:Bearer|token)\s+(\S+)$/i.exec(req.headers.authorization ?? "");
    const login = m?.[1] ? tokens.get(m[1]) : undefined;
    return login ? accounts.get(login) : undefined;
  };

  service.on("beforeUserinfo", (resp: { statusCode: number; body: unknown }, req: Request) => {
    const a = accountFor(req);
    if (!a) {
      resp.statusCode = 401;
      resp.body = { message: "Bad credentials" };
      return;
    }
    resp.body = {
      id: a.githubId,
      login: a.login,
      name: a.name,
      type: "User",
      html_url: `${base}/${a.login}`,
      avatar_url: `${base}/avatars/${a.login}.png`,
      email: null,
    };
  });

  const app = express();
  app.disable("x-powered-by");
  app.get(FAKE_PATHS.authorize, (req: Request, res: Response, next) => {
    const redirectUri = typeof req.query.redirect_uri === "string" ? req.query.redirect_uri : "";
    let back: URL;
    try {
      back = new URL(redirectUri);
    } catch {
      res.status(400).type("text/plain").send("fake GitHub: redirect_uri is missing or not an absolute URL.");
      return;
    }
    const hint = typeof req.query.login_hint === "string" ? req.query.login_hint : "";
    if (!hint) {
      res.type("html").send(pickPage(req, [...accounts.values()]));
      return;
    }
    if (!accounts.has(hint.toLowerCase())) {
      back.searchParams.set("error", "access_denied");
      back.searchParams.set("error_description", `No account named ${hint} here.`);
      if (typeof req.query.state === "string") back.searchParams.set("state", req.query.state);
      res.redirect(back.href);
      return;
    }
    next();
  });
  app.get(FAKE_PATHS.emails, (req: Request, res: Response) => {
    const a = accountFor(req);
    if (!a) {
      res.status(401).json({ message: "Bad credentials" });
      return;
    }
    res.json([{ email: a.email, primary: true, verified: true, visibility: "private" }]);
  });
  // Browsers ask every origin for one; a 404 would show up as a console error in browser tests.
  app.get("/favicon.ico", (_req: Request, res: Response) => void res.status(204).end());
  app.use(service.requestHandler);

  const server: Server = createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port ?? 0, opts.host ?? "127.0.0.1", () => resolve());
  });
  const addr = server.address();
  const port = typeof addr === "object" && addr ? addr.port : 0;
  base = `http://${opts.host ?? "127.0.0.1"}:${port}`;
  issuer.url = base;

  return {
    url: base,
    env: {
      GITHUB_AUTHORIZE_URL: base + FAKE_PATHS.authorize,
      GITHUB_TOKEN_URL: base + FAKE_PATHS.token,
      GITHUB_USER_URL: base + FAKE_PATHS.user,
      GITHUB_EMAILS_URL: base + FAKE_PATHS.emails,
      GITHUB_CLIENT_ID: clientId,
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** A deliberately plain page (it is not part of Dragoman): one link per account. */
function pickPage(req: Request, accounts: FakeGitHubAccount[]): string {
  const links = accounts
    .map((a) => {
      const q = new URLSearchParams();
      for (const [k, v] of Object.entries(req.query)) if (typeof v === "string") q.set(k, v);
      q.set("login_hint", a.login);
      return `<li><a data-login="${escapeHtml(a.login)}" href="${FAKE_PATHS.authorize}?${escapeHtml(q.toString())}"><b>${escapeHtml(a.login)}</b></a> ${escapeHtml(a.name)}${a.blurb ? ` <i>(${escapeHtml(a.blurb)})</i>` : ""}</li>`;
    })
    .join("\n");
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>Local sign-in stand-in</title>
<style>body{font:16px/1.5 system-ui,sans-serif;max-width:40rem;margin:3rem auto;padding:0 1rem;background:#fff;color:#222}
li{margin:.6rem 0}a{color:#0645ad}.note{color:#666;font-size:.9rem}</style></head>
<body><h1>Local sign-in stand-in</h1>
<p>This page stands in for GitHub on this machine. Pick the account to continue as:</p>
<ul>${links}</ul>
<p class="note">Nothing here reaches the internet. Configure a real GitHub OAuth app to sign in for real.</p>
</body></html>`;
}
