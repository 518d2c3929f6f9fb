import type { Metadata } from "next";
import Link from "next/link";
import { InviteForm } from "@/components/admin/invite-form";
import { PageHeader } from "@/components/ui/card";
import { listVesselOptions } from "@/lib/admin/queries";
import { requirePermission } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Invite a person" };

export default async function InvitePage() {
  await requirePermission("admin.users");
  const vessels = await listVesselOptions();
  return (
    <>
      <PageHeader eyebrow={<Link href="/admin/users" className="hover:underline">Users</Link>} title="Invite a person" />
      <InviteForm vessels={vessels} />
    </>
  );
}
