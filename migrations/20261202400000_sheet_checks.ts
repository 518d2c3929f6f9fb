import type { Knex } from "knex";

// "Gap measured in" has no default: a skipped answer must stay unanswered, not become
// "gauge ring". And a profile may set how far the rod nut tightening pressure may be off
// its figure before submission is blocked (null: the default ±10 %).
export async function up(knex: Knex): Promise<void> {
  await knex.raw("ALTER TABLE ring_readings MODIFY gap_measured_in ENUM('gauge_ring','liner_unworn','liner_worn') NULL DEFAULT NULL");
  await knex.schema.alterTable("engine_profiles", (t) => {
    t.decimal("rod_nut_tolerance_pct", 4, 1).nullable().after("rod_nut_pressure_bar");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("engine_profiles", (t) => {
    t.dropColumn("rod_nut_tolerance_pct");
  });
  await knex("ring_readings").whereNull("gap_measured_in").update({ gap_measured_in: "gauge_ring" });
  await knex.raw("ALTER TABLE ring_readings MODIFY gap_measured_in ENUM('gauge_ring','liner_unworn','liner_worn') NOT NULL DEFAULT 'gauge_ring'");
}
