import "server-only";
import { ROLE_LABELS, type Role } from "@/lib/auth/roles";
import { serverEnv } from "@/lib/env";
import { day } from "@/lib/format";
import { invitationEmail, invitationRequestEmail } from "@/lib/mail/templates";
import { sendMail } from "@/lib/mail/transport";
import { listVesselNames } from "./queries";

export function invitationUrl(token: string): string {
  return new URL(`/invite/${encodeURIComponent(token)}`, serverEnv.APP_URL).href;
}

/** Sends the invitation e-mail; false (and a log line) when the mail server refused it. */
export async function sendInvitationMail(o: {
  token: string;
  name: string;
  email: string;
  role: Role;
  vesselIds: number[];
  expiresAt: Date;
  inviterName: string;
}): Promise<boolean> {
  try {
    const vesselNames = await listVesselNames(o.vesselIds);
    await sendMail({
      to: o.email,
      ...invitationEmail({
        name: o.name,
        inviterName: o.inviterName,
        roleLabel: ROLE_LABELS[o.role],
        vesselNames,
        url: invitationUrl(o.token),
        expiresOn: day(o.expiresAt.toISOString()),
      }),
    });
    return true;
  } catch (err) {
    console.error("invitation e-mail not sent", err);
    return false;
  }
}

export async function sendReissueRequestMail(o: {
  to: { name: string; email: string };
  inviteeName: string;
  inviteeEmail: string;
  reason: "expired" | "revoked";
}): Promise<void> {
  await sendMail({
    to: o.to.email,
    ...invitationRequestEmail({
      inviterName: o.to.name,
      inviteeName: o.inviteeName,
      inviteeEmail: o.inviteeEmail,
      reason: o.reason,
      url: new URL("/admin/users", serverEnv.APP_URL).href,
    }),
  });
}
