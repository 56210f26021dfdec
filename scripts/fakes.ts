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
export async function startLocalFakes(_config: Config): Promise<LocalFakes> {
  const services: { name: string; url: string; close: () => Promise<void> }[] = [];
  return {
    env: {},
    describe: () => services.map((s) => `  ${s.name}: ${s.url}\n`).join(""),
    close: async () => {
      for (const s of services.reverse()) await s.close();
    },
  };
}
