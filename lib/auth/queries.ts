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

export type SessionAccessRow = {
  id: string;
  name: string;
  email: string;
  role: string | null;
  banned: number | null;
  /** The session row still exists and has not expired (not signed out, revoked or ended by deactivation). */
  sessionLive: number;
  /** Comma-separated assigned vessel ids, or null. */
  vesselIds: string | null;
};

/**
 * Everything a request needs to trust a session, in one round trip: the user's role and ban, their
 * vessels, and whether the session row is still live. better-auth's cookie cache may vouch for a
 * session for up to SESSION_COOKIE_CACHE_S after it was revoked; this check closes that window.
 */
export async function getSessionAccessRow(userId: string, sessionId: string): Promise<SessionAccessRow | undefined> {
  return db("user as u")
    .where("u.id", userId)
    .first<SessionAccessRow | undefined>(
      "u.id",
      "u.name",
      "u.email",
      "u.role",
      "u.banned",
      db.raw("EXISTS (SELECT 1 FROM `session` s WHERE s.id = ? AND s.userId = u.id AND s.expiresAt > CURRENT_TIMESTAMP(3)) AS sessionLive", [sessionId]),
      db.raw("(SELECT GROUP_CONCAT(uv.vessel_id) FROM user_vessels uv WHERE uv.user_id = u.id) AS vesselIds"),
    );
}
