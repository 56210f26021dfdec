import type { Knex } from "knex";

/**
 * Accounts: people (signed in through GitHub), their roles, personal API tokens, the audit log of
 * account changes, and the session table of connect-pg-simple (created here, not by the store, so
 * every migrated database - including the tests' template - already has it).
 */
const ROLE_NAMES = ["contributor", "analyst", "editor", "admin"];

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("users", (t) => {
    t.increments("id").primary();
    // GitHub's numeric id is the stable key; logins can be renamed on GitHub.
    t.bigInteger("github_id").unique();
    t.text("login").notNullable();
    t.text("name").notNullable();
    t.text("email");
    t.text("avatar_url");
    t.text("html_url");
    t.specificType("roles", "text[]").notNullable().defaultTo("{}");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("last_sign_in_at", { useTz: true });
  });
  // Logins are case-insensitive on GitHub, so they are here too.
  await knex.raw("create unique index users_login_lower on users (lower(login))");
  await knex.raw(`alter table users add constraint users_roles_known check (roles <@ array[${ROLE_NAMES.map((r) => `'${r}'`).join(",")}]::text[])`);

  await knex.schema.createTable("api_tokens", (t) => {
    t.increments("id").primary();
    t.integer("user_id").notNullable().references("users.id").onDelete("CASCADE");
    t.text("name").notNullable();
    // sha256 of the whole token, hex; the token itself is shown once and never stored.
    t.text("token_hash").notNullable().unique();
    // The first characters, so a person can tell their tokens apart in a list.
    t.text("token_start").notNullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("last_used_at", { useTz: true });
    t.index(["user_id"]);
  });

  await knex.schema.createTable("audit_log", (t) => {
    t.bigIncrements("id").primary();
    t.timestamp("at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    // Null actor: the system itself (for example ADMIN_LOGINS granting the first admin).
    t.integer("actor_id").references("users.id").onDelete("SET NULL");
    // Kept as text so the history still reads after a user row is gone.
    t.text("actor_login");
    t.text("action").notNullable();
    t.text("subject").notNullable();
    t.jsonb("before");
    t.jsonb("after");
    t.index(["at"]);
  });

  // The table layout connect-pg-simple expects (its table.sql), under our own name.
  await knex.schema.createTable("user_sessions", (t) => {
    t.string("sid").notNullable().primary();
    t.json("sess").notNullable();
    t.timestamp("expire", { precision: 6, useTz: false }).notNullable();
    t.index(["expire"], "user_sessions_expire");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("user_sessions");
  await knex.schema.dropTable("audit_log");
  await knex.schema.dropTable("api_tokens");
  await knex.schema.dropTable("users");
}
