import knex, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { testDb } from "../support/db";
import { migrationSource } from "../support/migration-source";

// A scratch database of its own, so going down and up does not disturb other test files.
const NAME = `${process.env.DB_NAME ?? "kalibore_it"}_mig`;
let admin: Knex;
let db: Knex;

async function tables(): Promise<string[]> {
  const [rows] = await db.raw("SHOW TABLES");
  return (rows as Record<string, string>[]).map((r) => Object.values(r)[0]).sort();
}

beforeAll(async () => {
  admin = knex({
    client: "mysql2",
    connection: { host: "127.0.0.1", port: Number(process.env.DB_PORT ?? 3317), user: process.env.DB_USER, password: process.env.DB_PASSWORD },
  });
  await admin.raw(`DROP DATABASE IF EXISTS \`${NAME}\``);
  await admin.raw(`CREATE DATABASE \`${NAME}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  db = testDb(NAME);
});

afterAll(async () => {
  await db?.destroy();
  await admin?.raw(`DROP DATABASE IF EXISTS \`${NAME}\``);
  await admin?.destroy();
});

describe("migrations", () => {
  it("go up to the whole domain schema, down to nothing, and up again", async () => {
    await db.migrate.latest({ migrationSource });
    const up = await tables();
    for (const t of ["user", "session", "vessels", "main_engines", "engine_profiles", "profile_stations", "cylinder_units", "liners", "inspections", "liner_readings", "ring_readings", "stored_files", "checklist_entries", "audit_log", "running_hours_log", "unit_analysis"]) {
      expect(up).toContain(t);
    }
    await db.migrate.rollback({ migrationSource }, true);
    expect((await tables()).filter((t) => !t.startsWith("knex_migrations"))).toEqual([]);
    await db.migrate.latest({ migrationSource });
    expect(await tables()).toEqual(up);
  }, 120_000); // three full passes of DDL: ~11 s idle, over 30 s on two busy cores

  it("uses utf8mb4 for every table", async () => {
    const rows = await db("information_schema.TABLES")
      .where({ TABLE_SCHEMA: NAME })
      .select("TABLE_NAME as name", "TABLE_COLLATION as collation");
    expect(rows.length).toBeGreaterThan(10);
    for (const r of rows) expect(r.collation, r.name).toMatch(/^utf8mb4/);
  });

  it("keeps one liner reading per inspection, station and axis", async () => {
    const [idx] = await db.raw(
      "SELECT INDEX_NAME, GROUP_CONCAT(COLUMN_NAME ORDER BY SEQ_IN_INDEX) AS cols FROM information_schema.STATISTICS WHERE TABLE_SCHEMA = ? AND TABLE_NAME = 'liner_readings' AND NON_UNIQUE = 0 GROUP BY INDEX_NAME",
      [NAME],
    );
    expect((idx as { cols: string }[]).map((r) => r.cols)).toContain("inspection_id,station_id,axis_key");
  });
});
