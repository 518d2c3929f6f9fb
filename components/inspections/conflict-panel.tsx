"use client";

import Link from "next/link";
import { Button } from "@/components/ui/button";
import { cellKey, type InspectionContext } from "@/lib/inspections/context";
import type { toDraft } from "@/lib/inspections/form";
import type { InspectionDto } from "@/lib/inspections/schemas";
import { formatFixed } from "@/lib/units/length";
import { formatRunningHours } from "@/lib/wear/calendar";
import type { SaveStatus } from "./use-draft-autosave";

/** The choice offered when the server's copy of the draft changed on another device. */
export function ConflictPanel({
  conflict,
  status,
  mine,
  ctx,
  inspectionId,
  resolveConflict,
}: {
  conflict: InspectionDto;
  status: SaveStatus;
  mine: ReturnType<typeof toDraft>["draft"];
  ctx: InspectionContext;
  inspectionId: number;
  resolveConflict: (choice: "mine" | "theirs") => void;
}) {
  const conflictEditable = conflict.state === "draft" || conflict.state === "returned";
  return (
    <section role="alert" className="rounded-lg border-2 border-caution bg-caution-tint p-4">
      <h2 className="font-semibold text-caution">⚠ This draft was changed elsewhere</h2>
      <p className="mt-1 text-sm">
        {status.kind === "conflict" ? status.message : null} The server&apos;s copy was saved{" "}
        {new Date(conflict.updatedAt).toLocaleString()}
        {conflict.state !== "draft" ? ` and is now “${conflict.state}”` : ""}. Your entries on this screen are kept on this device until you choose.
      </p>
      <ConflictDiff mine={mine} theirs={conflict} ctx={ctx} />
      <div className="mt-3 flex flex-wrap gap-2">
        {conflictEditable ? (
          <>
            <Button type="button" size="lg" onClick={() => resolveConflict("mine")}>
              Keep mine (save over the other copy)
            </Button>
            <Button type="button" size="lg" variant="secondary" onClick={() => resolveConflict("theirs")}>
              Take the other copy (discard mine)
            </Button>
          </>
        ) : (
          <Link href={`/inspections/${inspectionId}`} className="inline-flex min-h-12 items-center rounded-md border border-ink-line bg-paper-raised px-4 font-medium">
            Open the record as it is now
          </Link>
        )}
      </div>
    </section>
  );
}

/** Which readings differ between this device and the server's copy, so the choice is an informed one. */
function ConflictDiff({ mine, theirs, ctx }: { mine: ReturnType<typeof toDraft>["draft"]; theirs: InspectionDto; ctx: InspectionContext }) {
  const a = new Map(mine.readings.map((r) => [cellKey(r.stationKey, r.axisKey), r.diameterMm]));
  const b = new Map(theirs.draft.readings.map((r) => [cellKey(r.stationKey, r.axisKey), r.diameterMm]));
  const rows: { label: string; mine: string; theirs: string }[] = [];
  for (const s of ctx.profile.stations) {
    for (const ax of ctx.profile.axes) {
      const k = cellKey(s.key, ax.key);
      if (a.get(k) !== b.get(k)) {
        rows.push({ label: `${s.key} ${ax.label.toLowerCase()}`, mine: a.has(k) ? `${formatFixed(a.get(k)!, 3)} mm` : "—", theirs: b.has(k) ? `${formatFixed(b.get(k)!, 3)} mm` : "—" });
      }
    }
  }
  if (mine.header.engineHours !== theirs.draft.header.engineHours) {
    rows.unshift({ label: "Engine hours", mine: formatRunningHours(mine.header.engineHours), theirs: formatRunningHours(theirs.draft.header.engineHours) });
  }
  if (!rows.length) return <p className="mt-2 text-sm">The liner readings and engine hours are the same in both; other fields may differ.</p>;
  return (
    <div className="mt-2 overflow-x-auto">
      <table className="text-sm">
        <thead>
          <tr className="text-left text-ink-soft">
            <th className="py-1 pr-4 font-medium" scope="col">Reading</th>
            <th className="py-1 pr-4 text-right font-medium" scope="col">This device</th>
            <th className="py-1 text-right font-medium" scope="col">Other copy</th>
          </tr>
        </thead>
        <tbody>
          {rows.slice(0, 12).map((r) => (
            <tr key={r.label}>
              <th scope="row" className="py-0.5 pr-4 text-left font-normal">{r.label}</th>
              <td className="num py-0.5 pr-4 text-right">{r.mine}</td>
              <td className="num py-0.5 text-right">{r.theirs}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {rows.length > 12 ? <p className="text-sm">…and {rows.length - 12} more.</p> : null}
    </div>
  );
}
