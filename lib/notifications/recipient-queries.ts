import "server-only";
import type { Knex } from "knex";
import { approvalRefusal, type ApprovalParties } from "@/lib/inspections/approval";
import { isRole, type Role } from "@/lib/auth/roles";
import type { Topic } from "./topics";

/*
 * Who hears of what. Only active accounts, only people assigned to the vessel the alert is
 * about (vessel scope, as for the records themselves), and only those who have not switched
 * the topic off (no preference row means on).
 */

type Conn = Knex | Knex.Transaction;

export type Recipient = { id: string; name: string; email: string; role: Role };

function subscribed(conn: Conn, topic: Topic) {
  return conn("user as u")
    .leftJoin("notification_preferences as np", (j) => j.on("np.user_id", "u.id").andOnVal("np.topic", topic))
    .where((w) => w.whereNull("u.banned").orWhere("u.banned", false))
    .where((w) => w.whereNull("np.enabled").orWhere("np.enabled", true));
}

async function onVessel(conn: Conn, topic: Topic, vesselId: number, roles: Role[]): Promise<Recipient[]> {
  const rows = await subscribed(conn, topic)
    .join("user_vessels as uv", "uv.user_id", "u.id")
    .where("uv.vessel_id", vesselId)
    .whereIn("u.role", roles)
    .orderBy("u.name")
    .select<{ id: string; name: string; email: string; role: string }[]>("u.id", "u.name", "u.email", "u.role");
  return rows.filter((r): r is Recipient => isRole(r.role));
}

/** Every active person of `roles` who has `topic` on (the digest's readers), by id. */
export async function subscribedPeople(conn: Conn, topic: Topic, roles: Role[]): Promise<Recipient[]> {
  const rows = await subscribed(conn, topic).whereIn("u.role", roles).orderBy("u.id").select<{ id: string; name: string; email: string; role: string }[]>("u.id", "u.name", "u.email", "u.role");
  return rows.filter((r): r is Recipient => isRole(r.role));
}

/** One person by id, when they are active and have `topic` on. */
export async function subscribedUser(conn: Conn, topic: Topic, userId: string): Promise<Recipient | null> {
  const row = await subscribed(conn, topic).where("u.id", userId).first<{ id: string; name: string; email: string; role: string } | undefined>("u.id", "u.name", "u.email", "u.role");
  return row && isRole(row.role) ? { ...row, role: row.role } : null;
}

/**
 * The people who may approve a submitted record (lib/inspections/approval.ts: never who
 * entered or submitted it): the vessel's chief engineers first; when none of them may, the
 * vessel's superintendents, who approve in their place. Computed from everyone assigned, then
 * narrowed to who has the topic on, so someone who switched it off is not replaced by another.
 */
export async function approversToTell(conn: Conn, vesselId: number, parties: ApprovalParties): Promise<Recipient[]> {
  const assigned = await conn("user as u")
    .join("user_vessels as uv", "uv.user_id", "u.id")
    .where("uv.vessel_id", vesselId)
    .whereIn("u.role", ["chief_engineer", "superintendent"])
    .where((w) => w.whereNull("u.banned").orWhere("u.banned", false))
    .select<{ id: string; role: string }[]>("u.id", "u.role");
  const may = assigned.filter((u) => isRole(u.role) && approvalRefusal({ id: u.id, role: u.role }, parties) === null);
  const chiefs = may.filter((u) => u.role === "chief_engineer");
  const chosen = new Set((chiefs.length ? chiefs : may).map((u) => u.id));
  const wanting = await onVessel(conn, "inspection_submitted", vesselId, ["chief_engineer", "superintendent"]);
  return wanting.filter((u) => chosen.has(u.id));
}

/** The vessel's chief engineers and superintendents who have `topic` on. */
export function chiefsAndSuperintendents(conn: Conn, topic: Topic, vesselId: number): Promise<Recipient[]> {
  return onVessel(conn, topic, vesselId, ["chief_engineer", "superintendent"]);
}

/** The vessel's superintendents who have `topic` on. */
export function superintendentsOf(conn: Conn, topic: Topic, vesselId: number): Promise<Recipient[]> {
  return onVessel(conn, topic, vesselId, ["superintendent"]);
}
