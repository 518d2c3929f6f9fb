import "server-only";
import { recomputeUnits } from "@/lib/analysis/recompute";
import type { Knex } from "knex";
import { writeAudit } from "@/lib/audit/mutations";
import { ActionError } from "@/lib/auth/action-error";
import type { Role } from "@/lib/auth/roles";
import { db as defaultDb } from "@/lib/db/knex";
import type { ProfileData } from "./schemas";
import { inTransaction } from "@/lib/db/transaction";

type Actor = { id: string; name: string };

/** MariaDB's duplicate-key error, with the name of the unique index that caught it. */
function duplicateKey(err: unknown): string | null {
  const e = err as { code?: string; sqlMessage?: string };
  if (e?.code !== "ER_DUP_ENTRY") return null;
  return /for key '([^']+)'/.exec(e.sqlMessage ?? "")?.[1] ?? "";
}

async function otherActiveAdmins(trx: Knex.Transaction, userId: string): Promise<number> {
  const r = await trx("user")
    .where({ role: "admin" })
    .whereNot({ id: userId })
    .where((w) => w.whereNull("banned").orWhere("banned", false))
    .forUpdate()
    .count<{ n: number }[]>({ n: "*" });
  return Number(r[0].n);
}

async function lockUser(trx: Knex.Transaction, userId: string) {
  const user = await trx("user").where({ id: userId }).forUpdate().first<{ id: string; name: string; role: string | null; banned: number | null } | undefined>("id", "name", "role", "banned");
  if (!user) throw new ActionError("That user no longer exists.", {}, "not_found");
  return user;
}

/** Sets a user's role and vessel list (replacing the old list). Keeps at least one active admin. */
export async function setUserAccess(actor: Actor, o: { userId: string; role: Role; vesselIds: number[] }, db: Knex = defaultDb): Promise<void> {
  await inTransaction(db, async (trx) => {
    const user = await lockUser(trx, o.userId);
    if (user.role === "admin" && o.role !== "admin") {
      if (o.userId === actor.id) throw new ActionError("You cannot take away your own admin role.", { role: ["Ask another admin to change this."] });
      if ((await otherActiveAdmins(trx, o.userId)) === 0) throw new ActionError("This is the last active admin.", { role: ["Make someone else admin first."] });
    }
    const known = o.vesselIds.length ? await trx("vessels").whereIn("id", o.vesselIds).select<{ id: number }[]>("id") : [];
    if (known.length !== new Set(o.vesselIds).size) throw new ActionError("A chosen vessel no longer exists.", { vesselIds: ["Reload the page and choose again."] });
    const before = await trx("user_vessels").where({ user_id: o.userId }).select<{ vessel_id: number }[]>("vessel_id");
    await trx("user").where({ id: o.userId }).update({ role: o.role, updatedAt: new Date() });
    await trx("user_vessels").where({ user_id: o.userId }).delete();
    if (known.length) await trx("user_vessels").insert(known.map((v) => ({ user_id: o.userId, vessel_id: v.id })));
    await writeAudit(
      {
        actor,
        action: "user.update_access",
        entityType: "user",
        entityId: o.userId,
        detail: { roleBefore: user.role, role: o.role, vesselsBefore: before.map((b) => b.vessel_id), vessels: known.map((v) => v.id) },
      },
      trx,
    );
  });
}

/**
 * Deactivates a user: `banned` stops new sign-ins (better-auth's admin plugin refuses them)
 * and deleting the sessions ends any open one at once — session.ts re-reads `banned` on
 * every request as a second guard.
 */
export async function deactivateUser(actor: Actor, userId: string, reason: string | null, db: Knex = defaultDb): Promise<void> {
  await inTransaction(db, async (trx) => {
    const user = await lockUser(trx, userId);
    if (userId === actor.id) throw new ActionError("You cannot deactivate your own account.");
    if (user.role === "admin" && (await otherActiveAdmins(trx, userId)) === 0) throw new ActionError("This is the last active admin; it cannot be deactivated.");
    await trx("user").where({ id: userId }).update({ banned: true, banReason: reason ?? "Deactivated by an administrator", banExpires: null, updatedAt: new Date() });
    const ended = await trx("session").where({ userId }).delete();
    await writeAudit({ actor, action: "user.deactivate", entityType: "user", entityId: userId, detail: { reason, sessionsEnded: ended } }, trx);
  });
}

