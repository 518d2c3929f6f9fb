"use server";

import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { ActionError, ruledAction } from "@/lib/auth/actions";
import { auth } from "@/lib/auth/auth";
import { acceptInvitation, recordReissueRequest } from "./mutations";
import { getInvitationByToken, hasRecentReissueRequest, listActiveAdminContacts } from "./queries";
import { acceptInvitationSchema, requestNewInvitationSchema } from "./schemas";

const REFUSALS = {
  unknown: "This invitation link is not known. Open it again from the e-mail, or ask your administrator.",
  expired: "This invitation has expired. Ask for a new one below.",
  revoked: "This invitation was withdrawn. Ask for a new one below.",
  used: "This invitation has already been used. Sign in with your password, or reset it.",
  has_account: "An account for this address already exists. Sign in, or reset your password.",
  valid: "",
} as const;

// Public: the token in the link is the credential. Creates the account, signs in, goes home.
export const acceptInvitationAction = ruledAction("acceptInvitationAction", acceptInvitationSchema, async ({ token, password }) => {
  const result = await acceptInvitation(token, password);
  if (!result.ok) throw new ActionError(REFUSALS[result.reason], {}, "conflict");
  try {
    // nextCookies() puts the new session cookie on this response.
    await auth.api.signInEmail({ body: { email: result.email, password }, headers: await headers() });
  } catch {
    // The account exists either way; signing in by hand still works.
    redirect("/sign-in");
  }
  redirect("/");
});

// Public: tells the inviter (or, if they are gone, the admins) that the invitee needs a new link.
export const requestNewInvitationAction = ruledAction("requestNewInvitationAction", requestNewInvitationSchema, async ({ token }) => {
  const inv = await getInvitationByToken(token);
  if (!inv) throw new ActionError(REFUSALS.unknown, {}, "not_found");
  if (inv.status === "valid") return { message: "This invitation still works: choose your password above." };
  if (inv.status === "used") throw new ActionError(REFUSALS.used);
  const done = { message: "Your administrator has been asked to send you a new invitation. It will arrive by e-mail." };
  if (await hasRecentReissueRequest(inv.id)) return done;
  const recipients = inv.inviter ? [inv.inviter] : (await listActiveAdminContacts()).slice(0, 3);
  await recordReissueRequest({ id: inv.id, name: inv.name, email: inv.email, status: inv.status }, recipients);
  return done;
});
