import type { Knex } from "knex";

/*
 * Alerts and the weekly digest. Each queued mail names who it is for and which vessel it is
 * about, so the notifications page can show people the mail about their own vessels (and the
 * administrator every mail, undelivered ones first). A mail refused for good by the receiving
 * server (an SMTP 5xx answer: no such mailbox…) is marked `bounced` and never retried; one that
 * kept failing is `gave_up`. Preferences are one row per person and topic (a missing row means
 * the topic's default, on). The digest keeps each unit's band as it stood in an ISO week, so the
 * next week's digest can say which units moved band.
 */
export async function up(knex: Knex): Promise<void> {
  // The outbox was created without naming its collation, so it took the server's default, which
  // may differ from every other table's; the notifications page joins it to `user`.
  await knex.raw("ALTER TABLE mail_outbox CONVERT TO CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci");
  await knex.schema.alterTable("mail_outbox", (t) => {
    t.string("user_id", 36).nullable().after("to_address");
    t.integer("vessel_id").unsigned().nullable().after("user_id");
    t.string("link_path", 255).nullable().after("kind");
    t.enum("failure", ["bounced", "gave_up"]).nullable().after("status");
    t.index(["user_id", "created_at"]);
    t.index(["vessel_id", "created_at"]);
    t.index(["kind"]);
  });
  await knex.schema.createTable("notification_preferences", (t) => {
    t.charset("utf8mb4");
    t.collate("utf8mb4_unicode_ci");
    t.string("user_id", 36).notNullable();
    t.foreign("user_id").references("user.id").onDelete("CASCADE");
    t.string("topic", 40).notNullable();
    t.boolean("enabled").notNullable();
    t.datetime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.primary(["user_id", "topic"]);
  });
  await knex.schema.createTable("digest_band_snapshots", (t) => {
    t.charset("utf8mb4");
    t.collate("utf8mb4_unicode_ci");
    t.string("iso_week", 8).notNullable(); // e.g. 2026-W49
    t.integer("unit_id").unsigned().notNullable().references("cylinder_units.id").onDelete("CASCADE");
    t.string("band", 32).notNullable();
    t.primary(["iso_week", "unit_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("digest_band_snapshots");
  await knex.schema.dropTable("notification_preferences");
  await knex.schema.alterTable("mail_outbox", (t) => {
    t.dropIndex(["user_id", "created_at"]);
    t.dropIndex(["vessel_id", "created_at"]);
    t.dropIndex(["kind"]);
    t.dropColumn("user_id");
    t.dropColumn("vessel_id");
    t.dropColumn("link_path");
    t.dropColumn("failure");
  });
}
