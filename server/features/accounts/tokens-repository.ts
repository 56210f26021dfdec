import type { Knex } from "../../db/knex.ts";
import { normaliseRoles, type User } from "./users-repository.ts";

/** What a person may see about one of their tokens: never the secret, never the hash. */
export interface TokenSummary {
  id: number;
  name: string;
  tokenStart: string;
  createdAt: Date;
  lastUsedAt: Date | null;
}

interface TokenRow {
  id: number;
  user_id: number;
  name: string;
  token_hash: string;
  token_start: string;
  created_at: Date;
  last_used_at: Date | null;
}

const toSummary = (r: TokenRow): TokenSummary => ({
  id: r.id,
  name: r.name,
  tokenStart: r.token_start,
  createdAt: r.created_at,
  lastUsedAt: r.last_used_at,
});

export function tokensRepository(db: Knex | Knex.Transaction) {
  return {
    async insert(userId: number, name: string, tokenHash: string, tokenStart: string): Promise<TokenSummary> {
      const [row] = await db<TokenRow>("api_tokens")
        .insert({ user_id: userId, name, token_hash: tokenHash, token_start: tokenStart })
        .returning("*");
      if (!row) throw new Error("insert into api_tokens returned no row");
      return toSummary(row);
    },

    async listForUser(userId: number): Promise<TokenSummary[]> {
      const rows = await db<TokenRow>("api_tokens").where({ user_id: userId }).orderBy("id", "desc");
      return rows.map(toSummary);
    },

    /** Deletes only when the token belongs to userId; false when there was nothing of theirs to delete. */
    async deleteOwned(userId: number, id: number): Promise<boolean> {
      const n = await db("api_tokens").where({ id, user_id: userId }).delete();
      return n > 0;
    },

    /** The owner of a token (with their roles as they are now) or undefined. */
    async ownerByHash(tokenHash: string): Promise<{ tokenId: number; user: Pick<User, "id" | "login" | "name" | "roles"> } | undefined> {
      const row = await db("api_tokens as t")
        .join("users as u", "u.id", "t.user_id")
        .where("t.token_hash", tokenHash)
        .first<{ token_id: number; id: number; login: string; name: string; roles: string[] } | undefined>(
          "t.id as token_id",
          "u.id",
          "u.login",
          "u.name",
          "u.roles",
        );
      if (!row) return undefined;
      return { tokenId: row.token_id, user: { id: row.id, login: row.login, name: row.name, roles: normaliseRoles(row.roles) } };
    },

    /**
     * Stamps last use. Writes at most once a minute per token: a script polling the API should not
     * turn every read into a write.
     */
    async touch(tokenId: number, at: Date): Promise<void> {
      await db("api_tokens")
        .where({ id: tokenId })
        .andWhere((q) => q.whereNull("last_used_at").orWhere("last_used_at", "<", new Date(at.getTime() - 60_000)))
        .update({ last_used_at: at });
    },
  };
}
