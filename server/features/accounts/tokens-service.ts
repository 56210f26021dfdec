import { createHash, randomBytes } from "node:crypto";
import type { Knex } from "../../db/knex.ts";
import { NotFoundError, UnauthorizedError } from "../../errors.ts";
import type { Identity } from "../../http/identity.ts";
import { tokensRepository, type TokenSummary } from "./tokens-repository.ts";

/**
 * Personal API tokens: "drg_" + 32 random bytes (base64url). The prefix makes a leaked token easy to
 * recognise (secret scanners, logs); only its sha256 is stored, so a database dump reveals no token.
 */
export const TOKEN_PREFIX = "drg_";
const TOKEN_PATTERN = /^drg_[A-Za-z0-9_-]{43}$/;

export const hashToken = (token: string): string => createHash("sha256").update(token, "utf8").digest("hex");

export function newTokenSecret(): string {
  return TOKEN_PREFIX + randomBytes(32).toString("base64url");
}

export function tokensService(db: Knex, clock: () => Date = () => new Date()) {
  const repo = tokensRepository(db);
  return {
    async create(userId: number, name: string): Promise<{ summary: TokenSummary; token: string }> {
      const token = newTokenSecret();
      const summary = await repo.insert(userId, name, hashToken(token), token.slice(0, TOKEN_PREFIX.length + 4));
      return { summary, token };
    },

    list: (userId: number) => repo.listForUser(userId),

    async revoke(userId: number, id: number): Promise<void> {
      // Someone else's token answers exactly like a missing one: ids reveal nothing about other people.
      if (!(await repo.deleteOwned(userId, id))) throw new NotFoundError(`You have no API token with id ${id}.`);
    },

    /** Resolves a presented token to its owner's identity (current roles), or throws 401 with the reason. */
    async authenticate(token: string): Promise<Identity> {
      if (!TOKEN_PATTERN.test(token)) {
        throw new UnauthorizedError(`Malformed API token: expected "${TOKEN_PREFIX}" followed by 43 characters, as shown when it was created.`);
      }
      const found = await repo.ownerByHash(hashToken(token));
      if (!found) throw new UnauthorizedError("This API token is unknown or has been revoked; create a new one.");
      await repo.touch(found.tokenId, clock());
      return { ...found.user, via: "token" };
    },
  };
}

export type TokensService = ReturnType<typeof tokensService>;
