import type { SeedStep } from "./index.ts";
import { demoAccounts } from "./data/demo-accounts.ts";
import { usersRepository } from "../server/features/accounts/users-repository.ts";

/**
 * The demo people, with the GitHub ids the local fake hands out, so signing in as demo-editor lands
 * on this row. Runs inside the one seeding transaction (seeds/index.ts).
 */
export const accountsSeed: SeedStep = {
  name: "accounts",
  run: async (trx) => {
    const users = usersRepository(trx);
    for (const a of demoAccounts) {
      await users.insert({ githubId: a.githubId, login: a.login, name: a.name, email: a.email, roles: a.roles });
    }
  },
};
