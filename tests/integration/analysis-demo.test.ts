import knex, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { collectScenario } from "@/fixtures/demo/scenario";
import { insertScenario } from "@/fixtures/demo/insert";
import { recomputeAllUnits, recomputeUnits } from "@/lib/analysis/recompute";
import { testDb } from "../support/db";
import { migrationSource } from "../support/migration-source";

// The invented demo fleet, inserted into a scratch database of its own, then analysed.
// The designed cases of the generator must come out of the real computation as designed.
const NAME = `${process.env.DB_NAME ?? "kalibore_it"}_demo`;
let admin: Knex;
let db: Knex;
const scenario = collectScenario({ seed: 20261201, scale: 1, today: "2026-12-01" });

async function unitIdOf(unitKey: string): Promise<number> {
  const unit = scenario.units.find((u) => u.key === unitKey)!;
  const engine = scenario.engines.find((e) => e.key === unit.engineKey)!;
  const row = await db("cylinder_units as u")
    .join("main_engines as e", "e.id", "u.engine_id")
    .where({ "e.serial": engine.serial, "u.cylinder_no": unit.cylinderNo })
    .first("u.id");
  return row.id;
}

beforeAll(async () => {
  admin = knex({
    client: "mysql2",
    connection: { host: "127.0.0.1", port: Number(process.env.DB_PORT ?? 3317), user: process.env.DB_USER, password: process.env.DB_PASSWORD },
  });
  await admin.raw(`DROP DATABASE IF EXISTS \`${NAME}\``);
  await admin.raw(`CREATE DATABASE \`${NAME}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  db = testDb(NAME);
  await db.migrate.latest({ migrationSource });
  await insertScenario(db, scenario);
}, 120_000);

afterAll(async () => {
  await db?.destroy();
  await admin?.raw(`DROP DATABASE IF EXISTS \`${NAME}\``);
  await admin?.destroy();
});

