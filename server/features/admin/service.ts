import type { Knex } from "../../db/knex.ts";
import { ConflictError, NotFoundError } from "../../errors.ts";
import type { Identity, Role } from "../../http/identity.ts";
import { auditRepository, type AuditEntry } from "../accounts/audit-repository.ts";
import { normaliseRoles, usersRepository, type User } from "../accounts/users-repository.ts";

export function adminService(db: Knex) {
  return {
    listUsers: (): Promise<User[]> => usersRepository(db).list(),

    listAudit: (opts: { limit: number; subject?: string | undefined }): Promise<AuditEntry[]> => auditRepository(db).list(opts),

    /**
     * Sets a person's roles to exactly `roles` and records before/after in the audit log, in one
     * transaction. The site never loses its last admin: admins are locked first, so two admins
     * demoting each other at the same moment cannot both succeed.
     */
    async setRoles(actor: Identity, login: string, roles: readonly Role[]): Promise<User> {
      return db.transaction(async (trx) => {
        const users = usersRepository(trx);
        const admins = await users.lockAdmins();
        const target = await users.findByLoginForUpdate(login);
        if (!target) throw new NotFoundError(`No user with login ${login}.`);
        const after = normaliseRoles(roles);
        if (after.length === target.roles.length && after.every((r, i) => r === target.roles[i])) return target;
        if (target.roles.includes("admin") && !after.includes("admin") && admins.length <= 1) {
          throw new ConflictError(`${target.login} is the last admin; make someone else admin first.`, { login: target.login, admins: admins.length });
        }
        const updated = await users.setRoles(target.id, after);
        await auditRepository(trx).append({
          actorId: actor.id,
          actorLogin: actor.login,
          action: "roles.set",
          subject: target.login,
          before: target.roles,
          after: updated.roles,
        });
        return updated;
      });
    },
  };
}
