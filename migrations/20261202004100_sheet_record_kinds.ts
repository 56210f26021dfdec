import type { Knex } from "knex";

/**
 * Sheet records of several kinds: a translated bound (as before), a posterior-samples job result, a
 * stacking result and an IMR-consistency result. A translation record keeps the entry revisions it
 * was computed against (so a reader can see it is stale) and its earlier translations (history, filled
 * when the owner accepts a re-translation). The other kinds keep their provenance and the result as
 * computed in `payload`; they have no bound, binary or translation.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("sheet_records", (t) => {
    t.text("kind").notNullable().defaultTo("translation");
    t.jsonb("payload");
    t.jsonb("entry_revisions");
    t.jsonb("history").notNullable().defaultTo("[]");
    // When the record was added; translated_at moves when a re-translation is accepted.
    t.timestamp("saved_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw("update sheet_records set saved_at = translated_at");
  for (const column of ["bound", "binary", "cosmology", "translation", "catalogue_revision"]) {
    await knex.raw(`alter table sheet_records alter column "${column}" drop not null`);
  }
  await knex.raw("alter table sheet_records add constraint sheet_records_kind check (kind in ('translation','samples_job','stack','consistency'))");
  await knex.raw(
    `alter table sheet_records add constraint sheet_records_kind_shape check (
       (kind = 'translation' and bound is not null and "binary" is not null and cosmology is not null and translation is not null and catalogue_revision is not null)
       or (kind <> 'translation' and payload is not null))`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex("sheet_records").whereNot({ kind: "translation" }).delete();
  await knex.raw("alter table sheet_records drop constraint sheet_records_kind_shape");
  await knex.raw("alter table sheet_records drop constraint sheet_records_kind");
  for (const column of ["bound", "binary", "cosmology", "translation", "catalogue_revision"]) {
    await knex.raw(`alter table sheet_records alter column "${column}" set not null`);
  }
  await knex.schema.alterTable("sheet_records", (t) => {
    t.dropColumn("saved_at");
    t.dropColumn("history");
    t.dropColumn("entry_revisions");
    t.dropColumn("payload");
    t.dropColumn("kind");
  });
}
