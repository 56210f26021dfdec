import type { Knex } from "knex";

/**
 * Noise curves a user uploaded for Fisher forecasts (custom:<id>). Stored as the PSD in 1/Hz on
 * strictly increasing frequencies, whatever the upload held (an ASD is squared on the way in), with
 * the amplitude convention the user declared.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("forecast_curves", (t) => {
    t.increments("id").primary();
    t.integer("owner_id").notNullable().references("users.id").onDelete("CASCADE");
    t.text("name").notNullable();
    t.text("convention").notNullable();
    t.boolean("space").notNullable().defaultTo(false);
    t.text("uploaded_kind").notNullable();
    t.specificType("frequencies", "double precision[]").notNullable();
    t.specificType("psd", "double precision[]").notNullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["owner_id"]);
  });
  await knex.raw(
    "alter table forecast_curves add constraint forecast_curves_convention check (convention in ('l_shaped', 'triangle', 'two_channel_triangle', 'response_averaged'))",
  );
  await knex.raw("alter table forecast_curves add constraint forecast_curves_kind check (uploaded_kind in ('asd', 'psd'))");
  await knex.raw("alter table forecast_curves add constraint forecast_curves_points check (cardinality(frequencies) = cardinality(psd) and cardinality(psd) >= 2)");
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("forecast_curves");
}
