import knexPkg, { type Knex } from "knex";
import { migrations } from "../../migrations/index.ts";

export type { Knex };

// knex is CommonJS; under native ESM the named export is missing, the default is the factory.
const knexFactory = ((knexPkg as unknown as { default?: typeof knexPkg }).default ?? knexPkg) as typeof knexPkg;

export function createDb(databaseUrl: string, pool: { min?: number; max?: number } = {}): Knex {
  return knexFactory({
    client: "pg",
    connection: { connectionString: databaseUrl, connectionTimeoutMillis: 3000 },
    pool: { min: pool.min ?? 0, max: pool.max ?? 10, acquireTimeoutMillis: 5000, idleTimeoutMillis: 10_000 },
    acquireConnectionTimeout: 5000,
  });
}

class ListedMigrations implements Knex.MigrationSource<string> {
  getMigrations(): Promise<string[]> {
    return Promise.resolve(Object.keys(migrations).sort());
  }
  getMigrationName(name: string): string {
    return name;
  }
  getMigration(name: string): Promise<Knex.Migration> {
    const m = migrations[name];
    if (!m) throw new Error(`Unknown migration ${name}`);
    return Promise.resolve(m);
  }
}

export const migrationConfig: Knex.MigratorConfig = {
  migrationSource: new ListedMigrations(),
  tableName: "knex_migrations",
};

export async function migrateLatest(db: Knex): Promise<string[]> {
  const [, applied] = (await db.migrate.latest(migrationConfig)) as [number, string[]];
  return applied;
}

/** True when a trivial query answers within timeoutMs. Never throws. */
export async function pingDb(db: Knex, timeoutMs = 1500): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  try {
    const ping = db.raw("select 1").then(() => true);
    const timeout = new Promise<boolean>((resolve) => {
      timer = setTimeout(() => resolve(false), timeoutMs);
    });
    return await Promise.race([ping, timeout]);
  } catch {
    return false;
  } finally {
    if (timer) clearTimeout(timer);
  }
}
