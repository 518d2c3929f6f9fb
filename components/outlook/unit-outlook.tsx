import { Card } from "@/components/ui/card";
import { DataTable } from "@/components/wear/data-table";
import { day, fixed } from "@/lib/format";
import type { RingHistoryPoint } from "@/lib/outlook/ring-history";
import { PLAN_STATE_LABELS, type PlanSummary } from "@/lib/outlook/types";
import { RingHistoryChart, type RingSeries } from "./ring-history-chart";

type RingSpec = { position: number; label?: string; gapLimitMm: number; grooveLimitMm: number };

/** The unit's renewal plans, open and past, as the chief and the superintendent see them. */
export function UnitPlans({ plans }: { plans: PlanSummary[] }) {
  return (
    <section className="mb-6" data-testid="unit-plans">
      <h2 className="mb-2 text-lg font-semibold">Renewal plans</h2>
      {plans.length ? (
        <ul className="space-y-2">
          {plans.map((p) => (
            <li key={p.id}>
              <Card className="p-3 text-sm">
                <span className="font-semibold">{PLAN_STATE_LABELS[p.state]}</span>: {p.part === "liner" ? "liner" : "ring set"} renewal on <span className="num">{day(p.plannedOn)}</span>
                {p.opportunity ? `, ${p.opportunity}` : ""}
                {p.missed ? <span className="block font-semibold text-limit">The day has passed without the inspection that records the renewal.</span> : null}
                {p.note ? <span className="block text-ink-soft">{p.note}</span> : null}
              </Card>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-sm text-ink-soft">No renewal planned for this unit.</p>
      )}
    </section>
  );
}

/** Closed gaps and groove clearances of every ring at every approved overhaul: two charts and the table they draw. */
export function RingHistory({ history, specs }: { history: RingHistoryPoint[]; specs: RingSpec[] }) {
  if (!history.length) return null;
  const positions = [...new Set(history.map((h) => h.position))].sort((a, b) => a - b);
  const spec = (p: number) => specs.find((s) => s.position === p);
  const series = (pick: (h: RingHistoryPoint) => number | null, limit: (s: RingSpec) => number): RingSeries[] =>
    positions
      .filter((p) => spec(p))
      .map((p) => ({
        position: p,
        label: p === 1 ? "Ring 1 (top)" : `Ring ${p}`,
        limitMm: limit(spec(p)!),
        points: history.filter((h) => h.position === p && pick(h) !== null).map((h) => ({ date: h.date, valueMm: pick(h)!, renewed: h.renewed })),
      }));
  const inspections = [...new Map(history.map((h) => [h.inspectionId, h.date])).entries()];
  const cell = (id: number, p: number) => history.find((h) => h.inspectionId === id && h.position === p);
  return (
    <section className="mb-6" data-testid="ring-history">
      <h2 className="mb-2 text-lg font-semibold">Ring gaps and groove clearances over time</h2>
      <div className="grid gap-6 lg:grid-cols-2 [&>*]:min-w-0">
        <Card className="p-4">
          <h3 className="font-semibold">Closed gap</h3>
          <RingHistoryChart title="Closed gap" series={series((h) => h.closedGapMm, (s) => s.gapLimitMm)} />
        </Card>
        <Card className="p-4">
          <h3 className="font-semibold">Groove clearance</h3>
          <RingHistoryChart title="Groove clearance" series={series((h) => h.grooveClearanceMm, (s) => s.grooveLimitMm)} />
        </Card>
      </div>
      <div className="mt-3">
        <DataTable
          testId="ring-history-table"
          caption="Closed gap and groove clearance of each ring at each overhaul, mm"
          dense
          rows={inspections}
          rowKey={([id]) => id}
          columns={[
            { key: "date", header: "Date", rowHeader: true, numeric: true, cell: ([, date]) => day(date) },
            ...positions.map((p) => ({
              key: `r${p}`,
              header: `Ring ${p} gap / groove`,
              align: "right" as const,
              numeric: true,
              cell: ([id]: [number, string]) => {
                const c = cell(id, p);
                return c ? (
                  <>
                    {fixed(c.closedGapMm)} / {fixed(c.grooveClearanceMm)}
                    {c.renewed ? <span className="block text-xs text-ink-faint">renewed</span> : null}
                    {c.gapMeasuredIn === "liner_worn" ? <span className="block text-xs text-ink-faint">gap read in worn liner</span> : null}
                  </>
                ) : (
                  "–"
                );
              },
            })),
          ]}
        />
        <p className="mt-1 text-xs text-ink-faint">All figures in mm as read; limits per ring from the engine profile.</p>
      </div>
    </section>
  );
}