export async function reactivateUser(actor: Actor, userId: string, db: Knex = defaultDb): Promise<void> {
  await inTransaction(db, async (trx) => {
    await lockUser(trx, userId);
    await trx("user").where({ id: userId }).update({ banned: false, banReason: null, banExpires: null, updatedAt: new Date() });
    await writeAudit({ actor, action: "user.reactivate", entityType: "user", entityId: userId }, trx);
  });
}

export type SaveVesselOptions = {
  vesselId?: number | null;
  name: string;
  imoNumber: string;
  companyId: number | null;
  newCompanyName: string | null;
  vesselType: string | null;
  flag: string | null;
  builtYear: number | null;
};

/** Creates or updates a vessel (and, if named, its new managing company). */
export async function saveVessel(actor: Actor, o: SaveVesselOptions, db: Knex = defaultDb): Promise<number> {
  try {
    return await inTransaction(db, async (trx) => {
      let companyId = o.companyId;
      if (o.newCompanyName) {
        const existing = await trx("companies").where({ name: o.newCompanyName }).first<{ id: number } | undefined>("id");
        companyId = existing?.id ?? (await trx("companies").insert({ name: o.newCompanyName }))[0];
        if (!existing) await writeAudit({ actor, action: "company.create", entityType: "company", entityId: companyId!, detail: { name: o.newCompanyName } }, trx);
      } else if (!(await trx("companies").where({ id: companyId }).first("id"))) {
        throw new ActionError("That company no longer exists.", { companyId: ["Choose again."] });
      }
      const row = { name: o.name, imo_number: o.imoNumber, company_id: companyId, vessel_type: o.vesselType, flag: o.flag, built_year: o.builtYear };
      let id: number;
      if (o.vesselId) {
        const n = await trx("vessels").where({ id: o.vesselId }).update(row);
        if (!n) throw new ActionError("That vessel no longer exists.", {}, "not_found");
        id = o.vesselId;
      } else {
        [id] = await trx("vessels").insert(row);
      }
      await writeAudit({ actor, action: o.vesselId ? "vessel.update" : "vessel.create", entityType: "vessel", entityId: id, vesselId: id, detail: row }, trx);
      return id;
    });
  } catch (err) {
    const key = duplicateKey(err);
    if (key?.includes("imo")) throw new ActionError("Another vessel has this IMO number.", { imoNumber: ["Another vessel already has this IMO number."] });
    throw err;
  }
}

export type CreateEngineOptions = { vesselId: number; profileId: number; serial: string; cylinderCount: number; commissionedOn: string | null };

/** Creates a main engine with its cylinder units numbered 1 … n. The unique serial makes a double submit harmless. */
export async function createEngine(actor: Actor, o: CreateEngineOptions, db: Knex = defaultDb): Promise<number> {
  try {
    return await inTransaction(db, async (trx) => {
      if (!(await trx("vessels").where({ id: o.vesselId }).first("id"))) throw new ActionError("That vessel no longer exists.", { vesselId: ["Choose again."] });
      if (!(await trx("engine_profiles").where({ id: o.profileId }).first("id"))) throw new ActionError("That profile no longer exists.", { profileId: ["Choose again."] });
      const [id] = await trx("main_engines").insert({
        vessel_id: o.vesselId,
        profile_id: o.profileId,
        serial: o.serial,
        cylinder_count: o.cylinderCount,
        commissioned_on: o.commissionedOn,
      });
      await trx("cylinder_units").insert(Array.from({ length: o.cylinderCount }, (_, i) => ({ engine_id: id, cylinder_no: i + 1 })));
      await writeAudit({ actor, action: "engine.create", entityType: "engine", entityId: id, vesselId: o.vesselId, detail: { ...o } }, trx);
      return id;
    });
  } catch (err) {
    if (duplicateKey(err)?.includes("serial")) throw new ActionError("An engine with this serial exists.", { serial: ["An engine with this serial is already recorded."] });
    throw err;
  }
}

/**
 * Creates or updates an engine profile with its stations and rings. Stations are matched
 * by key, so an edited depth or label keeps the readings taken there; a station that
 * already has readings cannot be removed, nor a ring position with ring readings.
 */
