import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PhotoPanel } from "@/components/inspections/photo-panel";
import { WorkflowActions } from "@/components/inspections/workflow-actions";
import { BandBadge } from "@/components/wear/band-badge";
import { Card, PageHeader, Stat } from "@/components/ui/card";
import { ProjectionText } from "@/components/wear/projection-text";
import { WearTable, wearCellKey } from "@/components/wear/wear-table";
import { can } from "@/lib/auth/permissions";
import { requireRecordInScope } from "@/lib/auth/record-scope";
import { requirePermission } from "@/lib/auth/session";
import { day, fixed, hours, spread } from "@/lib/format";
import { toWearProfile } from "@/lib/inspections/context";
import { listInspectionAudit } from "@/lib/inspections/audit-queries";
import { getInspectionForUser } from "@/lib/inspections/queries";
import { getStoredUnitSummary } from "@/lib/inspections/summary-queries";
import { approvalFigures, approvalRefusal } from "@/lib/inspections/approval";
import { correctionFactor, openCautions, RING_STATE_TEXT, ringLive, rodNutDeviation, submissionProblems, tallyStatus } from "@/lib/inspections/rules";
import { GAP_MEASURED_IN_LABELS, STATE_LABELS } from "@/lib/inspections/schemas";
import { analyseGauging, toGauging } from "@/lib/analysis/input";
import { intervalRate } from "@/lib/wear/liner";
import { gapLinerIncrease, normaliseClosedGap } from "@/lib/rings/rings";
import { OverLimitMark, CautionMark } from "@/components/inspections/marks";

export const metadata: Metadata = { title: "Inspection" };

const ACTION_LABELS: Record<string, string> = {
  "inspection.create": "opened the draft",
  "inspection.submit": "submitted for approval",
  "inspection.approve": "approved",
  "inspection.return": "returned for correction",
  "inspection.amend": "opened this amendment",
  "inspection.amendment_opened": "opened an amendment",
  "inspection.superseded": "superseded by an approved amendment",
  "inspection.photo_added": "added a photo",
  "inspection.photo_removed": "removed a photo",
};

function detailText(action: string, d: Record<string, unknown> | null): string | null {
  if (!d) return null;
  if (action === "inspection.return" && d.comment) return `“${String(d.comment)}”`;
  if ((action === "inspection.amend" || action === "inspection.amendment_opened") && d.reason) return `Reason: ${String(d.reason)}`;
  if (action === "inspection.approve" && d.maxWearMm != null) return `max wear ${fixed(Number(d.maxWearMm))} mm at ${String(d.maxWearStation)}`;
  if (action.startsWith("inspection.photo") && d.caption) return String(d.caption);
  return null;
}

