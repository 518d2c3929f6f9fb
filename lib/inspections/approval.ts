import { can } from "@/lib/auth/permissions";
import type { Role } from "@/lib/auth/roles";

/*
 * The second pair of eyes, in one place: whoever entered an inspection (created the
 * record, or the amendment) or submitted it cannot approve it, a chief engineer included.
 * Then another chief engineer assigned to the vessel, or the superintendent, approves.
 * The approve mutation applies this inside its transaction; screens ask it to decide
 * whether to offer the button and what to say instead.
 */

export type ApprovalParties = { createdBy: string | null; submittedBy: string | null };

/** Why `user` may not approve a record with these parties, or null when they may. */
export function approvalRefusal(user: { id: string; role: Role }, parties: ApprovalParties): string | null {
  if (!can(user.role, "inspection.approve")) return "Your role does not approve inspection records.";
  const who = "Another chief engineer of the vessel or the superintendent approves it.";
  if (parties.createdBy === user.id) return `You entered this record, so someone else checks it. ${who}`;
  if (parties.submittedBy === user.id) return `You submitted this record, so someone else checks it. ${who}`;
  return null;
}
