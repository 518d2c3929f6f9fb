import type { Metadata } from "next";
import Link from "next/link";
import { InvitationsList } from "@/components/admin/invitations-list";
import { UsersTable } from "@/components/admin/users-table";
import { buttonClass } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/card";
import { listOpenInvitations, listUsersForAdmin, listVesselOptions } from "@/lib/admin/queries";
import { requirePermission } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Users" };

export default async function AdminUsersPage() {
  const me = await requirePermission("admin.users");
  const [users, invitations, vessels] = await Promise.all([listUsersForAdmin(), listOpenInvitations(), listVesselOptions()]);
  const vesselName = new Map(vessels.map((v) => [v.id, v.name]));
  return (
    <>
      <PageHeader eyebrow="Administration" title="Users">
        <Link href="/admin/users/invite" className={buttonClass("primary")}>Invite a person</Link>
      </PageHeader>
      <UsersTable
        currentUserId={me.id}
        users={users.map((u) => ({ id: u.id, name: u.name, email: u.email, role: u.role, active: u.active, vessels: u.vessels, lastActiveAt: u.lastActiveAt }))}
      />
      <h2 className="mb-3 mt-8 text-lg font-semibold">Invitations not yet accepted</h2>
      <InvitationsList
        invitations={invitations.map((i) => ({
          id: i.id,
          name: i.name,
          email: i.email,
          role: i.role,
          vesselNames: i.vesselIds.map((id) => vesselName.get(id)).filter((n): n is string => !!n),
          status: i.status,
          expiresAt: i.expiresAt,
          invitedByName: i.invitedByName,
        }))}
      />
    </>
  );
}
