import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { VesselForm } from "@/components/admin/vessel-form";
import { PageHeader } from "@/components/ui/card";
import { getVesselForEdit, listCompanies } from "@/lib/admin/queries";
import { requirePermission } from "@/lib/auth/session";
import { parseRecordId } from "@/lib/validation/ids";

export const metadata: Metadata = { title: "Edit vessel" };

export default async function EditVesselPage({ params }: { params: Promise<{ vesselId: string }> }) {
  await requirePermission("admin.fleet");
  const { vesselId } = await params;
  const id = parseRecordId(vesselId);
  const [vessel, companies] = await Promise.all([id === null ? null : getVesselForEdit(id), listCompanies()]);
  if (!vessel) notFound();
  return (
    <>
      <PageHeader eyebrow={<Link href="/admin/vessels" className="hover:underline">Vessels</Link>} title={vessel.name}>
        <Link href={`/vessels/${vessel.id}`} className="text-sm font-medium text-signal hover:underline">Open in fleet →</Link>
      </PageHeader>
      <VesselForm
        companies={companies}
        initial={{
          vesselId: vessel.id,
          name: vessel.name,
          imoNumber: vessel.imoNumber,
          companyId: String(vessel.companyId),
          newCompanyName: "",
          vesselType: vessel.vesselType ?? "",
          flag: vessel.flag ?? "",
          builtYear: vessel.builtYear ?? "",
        }}
      />
    </>
  );
}
