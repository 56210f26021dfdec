import type { Knex } from "knex";

/**
 * Each coupling's physical range (positive, non_negative, any_sign) and its value in general
 * relativity (zero, infinity): the translator decides per binary whether a mapping has one sign.
 * Null for rows written before the fields existed. A mapping may carry a caution shown beside every
 * translation that uses it.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("couplings", (t) => {
    t.text("range");
    t.text("gr_value");
  });
  await knex.schema.alterTable("mappings", (t) => {
    t.text("caution");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("mappings", (t) => {
    t.dropColumn("caution");
  });
  await knex.schema.alterTable("couplings", (t) => {
    t.dropColumn("range");
    t.dropColumn("gr_value");
  });
}
