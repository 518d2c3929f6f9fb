import "server-only";
import type { Knex } from "knex";
import { db } from "@/lib/db/knex";
import type { CurrentUser } from "@/lib/auth/session";
import { whereVesselInScope } from "@/lib/auth/scope";

/** Restricts a query on `vessels` (aliased `v`) to what the user may see. */
const scopeVessels = (q: Knex.QueryBuilder, user: CurrentUser) => whereVesselInScope(q, user, "v.id");

/*
 * The vessel a record belongs to, for the route wrapper's scope check: null when the id
 * names nothing (or could not, e.g. a malformed id parsed to null), answered 404 alike.
 */

/** The vessel id when that vessel exists, else null. */
export async function getVesselIdIfExists(vesselId: number | null): Promise<number | null> {
  if (vesselId === null) return null;
  const row = await db("vessels").where({ id: vesselId }).first("id");
  return row ? Number(row.id) : null;
}

/** The vessel of a main engine, or null when the engine does not exist. */
export async function getEngineVesselId(engineId: number | null): Promise<number | null> {
  if (engineId === null) return null;
  const row = await db("main_engines").where({ id: engineId }).first("vessel_id");
  return row ? Number(row.vessel_id) : null;
}

/** The vessel of a cylinder unit, or null when the unit does not exist. */
export async function getUnitVesselId(unitId: number | null): Promise<number | null> {
  if (unitId === null) return null;
  const row = await db("cylinder_units as u").join("main_engines as e", "e.id", "u.engine_id").where("u.id", unitId).first("e.vessel_id as vesselId");
  return row ? Number(row.vesselId) : null;
}

export type BandCounts = Record<string, number>;

export type FleetVesselRow = {
  id: number;
  name: string;
  imoNumber: string;
  vesselType: string | null;
  companyName: string;
  engineId: number | null;
  engineDesignation: string | null;
  boreMm: number | null;
  cylinderCount: number | null;
  bands: BandCounts;
  lastInspectedOn: string | null;
  earliestLimitOn: string | null;
  awaitingApproval: number;
};

/** Every vessel the user may see, with its main engine and the spread of unit bands. */
export async function listFleet(user: CurrentUser): Promise<FleetVesselRow[]> {
  const vessels = await scopeVessels(
    db("vessels as v")
      .join("companies as c", "c.id", "v.company_id")
      .leftJoin("main_engines as e", "e.vessel_id", "v.id")
      .leftJoin("engine_profiles as p", "p.id", "e.profile_id")
      .whereNull("v.archived_at")
      .orderBy("v.name")
      .select(
        "v.id",
        "v.name",
        "v.imo_number as imoNumber",
        "v.vessel_type as vesselType",
        "c.name as companyName",
        "e.id as engineId",
        "p.designation as engineDesignation",
        "p.bore_mm as boreMm",
        "e.cylinder_count as cylinderCount",
      ),
    user,
  );
  if (!vessels.length) return [];
  const ids = vessels.map((v: { id: number }) => v.id);
  const bandRows = await db("unit_analysis as a")
    .join("cylinder_units as u", "u.id", "a.unit_id")
    .join("main_engines as e", "e.id", "u.engine_id")
    .whereIn("e.vessel_id", ids)
    .groupBy("e.vessel_id", "a.band")
    .select("e.vessel_id as vesselId", "a.band")
    .count<{ vesselId: number; band: string; n: number }[]>({ n: "*" })
    .min({ earliest: "a.limit_on" })
    .max({ last: "a.last_inspected_on" });
  const pending = await db("inspections as i")
    .join("cylinder_units as u", "u.id", "i.unit_id")
    .join("main_engines as e", "e.id", "u.engine_id")
    .whereIn("e.vessel_id", ids)
    .where("i.state", "submitted")
    .whereNull("i.import_id")
    .groupBy("e.vessel_id")
    .select("e.vessel_id as vesselId")
    .count<{ vesselId: number; n: number }[]>({ n: "*" });
  return vessels.map((v: Omit<FleetVesselRow, "bands" | "lastInspectedOn" | "earliestLimitOn" | "awaitingApproval">) => {
    const mine = (bandRows as unknown as { vesselId: number; band: string; n: number; earliest: string | null; last: string | null }[]).filter(
      (r) => r.vesselId === v.id,
    );
    const bands: BandCounts = {};
    for (const r of mine) bands[r.band] = Number(r.n);
    const earliest = mine.map((r) => r.earliest).filter((d): d is string => !!d).sort()[0] ?? null;
    const last = mine.map((r) => r.last).filter((d): d is string => !!d).sort().at(-1) ?? null;
    return {
      ...v,
      boreMm: v.boreMm === null ? null : Number(v.boreMm),
      bands,
      earliestLimitOn: earliest,
      lastInspectedOn: last,
      awaitingApproval: Number(pending.find((p) => p.vesselId === v.id)?.n ?? 0),
    };
  });
}

