import "server-only";
import { db } from "@/lib/db/knex";

/** Vessel ids assigned to a user (crew and superintendents). */
export async function listAssignedVesselIds(userId: string): Promise<number[]> {
  const rows = await db("user_vessels").where({ user_id: userId }).select<{ vessel_id: number }[]>("vessel_id");
  return rows.map((r) => r.vessel_id);
}

/** Minimal user row used to re-check a session on every request (role and deactivation). */
export async function getUserAccessRow(userId: string) {
  return db("user")
    .where({ id: userId })
    .first<{ id: string; name: string; email: string; role: string | null; banned: number | null } | undefined>(
      "id",
      "name",
      "email",
      "role",
      "banned",
    );
}
