import "server-only";
import { db } from "@/lib/db/knex";

/** The vessel an engine belongs to, or null when the engine does not exist. */
export async function vesselOfEngine(engineId: number): Promise<number | null> {
  const row = await db("main_engines").where({ id: engineId }).first<{ vessel_id: number } | undefined>("vessel_id");
  return row?.vessel_id ?? null;
}

export type HoursLogEntry = { loggedOn: string; engineHours: number };

/** The latest counter readings of an engine, newest first. Caller checks vessel scope. */
export async function listRecentHours(engineId: number, limit = 6): Promise<HoursLogEntry[]> {
  const rows = await db("running_hours_log")
    .where({ engine_id: engineId })
    .orderBy("logged_on", "desc")
    .limit(limit)
    .select("logged_on as loggedOn", "engine_hours as engineHours");
  return rows.map((r) => ({ loggedOn: r.loggedOn, engineHours: Number(r.engineHours) }));
}
