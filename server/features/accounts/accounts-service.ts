import type { Knex } from "../../db/knex.ts";
import type { Role } from "../../http/identity.ts";
import { auditRepository } from "./audit-repository.ts";
import { usersRepository, type User } from "./users-repository.ts";

/** What the sign-in strategy learned from GitHub about the person. */
export interface GitHubProfile {
  githubId: number;
  login: string;
  name: string | null;
  email: string | null;
  avatarUrl: string | null;
  htmlUrl: string | null;
}

/** A sign-in that cannot go ahead, with a code the sign-in page turns into a sentence. */
export class SignInError extends Error {
  readonly code: string;
  constructor(code: string, message: string) {
    super(message);
    this.name = "SignInError";
    this.code = code;
  }
}

export function accountsService(db: Knex, opts: { adminLogins: readonly string[]; clock?: () => Date }) {
  const clock = opts.clock ?? (() => new Date());
  const adminLogins = new Set(opts.adminLogins.map((l) => l.toLowerCase()));

  return {
    findById: (id: number): Promise<User | undefined> => usersRepository(db).findById(id),

    /**
     * Finds or creates the person behind a GitHub profile. Matching is by GitHub's numeric id; a row
     * made before its first sign-in (seeded, or created by an admin/test) is linked by login once.
     * A login in ADMIN_LOGINS gets the admin role when its row is first created, and only then, so an
     * admin who later removes that role is not overruled at the next sign-in.
     */
    async signInFromGitHub(p: GitHubProfile): Promise<User> {
      if (!Number.isSafeInteger(p.githubId) || p.githubId <= 0 || !p.login) {
        throw new SignInError("bad_profile", "GitHub did not say who you are (no id or login in the profile).");
      }
      return db.transaction(async (trx) => {
        const users = usersRepository(trx);
        let user = await users.findByGithubId(p.githubId);
        if (!user) {
          const sameLogin = await users.findByLogin(p.login);
          if (sameLogin && sameLogin.githubId !== null) {
            throw new SignInError("login_taken", `The login ${p.login} belongs to another GitHub account here; ask an admin to sort it out.`);
          }
          user = sameLogin;
        }
        if (!user) {
          const grantAdmin = adminLogins.has(p.login.toLowerCase());
          user = await users.insert({ githubId: p.githubId, login: p.login, name: p.name || p.login, roles: grantAdmin ? ["admin"] : [] });
          if (grantAdmin) {
            await auditRepository(trx).append({
              actorId: null,
              actorLogin: null,
              action: "roles.granted_by_config",
              subject: user.login,
              before: [],
              after: user.roles,
            });
          }
        }
        const clash = await users.findByLogin(p.login);
        if (clash && clash.id !== user.id) {
          throw new SignInError("login_taken", `The login ${p.login} belongs to another account here; ask an admin to sort it out.`);
        }
        return users.recordSignIn(
          user.id,
          { githubId: p.githubId, login: p.login, name: p.name || p.login, email: p.email, avatarUrl: p.avatarUrl, htmlUrl: p.htmlUrl },
          clock(),
        );
      });
    },
  };
}

export type AccountsService = ReturnType<typeof accountsService>;

/**
 * Creates the user if the login is new, otherwise sets their roles to exactly `roles`. Used by the
 * test helpers; not reachable over HTTP (role changes there go through the audited admin service).
 */
export async function upsertUserWithRoles(db: Knex, u: { login: string; name?: string; roles: readonly Role[] }): Promise<User> {
  return db.transaction(async (trx) => {
    const users = usersRepository(trx);
    const existing = await users.findByLogin(u.login);
    if (existing) return users.setRoles(existing.id, u.roles);
    return users.insert({ login: u.login, name: u.name ?? u.login, roles: u.roles });
  });
}
