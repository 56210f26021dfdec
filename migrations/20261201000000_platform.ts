import type { Knex } from "knex";

/** Records which seed sets have been applied, so demo data is seeded once and never duplicated. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("seed_runs", (t) => {
    t.string("name").primary();
    t.timestamp("applied_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("seed_runs");
}
