import "server-only";
import type { Knex } from "knex";
import { ROLE_LABELS, type Role } from "@/lib/auth/roles";
import { serverEnv } from "@/lib/env";
import { day } from "@/lib/format";
import { queueMail } from "@/lib/mail/outbox";
import { invitationEmail, invitationRequestEmail } from "@/lib/mail/templates";

/*
 * Invitation mail goes through the outbox, queued in the transaction that issues the
 * invitation: the link in the mail is the one the database keeps, the mail is sent even when
 * the mail server is down at that moment (later, with retries), and nobody waits for it.
 */

export function invitationUrl(token: string): string {
  return new URL(`/invite/${encodeURIComponent(token)}`, serverEnv.APP_URL).href;
}

/** Queues the invitation e-mail in the issuing transaction. */
export async function queueInvitationMail(
  trx: Knex.Transaction,
  o: { token: string; name: string; email: string; role: Role; vesselIds: number[]; expiresAt: Date; inviterName: string },
): Promise<void> {
  const vesselNames = o.vesselIds.length ? ((await trx("vessels").whereIn("id", o.vesselIds).orderBy("name").pluck("name")) as string[]) : [];
  const content = invitationEmail({
    name: o.name,
    inviterName: o.inviterName,
    roleLabel: ROLE_LABELS[o.role],
    vesselNames,
    url: invitationUrl(o.token),
    expiresOn: day(o.expiresAt.toISOString()),
  });
  await queueMail({ to: o.email, kind: "invitation", linkPath: "/invite", ...content }, trx);
}

/** Queues the "please invite me again" e-mail to the inviter (or an admin). */
export async function queueReissueRequestMail(
  trx: Knex.Transaction,
  o: { to: { id: string; name: string; email: string }; inviteeName: string; inviteeEmail: string; reason: "expired" | "revoked" },
): Promise<void> {
  const content = invitationRequestEmail({
    inviterName: o.to.name,
    inviteeName: o.inviteeName,
    inviteeEmail: o.inviteeEmail,
    reason: o.reason,
    url: new URL("/admin/users", serverEnv.APP_URL).href,
  });
  await queueMail({ to: o.to.email, userId: o.to.id, kind: "invitation_request", linkPath: "/admin/users", ...content }, trx);
}