describe("analysis of the demo fleet against the real database", () => {
  it("stores one analysis per unit, with no NaN anywhere", async () => {
    const n = await recomputeAllUnits(db);
    const units = Number((await db("cylinder_units").count({ n: "*" }))[0].n);
    expect(n).toBe(units);
    const rows = await db("unit_analysis").select("band", "summary");
    expect(rows).toHaveLength(units);
    for (const r of rows) {
      expect(["over_limit", "renew_before_next", "watch", "steady", "unknown"]).toContain(r.band);
      expect(JSON.stringify(r.summary)).not.toMatch(/NaN|Infinity/);
    }
  });

  it("bands the ring set over its closed-gap limit as over limit", async () => {
    const id = await unitIdOf(scenario.specials.ringOverLimitUnitKey);
    const row = await db("unit_analysis").where({ unit_id: id }).first("band", "summary");
    expect(row.band).toBe("over_limit");
    const summary = typeof row.summary === "string" ? JSON.parse(row.summary) : row.summary;
    expect(summary.rings.some((r: { overLimit: boolean }) => r.overLimit)).toBe(true);
  });

  it("flags the liner whose wear jumped after a lubrication fault: abnormal over its last interval", async () => {
    // 0.1 mm/1000 h as abnormal: marineengineeringonline.com report on abnormal liner wear [src]
    const id = await unitIdOf(scenario.specials.fastWearUnitKey);
    const row = await db("unit_analysis").where({ unit_id: id }).first("band", "wear_rate_mm_per_1000h", "summary");
    const summary = typeof row.summary === "string" ? JSON.parse(row.summary) : row.summary;
    expect(["watch", "renew_before_next", "over_limit"]).toContain(row.band);
    expect(summary.lastIntervalRate).toBeGreaterThan(0.1);
    expect(summary.band.reasons.join(" ")).toMatch(/abnormal/);
    // One straight line through the normal years and the fast ones: steeper than the normal
    // 0.025–0.05 mm/1000 h (BrightHub Engineering [src]), and a poor fit, as such a kink must be.
    expect(row.wear_rate_mm_per_1000h).toBeGreaterThan(0.05);
    expect(summary.trend.rSquared).toBeLessThan(0.99);
  });

  it("bands the designed units as designed, and the ordinary ones mostly steady", async () => {
    const bandOf = async (key: string) => (await db("unit_analysis").where({ unit_id: await unitIdOf(key) }).first("band")).band;
    // Old liners at a normal rate whose projection reaches the limit before the next overhaul.
    for (const key of scenario.specials.nearLimitUnitKeys) expect(await bandOf(key)).toBe("renew_before_next");
    const designed = new Set(scenario.units.filter((u) => u.demoCases.length > 0).map((u) => u.key));
    const counts: Record<string, number> = {};
    let threePoint = 0;
    let threePointSteady = 0;
    for (const u of scenario.units.filter((x) => !designed.has(x.key))) {
      const row = await db("unit_analysis").where({ unit_id: await unitIdOf(u.key) }).first("band", "summary");
      const summary = typeof row.summary === "string" ? JSON.parse(row.summary) : row.summary;
      counts[row.band] = (counts[row.band] ?? 0) + 1;
      if (summary.trend === null) {
        // Too young for a projection: fewer than three gaugings past running-in.
        expect(row.band).toBe("unknown");
      } else if (summary.trend.n >= 4) {
        expect(row.band).toBe("steady");
      } else {
        // With three points the 95 % interval is wide (the t quantile with one degree of freedom
        // is 12.71, NIST/SEMATECH e-Handbook table of t critical values [src]), so its early end
        // may fall before the next overhaul and band the unit "renew before next overhaul".
        threePoint++;
        if (row.band === "steady") threePointSteady++;
      }
    }
    expect(threePointSteady / threePoint).toBeGreaterThanOrEqual(0.5);
    expect(counts.unknown).toBeGreaterThanOrEqual(3);
  });

  it("reads the stored trends as real gaugings: scattered by a few hundredths, not straight lines", async () => {
    const rows = await db("unit_analysis").select("unit_id", "summary");
    const fastId = await unitIdOf(scenario.specials.fastWearUnitKey);
    const trends = rows
      .filter((r) => r.unit_id !== fastId)
      .map((r) => (typeof r.summary === "string" ? JSON.parse(r.summary) : r.summary).trend)
      .filter((t): t is { rSquared: number; residualSdMm: number; n: number } => t !== null && t.n >= 4);
    expect(trends.length).toBeGreaterThanOrEqual(8);
    for (const t of trends) expect(t.rSquared).toBeLessThan(0.99995);
    const sds = trends.map((t) => t.residualSdMm).sort((a, b) => a - b);
    const median = sds[Math.floor(sds.length / 2)];
    // Inside micrometers on large bores repeat to a few hundredths of a millimetre (common practice).
    expect(median).toBeGreaterThan(0.015);
    expect(median).toBeLessThan(0.06);
  });

  it("analyses the renewed unit on its new liner only", async () => {
    const id = await unitIdOf(scenario.specials.renewedUnitKey);
    const current = await db("liners").where({ unit_id: id }).whereNull("removed_on").first("id");
    const row = await db("unit_analysis").where({ unit_id: id }).first("liner_id", "liner_hours");
    expect(row.liner_id).toBe(current.id);
    const removed = await db("liners").where({ unit_id: id }).whereNotNull("removed_on").first("id");
    expect(removed).toBeTruthy();
  });

  it("recomputing one unit is idempotent", async () => {
    const id = await unitIdOf(scenario.specials.fastWearUnitKey);
    const before = await db("unit_analysis").where({ unit_id: id }).first("band", "max_wear_mm", "limit_on");
    await recomputeUnits(db, { unitIds: [id] });
    const after = await db("unit_analysis").where({ unit_id: id }).first("band", "max_wear_mm", "limit_on");
    expect(after).toEqual(before);
  });
});
