import type { Knex } from "knex";

/**
 * Background analysis jobs (posterior samples, stacking): the record a client polls, and the bytes
 * the job needs or made (the upload, the per-sample CSV, the per-sample values for stacking) in
 * chunks, so a worker on any machine that reaches the database can run it (docs/samples-jobs.md).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("analysis_jobs", (t) => {
    // 144 random bits, base64url: unguessable, and the only handle an anonymous caller has.
    t.text("id").primary();
    t.text("kind").notNullable();
    t.text("status").notNullable();
    t.double("progress").notNullable().defaultTo(0);
    t.integer("owner_id").references("users.id").onDelete("SET NULL");
    t.jsonb("request").notNullable();
    t.jsonb("file");
    t.jsonb("result");
    t.jsonb("error");
    t.integer("attempts").notNullable().defaultTo(0);
    t.uuid("queue_id");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("started_at", { useTz: true });
    t.timestamp("finished_at", { useTz: true });
    t.timestamp("expires_at", { useTz: true });
    t.index(["owner_id", "created_at"]);
    t.index(["status"]);
  });
  await knex.raw(
    "alter table analysis_jobs add constraint analysis_jobs_status check (status in ('queued','running','done','failed','cancelled'))",
  );
  await knex.raw("alter table analysis_jobs add constraint analysis_jobs_progress check (progress >= 0 and progress <= 1)");

  await knex.schema.createTable("analysis_job_blobs", (t) => {
    t.text("job_id").notNullable().references("analysis_jobs.id").onDelete("CASCADE");
    t.text("name").notNullable();
    t.integer("seq").notNullable();
    t.binary("data").notNullable();
    t.primary(["job_id", "name", "seq"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("analysis_job_blobs");
  await knex.schema.dropTableIfExists("analysis_jobs");
}
