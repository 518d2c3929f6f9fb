import "server-only";
import { randomUUID } from "node:crypto";
import { hashPassword } from "better-auth/crypto";
import type { Knex } from "knex";
import { writeAudit } from "@/lib/audit/mutations";
import type { Role } from "@/lib/auth/roles";
import { db as defaultDb } from "@/lib/db/knex";
import { queueInvitationMail, queueReissueRequestMail } from "./notify";
import { invitationStatus, parseVesselIds, type InvitationStatus } from "./queries";
import { INVITATION_TTL_DAYS } from "./schemas";
import { hashInvitationToken, newInvitationToken } from "./token";
import { inTransaction } from "@/lib/db/transaction";

type Actor = { id: string; name: string };

export type IssueInvitationOptions = {
  name: string;
  email: string;
  role: Role;
  vesselIds: number[];
  /** Always make a new token (an explicit "send again"), never treat it as a double submit. */
  force?: boolean;
};

export type IssuedInvitation =
  | { kind: "issued"; invitationId: number; token: string; expiresAt: Date }
  /** The same invitation was issued seconds ago (a double submit): nothing new is sent. */
  | { kind: "duplicate"; invitationId: number }
  | { kind: "has_account" };

/** A second identical request within this window is taken as a double submit. */
const DUPLICATE_WINDOW_MS = 30_000;

function expiry(from = new Date()): Date {
  return new Date(from.getTime() + INVITATION_TTL_DAYS * 24 * 60 * 60 * 1000);
}

/**
 * Issues (or re-issues) the one open invitation for an address. An open invitation for
 * the same address is updated in place with a new token, so an old link stops working
 * and a person never holds two. Locks the address's rows so two clicks make one. The
 * invitation e-mail is queued in the same transaction (lib/mail/outbox.ts sends it).
 */
export async function issueInvitation(actor: Actor, o: IssueInvitationOptions, db: Knex = defaultDb): Promise<IssuedInvitation> {
  return inTransaction(db, async (trx) => {
    const existingUser = await trx("user").whereRaw("LOWER(email) = ?", [o.email.toLowerCase()]).first("id");
    if (existingUser) return { kind: "has_account" as const };
    const open = await trx("invitations")
      .where({ email: o.email })
      .whereNull("used_at")
      .orderBy("id", "desc")
      .forUpdate()
      .first<{ id: number; role: string; vessel_ids: unknown; updated_at: Date; revoked_at: Date | null } | undefined>(
        "id",
        "role",
        "vessel_ids",
        "updated_at",
        "revoked_at",
      );
    const sameRequest =
      open &&
      !o.force &&
      !open.revoked_at &&
      open.role === o.role &&
      JSON.stringify(parseVesselIds(open.vessel_ids).sort()) === JSON.stringify([...o.vesselIds].sort()) &&
      Date.now() - new Date(open.updated_at).getTime() < DUPLICATE_WINDOW_MS;
    if (open && sameRequest) return { kind: "duplicate" as const, invitationId: open.id };

    const token = newInvitationToken();
    const expiresAt = expiry();
    const row = {
      email: o.email,
      name: o.name,
      role: o.role,
      vessel_ids: JSON.stringify(o.vesselIds),
      token_hash: hashInvitationToken(token),
      expires_at: expiresAt,
      revoked_at: null,
      invited_by: actor.id,
    };
    let invitationId: number;
    if (open) {
      await trx("invitations").where({ id: open.id }).update(row);
      invitationId = open.id;
    } else {
      [invitationId] = await trx("invitations").insert(row);
    }
    await writeAudit(
      { actor, action: open ? "invitation.reissue" : "invitation.create", entityType: "invitation", entityId: invitationId, detail: { email: o.email, role: o.role, vesselIds: o.vesselIds } },
      trx,
    );
    await queueInvitationMail(trx, { token, name: o.name, email: o.email, role: o.role, vesselIds: o.vesselIds, expiresAt, inviterName: actor.name });
    return { kind: "issued" as const, invitationId, token, expiresAt };
  });
}

