import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { ProfileForm } from "@/components/admin/profile-form";
import { PageHeader } from "@/components/ui/card";
import { getProfileForEdit } from "@/lib/admin/queries";
import { requirePermission } from "@/lib/auth/session";
import { parseRecordId } from "@/lib/validation/ids";

export const metadata: Metadata = { title: "Engine profile" };

export default async function EditProfilePage({ params }: { params: Promise<{ profileId: string }> }) {
  await requirePermission("admin.profiles");
  const { profileId } = await params;
  const id = parseRecordId(profileId);
  const profile = id === null ? null : await getProfileForEdit(id);
  if (!profile) notFound();
  return (
    <>
      <PageHeader eyebrow={<Link href="/admin/profiles" className="hover:underline">Engine profiles</Link>} title={String(profile.values.name)} />
      <ProfileForm initial={profile.values} stationsWithReadings={profile.stationsWithReadings} engineCount={profile.engineCount} />
    </>
  );
}
