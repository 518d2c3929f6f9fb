import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { ImportActions } from "@/components/imports/import-actions";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import { canSeeVessel } from "@/lib/auth/scope";
import { requirePermission } from "@/lib/auth/session";
import { fixed, hours, mm } from "@/lib/format";
import { approvalRefusal } from "@/lib/inspections/approval";
import { getImportDto } from "@/lib/imports/queries";
import { IMPORT_STATUS_LABELS } from "@/lib/imports/schemas";
import { parseRecordId } from "@/lib/validation/ids";

export const metadata: Metadata = { title: "Import" };

const stamp = (iso: string | null) => (iso ? `${iso.slice(0, 16).replace("T", " ")} UTC` : "");

export default async function ImportPage({ params }: { params: Promise<{ importId: string }> }) {
  const user = await requirePermission("fleet.read");
  const id = parseRecordId((await params).importId);
  const dto = id ? await getImportDto(id) : null;
  // A missing import and one on another vessel look the same.
  if (!dto || !canSeeVessel(user, dto.vesselId)) notFound();
  const p = dto.preview;
  const refusal = can(user.role, "inspection.approve") ? approvalRefusal(user, { createdBy: dto.createdBy.id, submittedBy: dto.createdBy.id }) : null;
  const errors = p?.issues.filter((i) => i.level === "error") ?? [];
  const warnings = p?.issues.filter((i) => i.level === "warning") ?? [];
  const newDraft = (dto.options as unknown as { newDraft?: unknown }).newDraft ?? null;
  return (
    <>
      <PageHeader
        eyebrow={
          <>
            <Link href="/imports">Imports</Link> / {dto.vesselName}
          </>
        }
        title={`Import ${dto.id}`}
      >
        <a href={`/api/imports/${dto.id}/file`} className={buttonClass("secondary")}>
          Download the file as imported
        </a>
      </PageHeader>
      <Card className="mb-6 p-4 sm:p-5">
        <p className="font-semibold">
          {IMPORT_STATUS_LABELS[dto.status]}
          {dto.status === "committed" && dto.destination === "history" ? ": waiting for approval by a chief engineer of the vessel or the superintendent (not the importer)" : ""}
        </p>
        <p className="mt-1 break-words text-sm text-ink-soft">
          File <span className="font-medium text-ink">{dto.fileName}</span> ({fixed(dto.sizeBytes / 1024, 1)} kB, SHA-256 <span className="font-mono break-all">{dto.sha256}</span>) ·{" "}
          {dto.destination === "history" ? `past records of engine ${dto.engineSerial}` : `gauge file into ${dto.inspectionId ? `draft ${dto.inspectionId}` : "a new draft"} of cylinder ${dto.cylinderNo}`} · by {dto.createdBy.name} {stamp(dto.committedAt ?? dto.createdAt)}
          {dto.approvedBy ? ` · approved by ${dto.approvedBy.name} ${stamp(dto.approvedAt)}` : ""}
          {dto.replacesId ? ` · replaces import ${dto.replacesId}` : ""}
          {dto.supersededById ? ` · replaced by import ${dto.supersededById}` : ""}
        </p>
        {p ? <p className="mt-2" role="status">{p.summary}{dto.excludedLines.length ? ` Left out: line${dto.excludedLines.length === 1 ? "" : "s"} ${dto.excludedLines.slice(0, 30).join(", ")}${dto.excludedLines.length > 30 ? ", …" : ""}.` : ""}</p> : null}
        {dto.inspectionIds.length ? (
          <p className="mt-2 text-sm">
            {dto.destination === "draft" ? (
              <Link href={`/inspections/${dto.inspectionIds[0]}/edit`} className="inline-flex min-h-11 items-center font-medium text-signal underline">Open the draft sheet</Link>
            ) : (
              <>
                Records:{" "}
                {dto.inspectionIds.slice(0, 12).map((r) => (
                  <Link key={r} href={`/inspections/${r}`} className="mr-1 inline-flex min-h-11 min-w-11 items-center justify-center text-signal underline">{r}</Link>
                ))}
                {dto.inspectionIds.length > 12 ? `and ${dto.inspectionIds.length - 12} more` : ""}
              </>
            )}
          </p>
        ) : null}
        <div className="mt-4">
          <ImportActions
            importId={dto.id}
            mayCommit={dto.createdBy.id === user.id && can(user.role, "import.create")}
            mayApprove={can(user.role, "inspection.approve") && refusal === null}
            approveRefusal={refusal}
            status={dto.status}
            destination={dto.destination}
            errorLines={p?.errorLines ?? []}
            warningCount={dto.warningCount}
            overwrites={p?.overwrites.length ?? 0}
            again={{ fileId: dto.fileId, vesselId: dto.vesselId, engineId: dto.engineId, unitId: dto.unitId, inspectionId: dto.inspectionId, newDraft, mapping: dto.mapping, options: dto.options, excludedLines: dto.excludedLines, replacesImportId: dto.replacesId }}
          />
          {dto.status === "previewed" && dto.createdBy.id === user.id ? (
            <Link href={`/imports/new?again=${dto.id}`} className={`${buttonClass("quiet")} mt-3`}>
              Change the column mapping
            </Link>
          ) : null}
        </div>
      </Card>

      {errors.length ? (
        <section className="mb-6" aria-labelledby="errors">
          <h2 id="errors" className="mb-2 text-lg font-semibold text-limit">Rows with errors ({dto.errorCount})</h2>
          <p className="mb-2 text-sm text-ink-soft">Nothing is imported while an error remains. Correct the file or the mapping, or leave these rows out.</p>
          <ul className="divide-y divide-ink-line rounded-md border border-ink-line bg-paper-raised">
            {errors.map((e, k) => (
              <li key={k} className="p-3 text-sm">
                <span className="font-semibold">Line {e.line}</span>
                {e.lines && e.lines.length > 1 ? <span className="text-ink-soft"> (and the {e.lines.length - 1} other rows of that gauging)</span> : null}: {e.message}
              </li>
            ))}
          </ul>
          {p && p.issuesLeftOut ? <p className="mt-1 text-sm text-ink-soft">…and {p.issuesLeftOut} more not listed.</p> : null}
        </section>
      ) : null}

      {warnings.length ? (
        <section className="mb-6" aria-labelledby="warnings">
          <h2 id="warnings" className="mb-2 text-lg font-semibold">Warnings to confirm ({dto.warningCount})</h2>
          <ul className="divide-y divide-ink-line rounded-md border border-ink-line bg-paper-raised">
            {warnings.map((e, k) => (
              <li key={k} className="p-3 text-sm">
                <span className="font-semibold">Line {e.line}</span>: {e.message}
              </li>
            ))}
          </ul>
        </section>
      ) : null}

      {p?.overwrites.length ? (
        <section className="mb-6" aria-labelledby="typed">
          <h2 id="typed" className="mb-2 text-lg font-semibold">Typed readings the file would change</h2>
          <ul className="divide-y divide-ink-line rounded-md border border-ink-line bg-paper-raised">
            {p.overwrites.map((o, k) => (
              <li key={k} className="p-3 text-sm">
                {o.what}: typed <span className="num">{o.typed}</span>, the file says <span className="num">{o.file}</span> (line {o.line})
              </li>
            ))}
          </ul>
        </section>
      ) : null}

      {p?.groups.length ? (
        <section className="mb-6" aria-labelledby="groups">
          <h2 id="groups" className="mb-2 text-lg font-semibold">Gaugings ({dto.groupCount})</h2>
          <div className="max-w-full overflow-x-auto rounded-md border border-ink-line bg-paper-raised">
            <table className="min-w-full text-sm">
              <thead>
                <tr className="text-left">
                  <th className="px-2 py-2">Cylinder</th>
                  <th className="px-2 py-2">Date</th>
                  <th className="px-2 py-2 text-right">Engine h</th>
                  <th className="px-2 py-2 text-right">Liner h</th>
                  <th className="px-2 py-2 text-right">Diameters</th>
                  <th className="px-2 py-2 text-right">Rings</th>
                  <th className="px-2 py-2 text-right">Max wear</th>
                  <th className="px-2 py-2">Lines</th>
                </tr>
              </thead>
              <tbody>
                {p.groups.slice(0, 200).map((g, k) => (
                  <tr key={k} className="border-t border-ink-line">
                    <td className="px-2 py-1">{g.cylinderNo}</td>
                    <td className="num whitespace-nowrap px-2 py-1">{g.inspectedOn}</td>
                    <td className="num px-2 py-1 text-right">{hours(g.engineHours)}</td>
                    <td className="num px-2 py-1 text-right">{hours(g.linerHours)}</td>
                    <td className="num px-2 py-1 text-right">{g.readings}</td>
                    <td className="num px-2 py-1 text-right">{g.rings}</td>
                    <td className="num whitespace-nowrap px-2 py-1 text-right">{mm(g.maxWearMm)}</td>
                    <td className="num whitespace-nowrap px-2 py-1">{g.firstLine}–{g.lastLine}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {p.groups.length > 200 || p.groupsLeftOut ? <p className="mt-1 text-sm text-ink-soft">The first 200 are shown.</p> : null}
        </section>
      ) : null}

      {p?.readings.length ? (
        <section aria-labelledby="readings">
          <h2 id="readings" className="mb-2 text-lg font-semibold">Readings with their wear</h2>
          <div className="max-w-full overflow-x-auto rounded-md border border-ink-line bg-paper-raised">
            <table className="min-w-full text-sm">
              <thead>
                <tr className="text-left">
                  <th className="px-2 py-2">Line</th>
                  <th className="px-2 py-2">Cyl.</th>
                  <th className="px-2 py-2">Date</th>
                  <th className="px-2 py-2">Station</th>
                  <th className="px-2 py-2">Direction</th>
                  <th className="px-2 py-2 text-right">Diameter</th>
                  <th className="px-2 py-2 text-right">Wear</th>
                </tr>
              </thead>
              <tbody>
                {p.readings.slice(0, 60).map((r) => (
                  <tr key={r.line} className="border-t border-ink-line">
                    <td className="num px-2 py-1">{r.line}</td>
                    <td className="px-2 py-1">{r.cylinderNo}</td>
                    <td className="num whitespace-nowrap px-2 py-1">{r.inspectedOn}</td>
                    <td className="px-2 py-1">{r.stationKey}</td>
                    <td className="px-2 py-1">{r.axisKey}</td>
                    <td className="num whitespace-nowrap px-2 py-1 text-right">{mm(r.diameterMm, 3)}</td>
                    <td className="num whitespace-nowrap px-2 py-1 text-right">{mm(r.wearMm)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </section>
      ) : null}
    </>
  );
}
