import "server-only";
import { db } from "@/lib/db/knex";
import { isRole, type Role } from "@/lib/auth/roles";
import { hashInvitationToken } from "./token";

export type InvitationStatus = "valid" | "expired" | "used" | "revoked";

export type InvitationView = {
  id: number;
  name: string;
  email: string;
  role: Role;
  vesselNames: string[];
  expiresAt: Date;
  status: InvitationStatus;
  inviter: { id: string; name: string; email: string } | null;
};

export function invitationStatus(row: { used_at: Date | null; revoked_at: Date | null; expires_at: Date }, now = new Date()): InvitationStatus {
  if (row.used_at) return "used";
  if (row.revoked_at) return "revoked";
  if (new Date(row.expires_at).getTime() <= now.getTime()) return "expired";
  return "valid";
}

export function parseVesselIds(raw: unknown): number[] {
  const value = typeof raw === "string" ? JSON.parse(raw) : raw;
  return Array.isArray(value) ? value.map(Number).filter((n) => Number.isInteger(n) && n > 0) : [];
}

/** The invitation a link points to, whatever its state; null for an unknown token. */
export async function getInvitationByToken(token: string): Promise<InvitationView | null> {
  const row = await db("invitations as i")
    .leftJoin("user as u", "u.id", "i.invited_by")
    .where("i.token_hash", hashInvitationToken(token))
    .first<
      | {
          id: number;
          name: string;
          email: string;
          role: string;
          vessel_ids: unknown;
          expires_at: Date;
          used_at: Date | null;
          revoked_at: Date | null;
          inviter_id: string | null;
          inviter_name: string | null;
          inviter_email: string | null;
        }
      | undefined
    >(
      "i.id",
      "i.name",
      "i.email",
      "i.role",
      "i.vessel_ids",
      "i.expires_at",
      "i.used_at",
      "i.revoked_at",
      "u.id as inviter_id",
      "u.name as inviter_name",
      "u.email as inviter_email",
    );
  if (!row || !isRole(row.role)) return null;
  const ids = parseVesselIds(row.vessel_ids);
  const vessels = ids.length ? await db("vessels").whereIn("id", ids).orderBy("name").select<{ name: string }[]>("name") : [];
  return {
    id: row.id,
    name: row.name,
    email: row.email,
    role: row.role,
    vesselNames: vessels.map((v) => v.name),
    expiresAt: new Date(row.expires_at),
    status: invitationStatus(row),
    inviter: row.inviter_id ? { id: row.inviter_id, name: row.inviter_name ?? "", email: row.inviter_email ?? "" } : null,
  };
}

/** Active admins' addresses: who hears about an invitation whose inviter is gone. */
export async function listActiveAdminContacts(): Promise<{ id: string; name: string; email: string }[]> {
  return db("user")
    .where({ role: "admin" })
    .where((q) => q.whereNull("banned").orWhere("banned", false))
    .orderBy("createdAt")
    .select("id", "name", "email");
}

/** Whether someone already asked for a new invitation for this one recently (one e-mail per hour). */
export async function hasRecentReissueRequest(invitationId: number, withinMinutes = 60): Promise<boolean> {
  const row = await db("audit_log")
    .where({ action: "invitation.reissue_requested", entity_type: "invitation", entity_id: String(invitationId) })
    .where("at", ">", db.raw("UTC_TIMESTAMP(3) - INTERVAL ? MINUTE", [withinMinutes]))
    .first("id");
  return !!row;
}
