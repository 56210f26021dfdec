import type { Knex } from "knex";

/**
 * Retired entries and mappings: an editor takes a theory, or one mapping, out of translations and
 * forecasts with a reason, keeping it readable with its history. The reason and time also live in the
 * revision's entry document; these columns are its queryable projection.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("theories", (t) => {
    t.timestamp("retired_at", { useTz: true });
    t.text("retired_reason");
    t.text("retired_by");
  });
  for (const table of ["couplings", "mappings"]) {
    await knex.schema.alterTable(table, (t) => {
      t.timestamp("retired_at", { useTz: true });
      t.text("retired_reason");
      t.text("retired_by");
    });
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ["mappings", "couplings", "theories"]) {
    await knex.schema.alterTable(table, (t) => {
      t.dropColumn("retired_at");
      t.dropColumn("retired_reason");
      t.dropColumn("retired_by");
    });
  }
}
