import type { Metadata } from "next";
import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { NewInspectionForm } from "@/components/inspections/new-inspection-form";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { requirePermission } from "@/lib/auth/session";
import { day, hours } from "@/lib/format";
import { getNewInspectionContext, listOpenInspections, listUnitsToInspect } from "@/lib/inspections/queries";
import { STATE_LABELS } from "@/lib/inspections/schemas";
import { parseRecordId } from "@/lib/validation/ids";

export const metadata: Metadata = { title: "New inspection" };

export default async function NewInspectionPage({ searchParams }: { searchParams: Promise<{ unit?: string; discarded?: string }> }) {
  const user = await requirePermission("inspection.create");
  const { unit, discarded } = await searchParams;
  const today = new Date().toISOString().slice(0, 10);

  if (!unit) {
    const units = await listUnitsToInspect(user);
    const byEngine = new Map<number, typeof units>();
    for (const u of units) byEngine.set(u.engineId, [...(byEngine.get(u.engineId) ?? []), u]);
    return (
      <>
        <PageHeader title="New inspection" eyebrow="Choose the unit you are overhauling" />
        {discarded ? (
          <p role="status" className="mb-4 rounded-md border-2 border-ink bg-paper-raised p-3">
            The draft was discarded. Choose the unit you are overhauling.
          </p>
        ) : null}
        {units.length === 0 ? <Card className="p-5 text-ink-soft">No units on your vessels.</Card> : null}
        <div className="space-y-6">
          {[...byEngine.values()].map((list) => (
            <section key={list[0].engineId}>
              <h2 className="mb-2 text-lg font-semibold">
                {list[0].vesselName} · main engine <span className="font-mono text-base">{list[0].engineSerial}</span>
              </h2>
              <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6">
                {list.map((u) => (
                  <li key={u.id}>
                    <Link href={`/inspections/new?unit=${u.id}`} className="block min-h-12 rounded-md border border-ink-line bg-paper-raised p-3 hover:border-signal">
                      <span className="block font-semibold">Cylinder {u.cylinderNo}</span>
                      <span className="block text-sm text-ink-soft">last gauged {day(u.lastInspectedOn)}</span>
                      {u.nextOverhaulEngineHours ? (
                        <span className="block text-sm text-ink-soft">
                          next overhaul at <span className="num">{hours(u.nextOverhaulEngineHours)} engine h</span>
                        </span>
                      ) : null}
                    </Link>
                  </li>
                ))}
              </ul>
            </section>
          ))}
        </div>
      </>
    );
  }

  const unitId = parseRecordId(unit);
  const ctx = unitId === null ? null : await getNewInspectionContext(user, unitId, today);
  if (!ctx) notFound();
  const open = await listOpenInspections(ctx.unit.id);
  // One open draft per unit: it opens instead of a form for a second one (the server holds to that too).
  const draft = open.find((o) => (o.state === "draft" || o.state === "returned") && o.supersedesId === null);
  if (draft) redirect(`/inspections/${draft.id}/edit?opened=existing`);

  return (
    <>
      <PageHeader
        eyebrow={
          <>
            <Link href={`/vessels/${ctx.unit.vesselId}`} className="hover:underline">{ctx.unit.vesselName}</Link> /{" "}
            <Link href={`/units/${ctx.unit.id}`} className="hover:underline">Cylinder {ctx.unit.cylinderNo}</Link>
          </>
        }
        title={`New inspection · cylinder ${ctx.unit.cylinderNo}`}
      />
      {open.length ? (
        <Card className="mb-6 p-4">
          <h2 className="font-semibold">Open records of this unit</h2>
          <ul className="mt-2 space-y-2">
            {open.map((o) => (
              <li key={o.id} className="flex flex-wrap items-center justify-between gap-2">
                <span>
                  {day(o.inspectedOn)} · {STATE_LABELS[o.state]}
                  {o.version > 1 ? ` · amendment v${o.version}` : ""}
                </span>
                <Link href={o.state === "submitted" ? `/inspections/${o.id}` : `/inspections/${o.id}/edit`} className={buttonClass("secondary")}>
                  {o.state === "submitted" ? "View" : "Continue"}
                </Link>
              </li>
            ))}
          </ul>
        </Card>
      ) : null}
      <Card className="p-4 sm:p-6">
        <p className="mb-5 text-sm text-ink-soft">
          {ctx.profile.name} · bore <span className="num">{ctx.profile.boreMm.toFixed(2)} mm</span> · {ctx.profile.stations.length} stations × 2 directions ·{" "}
          {ctx.profile.rings.length} rings. The gauging sheet opens next and saves as you type, on this device too when there is no network.
        </p>
        <NewInspectionForm ctx={ctx} today={today} />
      </Card>
    </>
  );
}
