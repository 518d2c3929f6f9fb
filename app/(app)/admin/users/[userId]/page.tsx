import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { ActivationButton } from "@/components/admin/activation-button";
import { UserAccessForm } from "@/components/admin/user-access-form";
import { Card, PageHeader } from "@/components/ui/card";
import { getUserForAdmin, listVesselOptions } from "@/lib/admin/queries";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { requirePermission } from "@/lib/auth/session";

export const metadata: Metadata = { title: "User" };

export default async function AdminUserPage({ params }: { params: Promise<{ userId: string }> }) {
  const me = await requirePermission("admin.users");
  const { userId } = await params;
  const [user, vessels] = await Promise.all([getUserForAdmin(userId), listVesselOptions()]);
  if (!user) notFound();
  return (
    <>
      <PageHeader eyebrow={<Link href="/admin/users" className="hover:underline">Users</Link>} title={user.name}>
        <span className="text-sm text-ink-soft">{user.email}</span>
      </PageHeader>
      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <Card className="p-5">
          <h2 className="mb-4 text-lg font-semibold">Role and vessels</h2>
          <UserAccessForm userId={user.id} role={user.role} vesselIds={user.vessels.map((v) => v.id)} vessels={vessels} />
        </Card>
        <Card className="h-fit p-5">
          <h2 className="text-lg font-semibold">Account</h2>
          <dl className="mt-3 space-y-2 text-sm">
            <div className="flex justify-between gap-3"><dt className="text-ink-faint">Status</dt><dd>{user.active ? "Active" : "⊘ Deactivated"}</dd></div>
            <div className="flex justify-between gap-3"><dt className="text-ink-faint">Role</dt><dd>{user.role ? ROLE_LABELS[user.role] : "none"}</dd></div>
            <div className="flex justify-between gap-3"><dt className="text-ink-faint">Since</dt><dd className="num">{user.createdAt.slice(0, 10)}</dd></div>
            <div className="flex justify-between gap-3"><dt className="text-ink-faint">Last active</dt><dd className="num">{user.lastActiveAt?.slice(0, 10) ?? "never"}</dd></div>
          </dl>
          <p className="mt-4 text-xs text-ink-faint">
            Deactivating ends every open session at once; their records stay. Reactivating lets them sign in again with their password.
          </p>
          <div className="mt-3">
            {user.id === me.id ? <p className="text-sm text-ink-soft">This is your own account.</p> : <ActivationButton userId={user.id} name={user.name} active={user.active} size="md" />}
          </div>
        </Card>
      </div>
    </>
  );
}
