import type { Knex } from "knex";

/**
 * Ringdown translations as sheet records: kind 'ringdown' keeps its request (the QNM-shift bound and the
 * remnant or binary) in `payload` and, like a translation record, the translation as computed, the
 * catalogue version and entry revisions it used, and its history of replaced translations.
 */
const SHAPE_BEFORE = `(kind = 'translation' and bound is not null and "binary" is not null and cosmology is not null and translation is not null and catalogue_revision is not null)
       or (kind <> 'translation' and payload is not null)`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw("alter table sheet_records drop constraint sheet_records_kind_shape");
  await knex.raw("alter table sheet_records drop constraint sheet_records_kind");
  await knex.raw("alter table sheet_records add constraint sheet_records_kind check (kind in ('translation','samples_job','stack','consistency','ringdown'))");
  await knex.raw(
    `alter table sheet_records add constraint sheet_records_kind_shape check (
       (kind = 'translation' and bound is not null and "binary" is not null and cosmology is not null and translation is not null and catalogue_revision is not null)
       or (kind = 'ringdown' and payload is not null and translation is not null and catalogue_revision is not null)
       or (kind not in ('translation', 'ringdown') and payload is not null))`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex("sheet_records").where({ kind: "ringdown" }).delete();
  await knex.raw("alter table sheet_records drop constraint sheet_records_kind_shape");
  await knex.raw("alter table sheet_records drop constraint sheet_records_kind");
  await knex.raw("alter table sheet_records add constraint sheet_records_kind check (kind in ('translation','samples_job','stack','consistency'))");
  await knex.raw(`alter table sheet_records add constraint sheet_records_kind_shape check (${SHAPE_BEFORE})`);
}
