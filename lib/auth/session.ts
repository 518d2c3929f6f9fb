import "server-only";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";
import { auth } from "./auth";
import { can, seesAllVessels, type Permission } from "./permissions";
import { getSessionAccessRow, listAssignedVesselIds } from "./queries";
import { isRole, type Role } from "./roles";

export type CurrentUser = {
  id: string;
  name: string;
  email: string;
  role: Role;
  /** "all" for roles that see the whole fleet, else the assigned vessel ids. */
  vessels: "all" | number[];
};

export const getSession = cache(async () => auth.api.getSession({ headers: await headers() }));

/**
 * The signed-in user, re-read from the database on every request (one query) so a changed role,
 * a deactivation or a revoked session (signed out elsewhere, password reset) takes effect at once
 * — not when the session cookie, or better-auth's cached copy of it, expires.
 */
export const getCurrentUser = cache(async (): Promise<CurrentUser | null> => {
  const session = await getSession();
  if (!session) return null;
  const row = await getSessionAccessRow(session.user.id, session.session.id);
  if (!row || !row.sessionLive || row.banned || !isRole(row.role)) return null;
  // GROUP_CONCAT stops at group_concat_max_len (1024 bytes by default): a list that long is read whole instead.
  const listed = row.vesselIds ?? "";
  const vessels = seesAllVessels(row.role) ? "all" : listed.length >= 1000 ? await listAssignedVesselIds(row.id) : listed.split(",").filter(Boolean).map(Number);
  return { id: row.id, name: row.name, email: row.email, role: row.role, vessels };
});

/** For pages: the user, or a redirect to sign-in. */
export async function requireUser(): Promise<CurrentUser> {
  const user = await getCurrentUser();
  if (!user) redirect("/sign-in");
  return user;
}

/** For pages: the user holding `permission`, or the no-access page. */
export async function requirePermission(permission: Permission): Promise<CurrentUser> {
  const user = await requireUser();
  if (!can(user.role, permission)) redirect(`/no-access?need=${encodeURIComponent(permission)}`);
  return user;
}
