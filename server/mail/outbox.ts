import type { Config } from "../config.ts";
import type { Knex } from "../db/knex.ts";
import type { Logger } from "../logger.ts";
import { createMailDispatcher, type MailDispatcher } from "./dispatcher.ts";
import { createSmtpMailer, type Mailer } from "./mailer.ts";

/** The app's mail outbox: the configured (or injected) mailer behind the dispatcher, with the configured retry policy. */
export function createMailOutbox(deps: { db: Knex; config: Config; logger: Logger; mailer?: Mailer | undefined }): MailDispatcher {
  const { config } = deps;
  return createMailDispatcher({
    db: deps.db,
    mailer: deps.mailer ?? createSmtpMailer(config),
    logger: deps.logger,
    retryBaseMs: config.MAIL_RETRY_BASE_MS,
    retryMaxMs: config.MAIL_RETRY_MAX_MS,
    maxAttempts: config.MAIL_MAX_ATTEMPTS,
    sweepMs: config.MAIL_SWEEP_MS,
  });
}
