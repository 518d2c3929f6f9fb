import type { Knex } from "knex";

// Settings a company decides once for all its vessels: the currency of spare and renewal costs,
// and when an alert is due — how close the early end of a projection's interval may come, and
// how likely an overrun by the next overhaul may be, before the people concerned are told.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("companies", (t) => {
    t.string("currency_code", 3).notNullable().defaultTo("USD");
    t.smallint("alert_horizon_days").unsigned().notNullable().defaultTo(183);
    t.decimal("alert_probability", 4, 3).notNullable().defaultTo(0.2);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("companies", (t) => {
    t.dropColumn("currency_code");
    t.dropColumn("alert_horizon_days");
    t.dropColumn("alert_probability");
  });
}
