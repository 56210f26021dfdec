import type { Knex } from "knex";

/**
 * Every saved version of a submission's entry, so a reviewer can compare a resubmission with the
 * version that was returned (the submission row holds only the latest). Existing submissions are
 * back-filled with their current version; older versions of rows written before this table existed
 * are unknown, and the review page says so.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("submission_versions", (t) => {
    t.integer("submission_id").notNullable().references("submissions.id").onDelete("CASCADE");
    t.integer("version").notNullable();
    t.jsonb("entry").notNullable();
    t.integer("saved_by").references("users.id");
    t.timestamp("saved_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["submission_id", "version"]);
  });
  await knex.raw(`
    insert into submission_versions (submission_id, version, entry, saved_by, saved_at)
    select s.id, s.version, s.entry, null, s.updated_at from submissions s
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("submission_versions");
}
