import type { Knex } from "knex";

/**
 * Job blobs (uploads of up to 512 MB, per-sample outputs) are stored without PostgreSQL's default
 * pglz compression: it cost about 9 s of a 100 MB CSV upload and gained a quarter of the size.
 * STORAGE EXTERNAL keeps the values out of line and uncompressed (docs/samples-jobs.md, "Speed").
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw("alter table analysis_job_blobs alter column data set storage external");
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw("alter table analysis_job_blobs alter column data set storage extended");
}
