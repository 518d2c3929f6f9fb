import type { Knex } from "knex";

// The per-unit detail the unit screen and its API draw (trend points, the fit, the liner
// profile per gauging, the latest gauging's cells, the rings), stored with the summary so a
// request reads one row instead of recomputing from the raw readings.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("unit_analysis", (t) => {
    t.text("detail", "longtext").nullable().after("summary");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("unit_analysis", (t) => {
    t.dropColumn("detail");
  });
}
