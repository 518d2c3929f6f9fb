import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { ProfileChart } from "@/components/charts/profile-chart";
import { TrendChart } from "@/components/charts/trend-chart";
import { BandBadge, BandIcon } from "@/components/wear/band-badge";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader, Stat } from "@/components/ui/card";
import { ProjectionText } from "@/components/wear/projection-text";
import { DataTable } from "@/components/wear/data-table";
import { WearTable } from "@/components/wear/wear-table";
import { RingHistory, UnitPlans } from "@/components/outlook/unit-outlook";
import { getUnitAnalysis } from "@/lib/analysis/queries";
import { getRingHistory } from "@/lib/outlook/ring-history";
import { getUnitPlans } from "@/lib/outlook/queries";
import { can } from "@/lib/auth/permissions";
import { requireRecordInScope } from "@/lib/auth/record-scope";
import { requirePermission } from "@/lib/auth/session";
import { day, fixed, hours, hoursText, mm, rate, spread } from "@/lib/format";

export const metadata: Metadata = { title: "Unit history" };

const STATE_LABELS: Record<string, string> = {
  draft: "Draft",
  submitted: "Awaiting approval",
  returned: "Returned for correction",
  approved: "Approved",
  superseded: "Superseded by amendment",
};

export default async function UnitPage({ params }: { params: Promise<{ unitId: string }> }) {
  const user = await requirePermission("fleet.read");
  const { unitId } = await params;
  const data = await getUnitAnalysis(user, await requireRecordInScope("unit", unitId));
  if (!data) notFound();
  const [plans, ringHistory] = await Promise.all([getUnitPlans(data.context.id), getRingHistory(data.context.id)]);
  const { context: ctx, summary, profile } = data;
  const currentLiner = data.liners.find((l) => !l.removedOn) ?? null;
  const latestSeries = data.latest;
  const stationLabel = (key: string | null) => profile.stations.find((s) => s.key === key)?.label ?? key ?? "–";
  const axisLabel = (key: string) => profile.axes.find((a) => a.key === key)?.label.toLowerCase() ?? key;
  const wearProjection = summary.wear.kind === "projected" ? summary.wear : null;
  const excludedMax = data.points.filter((p) => p.maxWearExcluded);
  const pointOf = new Map(data.points.map((p) => [p.inspectionId, p]));
  const ringSpec = (position: number) => profile.rings.find((s) => s.position === position);
  const ringRows = data.rings?.rings ?? [];

  return (
    <>
      <PageHeader
        eyebrow={
          <>
            <Link href="/fleet" className="hover:underline">Fleet</Link> /{" "}
            <Link href={`/vessels/${ctx.vesselId}`} className="hover:underline">{ctx.vesselName}</Link> /{" "}
            <Link href={`/engines/${ctx.engineId}`} className="hover:underline">Main engine</Link>
          </>
        }
        title={`Cylinder ${ctx.cylinderNo}`}
      >
        <BandBadge band={summary.band.band} className="text-base" />
        {can(user.role, "inspection.create") ? (
          <Link href={`/inspections/new?unit=${ctx.id}`} className={buttonClass("primary", "lg")}>New inspection</Link>
        ) : null}
        {can(user.role, "import.create") ? (
          <Link href={`/imports/new?unit=${ctx.id}`} className={buttonClass("secondary", "lg")}>Import a gauge file</Link>
        ) : null}
      </PageHeader>

      {summary.band.reasons.length ? (
        <ul className="mb-6 space-y-1 text-sm text-ink-soft">
          {summary.band.reasons.map((r) => (
            <li key={r}>• {r}</li>
          ))}
        </ul>
      ) : null}

      <Card className="mb-6 grid grid-cols-2 gap-x-4 gap-y-5 p-4 md:grid-cols-3 xl:grid-cols-7">
        <Stat label="Liner" value={<span className="font-mono text-base">{currentLiner?.serial ?? "–"}</span>} hint={currentLiner ? `fitted ${day(currentLiner.installedOn)}` : undefined} />
        <Stat label="Liner hours" value={hours(summary.linerHours)} unit="h" hint={summary.lastInspectedOn ? `at last gauging, ${day(summary.lastInspectedOn)}` : "not gauged yet"} />
        <Stat
          label="Next overhaul"
          value={hours(summary.nextOverhaulEngineHours)}
          unit="h"
          hint={summary.lastEngineHours != null ? `engine hours; last overhaul at ${hoursText(summary.lastEngineHours)}` : "engine hours, as planned"}
        />
        <Stat label="Max wear" value={fixed(summary.maxWearMm)} unit="mm" hint={`limit ${fixed(profile.linerWearLimitMm)} mm · at ${stationLabel(summary.maxWearStation)}`} />
        <Stat label="Max ovality" value={fixed(summary.maxOvalityMm)} unit="mm" hint={`limit ${fixed(profile.ovalityLimitMm)} mm`} />
        <Stat
          label="Wear rate (trend)"
          value={summary.trend ? rate(summary.trend.slopeMmPer1000h) : "–"}
          unit="mm/1000 h"
          hint={
            summary.trend
              ? `± ${spread(summary.trend.slopeSdMmPer1000h, 3)} (1 s.d.) · R² ${fixed(summary.trend.rSquared, 3)} · ${summary.trend.n} points`
              : "needs readings past running-in"
          }
        />
        <Stat label="Last interval" value={rate(summary.lastIntervalRate)} unit="mm/1000 h" />
      </Card>

      <section className="mb-6 grid gap-6 lg:grid-cols-2 [&>*]:min-w-0">
        <Card className="p-4">
          <h2 className="font-semibold">Wear trend</h2>
          <p className="mb-2 text-sm text-ink-soft">
            <ProjectionText what="Wear" projection={summary.wear} limitMm={profile.linerWearLimitMm} />
          </p>
          <TrendChart
            label="Maximum wear"
            points={data.points.map((p) => ({ linerHours: p.linerHours, valueMm: p.maxWearMm, steady: p.steady, outlier: p.wearOutlier, date: p.date, maxExcluded: p.maxWearExcluded }))}
            fit={data.fit}
            limitMm={profile.linerWearLimitMm}
            projection={wearProjection ? { atLinerHours: wearProjection.atLinerHours, lowerHours: wearProjection.lowerHours, upperHours: wearProjection.upperHours } : null}
            runningInHours={profile.runningInHours}
          />
          <p className="mt-2 text-xs text-ink-faint">
            Filled dots are fitted by least squares; hollow dots are running-in readings (before {hours(profile.runningInHours)} h), left out of
            the fit. The shaded band is the 95 % prediction interval; the bar on the limit line is the 95 % interval of the liner hours at which
            the limit is reached (inverse prediction, Draper &amp; Smith, <i>Applied Regression Analysis</i>).
          </p>
          {excludedMax.length ? (
            <ul className="mt-2 space-y-1 text-sm" data-testid="trend-excluded">
              {excludedMax.map((p) => (
                <li key={p.inspectionId}>
                  <span className="font-semibold text-limit">▢ {day(p.date)}:</span> the largest reading,{" "}
                  {p.excluded[0] ? `${mm(p.excluded[0].correctedMm)} at ${stationLabel(p.excluded[0].stationKey)} ${axisLabel(p.excluded[0].axisKey)}` : "one cell"}, was
                  judged impossible and left out; the point shows the next-largest, {mm(p.maxWearMm)}. Check that gauging.
                </li>
              ))}
            </ul>
          ) : null}
        </Card>
        <Card className="p-4">
          <h2 className="font-semibold">Liner profile</h2>
          <p className="mb-2 text-sm text-ink-soft">
            Wear at each station, larger of {profile.axes[0].label.toLowerCase()} and {profile.axes[1].label.toLowerCase()}, one line per inspection
            (newest darkest).
          </p>
          <ProfileChart
            limitMm={profile.linerWearLimitMm}
            series={data.profileSeries.map((s) => ({
              id: s.inspectionId,
              label: day(s.date),
              points: profile.stations
                .map((st) => {
                  const worst = s.stations.find((c) => c.stationKey === st.key);
                  return worst ? { depthMm: st.depthMm, wearMm: worst.wearMm } : null;
                })
                .filter((p): p is { depthMm: number; wearMm: number } => p !== null),
            }))}
          />
          <p className="mt-2 text-xs text-ink-faint">
            <ProjectionText what="Ovality" projection={summary.ovality} limitMm={profile.ovalityLimitMm} />
          </p>
        </Card>
      </section>

      {latestSeries ? (
        <section className="mb-6">
          <h2 className="mb-2 text-lg font-semibold">Latest gauging, {day(latestSeries.date)}</h2>
          <WearTable
            stations={profile.stations}
            axes={profile.axes}
            cells={latestSeries.cells}
            ovality={latestSeries.ovality}
            wearLimitMm={profile.linerWearLimitMm}
            ovalityLimitMm={profile.ovalityLimitMm}
            maxWearStationKey={summary.maxWearStation}
          />
          <p className="mt-1 text-xs text-ink-faint">
            All figures in mm. {profile.temperatureCorrection ? "Readings are referred to 20 °C (ISO 1) from the recorded gauge and liner temperatures." : "Temperature correction is off for this engine profile."}{" "}
            Wear is measured from the {profile.wearReference === "nominal" ? `nominal bore of ${fixed(profile.boreMm, 2)} mm` : "liner's as-fitted readings"}.
          </p>
        </section>
      ) : null}

      {data.rings ? (
        <section className="mb-6">
          <h2 className="mb-2 text-lg font-semibold">Piston rings at the last overhaul</h2>
          <DataTable
            testId="unit-rings"
            caption="Piston rings at the last overhaul"
            minWidthClass="sm:min-w-[640px]"
            rows={ringRows}
            rowKey={(r) => r.position}
            columns={[
              { key: "ring", header: "Ring", rowHeader: true, cell: (r) => (r.position === 1 ? "1 (top)" : r.position) },
              {
                key: "gap",
                header: "Closed gap",
                align: "right",
                numeric: true,
                cell: (r) => (
                  <>
                    {r.gap ? mm(r.gap.valueMm) : "–"}
                    {ringSpec(r.position) ? <span className="block text-xs text-ink-faint sm:hidden">limit {fixed(ringSpec(r.position)!.gapLimitMm)}</span> : null}
                  </>
                ),
              },
              { key: "gapLimit", header: "Gap limit", align: "right", numeric: true, hideBelow: "sm", className: "text-ink-faint", cell: (r) => mm(ringSpec(r.position)?.gapLimitMm) },
              {
                key: "groove",
                header: "Groove clearance",
                align: "right",
                numeric: true,
                cell: (r) => (
                  <>
                    {r.groove ? mm(r.groove.valueMm) : "–"}
                    {ringSpec(r.position) ? <span className="block text-xs text-ink-faint sm:hidden">limit {fixed(ringSpec(r.position)!.grooveLimitMm)}</span> : null}
                  </>
                ),
              },
              { key: "grooveLimit", header: "Groove limit", align: "right", numeric: true, hideBelow: "sm", className: "text-ink-faint", cell: (r) => mm(ringSpec(r.position)?.grooveLimitMm) },
              {
                key: "verdict",
                header: "Verdict",
                cell: (r) => (
                  <>
                    {r.overLimit ? (
                      <span className="inline-flex items-center gap-1 font-semibold text-limit"><BandIcon band="over_limit" /> Over limit — renew</span>
                    ) : r.renew ? (
                      <span className="inline-flex items-center gap-1 font-semibold text-caution"><BandIcon band="renew_before_next" /> Renew at this overhaul</span>
                    ) : (
                      <span className="inline-flex items-center gap-1 text-steady"><BandIcon band="steady" /> Runs on</span>
                    )}
                    {r.reasons.length ? <span className="block text-xs text-ink-faint">{r.reasons.join(" ")}</span> : null}
                  </>
                ),
              },
            ]}
          />
        </section>
      ) : null}

      <RingHistory history={ringHistory} specs={profile.rings} />
      <UnitPlans plans={plans} />

      <section className="grid gap-6 lg:grid-cols-3">
        <div className="min-w-0 lg:col-span-2">
          <h2 className="mb-2 text-lg font-semibold">Overhauls</h2>
          <DataTable
            testId="unit-overhauls"
            caption="Overhauls"
            minWidthClass="sm:min-w-[560px]"
            rows={data.inspections}
            rowKey={(i) => i.id}
            columns={[
              {
                key: "date",
                header: "Date",
                numeric: true,
                cell: (i) => <Link href={`/inspections/${i.id}`} className="inline-flex min-h-11 items-center font-medium text-signal hover:underline">{day(i.inspectedOn)}</Link>,
              },
              { key: "engine", header: "Engine hours", align: "right", numeric: true, hideBelow: "sm", cell: (i) => hoursText(i.engineHours) },
              { key: "liner", header: "Liner hours", align: "right", numeric: true, cell: (i) => hoursText(i.linerHours) },
              {
                key: "wear",
                header: "Max wear",
                align: "right",
                numeric: true,
                cell: (i) => {
                  const p = pointOf.get(String(i.id));
                  return p ? (
                    <>
                      {mm(p.maxWearMm)}
                      {p.maxWearExcluded ? <span className="block text-xs text-limit">largest reading left out</span> : null}
                    </>
                  ) : (
                    "–"
                  );
                },
              },
              {
                key: "state",
                header: "State",
                cell: (i) => (
                  <>
                    {STATE_LABELS[i.state] ?? i.state}
                    {i.version > 1 ? <span className="text-ink-faint"> · v{i.version}</span> : null}
                  </>
                ),
              },
            ]}
          />
        </div>
        <div>
          <h2 className="mb-2 text-lg font-semibold">Liners in this unit</h2>
          <ul className="space-y-2">
            {data.liners.map((l) => (
              <li key={l.id}>
                <Card className="p-3 text-sm">
                  <div className="font-mono">{l.serial}</div>
                  <div className="num text-ink-soft">
                    fitted {day(l.installedOn)} at {hoursText(l.installedEngineHours)} on the engine
                  </div>
                  {l.removedOn ? (
                    <div className="text-ink-soft">
                      {/* Only the date keeps to one line: a long reason wraps instead of widening the page. */}
                      <span className="num">removed {day(l.removedOn)}</span>
                      {l.removalReason ? ` — ${l.removalReason}` : ""}
                    </div>
                  ) : (
                    <div className="font-medium text-steady">in service</div>
                  )}
                </Card>
              </li>
            ))}
          </ul>
        </div>
      </section>
    </>
  );
}
