import type { Metadata } from "next";
import Link from "next/link";
import { DeleteEntryButton, ScheduleForm } from "@/components/outlook/schedule-form";
import { Card, PageHeader } from "@/components/ui/card";
import { DataTable } from "@/components/wear/data-table";
import { can } from "@/lib/auth/permissions";
import { requirePermission } from "@/lib/auth/session";
import { listFleet } from "@/lib/fleet/queries";
import { day } from "@/lib/format";
import { getSchedule } from "@/lib/outlook/queries";

export const metadata: Metadata = { title: "Ship schedules" };

export default async function SchedulePage() {
  const user = await requirePermission("fleet.read");
  const vessels = await listFleet(user);
  const schedule = await getSchedule(vessels.map((v) => v.id));
  const canEdit = can(user.role, "schedule.write");
  return (
    <>
      <PageHeader eyebrow={<Link href="/outlook" className="hover:underline">Renewal outlook</Link>} title="Ship schedules" />
      <p className="mb-4 max-w-3xl text-sm text-ink-soft">
        Port stays and dockings ahead, the opportunities a renewal can be planned into. {canEdit ? "You keep them; the ships' chiefs see them." : "The superintendent keeps them."}
      </p>
      {vessels.map((v) => {
        const mine = schedule.filter((s) => s.vesselId === v.id);
        return (
          <Card key={v.id} className="mb-4 p-3 sm:p-4" data-testid="vessel-schedule">
            <h2 className="mb-2 text-lg font-semibold">{v.name}</h2>
            <DataTable
              caption={`Schedule of ${v.name}`}
              dense
              rows={mine}
              rowKey={(s) => s.id}
              columns={[
                { key: "when", header: "Days", rowHeader: true, numeric: true, cell: (s) => `${day(s.startsOn)} – ${day(s.endsOn)}` },
                { key: "kind", header: "Kind", cell: (s) => (s.kind === "docking" ? "Docking" : "Port stay") },
                { key: "place", header: "Port or yard", cell: (s) => s.place },
                ...(canEdit ? [{ key: "x", header: "Remove", cell: (s: (typeof mine)[number]) => <DeleteEntryButton vesselId={v.id} entryId={s.id} label={`${s.kind === "docking" ? "docking" : "port stay"} at ${s.place} on ${s.startsOn}`} /> }] : []),
              ]}
            />
            {mine.length === 0 ? <p className="mt-2 text-sm text-ink-soft">Nothing planned.</p> : null}
            {canEdit ? (
              <div className="no-print mt-3">
                <ScheduleForm vesselId={v.id} vesselName={v.name} />
              </div>
            ) : null}
          </Card>
        );
      })}
    </>
  );
}
