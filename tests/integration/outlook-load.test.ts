import knex, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { collectScenario } from "@/fixtures/demo/scenario";
import { insertScenario } from "@/fixtures/demo/insert";
import { recomputeAllUnits } from "@/lib/analysis/recompute";
import { loadOutlook, loadOutlookRows } from "@/lib/outlook/load";
import { testDb } from "../support/db";
import { migrationSource } from "../support/migration-source";

// The outlook built on the demo fleet's stored analysis in a scratch database of its own.
const NAME = `${process.env.DB_NAME ?? "kalibore_it"}_outlook`;
const TODAY = "2026-12-01";
let admin: Knex;
let db: Knex;
let vessels: { id: number; name: string }[];

beforeAll(async () => {
  admin = knex({
    client: "mysql2",
    connection: { host: "127.0.0.1", port: Number(process.env.DB_PORT ?? 3317), user: process.env.DB_USER, password: process.env.DB_PASSWORD },
  });
  await admin.raw(`DROP DATABASE IF EXISTS \`${NAME}\``);
  await admin.raw(`CREATE DATABASE \`${NAME}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  db = testDb(NAME);
  await db.migrate.latest({ migrationSource });
  await insertScenario(db, collectScenario({ seed: 20261201, scale: 1, today: TODAY }));
  await recomputeAllUnits(db);
  vessels = await db("vessels").orderBy("id").select("id", "name");
}, 180_000);

afterAll(async () => {
  await db?.destroy();
  await admin?.raw(`DROP DATABASE IF EXISTS \`${NAME}\``);
  await admin?.destroy();
});

describe("the demo scenario's planning data", () => {
  it("has port stays and dockings for every ship, plans in every state, and a spare short", async () => {
    const withStays = await db("vessel_schedule").where({ kind: "port_stay" }).distinct("vessel_id").pluck("vessel_id");
    const withDockings = await db("vessel_schedule").where({ kind: "docking" }).distinct("vessel_id").pluck("vessel_id");
    expect(withStays.sort()).toEqual(vessels.map((v) => v.id).sort());
    expect(withDockings.sort()).toEqual(vessels.map((v) => v.id).sort());
    expect((await db("renewal_plans").distinct("status").pluck("status")).sort()).toEqual(["closed", "confirmed", "dropped", "pencilled"]);
    const closed = await db("renewal_plans").where({ status: "closed" }).first("closed_by_inspection_id as by");
    expect(closed.by).not.toBeNull();
    const b = await loadOutlook(db, { vessels: "all" }, { today: TODAY, horizonMonths: 12 });
    expect(b.shortfall.some((l) => l.short > 0)).toBe(true);
    expect(b.rows.flatMap((r) => r.plans).some((p) => p.missed)).toBe(true);
  });
});

describe("outlook rows from unit_analysis", () => {
  it("keeps the trend's fit beside the stored detail (generated column)", async () => {
    const row = await db("unit_analysis").whereNotNull("fit_json").first("fit_json", "detail");
    expect(JSON.parse(row.fit_json)).toEqual(JSON.parse(row.detail).fit);
  });

  it("keeps the summary's figures the outlook reads, and the fit, in one small generated object", async () => {
    const rows = await db("unit_analysis").select("summary", "detail", "outlook_json");
    for (const r of rows) {
      const summary = typeof r.summary === "string" ? JSON.parse(r.summary) : r.summary;
      const o = JSON.parse(r.outlook_json);
      expect(o.nextOverhaulEngineHours).toEqual(summary.nextOverhaulEngineHours);
      expect(o.lastInspectedOn).toEqual(summary.lastInspectedOn);
      expect(o.runningRate).toEqual(summary.runningRate);
      expect(o.fit).toEqual(r.detail ? (JSON.parse(r.detail).fit ?? null) : null);
      const renew = summary.rings.map((x: { renew: boolean }) => x.renew);
      expect([o.ringsRenew].flat().filter((x: unknown) => x !== null)).toEqual(renew);
    }
  });

  it("gives every unit of the scope one row, with chances where there is a trend and words where not", async () => {
    const rows = await loadOutlookRows(db, { vessels: "all" }, { today: TODAY });
    const units = Number((await db("cylinder_units").count({ n: "*" }))[0].n);
    expect(rows).toHaveLength(units);
    const withChance = rows.filter((r) => r.exceed[0]?.kind === "probability");
    const without = rows.filter((r) => r.exceed[0]?.kind === "not_enough_data");
    expect(withChance.length).toBeGreaterThan(0);
    expect(without.length).toBeGreaterThan(0); // the young ship's units
    for (const r of withChance) for (const e of r.exceed) if (e.kind === "probability") expect(e.p).toBeGreaterThanOrEqual(0);
    // A later overhaul can only be riskier for a rising line.
    for (const r of withChance) {
      const [a, b] = r.exceed;
      if (a.kind === "probability" && b?.kind === "probability") expect(b.p).toBeGreaterThanOrEqual(a.p - 1e-12);
    }
    expect(new Set(rows.map((r) => r.recommendation.kind))).toContain("renew_now");
    expect(JSON.stringify(rows)).not.toMatch(/NaN|Infinity/);
  });

  it("a ship's scope sees its own units only; an empty scope sees nothing", async () => {
    const mine = await loadOutlookRows(db, { vessels: [vessels[1].id] }, { today: TODAY });
    expect(mine.length).toBeGreaterThan(0);
    expect(new Set(mine.map((r) => r.vesselId))).toEqual(new Set([vessels[1].id]));
    expect(await loadOutlookRows(db, { vessels: [] }, { today: TODAY })).toEqual([]);
  });

  it("a port stay on the schedule becomes the unit's next opportunity", async () => {
    const rows = await loadOutlookRows(db, { vessels: [vessels[0].id] }, { today: TODAY });
    const [id] = await db("vessel_schedule").insert({ vessel_id: vessels[0].id, kind: "port_stay", place: "Tarrow Roads", starts_on: TODAY, ends_on: TODAY });
    try {
      const again = await loadOutlookRows(db, { vessels: [vessels[0].id] }, { today: TODAY });
      expect(again).toHaveLength(rows.length);
      for (const r of again) expect(r.nextOpportunity).toMatchObject({ kind: "port_stay", scheduleId: id, date: TODAY, label: "the port stay at Tarrow Roads" });
    } finally {
      await db("vessel_schedule").where({ id }).delete();
    }
  });

  it("the whole bundle: demands within the horizon, a shortfall line per profile and part, a budget", async () => {
    const b = await loadOutlook(db, { vessels: "all" }, { today: TODAY, horizonMonths: 24 });
    expect(b.until).toBe("2028-12-01");
    expect(b.demands.length).toBeGreaterThan(0);
    for (const d of b.demands) expect(d.neededOn <= b.until && d.neededOn >= TODAY).toBe(true);
    expect(b.shortfall.length).toBeGreaterThan(0);
    expect(b.budget.reduce((s, l) => s + l.renewals, 0)).toBe(b.demands.length);
  });
});
