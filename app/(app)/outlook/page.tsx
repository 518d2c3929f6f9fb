import type { Metadata } from "next";
import Link from "next/link";
import { OutlookTable } from "@/components/outlook/outlook-table";
import { PrintButton } from "@/components/outlook/print-button";
import { TimelineChart } from "@/components/outlook/timeline-chart";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { Label, Select } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { ShortfallTable } from "@/components/outlook/shortfall-table";
import { DataTable } from "@/components/wear/data-table";
import { can } from "@/lib/auth/permissions";
import { requirePermission } from "@/lib/auth/session";
import { day, grouped, hours } from "@/lib/format";
import { currenciesOf } from "@/lib/outlook/currency";
import { RECOMMENDATION_LABELS } from "@/lib/outlook/numbers";
import { filterOutlook, parseOutlookQuery } from "@/lib/outlook/present";
import { getOutlook, todayIso } from "@/lib/outlook/queries";
import { PART_LABELS, PLAN_STATE_LABELS, type StockOption } from "@/lib/outlook/types";
import { describeIssues } from "@/lib/validation/issues";
import { BAND_LABELS } from "@/lib/wear/bands";

export const metadata: Metadata = { title: "Renewal outlook" };

const HORIZONS = [3, 6, 12, 24, 36, 60];

