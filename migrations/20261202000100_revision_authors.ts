import type { Knex } from "knex";

/**
 * Every author of a published revision, not only the contributor who opened the submission: whoever
 * saved a version of the submission (an editor's fix included) is one of the authors of that version
 * and later ones. Existing revisions are back-filled from the submission's create/save events, first
 * contribution first, or from their single author.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("theory_revisions", (t) => {
    t.specificType("author_ids", "integer[]").notNullable().defaultTo("{}");
  });
  await knex.raw(`
    update theory_revisions r set author_ids = coalesce(
      (select array_agg(x.actor_id order by x.first_at, x.actor_id)
         from (select e.actor_id, min(e.at) as first_at from submission_events e
                where e.submission_id = r.submission_id and e.action in ('create', 'save') and e.actor_id is not null
                group by e.actor_id) x),
      case when r.author_id is null then '{}'::integer[] else array[r.author_id] end)
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("theory_revisions", (t) => {
    t.dropColumn("author_ids");
  });
}