export type VesselDetail = {
  id: number;
  name: string;
  imoNumber: string;
  vesselType: string | null;
  flag: string | null;
  builtYear: number | null;
  companyName: string;
  engines: { id: number; serial: string; cylinderCount: number; profileName: string; designation: string; boreMm: number }[];
};

export async function getVessel(user: CurrentUser, vesselId: number): Promise<VesselDetail | null> {
  const v = await scopeVessels(
    db("vessels as v")
      .join("companies as c", "c.id", "v.company_id")
      .where("v.id", vesselId)
      .first(
        "v.id",
        "v.name",
        "v.imo_number as imoNumber",
        "v.vessel_type as vesselType",
        "v.flag",
        "v.built_year as builtYear",
        "c.name as companyName",
      ),
    user,
  );
  if (!v) return null;
  const engines = await db("main_engines as e")
    .join("engine_profiles as p", "p.id", "e.profile_id")
    .where("e.vessel_id", vesselId)
    .orderBy("e.id")
    .select("e.id", "e.serial", "e.cylinder_count as cylinderCount", "p.name as profileName", "p.designation", "p.bore_mm as boreMm");
  return { ...v, engines: engines.map((e) => ({ ...e, boreMm: Number(e.boreMm) })) };
}

export type EngineUnitRow = {
  id: number;
  cylinderNo: number;
  linerSerial: string | null;
  linerHours: number | null;
  band: string | null;
  maxWearMm: number | null;
  maxOvalityMm: number | null;
  wearRate: number | null;
  limitOn: string | null;
  limitOnEarliest: string | null;
  limitOnLatest: string | null;
  lastInspectedOn: string | null;
  nextOverhaulEngineHours: number | null;
  summary: unknown;
};

export type EngineDetail = {
  id: number;
  serial: string;
  cylinderCount: number;
  commissionedOn: string | null;
  vessel: { id: number; name: string; imoNumber: string };
  profile: { id: number; name: string; designation: string; boreMm: number; linerWearLimitMm: number; ovalityLimitMm: number };
  latestHours: { loggedOn: string; engineHours: number } | null;
  units: EngineUnitRow[];
};

const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));

