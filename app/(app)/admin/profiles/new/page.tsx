import type { Metadata } from "next";
import Link from "next/link";
import { ProfileForm } from "@/components/admin/profile-form";
import { PageHeader } from "@/components/ui/card";
import { EMPTY_PROFILE } from "@/lib/admin/schemas";
import { requirePermission } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Add engine profile" };

export default async function NewProfilePage() {
  await requirePermission("admin.profiles");
  return (
    <>
      <PageHeader eyebrow={<Link href="/admin/profiles" className="hover:underline">Engine profiles</Link>} title="Add engine profile" />
      <ProfileForm initial={EMPTY_PROFILE} />
    </>
  );
}
