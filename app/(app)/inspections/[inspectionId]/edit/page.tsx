import type { Metadata } from "next";
import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { InspectionEditor } from "@/components/inspections/inspection-editor";
import { DiscardDraft } from "@/components/inspections/workflow-actions";
import { PageHeader } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import { requireRecordInScope } from "@/lib/auth/record-scope";
import { requirePermission } from "@/lib/auth/session";
import { day } from "@/lib/format";
import { getInspectionForUser } from "@/lib/inspections/queries";
import { STATE_LABELS } from "@/lib/inspections/schemas";

export const metadata: Metadata = { title: "Gauging sheet" };

export default async function EditInspectionPage({
  params,
  searchParams,
}: {
  params: Promise<{ inspectionId: string }>;
  searchParams: Promise<{ opened?: string }>;
}) {
  const user = await requirePermission("inspection.editDraft");
  const id = await requireRecordInScope("inspection", (await params).inspectionId);
  const found = await getInspectionForUser(user, id);
  if (!found) notFound();
  const { inspection, context: ctx } = found;
  // Only drafts are edited; a submitted or approved record is read (and amended) on its own page.
  if (inspection.state !== "draft" && inspection.state !== "returned") redirect(`/inspections/${id}`);
  const openedExisting = (await searchParams).opened === "existing";
  return (
    <div className="entry-screen">
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
      {openedExisting ? (
        <p role="status" className="mb-4 rounded-md border-2 border-ink bg-paper-raised p-3">
          Cylinder {ctx.unit.cylinderNo} already had an open draft
          {inspection.createdBy ? `, started by ${inspection.createdBy.name}` : ""}, dated {day(inspection.draft.header.inspectedOn)}. It opened here instead of a
          second one; if it was opened by mistake, its author can discard it at the foot of this page.
        </p>
      ) : null}
      <InspectionEditor initial={inspection} ctx={ctx} canSubmit={can(user.role, "inspection.submit")} />
      {inspection.state === "draft" && inspection.createdBy?.id === user.id ? (
        <section aria-labelledby="discard-heading" className="no-print mt-10 border-t border-ink-line pt-4">
          <h2 id="discard-heading" className="text-lg font-semibold">
            Opened by mistake?
          </h2>
          <p className="mb-3 text-ink-soft">You opened this draft, so you can discard it while it has not been submitted.</p>
          <DiscardDraft inspectionId={id} />
        </section>
      ) : null}
    </div>
  );
}