export async function getEngine(user: CurrentUser, engineId: number): Promise<EngineDetail | null> {
  const e = await scopeVessels(
    db("main_engines as e")
      .join("vessels as v", "v.id", "e.vessel_id")
      .join("engine_profiles as p", "p.id", "e.profile_id")
      .where("e.id", engineId)
      .first(
        "e.id",
        "e.serial",
        "e.cylinder_count as cylinderCount",
        "e.commissioned_on as commissionedOn",
        "v.id as vesselId",
        "v.name as vesselName",
        "v.imo_number as imoNumber",
        "p.id as profileId",
        "p.name as profileName",
        "p.designation",
        "p.bore_mm as boreMm",
        "p.liner_wear_limit_mm as linerWearLimitMm",
        "p.ovality_limit_mm as ovalityLimitMm",
      ),
    user,
  );
  if (!e) return null;
  const latest = await db("running_hours_log")
    .where({ engine_id: engineId })
    .orderBy("logged_on", "desc")
    .first("logged_on as loggedOn", "engine_hours as engineHours");
  const units = await db("cylinder_units as u")
    .leftJoin("liners as l", function () {
      this.on("l.unit_id", "u.id").andOnNull("l.removed_on");
    })
    .leftJoin("unit_analysis as a", "a.unit_id", "u.id")
    .where("u.engine_id", engineId)
    .orderBy("u.cylinder_no")
    .select(
      "u.id",
      "u.cylinder_no as cylinderNo",
      "u.next_overhaul_engine_hours as nextOverhaulEngineHours",
      "l.serial as linerSerial",
      "a.liner_hours as linerHours",
      "a.band",
      "a.max_wear_mm as maxWearMm",
      "a.max_ovality_mm as maxOvalityMm",
      "a.wear_rate_mm_per_1000h as wearRate",
      "a.limit_on as limitOn",
      "a.limit_on_earliest as limitOnEarliest",
      "a.limit_on_latest as limitOnLatest",
      "a.last_inspected_on as lastInspectedOn",
      "a.summary",
    );
  return {
    id: e.id,
    serial: e.serial,
    cylinderCount: e.cylinderCount,
    commissionedOn: e.commissionedOn,
    vessel: { id: e.vesselId, name: e.vesselName, imoNumber: e.imoNumber },
    profile: {
      id: e.profileId,
      name: e.profileName,
      designation: e.designation,
      boreMm: Number(e.boreMm),
      linerWearLimitMm: Number(e.linerWearLimitMm),
      ovalityLimitMm: Number(e.ovalityLimitMm),
    },
    latestHours: latest ? { loggedOn: latest.loggedOn, engineHours: Number(latest.engineHours) } : null,
    units: units.map((u) => ({
      ...u,
      linerHours: num(u.linerHours),
      maxWearMm: num(u.maxWearMm),
      maxOvalityMm: num(u.maxOvalityMm),
      wearRate: num(u.wearRate),
      nextOverhaulEngineHours: num(u.nextOverhaulEngineHours),
      summary: typeof u.summary === "string" ? JSON.parse(u.summary) : u.summary,
    })),
  };
}

/** Where a unit sits and whether the user may see it; the base for every unit screen. */
export async function getUnitContext(user: CurrentUser, unitId: number) {
  const u = await scopeVessels(
    db("cylinder_units as u")
      .join("main_engines as e", "e.id", "u.engine_id")
      .join("vessels as v", "v.id", "e.vessel_id")
      .where("u.id", unitId)
      .first(
        "u.id",
        "u.cylinder_no as cylinderNo",
        "u.next_overhaul_engine_hours as nextOverhaulEngineHours",
        "e.id as engineId",
        "e.serial as engineSerial",
        "e.profile_id as profileId",
        "v.id as vesselId",
        "v.name as vesselName",
      ),
    user,
  );
  if (!u) return null;
  return { ...u, nextOverhaulEngineHours: num(u.nextOverhaulEngineHours) } as {
    id: number;
    cylinderNo: number;
    nextOverhaulEngineHours: number | null;
    engineId: number;
    engineSerial: string;
    profileId: number;
    vesselId: number;
    vesselName: string;
  };
}

/** The stored wear rate of every unit on the user's vessels, for the fleet's spread of rates. */
export async function listFleetWearRates(user: CurrentUser): Promise<(number | null)[]> {
  const rows = await scopeVessels(
    db("unit_analysis as a")
      .join("cylinder_units as u", "u.id", "a.unit_id")
      .join("main_engines as e", "e.id", "u.engine_id")
      .join("vessels as v", "v.id", "e.vessel_id")
      .whereNull("v.archived_at")
      .select("a.wear_rate_mm_per_1000h as rate"),
    user,
  );
  return rows.map((r: { rate: unknown }) => num(r.rate));
}
