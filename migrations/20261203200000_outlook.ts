import type { Knex } from "knex";

/*
 * Renewal planning: the ships' schedules (port stays and dockings), plans with states of our
 * own naming tied to an opportunity and a spare, and the spares' costs. A unit holds at most
 * one open plan per part, enforced by a unique key on a generated column, so two people
 * planning the same unit at once get a conflict rather than two plans.
 */

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("vessel_schedule", (t) => {
    t.charset("utf8mb4");
    t.collate("utf8mb4_unicode_ci");
    t.increments("id").primary();
    t.integer("vessel_id").unsigned().notNullable().references("vessels.id").onDelete("CASCADE");
    t.enum("kind", ["port_stay", "docking"]).notNullable();
    t.string("place", 120).notNullable();
    t.date("starts_on").notNullable();
    t.date("ends_on").notNullable();
    t.string("note", 500).nullable();
    t.integer("revision").unsigned().notNullable().defaultTo(1);
    t.string("created_by", 36).nullable();
    t.foreign("created_by").references("user.id").onDelete("RESTRICT");
    t.datetime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.datetime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3)"));
    t.index(["vessel_id", "starts_on"]);
  });

  // The old states (planned/done/cancelled) held no rows; ours are pencilled → confirmed → closed, or dropped.
  await knex.raw(
    "ALTER TABLE renewal_plans MODIFY status ENUM('pencilled','confirmed','closed','dropped') NOT NULL DEFAULT 'pencilled'",
  );
  await knex.schema.alterTable("renewal_plans", (t) => {
    t.integer("schedule_id").unsigned().nullable().references("vessel_schedule.id").onDelete("SET NULL");
    t.integer("spare_id").unsigned().nullable().references("spares_stock.id").onDelete("SET NULL");
    // The liner in the unit when the plan was made: an approved inspection on another liner closes a liner plan.
    t.integer("liner_id").unsigned().nullable().references("liners.id").onDelete("SET NULL");
    t.integer("closed_by_inspection_id").unsigned().nullable().references("inspections.id").onDelete("SET NULL");
    t.datetime("closed_at", { precision: 3 }).nullable();
    t.integer("revision").unsigned().notNullable().defaultTo(1);
    t.index(["unit_id", "status"]);
  });
  await knex.raw(
    "ALTER TABLE renewal_plans ADD COLUMN open_unit_id INT UNSIGNED AS (IF(status IN ('pencilled','confirmed'), unit_id, NULL)) PERSISTENT, " +
      "ADD UNIQUE KEY renewal_plans_one_open_per_part (open_unit_id, part)",
  );

  // The trend's fit, kept by the database beside the stored detail so the outlook reads a few
  // hundred bytes per unit rather than the whole detail (trend points, profiles, cells).
  await knex.raw("ALTER TABLE unit_analysis ADD COLUMN fit_json TEXT AS (JSON_EXTRACT(detail, '$.fit')) PERSISTENT");

  await knex.schema.alterTable("spares_stock", (t) => {
    t.decimal("unit_cost", 12, 2).nullable();
    t.decimal("job_cost", 12, 2).nullable();
    t.integer("revision").unsigned().notNullable().defaultTo(1);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("spares_stock", (t) => {
    t.dropColumn("unit_cost");
    t.dropColumn("job_cost");
    t.dropColumn("revision");
  });
  await knex.raw("ALTER TABLE unit_analysis DROP COLUMN fit_json");
  await knex.raw("ALTER TABLE renewal_plans DROP KEY renewal_plans_one_open_per_part, DROP COLUMN open_unit_id");
  await knex.schema.alterTable("renewal_plans", (t) => {
    t.dropForeign(["schedule_id"]);
    t.dropForeign(["spare_id"]);
    t.dropForeign(["liner_id"]);
    t.dropForeign(["closed_by_inspection_id"]);
    // The (unit_id, status) index stays: the unit foreign key now relies on it.
    t.dropColumn("schedule_id");
    t.dropColumn("spare_id");
    t.dropColumn("liner_id");
    t.dropColumn("closed_by_inspection_id");
    t.dropColumn("closed_at");
    t.dropColumn("revision");
  });
  await knex("renewal_plans").delete();
  await knex.raw("ALTER TABLE renewal_plans MODIFY status ENUM('planned','done','cancelled') NOT NULL DEFAULT 'planned'");
  await knex.schema.dropTable("vessel_schedule");
}
