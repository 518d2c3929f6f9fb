import type { Metadata } from "next";
import Link from "next/link";
import { SpareForm, type SpareValues } from "@/components/outlook/spare-form";
import { Card, PageHeader } from "@/components/ui/card";
import { ShortfallTable } from "@/components/outlook/shortfall-table";
import { DataTable } from "@/components/wear/data-table";
import { can } from "@/lib/auth/permissions";
import { requirePermission } from "@/lib/auth/session";
import { day, grouped } from "@/lib/format";
import { currenciesOf } from "@/lib/outlook/currency";
import { parseOutlookQuery } from "@/lib/outlook/present";
import { getOutlook, todayIso } from "@/lib/outlook/queries";
import { PART_LABELS } from "@/lib/outlook/types";

export const metadata: Metadata = { title: "Spares" };

const asText = (v: number | null | undefined) => (v === null || v === undefined ? "" : String(v));

export default async function SparesPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePermission("fleet.read");
  const q = parseOutlookQuery(await searchParams);
  const horizonMonths = (q.success && q.data.horizon) || 12;
  const bundle = await getOutlook(user, { horizonMonths, today: todayIso() });
  const canEdit = can(user.role, "spares.write");
  const currencies = await currenciesOf(bundle.rows.map((r) => r.companyId));
  const currency = currencies.size === 1 ? [...currencies.values()][0] : "";
  const profiles = [...new Map(bundle.rows.map((r) => [r.profileId, r.profileName])).entries()].map(([id, name]) => ({ id, name }));
  const vessels = [...new Map(bundle.rows.map((r) => [r.vesselId, r.vesselName])).entries()].map(([id, name]) => ({ id, name }));
  const profileName = new Map(bundle.stock.map((s) => [s.profileId, s.profileName]));

  return (
    <>
      <PageHeader eyebrow={<Link href="/outlook" className="hover:underline">Renewal outlook</Link>} title="Spares" />
      <p className="mb-4 max-w-3xl text-sm text-ink-soft">
        Liners and ring sets per engine profile, on board each ship and in the company store, with lead time and cost. Shortfall against the renewals
        planned or recommended in the next {horizonMonths} months (to {day(bundle.until)}).
      </p>
      <h2 className="mb-2 text-lg font-semibold">Shortfall</h2>
      <ShortfallTable lines={bundle.shortfall} profileName={profileName} testId="spares-shortfall" />
      <h2 className="mt-8 mb-2 text-lg font-semibold">Stock</h2>
      <div className="space-y-3">
        {bundle.stock.map((s) => (
          <Card key={s.id} className="p-3 sm:p-4" data-testid="stock-line">
            <h3 className="font-semibold">
              {PART_LABELS[s.part]}, {s.profileName} — {s.vesselName ? `on board ${s.vesselName}` : "company store"}
            </h3>
            {canEdit ? (
              <SpareForm
                profiles={profiles}
                vessels={vessels}
                currency={currency}
                initial={{
                  id: s.id,
                  revision: s.revision,
                  profileId: s.profileId,
                  part: s.part,
                  vesselId: s.vesselId,
                  onHand: asText(s.onHand),
                  onOrder: asText(s.onOrder),
                  onOrderDue: s.onOrderDue ?? "",
                  leadTimeDays: asText(s.leadTimeDays),
                  unitCost: asText(s.unitCost),
                  jobCost: asText(s.jobCost),
                }}
              />
            ) : (
              <p className="num text-sm text-ink-soft">
                {s.onHand} on hand{s.onOrder ? `, ${s.onOrder} on order due ${day(s.onOrderDue)}` : ""} · lead time {s.leadTimeDays} days · unit cost {s.unitCost === null ? "–" : grouped(s.unitCost)} · job {s.jobCost === null ? "–" : grouped(s.jobCost)} {currency}
              </p>
            )}
          </Card>
        ))}
      </div>
      {canEdit ? (
        <Card className="no-print mt-6 p-3 sm:p-4">
          <h2 className="mb-2 text-lg font-semibold">Add a stock line</h2>
          <SpareForm profiles={profiles} vessels={vessels} currency={currency} initial={{ profileId: "", part: "liner", vesselId: null, onHand: "0", onOrder: "0", onOrderDue: "", leadTimeDays: "90", unitCost: "", jobCost: "" } satisfies SpareValues} />
        </Card>
      ) : null}
    </>
  );
}
