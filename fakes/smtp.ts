import type { AddressInfo } from "node:net";
import { simpleParser, type AddressObject } from "mailparser";
import { SMTPServer } from "smtp-server";
import { createDb, type Knex } from "../server/db/knex.ts";

/**
 * A local SMTP sink on 127.0.0.1 for npm start and the tests: it accepts every message and writes
 * it to the dev_outbox table of the database it is given, where GET /api/v1/dev/outbox reads it.
 * Nothing leaves the machine.
 */
export interface SmtpSink {
  host: string;
  port: number;
  url: string;
  /** Environment overrides pointing the app's mailer at this sink (and enabling the outbox page). */
  env: Record<string, string>;
  close: () => Promise<void>;
}

function addresses(a: AddressObject | AddressObject[] | undefined): string {
  if (!a) return "";
  return (Array.isArray(a) ? a : [a])
    .flatMap((x) => x.value.map((v) => v.address ?? v.name))
    .filter(Boolean)
    .join(", ");
}

/** Starts the sink. Pass `port` to come back on a known port (a test that stops and restarts it). */
export async function startSmtpSink(opts: { databaseUrl?: string; db?: Knex; port?: number; host?: string }): Promise<SmtpSink> {
  const host = opts.host ?? "127.0.0.1";
  const ownDb = opts.db ? undefined : createDb(requireUrl(opts.databaseUrl), { max: 2 });
  const db = opts.db ?? (ownDb as Knex);
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    logger: false,
    banner: "Dragoman local mail sink",
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then(async (m) => {
          await db("dev_outbox").insert({
            to_address: addresses(m.to),
            from_address: addresses(m.from),
            subject: m.subject ?? "",
            text_body: m.text ?? "",
            message_id: m.messageId ?? null,
          });
          callback();
        })
        .catch((err: unknown) => callback(err instanceof Error ? err : new Error(String(err))));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port ?? 0, host, () => {
      server.off("error", reject);
      resolve();
    });
  });
  const port = (server.server.address() as AddressInfo).port;
  return {
    host,
    port,
    url: `smtp://${host}:${port}`,
    env: { SMTP_HOST: host, SMTP_PORT: String(port), SMTP_SECURE: "false", DEV_OUTBOX: "true" },
    close: async () => {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      if (ownDb) await ownDb.destroy();
    },
  };
}

function requireUrl(url: string | undefined): string {
  if (!url) throw new Error("startSmtpSink needs databaseUrl or db");
  return url;
}