export default async function InspectionPage({ params }: { params: Promise<{ inspectionId: string }> }) {
  const user = await requirePermission("fleet.read");
  const id = await requireRecordInScope("inspection", (await params).inspectionId);
  const found = await getInspectionForUser(user, id);
  if (!found) notFound();
  const { inspection: insp, context: ctx } = found;
  const [audit, summary] = await Promise.all([listInspectionAudit(id), getStoredUnitSummary(insp.unitId)]);
  const profile = ctx.profile;
  const h = insp.draft.header;
  const wearProfile = toWearProfile(profile);
  const analysis = analyseGauging(wearProfile, toGauging(id, h, insp.draft.readings), ctx.asFitted);
  // The previous approved gauging of the same liner, so the chief sees what changed since.
  const prev = ctx.previous && ctx.previous.linerId === insp.linerId ? ctx.previous : null;
  const prevAnalysis = prev
    ? analyseGauging(wearProfile, toGauging(prev.id, prev, prev.readings), ctx.asFitted)
    : null;
  const since = prev && prevAnalysis
    ? {
        label: day(prev.inspectedOn),
        hours: h.linerHours - prev.linerHours,
        wear: new Map(prevAnalysis.cells.filter((cell) => cell.usable).map((cell) => [wearCellKey(cell.stationKey, cell.axisKey), cell.wearMm])),
        maxWearMm: prevAnalysis.maxWear?.wearMm ?? null,
      }
    : null;
  const sinceRate =
    prev && since && since.maxWearMm !== null && analysis.maxWear ? intervalRate(since.maxWearMm, prev.linerHours, analysis.maxWear.wearMm, h.linerHours) : null;
  const stationLabel = (key: string | undefined) => profile.stations.find((s) => s.key === key)?.label ?? key ?? "–";
  const open = insp.state === "draft" || insp.state === "returned";
  const missing = open ? submissionProblems(ctx, insp.draft) : [];
  const c = insp.draft.checklist;
  const dev = rodNutDeviation(profile, c.rodNutPressureBar);
  const approval =
    insp.state === "submitted"
      ? approvalFigures({
          wearLimitMm: profile.linerWearLimitMm,
          inspectedOn: h.inspectedOn,
          linerHours: h.linerHours,
          maxWear: analysis.maxWear ? { wearMm: analysis.maxWear.wearMm, at: stationLabel(analysis.maxWear.stationKey) } : null,
          previous: prev && since ? { maxWearMm: since.maxWearMm, linerHours: prev.linerHours, inspectedOn: prev.inspectedOn } : null,
          hoursLog: ctx.hoursLog,
          cautions: openCautions(ctx, insp.draft),
        })
      : undefined;
  const approvalParties = { createdBy: insp.createdBy?.id ?? null, submittedBy: insp.submittedBy?.id ?? null };
  // A chief engineer who entered or submitted this record is told who approves it instead.
  const ownRecordNote = insp.state === "submitted" && can(user.role, "inspection.approve") ? approvalRefusal(user, approvalParties) : null;
  const isAuthor = insp.createdBy?.id === user.id;
  const allowed = {
    // A returned record is corrected by the crew, not by the chief who returned it.
    edit: can(user.role, "inspection.editDraft") && (insp.state !== "returned" || isAuthor || !can(user.role, "inspection.return")),
    discard: insp.state === "draft" && isAuthor && can(user.role, "inspection.editDraft"),
    approve: can(user.role, "inspection.approve") && !approvalRefusal(user, approvalParties),
    return: can(user.role, "inspection.return"),
    amend: can(user.role, "inspection.amend"),
  };

  return (
    <>
      <PageHeader
        eyebrow={
          <>
            <Link href="/fleet" className="hover:underline">Fleet</Link> /{" "}
            <Link href={`/vessels/${ctx.unit.vesselId}`} className="hover:underline">{ctx.unit.vesselName}</Link> /{" "}
            <Link href={`/units/${ctx.unit.id}`} className="hover:underline">Cylinder {ctx.unit.cylinderNo}</Link>
          </>
        }
        title={`Inspection ${day(h.inspectedOn)} · cylinder ${ctx.unit.cylinderNo}`}
      >
        <span className="rounded border-2 border-ink px-2 py-0.5 text-sm font-semibold" data-testid="inspection-state">
          {insp.state === "approved" ? "✓ " : insp.state === "superseded" ? "⊘ " : ""}
          {STATE_LABELS[insp.state]}
          {insp.version > 1 ? ` · version ${insp.version}` : ""}
        </span>
      </PageHeader>

      <div className="mb-6 space-y-3">
        {insp.supersedesId ? (
          <p className="text-sm">
            Amends <Link href={`/inspections/${insp.supersedesId}`} className="font-medium text-signal underline">version {insp.version - 1}</Link>. Reason: {insp.amendmentReason}
          </p>
        ) : null}
        {insp.supersededById ? (
          <p className="rounded-md border border-ink-line bg-paper-sunk p-3 text-sm">
            {insp.state === "superseded" ? "This version was replaced by " : "An amendment is open: "}
            <Link href={`/inspections/${insp.supersededById}`} className="font-medium text-signal underline">the newer version</Link>. It is kept here unchanged.
          </p>
        ) : null}
        {insp.state === "returned" && insp.returnComment ? (
          <p className="rounded-md border-2 border-ink bg-paper-raised p-3">
            <strong>Returned for correction:</strong> {insp.returnComment}
          </p>
        ) : null}
        <WorkflowActions inspectionId={id} state={insp.state} allowed={allowed} approval={approval} />
        {ownRecordNote ? <p className="text-sm text-ink-soft">{ownRecordNote}</p> : null}
        {open && missing.length ? <p className="text-sm text-ink-soft">{missing.length} item{missing.length === 1 ? "" : "s"} still to fill before it can be submitted.</p> : null}
      </div>

      <Card className="mb-6 grid grid-cols-2 gap-x-4 gap-y-5 p-4 md:grid-cols-4 xl:grid-cols-6 [&>*]:min-w-0">
        <Stat label="Engine hours" value={hours(h.engineHours)} unit="h" />
        <Stat label="Liner hours" value={hours(h.linerHours)} unit="h" hint={h.linerHoursReason ? `set by hand: ${h.linerHoursReason}` : `liner ${ctx.liner.serial}`} />
        <Stat label="Max wear" value={fixed(analysis.maxWear?.wearMm)} unit="mm" hint={analysis.maxWear ? `at ${stationLabel(analysis.maxWear.stationKey)} · limit ${fixed(profile.linerWearLimitMm)} mm` : undefined} />
        <Stat label="Max ovality" value={fixed(analysis.maxOvality?.ovalityMm)} unit="mm" hint={`limit ${fixed(profile.ovalityLimitMm)} mm`} />
        <Stat label="Temperatures" value={`${h.gaugeTempC ?? "–"} / ${h.linerTempC ?? "–"}`} unit="°C" hint="micrometer / liner" />
        <Stat label="Crew" value={<span className="text-base font-medium whitespace-normal">{h.crew ?? "–"}</span>} />
      </Card>

      {summary ? (
        <Card className="mb-6 p-4">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 className="font-semibold">This unit now (approved records)</h2>
            <BandBadge band={summary.band.band} />
          </div>
          <dl className="tabular-nums mt-2 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2">
            <div>
              <dt className="inline text-ink-faint">Wear rate, trend: </dt>
              <dd className="inline">{summary.trend ? `${fixed(summary.trend.slopeMmPer1000h, 3)} ± ${spread(summary.trend.slopeSdMmPer1000h, 3)} mm/1000 h` : "not enough points"}</dd>
            </div>
            <div>
              <dt className="inline text-ink-faint">Last interval: </dt>
              <dd className="inline">{summary.lastIntervalRate != null ? `${fixed(summary.lastIntervalRate, 3)} mm/1000 h` : "–"}</dd>
            </div>
          </dl>
          <p className="mt-2 text-sm text-ink-soft">
            <ProjectionText what="Wear" projection={summary.wear} limitMm={profile.linerWearLimitMm} />
          </p>
          <p className="mt-1 text-sm text-ink-soft">
            <ProjectionText what="Ovality" projection={summary.ovality} limitMm={profile.ovalityLimitMm} />
          </p>
          {insp.state !== "approved" ? <p className="mt-1 text-xs text-ink-faint">This record counts in the unit&apos;s analysis once it is approved.</p> : null}
        </Card>
      ) : null}

      <section className="mb-6">
        <h2 className="mb-2 text-lg font-semibold">Liner wear</h2>
        {since ? (
          <p className="mb-2 text-sm text-ink-soft" data-testid="since-previous">
            Against the previous gauging of this liner, {since.label}, <span className="num">{hours(since.hours)} h</span> earlier: maximum wear{" "}
            <span className="num font-medium text-ink">{fixed(since.maxWearMm)} → {fixed(analysis.maxWear?.wearMm)} mm</span>
            {sinceRate !== null ? (
              <>
                , <span className="num font-medium text-ink">{fixed(sinceRate, 3)} mm/1000 h</span> over the interval
              </>
            ) : null}
            . Each cell shows its change since then.
          </p>
        ) : (
          <p className="mb-2 text-sm text-ink-soft">The first gauging of this liner on record: nothing earlier to compare with.</p>
        )}
        <WearTable
          stations={profile.stations}
          axes={profile.axes}
          cells={analysis.cells}
          ovality={analysis.ovality}
          wearLimitMm={profile.linerWearLimitMm}
          ovalityLimitMm={profile.ovalityLimitMm}
          maxWearStationKey={analysis.maxWear?.stationKey}
          previousWear={since?.wear}
          notes={new Map(insp.draft.readings.map((r) => [wearCellKey(r.stationKey, r.axisKey), { enteredUnit: r.enteredUnit, warningConfirmed: r.warningConfirmed }]))}
        />
        <p className="mt-1 text-xs text-ink-faint">
          All figures in mm.{" "}
          {analysis.correction.applied
            ? `Referred to 20 °C (ISO 1) with factor ${analysis.correction.factor.toFixed(6)}.`
            : profile.temperatureCorrection
              ? "Not referred to 20 °C: a temperature is missing or implausible."
              : "Temperature correction is off for this engine profile."}{" "}
          Wear is measured from the {profile.wearReference === "nominal" ? `nominal bore of ${fixed(profile.boreMm)} mm` : "liner's as-fitted readings"}.
        </p>
      </section>

      <section className="mb-6">
        <h2 className="mb-2 text-lg font-semibold">Piston rings</h2>
        <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised">
          {/* On a phone the ring's other columns fold under its gap and its name. */}
          <table className="w-full text-sm md:min-w-[720px]">
            <thead className="bg-paper-sunk text-left text-xs tracking-wide text-ink-soft uppercase">
              <tr>
                <th className="px-2 py-2 sm:px-3" scope="col">Ring</th>
                <th className="px-2 py-2 text-right sm:px-3" scope="col">Closed gap</th>
                <th className="hidden px-3 py-2 md:table-cell" scope="col">Measured in</th>
                <th className="px-2 py-2 text-right sm:px-3" scope="col">Groove clearance</th>
                <th className="hidden px-3 py-2 md:table-cell" scope="col">Renewed</th>
                <th className="hidden px-3 py-2 md:table-cell" scope="col">Condition</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-ink-line/70">
              {profile.rings.map((spec) => {
                const r = insp.draft.rings.find((x) => x.position === spec.position);
                const increase = r?.gapMeasuredIn === "liner_worn" ? gapLinerIncrease(profile.boreMm, r.gapLinerDiameterMm, correctionFactor(profile, h.gaugeTempC, h.linerTempC)) : null;
                const referred =
                  r?.closedGapMm != null && increase?.kind === "ok" ? normaliseClosedGap(r.closedGapMm, "liner_worn", increase.increaseMm).gapMm : null;
                const live = ringLive(spec, referred ?? r?.closedGapMm ?? null, r?.grooveClearanceMm ?? null);
                const tone = (s: typeof live.gap) => (s === "at_or_over_limit" ? "font-semibold text-limit" : s === "below_new_range" ? "text-caution" : "");
                return (
                  <tr key={spec.position}>
                    <th scope="row" className="px-2 py-2 text-left align-top font-medium sm:px-3">
                      <span className="whitespace-nowrap">{spec.label}</span>
                      <span className="block text-xs font-normal text-ink-soft md:hidden">
                        {r?.renewed ? "renewed" : "not renewed"}
                        {r?.condition ? ` · ${r.condition}` : ""}
                      </span>
                    </th>
                    <td className="num px-2 py-2 text-right align-top sm:px-3">
                      {r?.closedGapMm != null ? <span className={tone(live.gap)}>{live.gap === "at_or_over_limit" ? <OverLimitMark /> : null}{fixed(r.closedGapMm)} mm</span> : "–"}
                      {live.gap ? <span className="block text-xs whitespace-normal text-ink-faint">{RING_STATE_TEXT[live.gap]} (limit {fixed(spec.gapLimitMm)} mm)</span> : null}
                      {r?.gapMeasuredIn ? <span className="block text-xs whitespace-normal text-ink-faint md:hidden">in {GAP_MEASURED_IN_LABELS[r.gapMeasuredIn].toLowerCase()}</span> : null}
                      {referred !== null ? (
                        <span className="num block text-xs text-ink-faint md:hidden">{fixed(referred)} mm in a gauge ring</span>
                      ) : null}
                    </td>
                    <td className="hidden px-3 py-2 align-top md:table-cell">
                      {r?.gapMeasuredIn ? GAP_MEASURED_IN_LABELS[r.gapMeasuredIn] : "–"}
                      {referred !== null ? (
                        <span className="num block text-xs text-ink-faint">
                          at {fixed(r!.gapLinerDiameterMm)} mm; {fixed(referred)} mm in a gauge ring
                        </span>
                      ) : null}
                    </td>
                    <td className="num px-2 py-2 text-right align-top sm:px-3">
                      {r?.grooveClearanceMm != null ? <span className={tone(live.groove)}>{live.groove === "at_or_over_limit" ? <OverLimitMark /> : null}{fixed(r.grooveClearanceMm)} mm</span> : "–"}
                      {live.groove ? <span className="block text-xs whitespace-normal text-ink-faint">{RING_STATE_TEXT[live.groove]} (limit {fixed(spec.grooveLimitMm)} mm)</span> : null}
                    </td>
                    <td className="hidden px-3 py-2 align-top md:table-cell">{r?.renewed ? "Yes" : "No"}</td>
                    <td className="hidden px-3 py-2 align-top md:table-cell">{r?.condition ?? <span className="text-ink-faint">–</span>}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      </section>

      <section className="mb-6 grid gap-4 lg:grid-cols-2">
        <Card className="p-4">
          <h2 className="font-semibold">Crankcase tool and rag tally</h2>
          {c.tally.length ? (
            <table className="mt-2 w-full text-sm tabular-nums">
              <thead className="text-left text-xs text-ink-soft uppercase">
                <tr>
                  <th className="py-1" scope="col">Item</th>
                  <th className="py-1 pl-3 text-right" scope="col">In</th>
                  <th className="py-1 pl-3 text-right" scope="col">Out</th>
                  <th className="py-1 pl-3" scope="col">Tally</th>
                </tr>
              </thead>
              <tbody>
                {c.tally.map((t) => {
                  const st = tallyStatus(t);
                  return (
                    <tr key={t.key}>
                      <td className="py-1">{t.label}</td>
                      <td className="py-1 pl-3 text-right">{t.countIn ?? "–"}</td>
                      <td className="py-1 pl-3 text-right">{t.countOut ?? "–"}</td>
                      <td className={`py-1 pl-3 ${st === "mismatch" ? "font-semibold text-limit" : ""}`}>{st === "match" ? "✓ matches" : st === "mismatch" ? <><OverLimitMark />does not match</> : "not counted"}</td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          ) : (
            <p className="mt-2 text-sm text-ink-faint">No tally recorded.</p>
          )}
        </Card>
        <Card className="p-4 text-sm">
          <h2 className="text-base font-semibold">Closing items</h2>
          <ul className="mt-2 space-y-2">
            <li>
              {c.closing.signedName && c.closing.signedAt ? "✓" : "○"} Closing inspection:{" "}
              {c.closing.signedName && c.closing.signedAt ? (
                <>
                  signed by <strong>{c.closing.signedName}</strong>, <span className="num">{new Date(c.closing.signedAt).toISOString().slice(0, 16).replace("T", " ")} UTC</span>
                </>
              ) : (
                "not signed"
              )}
            </li>
            <li className="tabular-nums">
              {c.rodNutPressureBar != null ? "✓" : "○"} Rod nut tightening pressure: {c.rodNutPressureBar != null ? `${fixed(c.rodNutPressureBar, 0)} bar` : "not recorded"}
              {profile.rodNutPressureBar != null ? <span className="text-ink-faint"> (profile {fixed(profile.rodNutPressureBar, 0)} bar{dev !== null ? `, ${dev > 0 ? "+" : ""}${fixed(dev * 100, 1)} %` : ""})</span> : null}
            </li>
            <li>
              {c.stuffingBox.done ? "✓" : "○"} Stuffing box overhauled and checked{c.stuffingBox.note ? ` — ${c.stuffingBox.note}` : ""}
            </li>
            <li>
              {c.cylinderLubrication.done ? "✓" : "○"} Cylinder lubrication checked{c.cylinderLubrication.note ? ` — ${c.cylinderLubrication.note}` : ""}
            </li>
          </ul>
        </Card>
      </section>

      <section className="mb-6">
        <h2 className="mb-2 text-lg font-semibold">Photos</h2>
        <PhotoPanel inspectionId={id} initial={insp.photos} profile={profile} editable={false} />
      </section>

      <section className="mb-6">
        <h2 className="mb-2 text-lg font-semibold">Record trail</h2>
        {audit.length ? (
          <ol className="space-y-1 text-sm">
            {audit.map((a) => (
              <li key={a.id} className="flex flex-wrap gap-x-2">
                <span className="num text-ink-faint">{new Date(a.at).toISOString().slice(0, 16).replace("T", " ")} UTC</span>
                <span>
                  <strong>{a.actorName ?? "system"}</strong> {ACTION_LABELS[a.action] ?? a.action}
                  {a.entityId !== String(id) ? (
                    <>
                      {" "}
                      (on <Link href={`/inspections/${a.entityId}`} className="text-signal underline">another version</Link>)
                    </>
                  ) : null}
                  {detailText(a.action, a.detail) ? <span className="text-ink-soft"> — {detailText(a.action, a.detail)}</span> : null}
                </span>
              </li>
            ))}
          </ol>
        ) : (
          <p className="text-sm text-ink-faint">No entries (imported or demo record).</p>
        )}
        <p className="mt-2 text-xs text-ink-faint">
          Created by {insp.createdBy?.name ?? "–"}
          {insp.submittedBy ? ` · submitted by ${insp.submittedBy.name}${insp.submittedAt ? ` on ${day(insp.submittedAt.slice(0, 10))}` : ""}` : ""}
          {insp.approvedBy ? ` · approved by ${insp.approvedBy.name}${insp.approvedAt ? ` on ${day(insp.approvedAt.slice(0, 10))}` : ""}` : ""}.
        </p>
      </section>
    </>
  );
}
