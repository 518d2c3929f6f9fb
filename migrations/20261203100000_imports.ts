import type { Knex } from "knex";

/*
 * Importing readings from files. `gauge_imports` (laid down with the domain, unused until now)
 * becomes one row per import of one stored file into one vessel: a gauge file into a draft of
 * one unit, or a ship's past records into the history of one engine. The file's SHA-256 sits on
 * the import too, so the same file on the same vessel is found with one index. Inspections made
 * from past records point at their import; a replaced import is superseded, never deleted.
 * `import_mappings` keeps the column mapping per vessel and file shape, offered for the next file.
 */
export async function up(knex: Knex): Promise<void> {
  await knex("gauge_imports").delete(); // nothing wrote to it before this migration
  await knex.raw("ALTER TABLE gauge_imports MODIFY unit_id INT UNSIGNED NULL");
  await knex.raw(
    "ALTER TABLE gauge_imports MODIFY status ENUM('previewed','committed','approved','superseded','discarded') NOT NULL DEFAULT 'previewed'",
  );
  await knex.schema.alterTable("gauge_imports", (t) => {
    t.integer("vessel_id").unsigned().notNullable().references("vessels.id").onDelete("RESTRICT").after("file_id");
    t.integer("engine_id").unsigned().nullable().references("main_engines.id").onDelete("RESTRICT").after("vessel_id");
    t.enum("destination", ["draft", "history"]).notNullable().defaultTo("draft").after("engine_id");
    t.string("sha256", 64).notNullable().after("destination");
    t.json("options").nullable().after("column_mapping");
    t.json("excluded_lines").nullable().after("options");
    t.text("preview", "longtext").nullable().after("excluded_lines");
    t.integer("warning_count").unsigned().nullable().after("error_count");
    t.integer("group_count").unsigned().nullable().after("warning_count");
    t.integer("replaces_id").unsigned().nullable().references("gauge_imports.id").onDelete("RESTRICT");
    t.integer("superseded_by_id").unsigned().nullable().references("gauge_imports.id").onDelete("RESTRICT");
    t.string("committed_by", 36).nullable().references("user.id").onDelete("RESTRICT");
    t.string("approved_by", 36).nullable().references("user.id").onDelete("RESTRICT");
    t.datetime("approved_at", { precision: 3 }).nullable();
    t.index(["vessel_id", "sha256"]);
    t.index(["vessel_id", "created_at"]);
  });
  await knex.schema.alterTable("inspections", (t) => {
    t.integer("import_id").unsigned().nullable().references("gauge_imports.id").onDelete("RESTRICT");
    t.string("gauge_serial", 60).nullable();
    t.index(["import_id"]);
  });
  await knex.schema.createTable("import_mappings", (t) => {
    t.charset("utf8mb4");
    t.collate("utf8mb4_unicode_ci");
    t.increments("id").primary();
    t.integer("vessel_id").unsigned().notNullable().references("vessels.id").onDelete("CASCADE");
    t.string("shape_key", 64).notNullable();
    t.json("mapping").notNullable();
    t.json("options").notNullable();
    t.string("updated_by", 36).nullable().references("user.id").onDelete("SET NULL");
    t.datetime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.unique(["vessel_id", "shape_key"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("import_mappings");
  await knex.schema.alterTable("inspections", (t) => {
    t.dropForeign(["import_id"]);
    t.dropIndex(["import_id"]);
    t.dropColumn("import_id");
    t.dropColumn("gauge_serial");
  });
  await knex("gauge_imports").delete();
  await knex.schema.alterTable("gauge_imports", (t) => {
    t.dropForeign(["vessel_id"]);
    t.dropForeign(["engine_id"]);
    t.dropForeign(["replaces_id"]);
    t.dropForeign(["superseded_by_id"]);
    t.dropForeign(["committed_by"]);
    t.dropForeign(["approved_by"]);
    t.dropIndex(["vessel_id", "sha256"]);
    t.dropIndex(["vessel_id", "created_at"]);
  });
  await knex.schema.alterTable("gauge_imports", (t) => {
    for (const c of ["vessel_id", "engine_id", "destination", "sha256", "options", "excluded_lines", "preview", "warning_count", "group_count", "replaces_id", "superseded_by_id", "committed_by", "approved_by", "approved_at"]) t.dropColumn(c);
  });
  await knex.raw("ALTER TABLE gauge_imports MODIFY status ENUM('uploaded','mapped','committed','failed') NOT NULL DEFAULT 'uploaded'");
  await knex.raw("ALTER TABLE gauge_imports MODIFY unit_id INT UNSIGNED NOT NULL");
}
