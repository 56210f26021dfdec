import type { Knex } from "knex";

/**
 * The catalogue: accepted theories normalised into tables (so "mappings with b = -7" is SQL), the
 * literature they cite, every published revision as a JSON document, and the submissions that
 * propose entries or changes, with their review comments and state changes.
 */
const SUBMISSION_STATUSES = ["draft", "submitted", "in_review", "accepted", "returned", "resubmitted", "withdrawn"];
const MAPPING_KINDS = ["inspiral_phase", "inspiral_amplitude", "ringdown_frequency", "ringdown_damping"];
const SOURCE_STATUSES = ["confirmed", "derived", "memory"];

const inList = (column: string, values: string[]) => `${column} in (${values.map((v) => `'${v}'`).join(", ")})`;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("theories", (t) => {
    t.increments("id").primary();
    t.text("slug").notNullable().unique();
    t.text("name").notNullable();
    t.text("kind").notNullable();
    t.text("family").notNullable();
    t.text("summary").notNullable();
    t.text("action_latex");
    t.text("metric_latex");
    t.jsonb("assumptions").notNullable().defaultTo("[]");
    t.boolean("needs_source_confirmation").notNullable().defaultTo(false);
    t.integer("current_revision").notNullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["family"]);
  });

  // "references" is an SQL keyword; the papers the catalogue cites live in "literature".
  await knex.schema.createTable("literature", (t) => {
    t.increments("id").primary();
    t.text("citation_key").notNullable();
    t.text("arxiv");
    t.text("doi");
    t.jsonb("authors").notNullable();
    t.text("title").notNullable();
    t.integer("year").notNullable();
    t.text("journal");
    t.text("volume");
    t.text("pages");
    t.text("note");
    t.boolean("details_from_memory").notNullable().defaultTo(false);
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  // One row per paper: DOIs are case-insensitive; arXiv ids are compared without their version.
  await knex.raw("create unique index literature_doi_lower on literature (lower(doi)) where doi is not null");
  await knex.raw("create unique index literature_arxiv_base on literature (regexp_replace(arxiv, 'v[0-9]+$', '')) where arxiv is not null");

  await knex.schema.createTable("theory_references", (t) => {
    t.integer("theory_id").notNullable().references("theories.id").onDelete("CASCADE");
    t.integer("literature_id").notNullable().references("literature.id");
    t.text("key").notNullable();
    t.integer("position").notNullable();
    t.text("locator");
    t.primary(["theory_id", "key"]);
    t.index(["literature_id"]);
  });

  await knex.schema.createTable("couplings", (t) => {
    t.increments("id").primary();
    t.integer("theory_id").notNullable().references("theories.id").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.text("symbol").notNullable();
    t.text("latex").notNullable();
    t.double("dimension").notNullable();
    t.text("unit").notNullable();
    t.text("quoted_form");
    t.text("quoted_symbol");
    t.text("quoted_latex");
    t.text("quoted_unit");
    t.double("quoted_alpha_md");
    t.text("description");
    t.text("convention");
    t.unique(["theory_id", "symbol"]);
  });

  await knex.schema.createTable("coupling_conventions", (t) => {
    t.increments("id").primary();
    t.integer("coupling_id").notNullable().references("couplings.id").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.text("name").notNullable();
    t.text("action_latex");
    t.double("factor").notNullable();
    t.text("factor_expression");
    t.integer("literature_id").references("literature.id");
    t.text("source_status");
    t.text("note");
    t.unique(["coupling_id", "name"]);
  });

  await knex.schema.createTable("definitions", (t) => {
    t.increments("id").primary();
    t.integer("theory_id").notNullable().references("theories.id").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.text("symbol").notNullable();
    t.text("expression").notNullable();
    t.text("latex").notNullable();
    t.text("description");
    t.unique(["theory_id", "symbol"]);
  });

  await knex.schema.createTable("mappings", (t) => {
    t.increments("id").primary();
    t.integer("theory_id").notNullable().references("theories.id").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.text("kind").notNullable();
    t.double("pn_order");
    t.double("b");
    t.double("a");
    t.jsonb("mode");
    t.text("expression").notNullable();
    t.text("latex").notNullable();
    t.text("coupling_symbol").notNullable();
    t.jsonb("held_fixed");
    t.double("alpha_md");
    t.text("frame_note");
    t.jsonb("derivation");
    t.jsonb("gimr_equivalent");
    t.jsonb("body_rules").notNullable().defaultTo("[]");
    t.text("source_status").notNullable();
    t.text("locator");
    t.text("notes");
    // The engine's check results at publication, as stored with the revision.
    t.jsonb("checks").notNullable().defaultTo("[]");
    t.boolean("checks_ok").notNullable();
    t.index(["b"]);
    t.index(["kind"]);
    t.index(["theory_id"]);
  });
  await knex.raw(`alter table mappings add constraint mappings_kind_known check (${inList("kind", MAPPING_KINDS)})`);
  await knex.raw(`alter table mappings add constraint mappings_source_known check (${inList("source_status", SOURCE_STATUSES)})`);

  await knex.schema.createTable("mapping_references", (t) => {
    t.integer("mapping_id").notNullable().references("mappings.id").onDelete("CASCADE");
    t.integer("literature_id").notNullable().references("literature.id");
    t.integer("position").notNullable();
    t.primary(["mapping_id", "literature_id"]);
  });

  await knex.schema.createTable("mapping_validity", (t) => {
    t.increments("id").primary();
    t.integer("mapping_id").notNullable().references("mappings.id").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.text("expression").notNullable();
    t.text("latex").notNullable();
    t.double("max").notNullable();
    t.text("label").notNullable();
    t.text("kind").notNullable();
    t.smallint("body");
    t.jsonb("applies_to");
    t.text("source_status");
    // A reference key of the entry (then literature_id is set too) or a note on the threshold's origin.
    t.text("reference_text");
    t.integer("literature_id").references("literature.id");
    t.jsonb("checks").notNullable().defaultTo("[]");
  });

  await knex.schema.createTable("reference_bounds", (t) => {
    t.increments("id").primary();
    t.integer("theory_id").notNullable().references("theories.id").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.text("coupling_symbol").notNullable();
    t.text("quoted_symbol");
    t.double("value").notNullable();
    t.text("unit").notNullable();
    t.text("side").notNullable();
    t.double("credibility");
    t.text("data");
    t.integer("literature_id").notNullable().references("literature.id");
    t.text("source_status");
    t.text("convention");
    t.text("note");
  });

  await knex.schema.createTable("submissions", (t) => {
    t.increments("id").primary();
    t.integer("author_id").notNullable().references("users.id");
    // Set when the submission changes an accepted theory; null for a proposed new entry.
    t.integer("target_theory_id").references("theories.id");
    t.text("status").notNullable();
    // Bumped on every save; a save from an older version is refused (optimistic locking).
    t.integer("version").notNullable().defaultTo(1);
    t.jsonb("entry").notNullable();
    t.jsonb("checks").notNullable();
    t.boolean("checks_ok").notNullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("submitted_at", { useTz: true });
    t.timestamp("decided_at", { useTz: true });
    t.integer("decided_by").references("users.id");
    t.integer("published_revision");
    t.index(["author_id"]);
    t.index(["status"]);
  });
  await knex.raw(`alter table submissions add constraint submissions_status_known check (${inList("status", SUBMISSION_STATUSES)})`);

  await knex.schema.createTable("theory_revisions", (t) => {
    t.increments("id").primary();
    t.integer("theory_id").notNullable().references("theories.id").onDelete("CASCADE");
    t.integer("number").notNullable();
    t.jsonb("entry").notNullable();
    t.jsonb("checks").notNullable();
    // Against the previous revision (revision 1: everything added).
    t.jsonb("diff").notNullable();
    t.integer("submission_id").references("submissions.id");
    t.integer("author_id").references("users.id");
    t.integer("accepted_by").references("users.id");
    t.timestamp("published_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["theory_id", "number"]);
  });

  await knex.schema.createTable("submission_comments", (t) => {
    t.increments("id").primary();
    t.integer("submission_id").notNullable().references("submissions.id").onDelete("CASCADE");
    t.integer("author_id").notNullable().references("users.id");
    t.text("kind").notNullable();
    t.text("body").notNullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["submission_id"]);
  });

  // Who moved a submission from which state to which, for the review history.
  await knex.schema.createTable("submission_events", (t) => {
    t.bigIncrements("id").primary();
    t.integer("submission_id").notNullable().references("submissions.id").onDelete("CASCADE");
    t.integer("actor_id").references("users.id");
    t.text("action").notNullable();
    t.text("from_status");
    t.text("to_status").notNullable();
    t.integer("version").notNullable();
    t.timestamp("at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["submission_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of [
    "submission_events",
    "submission_comments",
    "theory_revisions",
    "submissions",
    "reference_bounds",
    "mapping_validity",
    "mapping_references",
    "mappings",
    "definitions",
    "coupling_conventions",
    "couplings",
    "theory_references",
    "literature",
    "theories",
  ]) {
    await knex.schema.dropTable(table);
  }
}
