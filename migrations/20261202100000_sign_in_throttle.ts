import type { Knex } from "knex";

// Failed sign-ins per account, whatever address they come from, so guessing one account's
// password gets slower and slower while everyone else signs in as usual. Keyed by a hash
// of the normalised e-mail address: unknown addresses are throttled alike (no hint which
// exist) and are not stored in plain text.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("sign_in_throttle", (t) => {
    t.string("account_key", 64).primary();
    t.integer("failures").unsigned().notNullable().defaultTo(0);
    t.datetime("last_attempt_at", { precision: 3 }).notNullable();
    t.index(["last_attempt_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("sign_in_throttle");
}
