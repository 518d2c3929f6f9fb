import type { Metadata } from "next";
import Link from "next/link";
import { VesselForm } from "@/components/admin/vessel-form";
import { PageHeader } from "@/components/ui/card";
import { listCompanies } from "@/lib/admin/queries";
import { requirePermission } from "@/lib/auth/session";

export const metadata: Metadata = { title: "Add vessel" };

export default async function NewVesselPage() {
  await requirePermission("admin.fleet");
  const companies = await listCompanies();
  return (
    <>
      <PageHeader eyebrow={<Link href="/admin/vessels" className="hover:underline">Vessels</Link>} title="Add vessel" />
      <VesselForm companies={companies} />
    </>
  );
}
