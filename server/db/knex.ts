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

/**
 * True when a trivial query answers within timeoutMs of event-loop time. Never throws.
 *
 * A stalled event loop (seconds of synchronous work elsewhere) must not read as "database down": the
 * timer and the database's answer both wait for the loop, and timers run first. So when the timer fires
 * late (the loop was busy), the ping gets a fresh timeoutMs of free loop; only a timer that fired on
 * time while no answer had arrived means the database did not answer.
 */
export async function pingDb(db: Knex, timeoutMs = 1500): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  try {
    const ping = db.raw("select 1").then(
      () => true,
      () => false,
    );
    const timeout = new Promise<boolean>((resolve) => {
      const arm = () => {
        const armedAt = performance.now();
        timer = setTimeout(() => {
          const late = performance.now() - armedAt - timeoutMs;
          // Let the poll phase deliver an answer that arrived while the loop was blocked, then decide.
          setImmediate(() => (late > Math.max(50, timeoutMs / 4) ? arm() : resolve(false)));
        }, timeoutMs);
      };
      arm();
    });
    return await Promise.race([ping, timeout]);
  } catch {
    return false;
  } finally {
    if (timer) clearTimeout(timer);
  }
}
