import type { Knex } from "knex";

// Every e-mail the app sends is written here first and sent after the request has been
// answered, so no answer waits on (or reveals anything through) the mail server. A failed
// send is retried with its error kept. `dedupe_key` makes queueing idempotent for mail that
// must go once (an alert, a weekly digest); NULL for mail that may repeat.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("mail_outbox", (t) => {
    t.bigIncrements("id").primary();
    t.string("to_address", 320).notNullable();
    t.string("subject", 255).notNullable();
    t.text("text_body", "mediumtext").notNullable();
    t.text("html_body", "mediumtext").nullable();
    t.string("kind", 64).notNullable();
    t.string("dedupe_key", 191).nullable().unique();
    t.enum("status", ["pending", "sending", "sent", "failed"]).notNullable().defaultTo("pending");
    t.integer("attempts").unsigned().notNullable().defaultTo(0);
    t.text("last_error").nullable();
    t.datetime("next_attempt_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime("sent_at", { precision: 3 }).nullable();
    t.index(["status", "next_attempt_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("mail_outbox");
}
