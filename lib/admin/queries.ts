import "server-only";
import { db } from "@/lib/db/knex";
import { isRole, type Role } from "@/lib/auth/roles";
import { invitationStatus, parseVesselIds, type InvitationStatus } from "@/lib/invitations/queries";
import type { ProfileInput } from "./schemas";

/*
 * Reads for the admin screens. Callers have checked the admin permission; nothing
 * here returns password hashes or tokens (explicit column lists only).
 */

const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));

export type AdminUserRow = {
  id: string;
  name: string;
  email: string;
  role: Role | null;
  active: boolean;
  vessels: { id: number; name: string }[];
  createdAt: string;
  lastActiveAt: string | null;
};

export async function listUsersForAdmin(): Promise<AdminUserRow[]> {
  const users = await db("user as u")
    .leftJoin(db("session").groupBy("userId").select("userId").max({ lastActive: "updatedAt" }).as("s"), "s.userId", "u.id")
    .orderBy("u.name")
    .select("u.id", "u.name", "u.email", "u.role", "u.banned", "u.createdAt", "s.lastActive");
  const links = await db("user_vessels as uv")
    .join("vessels as v", "v.id", "uv.vessel_id")
    .orderBy("v.name")
    .select<{ userId: string; id: number; name: string }[]>("uv.user_id as userId", "v.id", "v.name");
  return users.map((u) => ({
    id: u.id,
    name: u.name,
    email: u.email,
    role: isRole(u.role) ? u.role : null,
    active: !u.banned,
    vessels: links.filter((l) => l.userId === u.id).map(({ id, name }) => ({ id, name })),
    createdAt: new Date(u.createdAt).toISOString(),
    lastActiveAt: u.lastActive ? new Date(u.lastActive).toISOString() : null,
  }));
}

export async function getUserForAdmin(userId: string): Promise<AdminUserRow | null> {
  return (await listUsersForAdmin()).find((u) => u.id === userId) ?? null;
}

export type InvitationRow = {
  id: number;
  name: string;
  email: string;
  role: string;
  vesselIds: number[];
  status: InvitationStatus;
  expiresAt: string;
  invitedByName: string | null;
  updatedAt: string;
};

/** Invitations not yet accepted (open, expired or withdrawn), newest first. */
export async function listOpenInvitations(): Promise<InvitationRow[]> {
  const rows = await db("invitations as i")
    .leftJoin("user as u", "u.id", "i.invited_by")
    .whereNull("i.used_at")
    .orderBy("i.updated_at", "desc")
    .limit(200)
    .select("i.id", "i.name", "i.email", "i.role", "i.vessel_ids", "i.expires_at", "i.used_at", "i.revoked_at", "i.updated_at", "u.name as invitedByName");
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    email: r.email,
    role: r.role,
    vesselIds: parseVesselIds(r.vessel_ids),
    status: invitationStatus(r),
    expiresAt: new Date(r.expires_at).toISOString(),
    invitedByName: r.invitedByName,
    updatedAt: new Date(r.updated_at).toISOString(),
  }));
}

export type VesselOption = { id: number; name: string; imoNumber: string; companyName: string };

export async function listVesselOptions(): Promise<VesselOption[]> {
  return db("vessels as v")
    .join("companies as c", "c.id", "v.company_id")
    .whereNull("v.archived_at")
    .orderBy(["c.name", "v.name"])
    .select("v.id", "v.name", "v.imo_number as imoNumber", "c.name as companyName");
}

export async function listCompanies(): Promise<{ id: number; name: string }[]> {
  return db("companies").orderBy("name").select("id", "name");
}

export type AdminVesselRow = VesselOption & {
  companyId: number;
  vesselType: string | null;
  flag: string | null;
  builtYear: number | null;
  engineCount: number;
  peopleCount: number;
};

export async function listVesselsForAdmin(): Promise<AdminVesselRow[]> {
  const rows = await db("vessels as v")
    .join("companies as c", "c.id", "v.company_id")
    .whereNull("v.archived_at")
    .orderBy(["c.name", "v.name"])
    .select(
      "v.id",
      "v.name",
      "v.imo_number as imoNumber",
      "v.company_id as companyId",
      "c.name as companyName",
      "v.vessel_type as vesselType",
      "v.flag",
      "v.built_year as builtYear",
      db("main_engines as e").whereRaw("e.vessel_id = v.id").count("*").as("engineCount"),
      db("user_vessels as uv").whereRaw("uv.vessel_id = v.id").count("*").as("peopleCount"),
    );
  return rows.map((r) => ({ ...r, engineCount: Number(r.engineCount), peopleCount: Number(r.peopleCount) }));
}

