import type { Knex } from "../../db/knex.ts";
import { ROLES, type Role } from "../../http/identity.ts";

/** A person as the rest of the server sees them. Plain object; never a query builder. */
export interface User {
  id: number;
  githubId: number | null;
  login: string;
  name: string;
  email: string | null;
  roles: Role[];
  createdAt: Date;
  lastSignInAt: Date | null;
}

interface UserRow {
  id: number;
  github_id: string | number | null;
  login: string;
  name: string;
  email: string | null;
  roles: string[];
  created_at: Date;
  last_sign_in_at: Date | null;
}

const isRole = (r: string): r is Role => (ROLES as readonly string[]).includes(r);

/** Roles in one fixed order, so stored arrays and audit entries compare equal regardless of input order. */
export function normaliseRoles(roles: readonly string[]): Role[] {
  return ROLES.filter((r) => roles.includes(r));
}

function toUser(row: UserRow): User {
  return {
    id: row.id,
    githubId: row.github_id === null ? null : Number(row.github_id),
    login: row.login,
    name: row.name,
    email: row.email,
    roles: normaliseRoles(row.roles.filter(isRole)),
    createdAt: row.created_at,
    lastSignInAt: row.last_sign_in_at,
  };
}

export interface NewUser {
  githubId?: number | null;
  login: string;
  name: string;
  email?: string | null;
  avatarUrl?: string | null;
  htmlUrl?: string | null;
  roles: readonly Role[];
}

export interface ProfileUpdate {
  githubId: number;
  login: string;
  name: string;
  email: string | null;
  avatarUrl: string | null;
  htmlUrl: string | null;
}

export function usersRepository(db: Knex | Knex.Transaction) {
  return {
    async findById(id: number): Promise<User | undefined> {
      const row = await db<UserRow>("users").where({ id }).first();
      return row ? toUser(row) : undefined;
    },

    async findByLogin(login: string): Promise<User | undefined> {
      const row = await db<UserRow>("users").whereRaw("lower(login) = lower(?)", [login]).first();
      return row ? toUser(row) : undefined;
    },

    async findByGithubId(githubId: number): Promise<User | undefined> {
      const row = await db<UserRow>("users").where({ github_id: githubId }).first();
      return row ? toUser(row) : undefined;
    },

    /** Locks the row until the surrounding transaction ends (role changes are read-modify-write). */
    async findByLoginForUpdate(login: string): Promise<User | undefined> {
      const row = await db<UserRow>("users").whereRaw("lower(login) = lower(?)", [login]).forUpdate().first();
      return row ? toUser(row) : undefined;
    },

    async insert(u: NewUser): Promise<User> {
      const [row] = await db<UserRow>("users")
        .insert({
          github_id: u.githubId ?? null,
          login: u.login,
          name: u.name,
          email: u.email ?? null,
          avatar_url: u.avatarUrl ?? null,
          html_url: u.htmlUrl ?? null,
          roles: normaliseRoles(u.roles),
        } as Partial<UserRow>)
        .returning("*");
      if (!row) throw new Error("insert into users returned no row");
      return toUser(row);
    },

    /** Refreshes what GitHub says about the person and stamps the sign-in time. */
    async recordSignIn(id: number, p: ProfileUpdate, at: Date): Promise<User> {
      const [row] = await db<UserRow>("users")
        .where({ id })
        .update({
          github_id: p.githubId,
          login: p.login,
          name: p.name,
          email: p.email,
          avatar_url: p.avatarUrl,
          html_url: p.htmlUrl,
          last_sign_in_at: at,
        } as Partial<UserRow>)
        .returning("*");
      if (!row) throw new Error(`user ${id} vanished during sign-in`);
      return toUser(row);
    },

    async setRoles(id: number, roles: readonly Role[]): Promise<User> {
      const [row] = await db<UserRow>("users")
        .where({ id })
        .update({ roles: normaliseRoles(roles) })
        .returning("*");
      if (!row) throw new Error(`user ${id} vanished while setting roles`);
      return toUser(row);
    },

    /** Ids of every admin, locked, so two concurrent demotions cannot both pass the last-admin check. */
    async lockAdmins(): Promise<number[]> {
      const rows = await db<UserRow>("users").select("id").whereRaw("'admin' = any(roles)").forUpdate();
      return rows.map((r) => r.id);
    },

    async list(): Promise<User[]> {
      const rows = await db<UserRow>("users").select("*").orderByRaw("lower(login)");
      return rows.map(toUser);
    },
  };
}

export type UsersRepository = ReturnType<typeof usersRepository>;
