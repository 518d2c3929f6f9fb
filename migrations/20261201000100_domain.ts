import type { Knex } from "knex";

/*
 * The wear record. Lengths are SI millimetres in DECIMAL columns (3 decimals = 1 µm,
 * finer than any inside micrometer in the trade); inches are a display and import
 * choice only. Calendar days are DATE, instants DATETIME(3) in UTC.
 */

const MM = [9, 3] as const; // up to 999999.999 mm
const HOURS = [10, 1] as const; // running hours, 0.1 h

function utf8(table: Knex.CreateTableBuilder) {
  table.charset("utf8mb4");
  table.collate("utf8mb4_unicode_ci");
}

function timestamps(table: Knex.CreateTableBuilder, knex: Knex) {
  table.datetime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
  table
    .datetime("updated_at", { precision: 3 })
    .notNullable()
    .defaultTo(knex.raw("CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3)"));
}

function userRef(table: Knex.CreateTableBuilder, column: string, nullable = true) {
  const c = table.string(column, 36);
  if (!nullable) c.notNullable();
  table.foreign(column).references("user.id").onDelete("RESTRICT");
}

export async function up(knex: Knex): Promise<void> {
  // Ship-management companies own vessels; a superintendent's fleet is a set of vessels.
  await knex.schema.createTable("companies", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.string("name", 160).notNullable().unique();
    timestamps(t, knex);
  });

  await knex.schema.createTable("vessels", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("company_id").unsigned().notNullable().references("companies.id").onDelete("RESTRICT");
    t.string("name", 120).notNullable();
    t.string("imo_number", 7).notNullable().unique();
    t.string("vessel_type", 60).nullable();
    t.string("flag", 60).nullable();
    t.smallint("built_year").unsigned().nullable();
    t.datetime("archived_at", { precision: 3 }).nullable();
    timestamps(t, knex);
    t.index(["company_id", "name"]);
  });

  // Which vessels a crew member or superintendent may see (the role lives on `user`).
  await knex.schema.createTable("user_vessels", (t) => {
    utf8(t);
    userRef(t, "user_id", false);
    t.integer("vessel_id").unsigned().notNullable().references("vessels.id").onDelete("CASCADE");
    t.datetime("assigned_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.primary(["user_id", "vessel_id"]);
    t.index(["vessel_id"]);
  });

  await knex.schema.createTable("invitations", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.string("email", 255).notNullable();
    t.string("name", 255).notNullable();
    t.string("role", 32).notNullable();
    t.json("vessel_ids").notNullable();
    t.string("token_hash", 64).notNullable().unique();
    t.datetime("expires_at", { precision: 3 }).notNullable();
    t.datetime("used_at", { precision: 3 }).nullable();
    t.datetime("revoked_at", { precision: 3 }).nullable();
    userRef(t, "invited_by");
    timestamps(t, knex);
    t.index(["email"]);
  });

  // What the maker's manual says about one engine design: bore, gauging stations, limits.
  await knex.schema.createTable("engine_profiles", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.string("name", 120).notNullable().unique();
    t.string("designation", 80).notNullable();
    t.decimal("bore_mm", ...MM).notNullable();
    t.decimal("stroke_mm", ...MM).nullable();
    t.decimal("liner_wear_limit_mm", ...MM).notNullable();
    t.decimal("ovality_limit_mm", ...MM).notNullable();
    t.enum("wear_reference", ["nominal", "as_fitted"]).notNullable().defaultTo("nominal");
    t.boolean("temperature_correction").notNullable().defaultTo(true);
    t.double("alpha_liner_per_k").notNullable().defaultTo(10.5e-6);
    t.double("alpha_gauge_per_k").notNullable().defaultTo(11.5e-6);
    t.string("liner_material", 80).notNullable().defaultTo("Grey cast iron");
    t.string("gauge_material", 80).notNullable().defaultTo("Carbon steel");
    t.decimal("running_in_hours", ...HOURS).notNullable().defaultTo(3000);
    t.tinyint("min_points_for_projection").unsigned().notNullable().defaultTo(3);
    t.string("axis_a_key", 16).notNullable().defaultTo("fa");
    t.string("axis_a_label", 40).notNullable().defaultTo("Fore–aft");
    t.string("axis_b_key", 16).notNullable().defaultTo("ath");
    t.string("axis_b_label", 40).notNullable().defaultTo("Athwartships");
    t.tinyint("ring_count").unsigned().notNullable();
    t.decimal("overhaul_interval_hours", ...HOURS).notNullable().defaultTo(16000);
    t.decimal("rod_nut_pressure_bar", 7, 1).nullable();
    t.text("notes").nullable();
    timestamps(t, knex);
  });

  await knex.schema.createTable("profile_stations", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("profile_id").unsigned().notNullable().references("engine_profiles.id").onDelete("CASCADE");
    t.tinyint("position").unsigned().notNullable();
    t.string("station_key", 16).notNullable();
    t.string("label", 60).notNullable();
    t.decimal("depth_mm", ...MM).notNullable();
    t.enum("role", ["unworn_top", "ring_tdc", "intermediate", "lubricator", "above_ports", "unworn_bottom"]).notNullable();
    t.unique(["profile_id", "position"]);
    t.unique(["profile_id", "station_key"]);
  });

  await knex.schema.createTable("profile_rings", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("profile_id").unsigned().notNullable().references("engine_profiles.id").onDelete("CASCADE");
    t.tinyint("position").unsigned().notNullable(); // 1 = top ring
    t.string("label", 40).notNullable();
    t.decimal("gap_new_min_mm", ...MM).notNullable();
    t.decimal("gap_new_max_mm", ...MM).notNullable();
    t.decimal("gap_limit_mm", ...MM).notNullable();
    t.decimal("groove_new_min_mm", ...MM).notNullable();
    t.decimal("groove_new_max_mm", ...MM).notNullable();
    t.decimal("groove_limit_mm", ...MM).notNullable();
    t.unique(["profile_id", "position"]);
  });

  await knex.schema.createTable("main_engines", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("vessel_id").unsigned().notNullable().references("vessels.id").onDelete("RESTRICT");
    t.integer("profile_id").unsigned().notNullable().references("engine_profiles.id").onDelete("RESTRICT");
    t.string("serial", 60).notNullable().unique();
    t.tinyint("cylinder_count").unsigned().notNullable();
    t.date("commissioned_on").nullable();
    timestamps(t, knex);
    t.index(["vessel_id"]);
  });

  // Noon-report style counter readings; the projection turns liner hours into dates from it.
  await knex.schema.createTable("running_hours_log", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("engine_id").unsigned().notNullable().references("main_engines.id").onDelete("CASCADE");
    t.date("logged_on").notNullable();
    t.decimal("engine_hours", ...HOURS).notNullable();
    userRef(t, "recorded_by");
    t.datetime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.unique(["engine_id", "logged_on"]);
  });

  await knex.schema.createTable("cylinder_units", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("engine_id").unsigned().notNullable().references("main_engines.id").onDelete("CASCADE");
    t.tinyint("cylinder_no").unsigned().notNullable();
    t.decimal("next_overhaul_engine_hours", ...HOURS).nullable();
    t.date("next_overhaul_on").nullable();
    t.unique(["engine_id", "cylinder_no"]);
  });

  await knex.schema.createTable("liners", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("unit_id").unsigned().notNullable().references("cylinder_units.id").onDelete("CASCADE");
    t.string("serial", 60).notNullable().unique();
    t.date("installed_on").notNullable();
    t.decimal("installed_engine_hours", ...HOURS).notNullable();
    t.decimal("liner_hours_at_install", ...HOURS).notNullable().defaultTo(0); // a reconditioned liner may arrive with hours
    t.date("removed_on").nullable();
    t.decimal("removed_engine_hours", ...HOURS).nullable();
    t.string("removal_reason", 255).nullable();
    timestamps(t, knex);
    t.index(["unit_id", "removed_on"]);
  });

  // One overhaul's record for one unit. Approved rows are never edited: an amendment is
  // a new row with `supersedes_id` and a reason, and the old row becomes `superseded`.
  await knex.schema.createTable("inspections", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("unit_id").unsigned().notNullable().references("cylinder_units.id").onDelete("RESTRICT");
    t.integer("liner_id").unsigned().notNullable().references("liners.id").onDelete("RESTRICT");
    t.date("inspected_on").notNullable();
    t.decimal("engine_hours", ...HOURS).notNullable();
    t.decimal("liner_hours", ...HOURS).notNullable();
    t.string("liner_hours_reason", 255).nullable(); // set when liner hours differ from the derived value
    t.string("crew", 255).nullable();
    t.decimal("gauge_temp_c", 5, 1).nullable();
    t.decimal("liner_temp_c", 5, 1).nullable();
    t.enum("state", ["draft", "submitted", "returned", "approved", "superseded"]).notNullable().defaultTo("draft");
    t.smallint("version").unsigned().notNullable().defaultTo(1);
    t.integer("supersedes_id").unsigned().nullable().references("inspections.id").onDelete("RESTRICT");
    t.string("amendment_reason", 500).nullable();
    t.integer("revision").unsigned().notNullable().defaultTo(1); // optimistic lock for autosave from two devices
    t.string("client_token", 64).nullable().unique(); // idempotency: a double submit creates one row
    t.text("notes").nullable();
    t.string("return_comment", 1000).nullable();
    userRef(t, "created_by", false);
    userRef(t, "submitted_by");
    t.datetime("submitted_at", { precision: 3 }).nullable();
    userRef(t, "approved_by");
    t.datetime("approved_at", { precision: 3 }).nullable();
    t.enum("source", ["manual", "import", "demo"]).notNullable().defaultTo("manual");
    timestamps(t, knex);
    t.index(["unit_id", "state", "inspected_on"]);
    t.index(["liner_id", "state"]);
    t.index(["state", "updated_at"]);
  });

  await knex.schema.createTable("liner_readings", (t) => {
    utf8(t);
    t.bigIncrements("id").primary();
    t.integer("inspection_id").unsigned().notNullable().references("inspections.id").onDelete("CASCADE");
    t.integer("station_id").unsigned().notNullable().references("profile_stations.id").onDelete("RESTRICT");
    t.string("axis_key", 16).notNullable();
    t.decimal("diameter_mm", ...MM).notNullable();
    t.enum("entered_unit", ["mm", "in"]).notNullable().defaultTo("mm");
    t.string("warning_confirmed", 255).nullable(); // text of a plausibility warning the engineer confirmed
    t.unique(["inspection_id", "station_id", "axis_key"]);
  });

  await knex.schema.createTable("ring_readings", (t) => {
    utf8(t);
    t.bigIncrements("id").primary();
    t.integer("inspection_id").unsigned().notNullable().references("inspections.id").onDelete("CASCADE");
    t.tinyint("ring_position").unsigned().notNullable();
    t.decimal("closed_gap_mm", ...MM).nullable();
    t.enum("gap_measured_in", ["gauge_ring", "liner_unworn", "liner_worn"]).notNullable().defaultTo("gauge_ring");
    t.decimal("groove_clearance_mm", ...MM).nullable();
    t.boolean("renewed").notNullable().defaultTo(false);
    t.string("condition", 500).nullable();
    t.unique(["inspection_id", "ring_position"]);
  });

  // Objects live in S3; this is their ledger (photos, gauge files, exports, thumbnails).
  await knex.schema.createTable("stored_files", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.string("object_key", 512).notNullable().unique();
    t.enum("kind", ["photo", "thumbnail", "gauge_import", "export"]).notNullable();
    t.string("content_type", 120).notNullable();
    t.bigInteger("size_bytes").unsigned().notNullable();
    t.string("sha256", 64).nullable();
    t.string("original_name", 255).nullable();
    t.enum("status", ["pending", "stored", "deleted"]).notNullable().defaultTo("pending");
    t.integer("vessel_id").unsigned().nullable().references("vessels.id").onDelete("RESTRICT");
    userRef(t, "uploaded_by");
    timestamps(t, knex);
    t.index(["status", "created_at"]);
  });

  await knex.schema.createTable("inspection_photos", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("inspection_id").unsigned().notNullable().references("inspections.id").onDelete("CASCADE");
    t.integer("file_id").unsigned().notNullable().references("stored_files.id").onDelete("RESTRICT");
    t.integer("thumbnail_file_id").unsigned().nullable().references("stored_files.id").onDelete("SET NULL");
    t.integer("station_id").unsigned().nullable().references("profile_stations.id").onDelete("SET NULL");
    t.tinyint("ring_position").unsigned().nullable();
    t.string("caption", 500).nullable();
    t.datetime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["inspection_id"]);
  });

  await knex.schema.createTable("gauge_imports", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("file_id").unsigned().notNullable().references("stored_files.id").onDelete("RESTRICT");
    t.integer("unit_id").unsigned().notNullable().references("cylinder_units.id").onDelete("CASCADE");
    t.integer("inspection_id").unsigned().nullable().references("inspections.id").onDelete("SET NULL");
    t.json("column_mapping").nullable();
    t.enum("status", ["uploaded", "mapped", "committed", "failed"]).notNullable().defaultTo("uploaded");
    t.integer("row_count").unsigned().nullable();
    t.integer("error_count").unsigned().nullable();
    userRef(t, "created_by", false);
    t.datetime("committed_at", { precision: 3 }).nullable();
    timestamps(t, knex);
  });

  // The overhaul's safety and closing items: tool tally, closing inspection, nut pressure.
  await knex.schema.createTable("checklist_entries", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("inspection_id").unsigned().notNullable().references("inspections.id").onDelete("CASCADE");
    t.string("item_key", 48).notNullable();
    t.enum("kind", ["tally", "check", "pressure", "signature"]).notNullable();
    t.string("label", 160).notNullable();
    t.smallint("count_in").unsigned().nullable();
    t.smallint("count_out").unsigned().nullable();
    t.decimal("value_number", 9, 2).nullable();
    t.string("value_unit", 16).nullable();
    t.boolean("done").notNullable().defaultTo(false);
    t.string("signed_name", 120).nullable();
    t.datetime("signed_at", { precision: 3 }).nullable();
    t.string("note", 500).nullable();
    t.unique(["inspection_id", "item_key"]);
  });

  await knex.schema.createTable("comments", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("unit_id").unsigned().notNullable().references("cylinder_units.id").onDelete("CASCADE");
    t.integer("inspection_id").unsigned().nullable().references("inspections.id").onDelete("CASCADE");
    userRef(t, "author_id", false);
    t.text("body").notNullable();
    t.datetime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["unit_id", "created_at"]);
  });

  // Renewal planning and spares (fleet outlook).
  await knex.schema.createTable("renewal_plans", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("unit_id").unsigned().notNullable().references("cylinder_units.id").onDelete("CASCADE");
    t.enum("part", ["liner", "ring_set"]).notNullable();
    t.date("planned_on").notNullable();
    t.string("port_or_yard", 120).nullable();
    t.enum("status", ["planned", "done", "cancelled"]).notNullable().defaultTo("planned");
    t.string("note", 500).nullable();
    userRef(t, "created_by", false);
    timestamps(t, knex);
    t.index(["planned_on"]);
  });

  await knex.schema.createTable("spares_stock", (t) => {
    utf8(t);
    t.increments("id").primary();
    t.integer("company_id").unsigned().notNullable().references("companies.id").onDelete("CASCADE");
    t.integer("profile_id").unsigned().notNullable().references("engine_profiles.id").onDelete("CASCADE");
    t.enum("part", ["liner", "ring_set"]).notNullable();
    t.integer("vessel_id").unsigned().nullable().references("vessels.id").onDelete("CASCADE"); // null = shore store
    t.smallint("on_hand").unsigned().notNullable().defaultTo(0);
    t.smallint("on_order").unsigned().notNullable().defaultTo(0);
    t.date("on_order_due").nullable();
    t.smallint("lead_time_days").unsigned().notNullable().defaultTo(60);
    timestamps(t, knex);
    t.unique(["company_id", "profile_id", "part", "vessel_id"]);
  });

  // Per-unit results kept current whenever an inspection changes, so the fleet screens
  // never recompute from raw readings on a request.
  await knex.schema.createTable("unit_analysis", (t) => {
    utf8(t);
    t.integer("unit_id").unsigned().primary().references("cylinder_units.id").onDelete("CASCADE");
    t.integer("liner_id").unsigned().nullable().references("liners.id").onDelete("SET NULL");
    t.string("band", 32).notNullable();
    t.decimal("max_wear_mm", ...MM).nullable();
    t.decimal("max_ovality_mm", ...MM).nullable();
    t.double("wear_rate_mm_per_1000h").nullable();
    t.decimal("liner_hours", ...HOURS).nullable();
    t.decimal("limit_at_liner_hours", ...HOURS).nullable();
    t.date("limit_on").nullable();
    t.date("limit_on_earliest").nullable();
    t.date("limit_on_latest").nullable();
    t.date("last_inspected_on").nullable();
    t.json("summary").notNullable();
    t.datetime("computed_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["band"]);
    t.index(["limit_on"]);
  });

  await knex.schema.createTable("audit_log", (t) => {
    utf8(t);
    t.bigIncrements("id").primary();
    t.datetime("at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.string("actor_id", 36).nullable(); // kept even if the user is later removed
    t.string("actor_name", 255).nullable();
    t.string("action", 64).notNullable();
    t.string("entity_type", 40).notNullable();
    t.string("entity_id", 64).notNullable();
    t.integer("vessel_id").unsigned().nullable();
    t.json("detail").nullable();
    t.index(["entity_type", "entity_id", "at"]);
    t.index(["vessel_id", "at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  const tables = [
    "audit_log",
    "unit_analysis",
    "spares_stock",
    "renewal_plans",
    "comments",
    "checklist_entries",
    "gauge_imports",
    "inspection_photos",
    "stored_files",
    "ring_readings",
    "liner_readings",
    "inspections",
    "liners",
    "cylinder_units",
    "running_hours_log",
    "main_engines",
    "profile_rings",
    "profile_stations",
    "engine_profiles",
    "invitations",
    "user_vessels",
    "vessels",
    "companies",
  ];
  for (const table of tables) await knex.schema.dropTableIfExists(table);
}
