"use client";

import Link from "next/link";
import { Fragment, useMemo, useState } from "react";
import { createColumnHelper, flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { BandBadge } from "@/components/wear/band-badge";
import { buttonClass } from "@/components/ui/button";
import { day, hours } from "@/lib/format";
import type { OutlookRow, ScheduleEntry, StockOption } from "@/lib/outlook/types";
import { PLAN_STATE_LABELS } from "@/lib/outlook/types";
import { probabilityText, RECOMMENDATION_LABELS } from "@/lib/outlook/numbers";
import { cn } from "@/lib/utils";
import { PlanForm } from "./plan-form";

const BAND_ORDER = { over_limit: 0, renew_before_next: 1, watch: 2, unknown: 3, steady: 4 } as const;
const REC_ORDER = { renew_now: 0, renew_at: 1, run_on: 2 } as const;
const chance = (r: OutlookRow, i: number) => {
  const e = r.exceed[i];
  return e && e.kind === "probability" ? e.p : -1;
};

const col = createColumnHelper<OutlookRow>();

/**
 * Every unit of the outlook, one row each, sortable by any column (TanStack Table). Figures that
 * do not fit a phone move under the unit's name. The superintendent opens a plan from a row.
 */
export function OutlookTable({ rows, today, canPlan, schedule, stock }: { rows: OutlookRow[]; today: string; canPlan: boolean; schedule: ScheduleEntry[]; stock: StockOption[] }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "recommendation", desc: false }]);
  const [planning, setPlanning] = useState<number | null>(null);
  const columns = useMemo(
    () => [
      col.accessor((r) => `${r.vesselName} ${String(r.cylinderNo).padStart(2, "0")}`, {
        id: "unit",
        header: "Unit",
        cell: ({ row: { original: r } }) => (
          <div className="min-w-0">
            <Link href={`/units/${r.unitId}`} className="inline-flex min-h-11 items-center font-medium text-signal hover:underline">
              {r.vesselName} · cyl. {r.cylinderNo}
            </Link>
            <div className="text-xs text-ink-faint">{r.engineSerial}{r.linerSerial ? ` · liner ${r.linerSerial}` : ""}</div>
            <div className="mt-1 space-y-0.5 text-xs text-ink-soft md:hidden">
              <div>Limit {r.limitOn ? day(r.limitOn) : "–"} · by overhaul 1: {r.exceed[0] ? probabilityText(r.exceed[0]) : "not enough data"}</div>
              <div>Next: {r.nextOpportunity ? `${r.nextOpportunity.label}, ${day(r.nextOpportunity.date)}` : "–"}</div>
            </div>
          </div>
        ),
      }),
      col.accessor((r) => BAND_ORDER[r.band], { id: "status", header: "Status", cell: ({ row: { original: r } }) => <BandBadge band={r.band} /> }),
      col.accessor((r) => r.linerHours ?? -1, { id: "linerHours", header: "Liner h", cell: ({ row: { original: r } }) => <span className="num">{hours(r.linerHours)}</span>, meta: { right: true, hide: "md" } }),
      col.accessor((r) => r.limitOn ?? "9999", {
        id: "limitOn",
        header: "Limit (95 %)",
        meta: { hide: "md" },
        cell: ({ row: { original: r } }) =>
          r.limitOn ? (
            <span className="num">
              {day(r.limitOn)}
              <span className="block text-xs text-ink-faint">
                {r.limitOnEarliest ? day(r.limitOnEarliest) : "open"} – {r.limitOnLatest ? day(r.limitOnLatest) : "open"}
              </span>
            </span>
          ) : (
            <span className="text-ink-faint">no projection</span>
          ),
      }),
      col.accessor((r) => chance(r, 0), {
        id: "p1",
        header: "Over by OH 1",
        meta: { right: true, hide: "md" },
        cell: ({ row: { original: r } }) => <Chance r={r} i={0} />,
      }),
      col.accessor((r) => chance(r, 1), {
        id: "p2",
        header: "Over by OH 2",
        meta: { right: true, hide: "md" },
        cell: ({ row: { original: r } }) => <Chance r={r} i={1} />,
      }),
      col.accessor((r) => r.nextOpportunity?.date ?? "9999", {
        id: "next",
        header: "Next opportunity",
        meta: { hide: "md" },
        cell: ({ row: { original: r } }) => (r.nextOpportunity ? <span>{r.nextOpportunity.label}<span className="num block text-xs text-ink-faint">{day(r.nextOpportunity.date)}</span></span> : "–"),
      }),
      col.accessor((r) => REC_ORDER[r.recommendation.kind] * 1e5 + (r.recommendation.opportunity ? Number(r.recommendation.opportunity.date.replaceAll("-", "")) % 1e5 : 0), {
        id: "recommendation",
        header: "Recommendation",
        cell: ({ row: { original: r } }) => (
          <span className="block max-w-72">
            <span className={cn("font-semibold", r.recommendation.kind === "renew_now" ? "text-limit" : r.recommendation.kind === "renew_at" ? "text-caution" : "text-steady")}>
              {RECOMMENDATION_LABELS[r.recommendation.kind]}
              {r.recommendation.opportunity ? ` ${r.recommendation.opportunity.label}` : ""}
            </span>
            <span className="block text-xs text-ink-soft">{r.recommendation.text}</span>
            {r.ringsDue ? <span className="block text-xs font-medium text-caution">Ring set due at the next overhaul.</span> : null}
          </span>
        ),
      }),
      col.accessor((r) => r.plans.map((p) => p.plannedOn).sort()[0] ?? "9999", {
        id: "plan",
        header: "Plan",
        cell: ({ row: { original: r } }) => (
          <div className="space-y-1">
            {r.plans.map((p) => (
              <div key={p.id} className="text-xs" data-testid="plan-state">
                <span className="font-semibold">{PLAN_STATE_LABELS[p.state]}</span> {p.part === "liner" ? "liner" : "ring set"}, <span className="num">{day(p.plannedOn)}</span>
                {p.missed ? <span className="block font-semibold text-limit">Opportunity passed</span> : null}
              </div>
            ))}
            {canPlan ? (
              <button type="button" className={buttonClass("secondary")} aria-expanded={planning === r.unitId} onClick={() => setPlanning(planning === r.unitId ? null : r.unitId)}>
                {planning === r.unitId ? "Close" : "Plan"}
                <span className="sr-only"> renewal for {r.vesselName} cylinder {r.cylinderNo}</span>
              </button>
            ) : null}
          </div>
        ),
      }),
    ],
    [canPlan, planning],
  );
  const table = useReactTable({ data: rows, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  const hideClass = (meta: unknown) => ((meta as { hide?: string } | undefined)?.hide === "md" ? "hidden md:table-cell" : "");
  const right = (meta: unknown) => ((meta as { right?: boolean } | undefined)?.right ? "text-right" : "");

  return (
    // Positioned, so the screen-reader-only labels inside the scrolled table are clipped with it.
    <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised print:overflow-visible" data-testid="outlook-table">
      <table className="w-full text-sm">
        <caption className="sr-only">Renewal outlook, one row per cylinder unit; column headers sort the table</caption>
        <thead className="bg-paper-sunk text-left text-xs tracking-wide text-ink-soft uppercase">
          {table.getHeaderGroups().map((g) => (
            <tr key={g.id}>
              {g.headers.map((h) => {
                const sorted = h.column.getIsSorted();
                return (
                  <th key={h.id} scope="col" aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"} className={cn("px-2 py-1 sm:px-3", hideClass(h.column.columnDef.meta), right(h.column.columnDef.meta))}>
                    <button type="button" onClick={h.column.getToggleSortingHandler()} className="inline-flex min-h-11 items-center gap-1 uppercase print:min-h-0">
                      {flexRender(h.column.columnDef.header, h.getContext())}
                      <span aria-hidden className="print:hidden">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                    </button>
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody className="divide-y divide-ink-line/70">
          {table.getRowModel().rows.map((row) => (
            <Fragment key={row.id}>
              <tr data-testid="outlook-row" data-unit={row.original.unitId} className="align-top print:break-inside-avoid">
                {row.getVisibleCells().map((c) => (
                  <td key={c.id} className={cn("px-2 py-2 sm:px-3", hideClass(c.column.columnDef.meta), right(c.column.columnDef.meta))}>
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </td>
                ))}
              </tr>
              {planning === row.original.unitId ? (
                <tr className="print:hidden">
                  <td colSpan={row.getVisibleCells().length} className="bg-paper-sunk px-2 py-3 sm:px-3">
                    <PlanForm row={row.original} today={today} schedule={schedule.filter((s) => s.vesselId === row.original.vesselId)} stock={stock.filter((s) => s.profileId === row.original.profileId && (s.vesselId === null || s.vesselId === row.original.vesselId))} onDone={() => setPlanning(null)} />
                  </td>
                </tr>
              ) : null}
            </Fragment>
          ))}
        </tbody>
      </table>
      {rows.length === 0 ? <p className="p-4 text-sm text-ink-soft">No unit matches these filters.</p> : null}
    </div>
  );
}

function Chance({ r, i }: { r: OutlookRow; i: number }) {
  const e = r.exceed[i];
  const o = r.overhauls[i];
  if (!e || e.kind !== "probability") return <span className="text-ink-faint">not enough data</span>;
  return (
    <span className={cn("num", e.p >= 0.05 && "font-semibold text-limit")} title={e.kind === "probability" ? `Student t, ${e.df} degrees of freedom` : undefined}>
      {probabilityText(e)}
      {o?.date ? <span className="block text-xs font-normal text-ink-faint">{day(o.date)}</span> : null}
    </span>
  );
}
