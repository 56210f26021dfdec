import passportPkg from "passport";
import { Strategy as GitHubStrategy, type StrategyOptions } from "passport-github2";
import type { Config } from "../config.ts";
import type { Role } from "../http/identity.ts";
import { SignInError, type AccountsService, type GitHubProfile } from "../features/accounts/accounts-service.ts";
import { loadGitHubProfile, type OAuthGetter } from "./github-profile.ts";

/** What passport keeps on req.user for a signed-in session: loaded fresh from the database each request. */
declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface User {
      id: number;
      login: string;
      name: string;
      roles: Role[];
    }
  }
}

export type PassportInstance = InstanceType<typeof passportPkg.Passport>;

export const GITHUB_CALLBACK_PATH = "/auth/github/callback";

/**
 * One passport instance per app (not the module-level singleton), so two apps in one test process
 * never share strategies or serializers.
 */
export function createPassport(config: Config, accounts: AccountsService): PassportInstance {
  const passport = new passportPkg.Passport();
  // Relative callback: passport-oauth2 resolves it against the request's host. PUBLIC_URL pins it
  // (config.ts requires PUBLIC_URL in production, where the Host header must not decide).
  const callbackURL = config.PUBLIC_URL ? new URL(GITHUB_CALLBACK_PATH, config.PUBLIC_URL).href : GITHUB_CALLBACK_PATH;
  const options = {
    clientID: config.GITHUB_CLIENT_ID,
    clientSecret: config.GITHUB_CLIENT_SECRET ?? "",
    callbackURL,
    authorizationURL: config.GITHUB_AUTHORIZE_URL,
    tokenURL: config.GITHUB_TOKEN_URL,
    scope: ["read:user", "user:email"],
    userAgent: "dragoman",
    // Boolean true turns on passport-oauth2's session-backed state check (the types say string).
    state: true,
  } as unknown as StrategyOptions;

  const strategy = new GitHubStrategy(options, (_access: string, _refresh: string, profile: GitHubProfile, done: (err: unknown, user?: Express.User | false, info?: object) => void) => {
    accounts.signInFromGitHub(profile).then(
      (u) => done(null, { id: u.id, login: u.login, name: u.name, roles: u.roles }),
      (err: unknown) => (err instanceof SignInError ? done(null, false, { code: err.code, message: err.message }) : done(err)),
    );
  });
  // Our own reader of /user and /user/emails (see github-profile.ts for why).
  const oauth = (strategy as unknown as { _oauth2: OAuthGetter })._oauth2;
  strategy.userProfile = (accessToken, done) => loadGitHubProfile(oauth, { user: config.GITHUB_USER_URL, emails: config.GITHUB_EMAILS_URL }, accessToken, done);
  // GitHub ignores parameters it does not know; the local fake picks the account named by login_hint.
  strategy.authorizationParams = (o: { login_hint?: string }) => (o.login_hint ? { login_hint: o.login_hint } : {});
  passport.use("github", strategy);

  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: unknown, done: (err: unknown, user?: Express.User | false) => void) => {
    if (typeof id !== "number") return done(null, false);
    accounts.findById(id).then(
      // false ends the session: the account is gone.
      (u) => done(null, u ? { id: u.id, login: u.login, name: u.name, roles: u.roles } : false),
      (err: unknown) => done(err),
    );
  });
  return passport;
}
