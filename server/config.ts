import { z } from "zod";

/**
 * The only place that reads process.env. Every key is documented in README.md ("Configuration").
 * parseConfig fails fast with a sentence naming the variable at fault.
 */
const bool = z
  .enum(["true", "false", "1", "0"])
  .transform((v) => v === "true" || v === "1");

const csv = z
  .string()
  .transform((v) =>
    v
      .split(",")
      .map((s) => s.trim())
      .filter(Boolean),
  );

export const configSchema = z
  .object({
    NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
    HOST: z.string().min(1).default("127.0.0.1"),
    PORT: z.coerce.number().int().min(0).max(65535).default(3000),
    DATABASE_URL: z.url({ protocol: /^postgres(ql)?$/ }),
    LOG_LEVEL: z.enum(["fatal", "error", "warn", "info", "debug", "trace", "silent"]).default("info"),
    PUBLIC_URL: z.url().optional(),
    SESSION_SECRET: z.string().min(32, "must be at least 32 characters").optional(),
    CLIENT_DIST: z.string().default("dist"),
    // Unset outside production: the local fake's id ("dragoman-local"); production refuses to start without it.
    GITHUB_CLIENT_ID: z.string().min(1).optional(),
    GITHUB_CLIENT_SECRET: z.string().optional(),
    GITHUB_AUTHORIZE_URL: z.url().default("https://github.com/login/oauth/authorize"),
    GITHUB_TOKEN_URL: z.url().default("https://github.com/login/oauth/access_token"),
    GITHUB_USER_URL: z.url().default("https://api.github.com/user"),
    GITHUB_EMAILS_URL: z.url().default("https://api.github.com/user/emails"),
    ADMIN_LOGINS: csv.default([]),
    SMTP_HOST: z.string().default("127.0.0.1"),
    SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
    SMTP_SECURE: bool.default(false),
    SMTP_USER: z.string().optional(),
    SMTP_PASSWORD: z.string().optional(),
    MAIL_FROM: z.string().default("Dragoman <no-reply@dragoman.invalid>"),
    DEV_OUTBOX: bool.default(false),
    // Outbox dispatcher: first retry after MAIL_RETRY_BASE_MS, doubling up to MAIL_RETRY_MAX_MS; gives up after MAIL_MAX_ATTEMPTS.
    MAIL_RETRY_BASE_MS: z.coerce.number().int().min(0).default(5000),
    MAIL_RETRY_MAX_MS: z.coerce.number().int().min(0).default(3_600_000),
    MAIL_MAX_ATTEMPTS: z.coerce.number().int().min(1).default(10),
    MAIL_SWEEP_MS: z.coerce.number().int().min(100).default(30_000),
    // While the database cannot be reached, queries fail at once and a probe runs this often (server/db/breaker.ts).
    DB_PROBE_INTERVAL_MS: z.coerce.number().int().min(50).default(1000),
    RATE_LIMIT_PER_MINUTE: z.coerce.number().int().positive().default(120),
    // Expression checks run in worker threads (server/physics/checks/check-pool.ts): how many, the hard
    // time limit of one job, the requests one client (address or account) may have in flight, and how
    // many jobs may wait. Beyond the last two the answer is 429 / 503 with Retry-After, never a wait.
    // Largest JSON body of a route that declares no limit of its own (bytes); refused with 413 before it is read.
    JSON_BODY_MAX_BYTES: z.coerce.number().int().positive().default(2_097_152),
    CHECK_WORKERS: z.coerce.number().int().min(1).max(16).default(2),
    CHECK_TIMEOUT_MS: z.coerce.number().int().min(100).default(8000),
    CHECK_IN_FLIGHT_PER_CLIENT: z.coerce.number().int().min(1).default(2),
    CHECK_QUEUE_MAX: z.coerce.number().int().min(1).default(32),
    // Scheduling priority (Linux nice, 0-19) of the check and symbolic worker threads and of the job
    // worker process (server/jobs/worker-main.ts): above 0 the threads that answer requests (and
    // PostgreSQL) get the cores first when checks and jobs keep them busy.
    WORKER_NICE: z.coerce.number().int().min(0).max(19).default(10),
    // Largest CSV accepted by POST /api/v1/convert/table (bytes); 256 kB is some thousand rows.
    CONVERT_UPLOAD_MAX_BYTES: z.coerce.number().int().positive().default(262_144),
    // Largest body (JSON columns or CSV upload) accepted by POST /api/v1/convert/samples (bytes); 32 MiB holds 200 000 samples of six columns.
    CONVERT_SAMPLES_MAX_BYTES: z.coerce.number().int().positive().default(4_194_304),
    // Background jobs (docs/samples-jobs.md). Signed-in callers get the large limits, anonymous ones the small.
    JOBS_MAX_BYTES: z.coerce.number().int().positive().default(536_870_912),
    JOBS_MAX_SAMPLES: z.coerce.number().int().positive().default(10_000_000),
    JOBS_ANON_MAX_BYTES: z.coerce.number().int().positive().default(33_554_432),
    JOBS_ANON_MAX_SAMPLES: z.coerce.number().int().positive().default(200_000),
    JOBS_ANON_PER_HOUR: z.coerce.number().int().positive().default(20),
    JOBS_RETENTION_HOURS: z.coerce.number().positive().default(72),
    // A claimed job whose worker has not finished within this time is retried (the worker died or hung).
    JOBS_EXPIRE_SECONDS: z.coerce.number().int().min(1).default(900),
    JOBS_RETRY_LIMIT: z.coerce.number().int().min(0).max(10).default(2),
    // How often workers expire stale claims, reconcile records and delete expired jobs.
    JOBS_SWEEP_SECONDS: z.coerce.number().int().min(1).default(60),
    // Above this fraction of rows with a non-finite value in a mapped column, the job fails instead of skipping them.
    JOBS_MAX_NONFINITE_FRACTION: z.coerce.number().min(0).max(1).default(0.01),
    // Test-only fault injection: the worker waits this long (ms) after half the samples, so tests can cancel or kill it mid-job.
    JOBS_TEST_PAUSE_MS: z.coerce.number().int().min(0).default(0),
    SESSION_TTL_HOURS: z.coerce.number().positive().max(24 * 90).default(336),
    // Lifetime of the session that only holds an unfinished sign-in (OAuth state, return path).
    SIGNIN_SESSION_MINUTES: z.coerce.number().positive().max(24 * 60).default(10),
    // HTTP server: the whole request (headers and body) must arrive within REQUEST_TIMEOUT_MS, the headers
    // within HEADERS_TIMEOUT_MS; a slower client gets 408 and its connection is closed.
    REQUEST_TIMEOUT_MS: z.coerce.number().int().min(1000).default(60_000),
    HEADERS_TIMEOUT_MS: z.coerce.number().int().min(1000).default(15_000),
    KEEP_ALIVE_TIMEOUT_MS: z.coerce.number().int().min(1000).default(5_000),
    // Unset: 30 a minute, 10 000 under NODE_ENV=test (server/auth/rate-limits.ts).
    AUTH_RATE_LIMIT_PER_MINUTE: z.coerce.number().int().positive().optional(),
  })
  .superRefine((c, ctx) => {
    if (c.HEADERS_TIMEOUT_MS > c.REQUEST_TIMEOUT_MS) {
      ctx.addIssue({ code: "custom", path: ["HEADERS_TIMEOUT_MS"], message: `must not exceed REQUEST_TIMEOUT_MS (${c.REQUEST_TIMEOUT_MS})` });
    }
    if (c.NODE_ENV === "production") {
      if (!c.SESSION_SECRET) ctx.addIssue({ code: "custom", path: ["SESSION_SECRET"], message: "is required in production" });
      if (c.DEV_OUTBOX) ctx.addIssue({ code: "custom", path: ["DEV_OUTBOX"], message: "must be false in production" });
      if (!c.GITHUB_CLIENT_ID) ctx.addIssue({ code: "custom", path: ["GITHUB_CLIENT_ID"], message: "is required in production" });
      if (!c.GITHUB_CLIENT_SECRET) ctx.addIssue({ code: "custom", path: ["GITHUB_CLIENT_SECRET"], message: "is required in production" });
      // The OAuth callback URL is built from it; the Host header must not decide where GitHub sends people.
      if (c.JOBS_TEST_PAUSE_MS > 0) ctx.addIssue({ code: "custom", path: ["JOBS_TEST_PAUSE_MS"], message: "is for tests only and must be 0 in production" });
      if (!c.PUBLIC_URL) ctx.addIssue({ code: "custom", path: ["PUBLIC_URL"], message: "is required in production" });
    }
  })
  .transform((c) => ({ ...c, GITHUB_CLIENT_ID: c.GITHUB_CLIENT_ID ?? "dragoman-local" }));

export type Config = z.output<typeof configSchema>;

export class ConfigError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "ConfigError";
  }
}

export function parseConfig(env: Record<string, string | undefined> = process.env): Config {
  const result = configSchema.safeParse(env);
  if (result.success) return result.data;
  const lines = result.error.issues.map((i) => {
    const key = i.path.join(".") || "(environment)";
    const shown = typeof i.path[0] === "string" && env[i.path[0]] !== undefined && !/SECRET|PASSWORD/.test(key) ? ` (got "${env[i.path[0]]}")` : "";
    return `${key} ${i.message}${shown}`;
  });
  throw new ConfigError(`Bad configuration: ${lines.join("; ")}. See README.md, "Configuration".`);
}