export async function getVesselForEdit(vesselId: number): Promise<AdminVesselRow | null> {
  return (await listVesselsForAdmin()).find((v) => v.id === vesselId) ?? null;
}

export type AdminEngineRow = {
  id: number;
  serial: string;
  cylinderCount: number;
  commissionedOn: string | null;
  vesselId: number;
  vesselName: string;
  profileId: number;
  profileName: string;
  designation: string;
};

export async function listEnginesForAdmin(): Promise<AdminEngineRow[]> {
  return db("main_engines as e")
    .join("vessels as v", "v.id", "e.vessel_id")
    .join("engine_profiles as p", "p.id", "e.profile_id")
    .orderBy(["v.name", "e.serial"])
    .select(
      "e.id",
      "e.serial",
      "e.cylinder_count as cylinderCount",
      "e.commissioned_on as commissionedOn",
      "v.id as vesselId",
      "v.name as vesselName",
      "p.id as profileId",
      "p.name as profileName",
      "p.designation",
    );
}

export type AdminProfileRow = {
  id: number;
  name: string;
  designation: string;
  boreMm: number;
  linerWearLimitMm: number;
  ovalityLimitMm: number;
  ringCount: number;
  stationCount: number;
  engineCount: number;
  updatedAt: string;
};

export async function listProfilesForAdmin(): Promise<AdminProfileRow[]> {
  const rows = await db("engine_profiles as p")
    .orderBy("p.name")
    .select(
      "p.id",
      "p.name",
      "p.designation",
      "p.bore_mm as boreMm",
      "p.liner_wear_limit_mm as linerWearLimitMm",
      "p.ovality_limit_mm as ovalityLimitMm",
      "p.ring_count as ringCount",
      "p.updated_at as updatedAt",
      db("profile_stations as s").whereRaw("s.profile_id = p.id").count("*").as("stationCount"),
      db("main_engines as e").whereRaw("e.profile_id = p.id").count("*").as("engineCount"),
    );
  return rows.map((r) => ({
    ...r,
    boreMm: Number(r.boreMm),
    linerWearLimitMm: Number(r.linerWearLimitMm),
    ovalityLimitMm: Number(r.ovalityLimitMm),
    stationCount: Number(r.stationCount),
    engineCount: Number(r.engineCount),
    updatedAt: new Date(r.updatedAt).toISOString(),
  }));
}

export async function listProfileOptions(): Promise<{ id: number; name: string; designation: string; boreMm: number }[]> {
  const rows = await db("engine_profiles").orderBy("name").select("id", "name", "designation", "bore_mm as boreMm");
  return rows.map((r) => ({ ...r, boreMm: Number(r.boreMm) }));
}

