import type { Knex } from "knex";

/**
 * Remnant mapping kinds: a catalogue mapping may give the fractional shift of the remnant's mass
 * (remnant_mass) or spin (remnant_spin), beside the inspiral and ringdown kinds. The kinds are listed
 * here as written at this migration, not imported, so later vocabulary changes do not rewrite history.
 */
const BEFORE = ["inspiral_phase", "inspiral_amplitude", "ringdown_frequency", "ringdown_damping"];
const AFTER = [...BEFORE, "remnant_mass", "remnant_spin"];
const inList = (values: string[]) => `kind in (${values.map((v) => `'${v}'`).join(", ")})`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw("alter table mappings drop constraint mappings_kind_known");
  await knex.raw(`alter table mappings add constraint mappings_kind_known check (${inList(AFTER)})`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw("alter table mappings drop constraint mappings_kind_known");
  await knex.raw(`alter table mappings add constraint mappings_kind_known check (${inList(BEFORE)})`);
}
