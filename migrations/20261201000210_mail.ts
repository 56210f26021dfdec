import type { Knex } from "knex";

/**
 * E-mail: the outbox the app writes inside its transactions (mail_queue, sent after commit by the
 * in-process dispatcher), and the messages the local SMTP sink captured (dev_outbox; only ever
 * filled on a development or test machine).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("mail_queue", (t) => {
    t.bigIncrements("id").primary();
    t.text("to_address").notNullable();
    t.text("subject").notNullable();
    t.text("text_body").notNullable();
    // What the message is about, for logs and tests: "submission.submitted", "submission.decided".
    t.text("topic").notNullable();
    t.text("status").notNullable().defaultTo("pending");
    t.integer("attempts").notNullable().defaultTo(0);
    t.timestamp("next_attempt_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    // A dispatcher holding the row until then; another process skips it meanwhile.
    t.timestamp("locked_until", { useTz: true });
    t.text("last_error");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("sent_at", { useTz: true });
  });
  await knex.raw("alter table mail_queue add constraint mail_queue_status_known check (status in ('pending', 'sent', 'failed'))");
  await knex.raw("create index mail_queue_due on mail_queue (next_attempt_at) where status = 'pending'");

  await knex.schema.createTable("dev_outbox", (t) => {
    t.bigIncrements("id").primary();
    t.text("to_address").notNullable();
    t.text("from_address").notNullable();
    t.text("subject").notNullable();
    t.text("text_body").notNullable();
    t.text("message_id");
    t.timestamp("received_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("dev_outbox");
  await knex.schema.dropTable("mail_queue");
}
