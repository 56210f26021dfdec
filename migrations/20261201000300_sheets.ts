import type { Knex } from "knex";

/**
 * Saved sheets: an analyst's named set of bound records. Each record keeps the request it was
 * translated from (bound, binary, cosmology, conventions) and the translation itself, with the
 * catalogue revision it used, so a sheet reads the same after the catalogue moves on.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("sheets", (t) => {
    t.increments("id").primary();
    t.integer("owner_id").notNullable().references("users.id").onDelete("CASCADE");
    t.text("name").notNullable();
    t.text("description").notNullable().defaultTo("");
    // Optimistic concurrency: a PATCH names the version it read; a stale one is refused with 409.
    t.integer("version").notNullable().defaultTo(1);
    // Read-only share link: 32 random bytes, base64url. Null until the owner shares the sheet.
    t.text("share_token").unique();
    t.timestamp("shared_at", { useTz: true });
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["owner_id"]);
  });
  await knex.raw("alter table sheets add constraint sheets_version_positive check (version > 0)");

  await knex.schema.createTable("sheet_records", (t) => {
    t.increments("id").primary();
    t.integer("sheet_id").notNullable().references("sheets.id").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.text("label").notNullable();
    t.text("detector_network").notNullable().defaultTo("");
    t.text("analysis_method").notNullable().defaultTo("");
    t.text("data_link").notNullable().defaultTo("");
    t.text("notes").notNullable().defaultTo("");
    t.jsonb("bound").notNullable();
    t.jsonb("binary").notNullable();
    t.jsonb("cosmology").notNullable();
    t.jsonb("conventions").notNullable().defaultTo("{}");
    t.jsonb("translation").notNullable();
    t.text("catalogue_revision").notNullable();
    t.timestamp("translated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["sheet_id", "position"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("sheet_records");
  await knex.schema.dropTable("sheets");
}
