import { startFakeGitHub } from "../fakes/github.ts";
import { startSmtpSink } from "../fakes/smtp.ts";
import type { Config } from "../server/config.ts";

export interface LocalFakes {
  /** Environment overrides that point the app at the fakes. */
  env: Record<string, string>;
  describe: () => string;
  close: () => Promise<void>;
}

/**
 * Starts the local stand-ins for hosted services (GitHub sign-in, SMTP) on 127.0.0.1.
 * Each service registers itself in `services` below as it is added.
 */
export async function startLocalFakes(config: Config): Promise<LocalFakes> {
  const services: { name: string; url: string; close: () => Promise<void> }[] = [];
  const env: Record<string, string> = {};
  // A configured client secret means a real GitHub OAuth app: then there is nothing to fake.
  if (!config.GITHUB_CLIENT_SECRET) {
    const github = await startFakeGitHub({ clientId: config.GITHUB_CLIENT_ID });
    services.push({ name: "GitHub sign-in (local fake; pick a demo account)", url: github.url, close: github.close });
    Object.assign(env, github.env);
  }
  // SMTP left at its loopback default means no relay was configured: catch mail in the local sink.
  if (["127.0.0.1", "localhost", "::1"].includes(config.SMTP_HOST) && config.NODE_ENV !== "production") {
    const smtp = await startSmtpSink({ databaseUrl: config.DATABASE_URL });
    services.push({ name: "SMTP sink (mail lands in the outbox page, /dev/outbox)", url: smtp.url, close: smtp.close });
    Object.assign(env, smtp.env);
  }
  return {
    env,
    describe: () => services.map((s) => `  ${s.name}: ${s.url}\n`).join(""),
    close: async () => {
      for (const s of services.reverse()) await s.close();
    },
  };
}
