import type { Metadata } from "next";
import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { InspectionEditor } from "@/components/inspections/inspection-editor";
import { PageHeader } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import { requireRecordInScope } from "@/lib/auth/record-scope";
import { requirePermission } from "@/lib/auth/session";
import { day } from "@/lib/format";
import { getInspectionForUser } from "@/lib/inspections/queries";
import { STATE_LABELS } from "@/lib/inspections/schemas";

export const metadata: Metadata = { title: "Gauging sheet" };

export default async function EditInspectionPage({ params }: { params: Promise<{ inspectionId: string }> }) {
  const user = await requirePermission("inspection.editDraft");
  const id = await requireRecordInScope("inspection", (await params).inspectionId);
  const found = await getInspectionForUser(user, id);
  if (!found) notFound();
  const { inspection, context: ctx } = found;
  // Only drafts are edited; a submitted or approved record is read (and amended) on its own page.
  if (inspection.state !== "draft" && inspection.state !== "returned") redirect(`/inspections/${id}`);
  return (
    <>
      <PageHeader
        eyebrow={
          <>
            <Link href={`/vessels/${ctx.unit.vesselId}`} className="hover:underline">{ctx.unit.vesselName}</Link> /{" "}
            <Link href={`/units/${ctx.unit.id}`} className="hover:underline">Cylinder {ctx.unit.cylinderNo}</Link> /{" "}
            <Link href={`/inspections/${id}`} className="hover:underline">Inspection {day(inspection.draft.header.inspectedOn)}</Link>
          </>
        }
        title={`Gauging sheet · cylinder ${ctx.unit.cylinderNo}`}
      >
        <span className="rounded border border-ink-line px-2 py-0.5 text-sm">
          {STATE_LABELS[inspection.state]}
          {inspection.version > 1 ? ` · v${inspection.version}` : ""}
        </span>
      </PageHeader>
      <InspectionEditor initial={inspection} ctx={ctx} canSubmit={can(user.role, "inspection.submit")} />
    </>
  );
}
