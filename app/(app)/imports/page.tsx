import type { Metadata } from "next";
import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import { requirePermission } from "@/lib/auth/session";
import { listImportTargets, listImports } from "@/lib/imports/queries";
import { IMPORT_STATUS_LABELS } from "@/lib/imports/schemas";

export const metadata: Metadata = { title: "Imports" };

export default async function ImportsPage() {
  const user = await requirePermission("fleet.read");
  const [imports, vessels] = await Promise.all([listImports(user), listImportTargets(user)]);
  const waiting = imports.filter((i) => i.status === "committed" && i.destination === "history");
  return (
    <>
      <PageHeader title="Imports" eyebrow="Readings brought in from files: who imported what, when, into which records">
        {can(user.role, "import.create") ? (
          <Link href="/imports/new" className={buttonClass("primary")}>
            Import readings
          </Link>
        ) : null}
      </PageHeader>
      {waiting.length ? (
        <p className="mb-4 rounded-md border-2 border-ink bg-paper-raised p-3" role="status">
          {waiting.length} import{waiting.length === 1 ? "" : "s"} of past records wait{waiting.length === 1 ? "s" : ""} for approval by a chief engineer of the vessel or the superintendent.
        </p>
      ) : null}
      {imports.length === 0 ? <Card className="p-5 text-ink-soft">Nothing has been imported on your vessels yet.</Card> : null}
      <ul className="space-y-3">
        {imports.map((i) => (
          <li key={i.id}>
            <Card className="p-4">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <Link href={`/imports/${i.id}`} className="inline-flex min-h-11 items-center font-semibold text-signal hover:underline">
                  Import {i.id}: <span className="ml-1 break-all">{i.fileName}</span>
                </Link>
                <span className="text-sm font-medium">{IMPORT_STATUS_LABELS[i.status]}</span>
              </div>
              <p className="text-sm text-ink-soft">
                {i.vesselName} · {i.destination === "history" ? `past records of engine ${i.engineSerial}` : `gauge file into a draft of cylinder ${i.cylinderNo}`} · {i.createdBy.name},{" "}
                {new Date(i.committedAt ?? i.createdAt).toISOString().slice(0, 16).replace("T", " ")} UTC · <span className="num">{i.rowCount}</span> rows,{" "}
                <span className="num">{i.inspectionIds.length}</span> record{i.inspectionIds.length === 1 ? "" : "s"}
                {i.approvedBy ? ` · approved by ${i.approvedBy.name}` : ""}
              </p>
            </Card>
          </li>
        ))}
      </ul>
      {vessels.length ? (
        <p className="mt-6 flex flex-wrap gap-2 text-sm">
          {vessels.map((v) => (
            <a key={v.id} href={`/api/imports?vesselId=${v.id}&format=csv`} className={buttonClass("secondary")}>
              Import log of {v.name} (CSV)
            </a>
          ))}
        </p>
      ) : null}
    </>
  );
}
