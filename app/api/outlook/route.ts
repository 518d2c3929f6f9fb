import { NextResponse } from "next/server";
import { HttpError, withRoute } from "@/lib/auth/api";
import { currenciesOf } from "@/lib/outlook/currency";
import { filterOutlook, outlookCsv, parseOutlookQuery } from "@/lib/outlook/present";
import { getOutlook, todayIso } from "@/lib/outlook/queries";
import { ZodError } from "zod";

export const dynamic = "force-dynamic";

// GET /api/outlook[?horizon=12&vessel=ID&status=BAND&recommendation=KIND&format=csv] – the renewal
// outlook of every unit on the caller's vessels, with the spares shortfall and the budget
export const GET = withRoute("GET /api/outlook", async (req, { user }) => {
  const parsed = parseOutlookQuery(new URL(req.url).searchParams);
  if (!parsed.success) throw new ZodError(parsed.error.issues);
  const q = parsed.data;
  const today = todayIso();
  const bundle = await getOutlook(user, { horizonMonths: q.horizon ?? 12, today });
  if (q.vessel !== undefined && !bundle.rows.some((r) => r.vesselId === q.vessel)) throw new HttpError(404, "Not found: no such vessel among yours. (field: vessel)");
  const rows = filterOutlook(bundle.rows, q, today);
  if (q.format === "csv") {
    return new Response(outlookCsv(rows), {
      headers: {
        "content-type": "text/csv; charset=utf-8",
        "content-disposition": `attachment; filename="renewal-outlook-${today}.csv"`,
        "cache-control": "no-store",
      },
    });
  }
  const vessels = q.vessel === undefined ? null : new Set([q.vessel]);
  const keep = <T extends { vesselId: number | null }>(list: T[]) => (vessels ? list.filter((x) => x.vesselId === null || vessels.has(x.vesselId)) : list);
  return NextResponse.json({
    today,
    horizonMonths: bundle.horizonMonths,
    until: bundle.until,
    // One currency per company (company settings); a fleet of one company has one.
    currencies: Object.fromEntries(await currenciesOf(bundle.rows.map((r) => r.companyId))),
    rows,
    schedule: keep(bundle.schedule),
    shortfall: bundle.shortfall,
    demands: keep(bundle.demands),
    budget: keep(bundle.budget),
  });
});