export async function saveProfile(actor: Actor, p: ProfileData, db: Knex = defaultDb): Promise<number> {
  const row = {
    name: p.name,
    designation: p.designation,
    bore_mm: p.boreMm,
    stroke_mm: p.strokeMm,
    liner_wear_limit_mm: p.linerWearLimitMm,
    ovality_limit_mm: p.ovalityLimitMm,
    wear_reference: p.wearReference,
    temperature_correction: p.temperatureCorrection,
    alpha_liner_per_k: p.alphaLinerPpmPerK * 1e-6,
    alpha_gauge_per_k: p.alphaGaugePpmPerK * 1e-6,
    liner_material: p.linerMaterial,
    gauge_material: p.gaugeMaterial,
    running_in_hours: p.runningInHours,
    min_points_for_projection: p.minPointsForProjection,
    axis_a_key: p.axisAKey,
    axis_a_label: p.axisALabel,
    axis_b_key: p.axisBKey,
    axis_b_label: p.axisBLabel,
    ring_count: p.rings.length,
    overhaul_interval_hours: p.overhaulIntervalHours,
    rod_nut_pressure_bar: p.rodNutPressureBar,
    rod_nut_tolerance_pct: p.rodNutTolerancePct,
    notes: p.notes,
  };
  try {
    return await inTransaction(db, async (trx) => {
      let id: number;
      if (p.profileId) {
        const n = await trx("engine_profiles").where({ id: p.profileId }).update(row);
        if (!n) throw new ActionError("That profile no longer exists.", {}, "not_found");
        id = p.profileId;
      } else {
        [id] = await trx("engine_profiles").insert(row);
      }

      const old = await trx("profile_stations").where({ profile_id: id }).forUpdate().select<{ id: number; station_key: string }[]>("id", "station_key");
      const keep = new Set(p.stations.map((s) => s.key));
      const removed = old.filter((s) => !keep.has(s.station_key));
      if (removed.length) {
        const used = await trx("liner_readings").whereIn("station_id", removed.map((s) => s.id)).first("station_id");
        if (used) {
          const key = removed.find((s) => s.id === used.station_id)!.station_key;
          throw new ActionError(`Station "${key}" has readings and cannot be removed.`, { stations: [`Station "${key}" has readings: keep it (you may change its label or depth).`] });
        }
        await trx("profile_stations").whereIn("id", removed.map((s) => s.id)).delete();
      }
      // Move kept rows out of the way first: (profile_id, position) is unique.
      await trx("profile_stations").where({ profile_id: id }).update({ position: trx.raw("position + 100") });
      for (const [i, s] of p.stations.entries()) {
        const values = { position: i + 1, label: s.label, depth_mm: s.depthMm, role: s.role };
        const existing = old.find((o) => o.station_key === s.key);
        if (existing) await trx("profile_stations").where({ id: existing.id }).update(values);
        else await trx("profile_stations").insert({ profile_id: id, station_key: s.key, ...values });
      }

      if (p.profileId) {
        const orphan = await trx("ring_readings as r")
          .join("inspections as i", "i.id", "r.inspection_id")
          .join("cylinder_units as u", "u.id", "i.unit_id")
          .join("main_engines as e", "e.id", "u.engine_id")
          .where("e.profile_id", id)
          .where("r.ring_position", ">", p.rings.length)
          .first("r.ring_position");
        if (orphan) {
          throw new ActionError(`Ring ${orphan.ring_position} has readings.`, { rings: [`Ring ${orphan.ring_position} has readings on engines using this profile; keep at least ${orphan.ring_position} rings.`] });
        }
      }
      await trx("profile_rings").where({ profile_id: id }).delete();
      await trx("profile_rings").insert(
        p.rings.map((r, i) => ({
          profile_id: id,
          position: i + 1,
          label: r.label,
          gap_new_min_mm: r.gapNewMinMm,
          gap_new_max_mm: r.gapNewMaxMm,
          gap_limit_mm: r.gapLimitMm,
          groove_new_min_mm: r.grooveNewMinMm,
          groove_new_max_mm: r.grooveNewMaxMm,
          groove_limit_mm: r.grooveLimitMm,
        })),
      );
      await writeAudit(
        { actor, action: p.profileId ? "profile.update" : "profile.create", entityType: "engine_profile", entityId: id, detail: { ...row, stations: p.stations, rings: p.rings } },
        trx,
      );
      if (p.profileId) {
        // New limits or stations change every band and projection of the engines on this profile.
        const engineIds = (await trx("main_engines").where({ profile_id: id }).select<{ id: number }[]>("id")).map((e) => e.id);
        if (engineIds.length) await recomputeUnits(trx, { engineIds });
      }
      return id;
    });
  } catch (err) {
    if (duplicateKey(err)?.includes("name")) throw new ActionError("A profile with this name exists.", { name: ["Another profile already has this name."] });
    throw err;
  }
}
