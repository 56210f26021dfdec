import type { GitHubProfile } from "../features/accounts/accounts-service.ts";

/** The part of passport-oauth2's OAuth2 client used here: an authenticated GET. */
export interface OAuthGetter {
  get(url: string, accessToken: string, callback: (err: unknown, body?: string | Buffer) => void): void;
}

export class ProviderAnswerError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "ProviderAnswerError";
  }
}

const parse = (body: string | Buffer | undefined): unknown => {
  try {
    return JSON.parse(String(body ?? ""));
  } catch {
    return undefined;
  }
};

/**
 * Reads the person from GitHub's /user and /user/emails. Replaces passport-github2's own reader,
 * which parses the e-mail answer unguarded (a non-JSON answer would throw outside any handler and
 * stop the server) and accepts unverified addresses. Every failure here becomes a callback error,
 * which the sign-in route turns into /sign-in?error=provider_error.
 */
export function loadGitHubProfile(oauth: OAuthGetter, urls: { user: string; emails: string }, accessToken: string, done: (err: Error | null, profile?: GitHubProfile) => void): void {
  oauth.get(urls.user, accessToken, (err, body) => {
    if (err) return done(new ProviderAnswerError("GitHub's user endpoint refused the access token"));
    const user = parse(body);
    if (!user || typeof user !== "object") return done(new ProviderAnswerError("GitHub's user endpoint did not answer JSON"));
    const u = user as Record<string, unknown>;
    const str = (v: unknown) => (typeof v === "string" && v.length > 0 ? v : null);
    oauth.get(urls.emails, accessToken, (emailErr, emailBody) => {
      // An account without a readable address can still sign in; the e-mail is a convenience.
      const list = emailErr ? undefined : parse(emailBody);
      const entries = Array.isArray(list) ? (list as Record<string, unknown>[]) : [];
      const primary = entries.find((e) => e.primary === true && e.verified === true) ?? entries.find((e) => e.verified === true);
      done(null, {
        githubId: typeof u.id === "number" ? u.id : Number.NaN,
        login: str(u.login) ?? "",
        name: str(u.name),
        email: primary ? str(primary.email) : null,
        avatarUrl: str(u.avatar_url),
        htmlUrl: str(u.html_url),
      });
    });
  });
}