export default async function OutlookPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePermission("fleet.read");
  const parsed = parseOutlookQuery(await searchParams);
  const q = parsed.success ? parsed.data : {};
  const refusal = parsed.success ? null : describeIssues(parsed.error).message;
  const today = todayIso();
  const horizonMonths = q.horizon ?? 12;
  const bundle = await getOutlook(user, { horizonMonths, today });
  const rows = filterOutlook(bundle.rows, q, today);
  const vessels = [...new Map(bundle.rows.map((r) => [r.vesselId, r.vesselName])).entries()];
  const inVessel = <T extends { vesselId: number | null }>(list: T[]) => (q.vessel === undefined ? list : list.filter((x) => x.vesselId === null || x.vesselId === q.vessel));
  const currencies = await currenciesOf(bundle.rows.map((r) => r.companyId));
  const currency = currencies.size === 1 ? [...currencies.values()][0] : "";
  const stock: StockOption[] = bundle.stock.map((s) => ({ id: s.id, profileId: s.profileId, part: s.part, vesselId: s.vesselId, vesselName: s.vesselName, onHand: s.onHand, onOrder: s.onOrder }));
  const profileName = new Map(bundle.stock.map((s) => [s.profileId, s.profileName]));
  for (const r of bundle.rows) profileName.set(r.profileId, r.profileName);
  const query = new URLSearchParams(Object.entries({ ...q, format: undefined }).filter(([, v]) => v !== undefined).map(([k, v]) => [k, String(v)]));
  const csvHref = `/api/outlook?${new URLSearchParams([...query.entries(), ["format", "csv"]]).toString()}`;
  const byVessel = vessels.filter(([id]) => rows.some((r) => r.vesselId === id));
  const budget = inVessel(bundle.budget);

  return (
    <>
      <PageHeader eyebrow="Renewal planning" title="Renewal outlook">
        <a href={csvHref} className={buttonClass("secondary")} download data-testid="csv-link">
          Download CSV
        </a>
        <PrintButton />
        <Link href="/outlook/schedule" className={buttonClass("quiet")}>Ship schedules</Link>
        <Link href="/outlook/spares" className={buttonClass("quiet")}>Spares</Link>
      </PageHeader>

      <p className="mb-4 max-w-3xl text-sm text-ink-soft">
        For each unit: the projected day at the wear limit with its 95 % interval, the chance the liner is over its limit by each of the next two
        piston overhauls (Student t prediction from the wear trend), the next opportunity and what to do. A liner is run on while that chance stays
        under 5 %. These figures order the work; the engine maker&apos;s limits and manual govern it.
      </p>

      <form method="get" className="no-print mb-4 grid grid-cols-2 gap-3 sm:grid-cols-4 lg:grid-cols-5" aria-label="Filter the outlook">
        <div>
          <Label htmlFor="f-vessel">Vessel</Label>
          <Select id="f-vessel" name="vessel" defaultValue={q.vessel ?? ""}>
            <option value="">All vessels</option>
            {vessels.map(([id, name]) => (
              <option key={id} value={id}>{name}</option>
            ))}
          </Select>
        </div>
        <div>
          <Label htmlFor="f-status">Status</Label>
          <Select id="f-status" name="status" defaultValue={q.status ?? ""}>
            <option value="">Any status</option>
            {Object.entries(BAND_LABELS).map(([k, label]) => (
              <option key={k} value={k}>{label}</option>
            ))}
          </Select>
        </div>
        <div>
          <Label htmlFor="f-horizon">Due within</Label>
          <Select id="f-horizon" name="horizon" defaultValue={q.horizon ?? ""}>
            <option value="">Any time</option>
            {HORIZONS.map((m) => (
              <option key={m} value={m}>{m} months</option>
            ))}
          </Select>
        </div>
        <div>
          <Label htmlFor="f-rec">Recommendation</Label>
          <Select id="f-rec" name="recommendation" defaultValue={q.recommendation ?? ""}>
            <option value="">Any</option>
            {Object.entries(RECOMMENDATION_LABELS).map(([k, label]) => (
              <option key={k} value={k}>{label}</option>
            ))}
          </Select>
        </div>
        <div className="col-span-2 flex items-end gap-2 sm:col-span-4 lg:col-span-1">
          <button type="submit" className={buttonClass("primary")}>Show</button>
          <Link href="/outlook" className={buttonClass("quiet")}>Clear</Link>
        </div>
      </form>
      {refusal ? <FormMessage ok={false} message={`${refusal} The filters were left out.`} className="mb-4" /> : null}

      <p className="mb-2 text-sm text-ink-soft" data-testid="outlook-count">
        {rows.length} of {bundle.rows.length} units{q.horizon ? `, due by ${day(bundle.until)}` : ""}. Spares and budget over the next {horizonMonths} months, to {day(bundle.until)}.
      </p>
      <OutlookTable rows={rows} today={today} canPlan={can(user.role, "outlook.plan")} schedule={bundle.schedule} stock={stock} />

      <section className="mt-8 grid gap-6 lg:grid-cols-2 [&>*]:min-w-0">
        <div>
          <h2 className="mb-2 text-lg font-semibold">Spares short within {horizonMonths} months</h2>
          <ShortfallTable lines={bundle.shortfall} profileName={profileName} testId="shortfall-table" />
          <p className="mt-1 text-xs text-ink-faint">Renewals planned or recommended within the horizon take a spare from their ship, then the company store, then an order due by the day; the order-by day is the first day short less the lead time.</p>
        </div>
        <div>
          <h2 className="mb-2 text-lg font-semibold">Budget by year and vessel{currency ? ` (${currency})` : ""}</h2>
          <DataTable
            testId="budget-table"
            caption="Renewal cost per year and vessel"
            dense
            rows={budget}
            rowKey={(b) => `${b.year}-${b.vesselId}`}
            columns={[
              { key: "year", header: "Year", rowHeader: true, numeric: true, cell: (b) => b.year },
              { key: "vessel", header: "Vessel", cell: (b) => b.vesselName },
              { key: "n", header: "Renewals", align: "right", numeric: true, cell: (b) => b.renewals },
              { key: "total", header: `Cost${currency ? ` ${currency}` : ""}`, align: "right", numeric: true, cell: (b) => <>{grouped(b.total)}{b.unpriced ? <span className="block text-xs text-caution">{b.unpriced} without a price</span> : null}</> },
            ]}
          />
          <p className="mt-1 text-xs text-ink-faint">Each renewal costs its spare&apos;s unit cost and the job cost kept with the stock line. Total {grouped(budget.reduce((s, b) => s + b.total, 0))} {currency}.</p>
        </div>
      </section>

      <section className="mt-8">
        <h2 className="mb-2 text-lg font-semibold">Timeline by ship</h2>
        {byVessel.map(([id, name]) => {
          const shipRows = rows.filter((r) => r.vesselId === id);
          return (
            <Card key={id} className="mb-4 p-3 sm:p-4" data-testid="timeline">
              <h3 className="mb-2 font-semibold">{name}</h3>
              <TimelineChart vesselName={name} rows={shipRows} schedule={bundle.schedule.filter((s) => s.vesselId === id)} today={today} until={bundle.until} />
              <details className="mt-3 print:open" open>
                <summary className="min-h-11 cursor-pointer py-2 text-sm font-medium text-signal">The timeline as a table</summary>
                <DataTable
                  caption={`Timeline of ${name}`}
                  dense
                  rows={shipRows}
                  rowKey={(r) => r.unitId}
                  columns={[
                    { key: "cyl", header: "Cyl.", rowHeader: true, numeric: true, cell: (r) => r.cylinderNo },
                    { key: "limit", header: "Limit (95 %)", numeric: true, cell: (r) => (r.limitOn ? <>{day(r.limitOn)}<span className="block text-xs text-ink-faint">{r.limitOnEarliest ? day(r.limitOnEarliest) : "open"} – {r.limitOnLatest ? day(r.limitOnLatest) : "open"}</span></> : "no projection") },
                    { key: "oh", header: "Overhauls", numeric: true, cell: (r) => r.overhauls.map((o) => (o.date ? day(o.date) : `${hours(o.engineHours)} h`)).join(", ") || "–" },
                    { key: "plans", header: "Plans", hideBelow: "sm", cell: (r) => r.plans.map((p) => `${PLAN_STATE_LABELS[p.state]} ${p.part === "liner" ? "liner" : "ring set"} ${day(p.plannedOn)}${p.missed ? " (passed)" : ""}`).join("; ") || "–" },
                  ]}
                />
                <p className="mt-2 text-xs text-ink-faint">
                  Port stays and dockings: {bundle.schedule.filter((s) => s.vesselId === id && s.startsOn <= bundle.until).map((s) => `${s.kind === "docking" ? "docking" : "port stay"} at ${s.place} ${day(s.startsOn)}–${day(s.endsOn)}`).join("; ") || "none planned"}.
                </p>
              </details>
            </Card>
          );
        })}
      </section>
    </>
  );
}
