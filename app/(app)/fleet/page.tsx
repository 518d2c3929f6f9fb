import type { Metadata } from "next";
import Link from "next/link";
import { InspectionList } from "@/components/home/inspection-list";
import { BandBadge, isBandKey, type BandKey } from "@/components/wear/band-badge";
import { Card, PageHeader } from "@/components/ui/card";
import { requirePermission } from "@/lib/auth/session";
import { can } from "@/lib/auth/permissions";
import { listFleet, listFleetWearRates } from "@/lib/fleet/queries";
import { rateSpread } from "@/lib/fleet/rates";
import { listAwaitingSuperintendent } from "@/lib/home/queries";
import { day, fixed, monthYear, rate, rateText } from "@/lib/format";

export const metadata: Metadata = { title: "Fleet" };

const BAND_ORDER: BandKey[] = ["over_limit", "renew_before_next", "watch", "steady", "unknown"];

export default async function FleetPage() {
  const user = await requirePermission("fleet.read");
  const [vessels, waiting, rates] = await Promise.all([
    listFleet(user),
    user.role === "superintendent" && can(user.role, "inspection.approve") ? listAwaitingSuperintendent(user) : Promise.resolve([]),
    listFleetWearRates(user),
  ]);
  const spread = rateSpread(rates);
  return (
    <>
      <PageHeader eyebrow={vessels[0]?.companyName ?? "Fleet"} title="Fleet">
        <span className="text-sm text-ink-soft">
          {vessels.length} {vessels.length === 1 ? "vessel" : "vessels"}
        </span>
      </PageHeader>
      {waiting.length ? (
        <section aria-labelledby="waiting-for-you" className="mb-8">
          <h2 id="waiting-for-you" className="mb-1 text-lg font-semibold">
            Waiting for your approval <span className="num text-ink-faint">({waiting.length})</span>
          </h2>
          <p className="mb-3 text-sm text-ink-soft">Every chief engineer assigned to these vessels entered or submitted the record themselves, so it needs your check.</p>
          <InspectionList rows={waiting} showBy empty="" />
        </section>
      ) : null}
      {spread ? (
        <p className="mb-4 text-sm text-ink-soft" data-testid="fleet-rate-spread">
          Liner wear across the fleet&apos;s {spread.n} units with a rate: median <span className="num font-semibold text-ink">{rateText(spread.median)}</span>; 8 in
          10 units between <span className="num">{rate(spread.p10)}</span> and <span className="num">{rateText(spread.p90)}</span>.
        </p>
      ) : null}
      {vessels.length === 0 ? (
        <Card className="p-6 text-ink-soft">No vessels are assigned to you yet. Ask your administrator to add you to a vessel.</Card>
      ) : (
        <ul className="grid gap-4 md:grid-cols-2 xl:grid-cols-3">
          {vessels.map((v) => (
            <li key={v.id}>
              <Card className="flex h-full flex-col p-5">
                <div className="flex items-start justify-between gap-3">
                  <div className="min-w-0">
                    <h2 className="text-lg font-semibold">
                      <Link href={`/vessels/${v.id}`} className="hover:text-signal hover:underline">
                        {v.name}
                      </Link>
                    </h2>
                    <p className="num text-sm text-ink-faint">IMO {v.imoNumber}{v.vesselType ? ` · ${v.vesselType}` : ""}</p>
                  </div>
                  {v.awaitingApproval > 0 ? (
                    <span className="rounded bg-signal-tint px-2 py-0.5 text-xs font-medium text-signal-strong">
                      {v.awaitingApproval} awaiting approval
                    </span>
                  ) : null}
                </div>
                <p className="mt-3 text-sm text-ink-soft">
                  {v.engineDesignation ? (
                    <>
                      Main engine {v.engineDesignation} · <span className="num">{v.cylinderCount}</span> cylinders ·{" "}
                      <span className="num">{fixed(v.boreMm, 0)} mm</span> bore
                    </>
                  ) : (
                    "No main engine recorded"
                  )}
                </p>
                <ul className="mt-3 flex flex-wrap gap-1.5" aria-label="Units by status">
                  {BAND_ORDER.filter((b) => v.bands[b]).map((b) => (
                    <li key={b}>
                      <BandBadge band={b} label={`${v.bands[b]} × ${bandShort(b)}`} />
                    </li>
                  ))}
                  {Object.keys(v.bands).filter((b) => !isBandKey(b)).length ? <li className="text-xs">other</li> : null}
                </ul>
                <dl className="mt-auto grid grid-cols-2 gap-3 pt-4 text-sm">
                  <div>
                    <dt className="text-xs text-ink-faint">Last overhaul gauged</dt>
                    <dd className="num">{day(v.lastInspectedOn)}</dd>
                  </div>
                  <div>
                    <dt className="text-xs text-ink-faint">First liner at limit</dt>
                    <dd className="num">{monthYear(v.earliestLimitOn)}</dd>
                  </div>
                </dl>
                {v.engineId ? (
                  <Link href={`/engines/${v.engineId}`} className="mt-4 text-sm font-medium text-signal hover:underline">
                    All units at a glance →
                  </Link>
                ) : null}
              </Card>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}

function bandShort(b: BandKey): string {
  return { over_limit: "over limit", renew_before_next: "renew soon", watch: "watch", steady: "steady", unknown: "too few readings" }[b];
}
