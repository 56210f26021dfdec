import PgBoss from "pg-boss";
import type { Config } from "../../config.ts";

/**
 * The pg-boss queue on our own database. The web process only sends and reads; worker processes
 * also supervise (expire claims of dead workers, archive). One queue for every job kind.
 */
export const JOB_QUEUE = "dragoman-jobs";
export const BOSS_SCHEMA = "pgboss";

export interface JobQueue {
  send(jobId: string): Promise<string>;
  /** pg-boss's state of a queue entry, null when it no longer exists. */
  state(queueId: string): Promise<string | null>;
  cancel(queueId: string): Promise<void>;
  boss(): Promise<PgBoss>;
  stop(): Promise<void>;
}

export function createJobQueue(config: Config, options: { supervise: boolean }): JobQueue {
  let started: Promise<PgBoss> | null = null;
  const start = () =>
    (started ??= (async () => {
      const boss = new PgBoss({
        connectionString: config.DATABASE_URL,
        schema: BOSS_SCHEMA,
        max: 3,
        supervise: options.supervise,
        schedule: false,
        migrate: true,
        ...(options.supervise ? { maintenanceIntervalSeconds: config.JOBS_SWEEP_SECONDS } : {}),
      });
      boss.on("error", () => undefined);
      await boss.start();
      await boss.createQueue(JOB_QUEUE);
      return boss;
    })());
  return {
    async send(jobId) {
      const boss = await start();
      const id = await boss.send(JOB_QUEUE, { jobId }, { retryLimit: config.JOBS_RETRY_LIMIT, retryDelay: 1, expireInSeconds: config.JOBS_EXPIRE_SECONDS });
      if (!id) throw new Error("the job queue refused the job");
      return id;
    },
    async state(queueId) {
      const boss = await start();
      const job = await boss.getJobById(JOB_QUEUE, queueId, { includeArchive: true });
      return job?.state ?? null;
    },
    async cancel(queueId) {
      const boss = await start();
      await boss.cancel(JOB_QUEUE, queueId);
    },
    boss: start,
    async stop() {
      if (!started) return;
      const boss = await started.catch(() => null);
      started = null;
      await boss?.stop({ graceful: false, wait: true, close: true, timeout: 2000 });
    },
  };
}
