"use server";

import { revalidatePath } from "next/cache";
import { ActionError, actor, ruledAction } from "@/lib/auth/actions";
import { issueInvitation, reissueInvitation, revokeInvitation } from "@/lib/invitations/mutations";
import { updateCompanySettings } from "@/lib/company/settings";
import { companySettingsSchema } from "@/lib/company/schemas";
import { createEngine, deactivateUser, reactivateUser, saveProfile, saveVessel, setUserAccess } from "./mutations";
import {
  engineSchema,
  invitationIdSchema,
  inviteUserSchema,
  profileSchema,
  updateUserAccessSchema,
  userIdSchema,
  vesselSchema,
} from "./schemas";

// Every action's permission comes from ACTION_RULES (lib/auth/route-rules.ts) by its name.

export const inviteUserAction = ruledAction("inviteUserAction", inviteUserSchema, async (input, ctx) => {
  const me = actor(ctx);
  const result = await issueInvitation(me, input);
  if (result.kind === "has_account") {
    throw new ActionError("This address already has an account.", { email: ["This address already has an account; find it in the users table."] });
  }
  revalidatePath("/admin/users");
  if (result.kind === "duplicate") return { message: `The invitation to ${input.email} was sent a moment ago.` };
  // Queued with the invitation; the notifications page shows it if the mail server refuses it.
  return { message: `Invitation sent to ${input.email}.`, data: { invitationId: result.invitationId } };
});

export const resendInvitationAction = ruledAction("resendInvitationAction", invitationIdSchema, async ({ invitationId }, ctx) => {
  const me = actor(ctx);
  const result = await reissueInvitation(me, invitationId);
  if (result.kind === "not_found") throw new ActionError("That invitation no longer exists.", {}, "not_found");
  if (result.kind === "used") throw new ActionError("That invitation has been used: the person has an account.");
  if (result.kind === "has_account") throw new ActionError("This address already has an account.");
  revalidatePath("/admin/users");
  if (result.kind === "duplicate") return { message: "Sent a moment ago." };
  return { message: `A new invitation went to ${result.person.email}.` };
});

export const revokeInvitationAction = ruledAction("revokeInvitationAction", invitationIdSchema, async ({ invitationId }, ctx) => {
  const done = await revokeInvitation(actor(ctx), invitationId);
  revalidatePath("/admin/users");
  return { message: done ? "Invitation withdrawn; its link no longer works." : "That invitation was already closed." };
});

export const updateUserAccessAction = ruledAction("updateUserAccessAction", updateUserAccessSchema, async (input, ctx) => {
  await setUserAccess(actor(ctx), input);
  revalidatePath("/admin/users");
  return { message: "Role and vessels saved. They apply from the person's next click." };
});

export const deactivateUserAction = ruledAction("deactivateUserAction", userIdSchema, async ({ userId, reason }, ctx) => {
  await deactivateUser(actor(ctx), userId, reason ?? null);
  revalidatePath("/admin/users");
  return { message: "Deactivated. Their open sessions have ended." };
});

export const reactivateUserAction = ruledAction("reactivateUserAction", userIdSchema, async ({ userId }, ctx) => {
  await reactivateUser(actor(ctx), userId);
  revalidatePath("/admin/users");
  return { message: "Reactivated. They can sign in again." };
});

export const saveVesselAction = ruledAction("saveVesselAction", vesselSchema, async (input, ctx) => {
  const id = await saveVessel(actor(ctx), input);
  revalidatePath("/admin/vessels");
  revalidatePath("/fleet");
  return { message: input.vesselId ? "Vessel saved." : "Vessel added.", data: { vesselId: id } };
});

export const createEngineAction = ruledAction("createEngineAction", engineSchema, async (input, ctx) => {
  const id = await createEngine(actor(ctx), input);
  revalidatePath("/admin/engines");
  revalidatePath("/fleet");
  return { message: `Engine added with ${input.cylinderCount} cylinder units.`, data: { engineId: id } };
});

export const saveProfileAction = ruledAction("saveProfileAction", profileSchema, async (input, ctx) => {
  const id = await saveProfile(actor(ctx), input);
  revalidatePath("/admin/profiles");
  return { message: input.profileId ? "Profile saved." : "Profile added.", data: { profileId: id } };
});

export const saveCompanySettingsAction = ruledAction("saveCompanySettingsAction", companySettingsSchema, async (input, ctx) => {
  const saved = await updateCompanySettings(actor(ctx), input);
  revalidatePath("/admin/companies");
  return { message: `Settings of ${saved.companyName} saved.` };
});