/** Re-issues an open invitation by id with a fresh token and a new week. */
export async function reissueInvitation(actor: Actor, invitationId: number, db: Knex = defaultDb) {
  const inv = await db("invitations")
    .where({ id: invitationId })
    .first<{ name: string; email: string; role: Role; vessel_ids: unknown; used_at: Date | null } | undefined>("name", "email", "role", "vessel_ids", "used_at");
  if (!inv) return { kind: "not_found" as const };
  if (inv.used_at) return { kind: "used" as const };
  const person = { name: inv.name, email: inv.email, role: inv.role, vesselIds: parseVesselIds(inv.vessel_ids) };
  const result = await issueInvitation(actor, { ...person, force: true }, db);
  return { ...result, person };
}

export async function revokeInvitation(actor: Actor, invitationId: number, db: Knex = defaultDb): Promise<boolean> {
  return inTransaction(db, async (trx) => {
    const n = await trx("invitations").where({ id: invitationId }).whereNull("used_at").whereNull("revoked_at").update({ revoked_at: new Date() });
    if (n) await writeAudit({ actor, action: "invitation.revoke", entityType: "invitation", entityId: invitationId }, trx);
    return n > 0;
  });
}

export type AcceptResult =
  | { ok: true; userId: string; email: string }
  | { ok: false; reason: InvitationStatus | "unknown" | "has_account" };

/**
 * Turns a valid invitation into a better-auth user with a credential account, its role
 * and its vessels, in one transaction. The invitation row is locked and marked used in
 * that transaction, so a link works exactly once even when submitted twice.
 */
export async function acceptInvitation(token: string, password: string, db: Knex = defaultDb): Promise<AcceptResult> {
  const passwordHash = await hashPassword(password); // slow on purpose: before taking any lock
  return inTransaction(db, async (trx) => {
    const inv = await trx("invitations")
      .where({ token_hash: hashInvitationToken(token) })
      .forUpdate()
      .first<
        | { id: number; name: string; email: string; role: string; vessel_ids: unknown; expires_at: Date; used_at: Date | null; revoked_at: Date | null }
        | undefined
      >("id", "name", "email", "role", "vessel_ids", "expires_at", "used_at", "revoked_at");
    if (!inv) return { ok: false as const, reason: "unknown" as const };
    const status = invitationStatus(inv);
    if (status !== "valid") return { ok: false as const, reason: status };
    if (await trx("user").whereRaw("LOWER(email) = ?", [inv.email.toLowerCase()]).first("id")) {
      return { ok: false as const, reason: "has_account" as const };
    }
    const userId = randomUUID();
    const now = new Date();
    await trx("user").insert({
      id: userId,
      name: inv.name,
      email: inv.email,
      emailVerified: true, // the link reached this address
      role: inv.role,
      banned: false,
      createdAt: now,
      updatedAt: now,
    });
    await trx("account").insert({
      id: randomUUID(),
      accountId: userId,
      providerId: "credential",
      userId,
      password: passwordHash,
      createdAt: now,
      updatedAt: now,
    });
    const wanted = parseVesselIds(inv.vessel_ids);
    // Vessels removed since the invitation was sent are skipped, not an error.
    const vessels = wanted.length ? await trx("vessels").whereIn("id", wanted).select<{ id: number }[]>("id") : [];
    if (vessels.length) await trx("user_vessels").insert(vessels.map((v) => ({ user_id: userId, vessel_id: v.id })));
    await trx("invitations").where({ id: inv.id }).update({ used_at: now });
    await writeAudit(
      { actor: { id: userId, name: inv.name }, action: "invitation.accept", entityType: "user", entityId: userId, detail: { invitationId: inv.id, role: inv.role } },
      trx,
    );
    return { ok: true as const, userId, email: inv.email };
  });
}

/**
 * Notes that the invitee asked for a new invitation (also the once-an-hour guard) and queues
 * the request to each of `recipients`, in one transaction.
 */
export async function recordReissueRequest(
  invitation: { id: number; name: string; email: string; status: "expired" | "revoked" },
  recipients: { id: string; name: string; email: string }[],
  db: Knex = defaultDb,
): Promise<void> {
  await inTransaction(db, async (trx) => {
    for (const to of recipients) {
      await queueReissueRequestMail(trx, { to, inviteeName: invitation.name, inviteeEmail: invitation.email, reason: invitation.status });
    }
    await writeAudit({ actor: null, action: "invitation.reissue_requested", entityType: "invitation", entityId: invitation.id, detail: { email: invitation.email } }, trx);
  });
}
