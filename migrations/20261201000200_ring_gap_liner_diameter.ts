import type { Knex } from "knex";

// Where a closed gap is measured in a worn part of the liner, the liner's diameter
// there lets the gap be referred back to a gauge ring of nominal bore (π × increase).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("ring_readings", (t) => {
    t.decimal("gap_liner_diameter_mm", 9, 3).nullable().after("gap_measured_in");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("ring_readings", (t) => {
    t.dropColumn("gap_liner_diameter_mm");
  });
}
