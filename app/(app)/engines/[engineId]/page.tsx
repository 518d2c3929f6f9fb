import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { BandBadge, isBandKey } from "@/components/wear/band-badge";
import { Card, PageHeader, Stat } from "@/components/ui/card";
import { LogHoursForm } from "@/components/hours/log-hours-form";
import { TrendMultiples } from "@/components/outlook/trend-multiples";
import { getEngineTrends } from "@/lib/outlook/engine-trends";
import { can } from "@/lib/auth/permissions";
import { requireRecordInScope } from "@/lib/auth/record-scope";
import { requirePermission } from "@/lib/auth/session";
import { getEngine } from "@/lib/fleet/queries";
import { day, fixed, hours, monthYear, rate as wearRate } from "@/lib/format";
import { logRunningHoursAction } from "@/lib/hours/actions";
import { listRecentHours } from "@/lib/hours/queries";
import { runningHoursPerDay } from "@/lib/wear/calendar";

export const metadata: Metadata = { title: "Main engine" };

export default async function EnginePage({ params }: { params: Promise<{ engineId: string }> }) {
  const user = await requirePermission("fleet.read");
  const { engineId } = await params;
  const engine = await getEngine(user, await requireRecordInScope("engine", engineId));
  if (!engine) notFound();
  const limit = engine.profile.linerWearLimitMm;
  const [log, trends] = await Promise.all([listRecentHours(engine.id, 40), getEngineTrends(engine.id, engine.profile.id)]);
  const rate = runningHoursPerDay(log.map((l) => ({ date: l.loggedOn, engineHours: l.engineHours })));
  const today = new Date().toISOString().slice(0, 10);
  return (
    <>
      <PageHeader
        eyebrow={
          <>
            <Link href="/fleet" className="hover:underline">Fleet</Link> /{" "}
            <Link href={`/vessels/${engine.vessel.id}`} className="hover:underline">{engine.vessel.name}</Link>
          </>
        }
        title={`Main engine ${engine.profile.designation}`}
      />
      <Card className="mb-6 grid grid-cols-2 gap-4 p-4 sm:grid-cols-4">
        <Stat label="Running hours" value={hours(engine.latestHours?.engineHours)} unit="h" hint={engine.latestHours ? `logged ${day(engine.latestHours.loggedOn)}` : "no log yet"} />
        <Stat label="Bore" value={fixed(engine.profile.boreMm, 0)} unit="mm" />
        <Stat label="Liner wear limit" value={fixed(limit, 2)} unit="mm" hint="from the engine profile" />
        <Stat label="Ovality limit" value={fixed(engine.profile.ovalityLimitMm, 2)} unit="mm" />
      </Card>
      <h2 className="mb-3 text-lg font-semibold">Units at a glance</h2>
      <ul className="space-y-3 md:hidden" aria-label="Units">
        {engine.units.map((u) => (
          <li key={u.id}>
            <Link href={`/units/${u.id}`} className="block rounded-lg border border-ink-line bg-paper-raised p-4 active:bg-signal-tint/40">
              <div className="flex items-center justify-between gap-3">
                <span className="text-lg font-semibold text-signal">Cylinder {u.cylinderNo}</span>
                {u.band && isBandKey(u.band) ? <BandBadge band={u.band} /> : <span className="text-ink-faint">Not analysed</span>}
              </div>
              <dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-2 text-sm">
                <div>
                  <dt className="text-xs text-ink-faint">Max wear</dt>
                  <dd className="num font-semibold">{fixed(u.maxWearMm)} <span className="font-normal text-ink-faint">/ {fixed(limit)} mm</span></dd>
                </div>
                <div>
                  <dt className="text-xs text-ink-faint">Wear rate</dt>
                  <dd className="num">{wearRate(u.wearRate)} <span className="text-ink-faint">mm/1000 h</span></dd>
                </div>
                <div>
                  <dt className="text-xs text-ink-faint">Wear limit reached</dt>
                  <dd className="num">{u.limitOn ? monthYear(u.limitOn) : u.band === "unknown" ? "not enough data" : "–"}</dd>
                </div>
                <div>
                  <dt className="text-xs text-ink-faint">Liner hours</dt>
                  <dd className="num">{hours(u.linerHours)} h</dd>
                </div>
              </dl>
            </Link>
          </li>
        ))}
      </ul>
      <div className="hidden overflow-x-auto rounded-lg border border-ink-line bg-paper-raised md:block">
        <table className="w-full min-w-[640px] text-sm">
          <thead className="bg-paper-sunk text-left text-xs uppercase tracking-wide text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2">Unit</th>
              <th scope="col" className="px-3 py-2">Status</th>
              <th scope="col" className="hidden px-3 py-2 lg:table-cell">Liner</th>
              <th scope="col" className="px-3 py-2 text-right">Liner hours</th>
              <th scope="col" className="px-3 py-2 text-right">Max wear</th>
              <th scope="col" className="px-3 py-2 text-right">Ovality</th>
              <th scope="col" className="px-3 py-2 text-right">Rate, <span className="normal-case">mm/1000 h</span></th>
              <th scope="col" className="px-3 py-2">Wear limit reached</th>
              <th scope="col" className="px-3 py-2">Last gauged</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-ink-line/70">
            {engine.units.map((u) => (
              <tr key={u.id} className="hover:bg-signal-tint/40">
                <td className="whitespace-nowrap px-3 py-2.5 font-semibold">
                  <Link href={`/units/${u.id}`} className="text-signal hover:underline">Cyl. {u.cylinderNo}</Link>
                </td>
                <td className="px-3 py-2.5">
                  {u.band && isBandKey(u.band) ? <BandBadge band={u.band} /> : <span className="text-ink-faint">Not analysed</span>}
                </td>
                <td className="hidden whitespace-nowrap px-3 py-2.5 font-mono text-xs lg:table-cell">{u.linerSerial ?? "–"}</td>
                <td className="num px-3 py-2.5 text-right">{hours(u.linerHours)} h</td>
                <td className="num px-3 py-2.5 text-right">
                  {fixed(u.maxWearMm)} <span className="text-ink-faint">/ {fixed(limit)} mm</span>
                </td>
                <td className="num px-3 py-2.5 text-right">{fixed(u.maxOvalityMm)} mm</td>
                <td className="num px-3 py-2.5 text-right">{wearRate(u.wearRate)}</td>
                <td className="num px-3 py-2.5">
                  {u.limitOn ? (
                    <>
                      {monthYear(u.limitOn)}
                      {u.limitOnEarliest || u.limitOnLatest ? (
                        <span className="block text-xs text-ink-faint">
                          95 %: {monthYear(u.limitOnEarliest)} – {u.limitOnLatest ? monthYear(u.limitOnLatest) : "later"}
                        </span>
                      ) : null}
                    </>
                  ) : (
                    <span className="text-ink-faint">{u.band === "unknown" ? "not enough data" : "–"}</span>
                  )}
                </td>
                <td className="num px-3 py-2.5">{day(u.lastInspectedOn)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <section className="mt-8" aria-labelledby="unit-trends">
        <h2 id="unit-trends" className="mb-3 text-lg font-semibold">Every unit&apos;s wear trend, one scale</h2>
        <TrendMultiples units={trends} limitMm={limit} />
      </section>
      <section className="mt-8 grid gap-6 md:grid-cols-2" aria-labelledby="hours-log">
        <div className="min-w-0">
          <h2 id="hours-log" className="mb-1 text-lg font-semibold">Running-hours log</h2>
          <p className="mb-3 text-sm text-ink-soft">
            {rate.kind === "known" ? (
              <>
                Averaging <span className="num font-semibold text-ink">{fixed(rate.hoursPerDay, 1)} h a day</span> from {day(rate.fromDate)} to {day(rate.toDate)}; projected dates
                count forward at this rate.
              </>
            ) : (
              "Too few readings for an average running rate, so projections give liner hours but no dates."
            )}
          </p>
          <table className="w-full text-sm">
            <thead className="text-left text-xs uppercase tracking-wide text-ink-soft">
              <tr>
                <th scope="col" className="py-1.5">Date</th>
                <th scope="col" className="py-1.5 text-right">Counter</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-ink-line/70">
              {log.slice(0, 6).map((l) => (
                <tr key={l.loggedOn}>
                  <td className="num py-1.5">{day(l.loggedOn)}</td>
                  <td className="num py-1.5 text-right">{hours(l.engineHours)} h</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        {can(user.role, "hoursLog.write") ? (
          <Card className="p-4">
            <h3 className="mb-3 font-semibold">Log a counter reading</h3>
            <LogHoursForm engineId={engine.id} action={logRunningHoursAction} today={today} />
          </Card>
        ) : null}
      </section>
    </>
  );
}