/** A profile in the shape of its form, plus which stations already carry readings. */
export async function getProfileForEdit(
  profileId: number,
): Promise<{ values: ProfileInput; stationsWithReadings: string[]; engineCount: number } | null> {
  const p = await db("engine_profiles")
    .where({ id: profileId })
    .first(
      "id",
      "name",
      "designation",
      "bore_mm",
      "stroke_mm",
      "liner_wear_limit_mm",
      "ovality_limit_mm",
      "wear_reference",
      "temperature_correction",
      "alpha_liner_per_k",
      "alpha_gauge_per_k",
      "liner_material",
      "gauge_material",
      "running_in_hours",
      "min_points_for_projection",
      "axis_a_key",
      "axis_a_label",
      "axis_b_key",
      "axis_b_label",
      "overhaul_interval_hours",
      "rod_nut_pressure_bar",
      "rod_nut_tolerance_pct",
      "notes",
    );
  if (!p) return null;
  const stations = await db("profile_stations").where({ profile_id: profileId }).orderBy("position").select("id", "station_key", "label", "depth_mm", "role");
  const rings = await db("profile_rings")
    .where({ profile_id: profileId })
    .orderBy("position")
    .select("label", "gap_new_min_mm", "gap_new_max_mm", "gap_limit_mm", "groove_new_min_mm", "groove_new_max_mm", "groove_limit_mm");
  const used = stations.length
    ? await db("liner_readings").whereIn("station_id", stations.map((s) => s.id)).distinct<{ station_id: number }[]>("station_id")
    : [];
  const engineCount = Number((await db("main_engines").where({ profile_id: profileId }).count<{ n: number }[]>({ n: "*" }))[0].n);
  // α is kept per kelvin; the form shows it in 10⁻⁶ per K, as manuals print it.
  const ppm = (v: number) => Math.round(Number(v) * 1e6 * 1000) / 1000;
  return {
    engineCount,
    stationsWithReadings: stations.filter((s) => used.some((u) => u.station_id === s.id)).map((s) => s.station_key),
    values: {
      profileId: p.id,
      name: p.name,
      designation: p.designation,
      boreMm: Number(p.bore_mm),
      strokeMm: num(p.stroke_mm),
      linerWearLimitMm: Number(p.liner_wear_limit_mm),
      ovalityLimitMm: Number(p.ovality_limit_mm),
      wearReference: p.wear_reference,
      temperatureCorrection: !!p.temperature_correction,
      alphaLinerPpmPerK: ppm(p.alpha_liner_per_k),
      alphaGaugePpmPerK: ppm(p.alpha_gauge_per_k),
      linerMaterial: p.liner_material,
      gaugeMaterial: p.gauge_material,
      runningInHours: Number(p.running_in_hours),
      minPointsForProjection: Number(p.min_points_for_projection),
      axisAKey: p.axis_a_key,
      axisALabel: p.axis_a_label,
      axisBKey: p.axis_b_key,
      axisBLabel: p.axis_b_label,
      overhaulIntervalHours: Number(p.overhaul_interval_hours),
      rodNutPressureBar: num(p.rod_nut_pressure_bar),
      rodNutTolerancePct: num(p.rod_nut_tolerance_pct),
      notes: p.notes,
      stations: stations.map((s) => ({ key: s.station_key, label: s.label, depthMm: Number(s.depth_mm), role: s.role })),
      rings: rings.map((r) => ({
        label: r.label,
        gapNewMinMm: Number(r.gap_new_min_mm),
        gapNewMaxMm: Number(r.gap_new_max_mm),
        gapLimitMm: Number(r.gap_limit_mm),
        grooveNewMinMm: Number(r.groove_new_min_mm),
        grooveNewMaxMm: Number(r.groove_new_max_mm),
        grooveLimitMm: Number(r.groove_limit_mm),
      })),
    },
  };
}

export type AuditRow = { id: number; at: string; actorName: string | null; action: string; entityType: string; entityId: string };

export async function listRecentAudit(limit = 12): Promise<AuditRow[]> {
  const rows = await db("audit_log")
    .where("action", "like", "user.%")
    .orWhere("action", "like", "invitation.%")
    .orWhere("action", "like", "vessel.%")
    .orWhere("action", "like", "engine.%")
    .orWhere("action", "like", "profile.%")
    .orderBy("id", "desc")
    .limit(limit)
    .select("id", "at", "actor_name as actorName", "action", "entity_type as entityType", "entity_id as entityId");
  return rows.map((r) => ({ ...r, at: new Date(r.at).toISOString() }));
}

export async function countAdminOverview() {
  const count = async (table: string, where?: (q: ReturnType<typeof db>) => void) => {
    const q = db(table);
    if (where) where(q);
    return Number((await q.count<{ n: number }[]>({ n: "*" }))[0].n);
  };
  return {
    activeUsers: await count("user", (q) => q.where((w) => w.whereNull("banned").orWhere("banned", false))),
    openInvitations: await count("invitations", (q) => q.whereNull("used_at").whereNull("revoked_at").where("expires_at", ">", new Date())),
    vessels: await count("vessels", (q) => q.whereNull("archived_at")),
    engines: await count("main_engines"),
    profiles: await count("engine_profiles"),
  };
}

/** Active admins other than `userId`: the last admin cannot be demoted or deactivated. */
export async function countOtherActiveAdmins(userId: string): Promise<number> {
  const r = await db("user")
    .where({ role: "admin" })
    .whereNot({ id: userId })
    .where((w) => w.whereNull("banned").orWhere("banned", false))
    .count<{ n: number }[]>({ n: "*" });
  return Number(r[0].n);
}
