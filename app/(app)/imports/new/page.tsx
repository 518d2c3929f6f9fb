import type { Metadata } from "next";
import Link from "next/link";
import { ImportWizard, type WizardStart } from "@/components/imports/import-wizard";
import { Card, PageHeader } from "@/components/ui/card";
import { canSeeVessel } from "@/lib/auth/scope";
import { requirePermission } from "@/lib/auth/session";
import { getImportDto, listImportTargets, listSavedMappings } from "@/lib/imports/queries";
import { parseRecordId } from "@/lib/validation/ids";

export const metadata: Metadata = { title: "Import readings" };

export default async function NewImportPage({ searchParams }: { searchParams: Promise<{ unit?: string; inspection?: string; engine?: string; vessel?: string; history?: string; again?: string }> }) {
  const user = await requirePermission("import.create");
  const q = await searchParams;
  const targets = await listImportTargets(user);
  const saved = Object.fromEntries(await Promise.all(targets.map(async (v) => [v.id, await listSavedMappings(v.id)] as const)));
  const start: WizardStart = { destination: q.history ? "history" : "draft" };
  const unitId = parseRecordId(q.unit);
  const engineId = parseRecordId(q.engine);
  const vesselId = parseRecordId(q.vessel);
  for (const v of targets) {
    for (const e of v.engines) {
      if (e.id === engineId) Object.assign(start, { vesselId: v.id, engineId: e.id });
      const u = e.units.find((x) => x.id === unitId);
      if (u) Object.assign(start, { vesselId: v.id, engineId: e.id, unitId: u.id, inspectionId: parseRecordId(q.inspection) ?? undefined });
    }
    if (v.id === vesselId && !start.vesselId) start.vesselId = v.id;
  }
  // Mapping an uploaded file again, from its preview: only the importer's own, on their vessels.
  const againId = parseRecordId(q.again);
  const again = againId ? await getImportDto(againId) : null;
  if (again && again.createdBy.id === user.id && canSeeVessel(user, again.vesselId) && again.status === "previewed" && again.preview) {
    const nd = (again.options as unknown as { newDraft?: { inspectedOn: string; engineHours: number } }).newDraft ?? null;
    Object.assign(start, {
      destination: again.destination,
      vesselId: again.vesselId,
      engineId: again.engineId ?? undefined,
      unitId: again.unitId ?? undefined,
      inspectionId: again.inspectionId ?? undefined,
      again: {
        fileId: again.fileId,
        fileName: again.fileName,
        mapping: again.mapping,
        options: { delimiter: again.options.delimiter, decimalMark: again.options.decimalMark, hasHeader: again.options.hasHeader, lengthUnit: again.options.lengthUnit },
        header: again.preview.header,
        sample: again.preview.sampleRows.map((r) => r.cells),
        columnCount: Math.max(again.preview.header?.length ?? 0, ...again.preview.sampleRows.map((r) => r.cells.length)),
        excludedLines: again.excludedLines,
        replacesImportId: again.replacesId,
        newDraft: nd,
      },
    });
  }
  return (
    <>
      <PageHeader eyebrow={<Link href="/imports">Imports</Link>} title="Import readings from a file" />
      {targets.length === 0 ? (
        <Card className="p-5 text-ink-soft">No vessels are assigned to you.</Card>
      ) : (
        <ImportWizard targets={targets} saved={saved} start={start} />
      )}
    </>
  );
}
