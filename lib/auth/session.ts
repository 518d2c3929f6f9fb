import "server-only";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { cache } from "react";
import { auth } from "./auth";
import { can, seesAllVessels, type Permission } from "./permissions";
import { getUserAccessRow, listAssignedVesselIds } from "./queries";
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
 * The signed-in user, re-read from the database on every request so a changed role
 * or a deactivation takes effect at once, not when the session cookie expires.
 */
export const getCurrentUser = cache(async (): Promise<CurrentUser | null> => {
  const session = await getSession();
  if (!session) return null;
  const row = await getUserAccessRow(session.user.id);
  if (!row || row.banned || !isRole(row.role)) return null;
  const vessels = seesAllVessels(row.role) ? "all" : await listAssignedVesselIds(row.id);
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
