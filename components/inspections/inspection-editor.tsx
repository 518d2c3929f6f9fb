"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { ApiError, apiJson, NetworkError } from "@/lib/inspections/api-client";
import { cellKey, toWearProfile, type InspectionContext } from "@/lib/inspections/context";
import { emptyRing, parseDecimal, ringInUnit, toDraft, type FormState } from "@/lib/inspections/form";
import { checkHours, derivedLinerHours, linerHoursDiffer, readingWarnings, submissionProblems, type Problem } from "@/lib/inspections/rules";
import type { InspectionDto } from "@/lib/inspections/schemas";
import { day } from "@/lib/format";
import { formatFixed, type LengthUnit } from "@/lib/units/length";
import { formatRunningHours } from "@/lib/wear/calendar";
import { analyseGauging, toGauging } from "@/lib/analysis/input";
import { cn } from "@/lib/utils";
import { ChecklistForm } from "./checklist-form";
import { LinerGrid } from "./liner-grid";
import { PhotoPanel } from "./photo-panel";
import { ringInputId, RingTable } from "./ring-table";
import { SaveStatusBadge } from "./save-status";
import { useDraftAutosave } from "./use-draft-autosave";
import { OverLimitMark, CautionMark } from "./marks";

const fieldCls = "mt-1 block min-h-12 w-full rounded-md border border-ink-line bg-paper-raised px-3 text-base";

function Field({ id, label, unit, children }: { id: string; label: string; unit?: string; children: React.ReactNode }) {
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink-soft">
        {label}
        {unit ? <span className="text-ink-faint"> ({unit})</span> : null}
      </label>
      {children}
    </div>
  );
}

function Messages({ items, tone }: { items: Problem[]; tone: "limit" | "caution" }) {
  if (!items.length) return null;
  return (
    <>
      {items.map((p) => (
        <p key={p.message} className={cn("mt-1 text-sm font-medium", tone === "limit" ? "text-limit" : "text-caution")} role={tone === "limit" ? "alert" : undefined}>
          {tone === "limit" ? <OverLimitMark /> : <CautionMark />}
          {p.message}
        </p>
      ))}
    </>
  );
}

/**
 * The gauging sheet of one draft: header, liner grid, rings, checklist and photos,
 * autosaved (to the device at once, to the server a moment later), with the live
 * checks the server applies on submit shown as the engineer types.
 */
export function InspectionEditor({ initial, ctx, canSubmit }: { initial: InspectionDto; ctx: InspectionContext; canSubmit: boolean }) {
  const router = useRouter();
  const { form, setForm, status, conflict, resolveConflict, invalid, flush, forget, restored } = useDraftAutosave(initial, ctx.profile);
  const [submitError, setSubmitError] = useState<Problem[] | string | null>(null);
  const [submitting, setSubmitting] = useState(false);
  const profile = ctx.profile;

  const { draft } = useMemo(() => toDraft(form, profile, initial.draft.header), [form, profile, initial.draft.header]);
  const wearProfile = useMemo(() => toWearProfile(profile), [profile]);
  const analysis = useMemo(
    () => analyseGauging(wearProfile, toGauging(initial.id, draft.header, draft.readings), ctx.asFitted),
    [wearProfile, draft, initial.id, ctx.asFitted],
  );
  const warnings = useMemo(() => readingWarnings(ctx, draft), [ctx, draft]);
  const hours = useMemo(() => checkHours(ctx, draft.header), [ctx, draft.header]);
  const problems = useMemo(() => submissionProblems(ctx, draft), [ctx, draft]);

  const setHeader = (patch: Partial<FormState["header"]>) => setForm((f) => ({ ...f, header: { ...f.header, ...patch } }));
  const engineParsed = parseDecimal(form.header.engineHours);
  const derived = typeof engineParsed === "number" ? derivedLinerHours(ctx.liner, engineParsed) : null;
  const linerParsed = parseDecimal(form.header.linerHours);
  const linerDiffers = derived !== null && typeof linerParsed === "number" && linerHoursDiffer(derived, linerParsed);
  const filled = draft.readings.length;
  const totalCells = profile.stations.length * profile.axes.length;

  async function submit() {
    setSubmitError(null);
    setSubmitting(true);
    try {
      const ok = await flush();
      if (!ok) {
        setSubmitError("The latest changes are not on the server yet (see the status above). Nothing was submitted; your entries are kept.");
        return;
      }
      const rev = (await apiJson<InspectionDto>(`/api/inspections/${initial.id}`)).revision;
      await apiJson(`/api/inspections/${initial.id}/submit`, { method: "POST", body: { revision: rev } });
      forget();
      router.push(`/inspections/${initial.id}`);
      router.refresh();
    } catch (err) {
      if (err instanceof NetworkError) setSubmitError("No network: submit when you are back online. Everything is kept on this device.");
      else if (err instanceof ApiError) setSubmitError(err.body.details?.problems ?? err.message);
      else setSubmitError("Something went wrong; nothing was submitted.");
    } finally {
      setSubmitting(false);
    }
  }

  // The switch applies to the whole sheet: ring lengths already typed are converted with it.
  const setUnit = (u: LengthUnit) =>
    setForm((f) => ({ ...f, entryUnit: u, rings: Object.fromEntries(Object.entries(f.rings).map(([k, r]) => [k, ringInUnit(r, u)])) }));
  const conflictEditable = conflict && (conflict.state === "draft" || conflict.state === "returned");

  return (
    <div className="space-y-8">
      <div className="no-print sticky top-0 z-20 -mx-4 border-b border-ink-line bg-paper/95 px-4 py-2 backdrop-blur sm:-mx-6 sm:px-6">
        <div className="flex flex-wrap items-center justify-between gap-x-4 gap-y-2">
          <SaveStatusBadge status={status} invalidCount={invalid.length} />
          <div className="flex items-center gap-3">
            <span className="num text-sm text-ink-soft">
              {filled}/{totalCells} read
            </span>
            <div role="radiogroup" aria-label="Entry unit" className="inline-flex overflow-hidden rounded-md border border-ink-line">
              {(["mm", "in"] as const).map((u) => (
                <button
                  key={u}
                  type="button"
                  role="radio"
                  aria-checked={form.entryUnit === u}
                  onClick={() => setUnit(u)}
                  className={cn("min-h-12 min-w-14 px-3 text-sm font-semibold", form.entryUnit === u ? "bg-signal text-white" : "bg-paper-raised text-ink")}
                >
                  {u === "mm" ? "mm" : "inch"}
                </button>
              ))}
            </div>
          </div>
        </div>
        <nav aria-label="Sections" className="mt-1 flex gap-1 overflow-x-auto text-sm">
          {[
            ["#hours", "Hours"],
            ["#liner", "Liner"],
            ["#rings", "Rings"],
            ["#checklist", "Checklist"],
            ["#photos", "Photos"],
            ["#submit", "Submit"],
          ].map(([href, label]) => (
            <a key={href} href={href} className="flex min-h-10 items-center rounded px-2 font-medium text-signal hover:bg-signal-tint">
              {label}
            </a>
          ))}
        </nav>
      </div>

      {restored && status.kind !== "conflict" ? (
        <p className="rounded-md border border-ink-line bg-paper-sunk p-3 text-sm">Unsaved entries from this device were restored.</p>
      ) : null}

      {conflict ? (
        <section role="alert" className="rounded-lg border-2 border-caution bg-caution-tint p-4">
          <h2 className="font-semibold text-caution">⚠ This draft was changed elsewhere</h2>
          <p className="mt-1 text-sm">
            {status.kind === "conflict" ? status.message : null} The server&apos;s copy was saved{" "}
            {new Date(conflict.updatedAt).toLocaleString()}
            {conflict.state !== "draft" ? ` and is now “${conflict.state}”` : ""}. Your entries on this screen are kept on this device until you choose.
          </p>
          <ConflictDiff mine={draft} theirs={conflict} ctx={ctx} />
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
              <Link href={`/inspections/${initial.id}`} className="inline-flex min-h-12 items-center rounded-md border border-ink-line bg-paper-raised px-4 font-medium">
                Open the record as it is now
              </Link>
            )}
          </div>
        </section>
      ) : null}

      {initial.state === "returned" && initial.returnComment ? (
        <section className="rounded-lg border-2 border-ink bg-paper-raised p-4">
          <h2 className="font-semibold">Returned for correction</h2>
          <p className="mt-1 whitespace-pre-line">{initial.returnComment}</p>
        </section>
      ) : null}
      {initial.supersedesId ? (
        <p className="rounded-md border border-ink-line bg-paper-raised p-3 text-sm">
          Amendment (version {initial.version}) of{" "}
          <Link href={`/inspections/${initial.supersedesId}`} className="font-medium text-signal underline">
            the approved record
          </Link>
          . Reason: {initial.amendmentReason}
        </p>
      ) : null}

      <section id="hours" aria-labelledby="hours-h" className="scroll-mt-32">
        <h2 id="hours-h" className="mb-3 text-xl font-semibold">
          Date, hours and temperatures
        </h2>
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <Field id="h-date" label="Date">
            <input id="h-date" type="date" className={fieldCls} value={form.header.inspectedOn} onChange={(e) => setHeader({ inspectedOn: e.target.value })} />
          </Field>
          <Field id="h-engine" label="Engine running hours" unit="h">
            <input
              id="h-engine"
              inputMode="decimal"
              autoComplete="off"
              className={cn(fieldCls, "num text-right text-lg")}
              value={form.header.engineHours}
              aria-invalid={hours.errors.some((e) => e.field === "header.engineHours") || undefined}
              onChange={(e) => setHeader({ engineHours: e.target.value })}
            />
          </Field>
          <Field id="h-liner" label="Liner hours" unit="h">
            <input
              id="h-liner"
              inputMode="decimal"
              autoComplete="off"
              className={cn(fieldCls, "num text-right text-lg")}
              value={form.header.linerHours}
              onChange={(e) => setHeader({ linerHours: e.target.value })}
            />
          </Field>
          <Field id="h-crew" label="Crew">
            <input id="h-crew" autoComplete="off" className={fieldCls} value={form.header.crew} onChange={(e) => setHeader({ crew: e.target.value })} />
          </Field>
          <div className="sm:col-span-2 lg:col-span-4">
            <Messages items={hours.errors.filter((e) => e.field === "header.engineHours")} tone="limit" />
            <Messages items={hours.warnings} tone="caution" />
            <p className="mt-1 text-sm text-ink-faint">
              {ctx.previous ? (
                <>
                  Previous inspection {day(ctx.previous.inspectedOn)} at <span className="num">{formatRunningHours(ctx.previous.engineHours)}</span>.{" "}
                </>
              ) : null}
              Liner <span className="font-mono">{ctx.liner.serial}</span>
              {derived !== null ? (
                <>
                  : derived liner hours <span className="num">{formatRunningHours(derived)}</span>
                  {linerDiffers ? (
                    <button type="button" className="ml-2 min-h-10 font-medium text-signal underline" onClick={() => setHeader({ linerHours: String(derived) })}>
                      use the derived value
                    </button>
                  ) : null}
                </>
              ) : null}
              .
            </p>
          </div>
          {linerDiffers ? (
            <div className="sm:col-span-2 lg:col-span-4">
              <Field id="h-reason" label="Reason the liner hours differ from the derived value">
                <input id="h-reason" className={fieldCls} value={form.header.linerHoursReason} onChange={(e) => setHeader({ linerHoursReason: e.target.value })} />
              </Field>
              <Messages items={hours.errors.filter((e) => e.field === "header.linerHoursReason")} tone="limit" />
            </div>
          ) : null}
          <Field id="h-gauge" label="Micrometer temperature" unit="°C">
            <input id="h-gauge" inputMode="decimal" autoComplete="off" className={cn(fieldCls, "num text-right text-lg")} value={form.header.gaugeTempC} onChange={(e) => setHeader({ gaugeTempC: e.target.value })} />
          </Field>
          <Field id="h-linert" label="Liner temperature" unit="°C">
            <input id="h-linert" inputMode="decimal" autoComplete="off" className={cn(fieldCls, "num text-right text-lg")} value={form.header.linerTempC} onChange={(e) => setHeader({ linerTempC: e.target.value })} />
          </Field>
          <div className="sm:col-span-2">
            <Field id="h-notes" label="Notes">
              <textarea id="h-notes" rows={2} className={cn(fieldCls, "py-2")} value={form.header.notes} onChange={(e) => setHeader({ notes: e.target.value })} />
            </Field>
          </div>
        </div>
      </section>

      <section id="liner" aria-labelledby="liner-h" className="scroll-mt-32">
        <div className="mb-3 flex flex-wrap items-end justify-between gap-2">
          <h2 id="liner-h" className="text-xl font-semibold">
            Liner gauging
          </h2>
          <p className="text-sm text-ink-soft">
            Nominal bore <span className="num">{formatFixed(profile.boreMm, 2)} mm</span> · wear limit <span className="num">{formatFixed(profile.linerWearLimitMm, 2)} mm</span> ·
            ovality limit <span className="num">{formatFixed(profile.ovalityLimitMm, 2)} mm</span>
          </p>
        </div>
        <p className="mb-3 text-sm text-ink-soft">
          Enter moves down the column, then to the top of the next direction.{" "}
          {analysis.correction.applied
            ? `Wear is shown at 20 °C (readings × ${analysis.correction.factor.toFixed(6)} for the recorded temperatures).`
            : profile.temperatureCorrection
              ? "Enter both temperatures to refer the wear to 20 °C; until then it is shown as read."
              : "Temperature correction is off for this engine profile."}
        </p>
        <LinerGrid
          profile={profile}
          cells={form.cells}
          entryUnit={form.entryUnit}
          analysis={analysis}
          warnings={warnings}
          previous={ctx.previous && ctx.previous.linerId === ctx.liner.id ? ctx.previous : null}
          afterLastId={profile.rings.length ? ringInputId(profile.rings[0].position, "gap") : undefined}
          onChange={(key, text) => setForm((f) => ({ ...f, cells: { ...f.cells, [key]: { text, unit: f.entryUnit, confirmed: null } } }))}
          onConfirm={(key, confirmed) => setForm((f) => ({ ...f, cells: { ...f.cells, [key]: { ...f.cells[key], confirmed } } }))}
        />
        <p className="mt-2 text-sm tabular-nums">
          {analysis.maxWear ? (
            <>
              Maximum wear <strong>{formatFixed(analysis.maxWear.wearMm, 2)} mm</strong> at {profile.stations.find((s) => s.key === analysis.maxWear!.stationKey)?.label} (
              {profile.axes.find((a) => a.key === analysis.maxWear!.axisKey)?.label.toLowerCase()}, depth {formatFixed(analysis.maxWear.depthMm, 0)} mm)
            </>
          ) : (
            "No readings yet."
          )}
          {analysis.maxOvality ? (
            <>
              {" "}
              · maximum ovality <strong>{formatFixed(analysis.maxOvality.ovalityMm, 2)} mm</strong> at{" "}
              {profile.stations.find((s) => s.key === analysis.maxOvality!.stationKey)?.label}
            </>
          ) : null}
        </p>
      </section>

      <section id="rings" aria-labelledby="rings-h" className="scroll-mt-32">
        <h2 id="rings-h" className="mb-3 text-xl font-semibold">
          Piston rings
        </h2>
        <RingTable
          profile={profile}
          rings={form.rings}
          unit={form.entryUnit}
          onChange={(position, patch) =>
            setForm((f) => ({ ...f, rings: { ...f.rings, [position]: { ...ringInUnit(f.rings[position] ?? emptyRing, f.entryUnit), ...patch } } }))
          }
        />
      </section>

      <section id="checklist" aria-labelledby="checklist-h" className="scroll-mt-32">
        <h2 id="checklist-h" className="mb-3 text-xl font-semibold">
          Overhaul checklist
        </h2>
        <ChecklistForm profile={profile} checklist={form.checklist} onChange={(update) => setForm((f) => ({ ...f, checklist: update(f.checklist) }))} />
      </section>

      <section id="photos" aria-labelledby="photos-h" className="scroll-mt-32">
        <h2 id="photos-h" className="mb-3 text-xl font-semibold">
          Photos
        </h2>
        <PhotoPanel inspectionId={initial.id} initial={initial.photos} profile={profile} editable />
      </section>

      <section id="submit" aria-labelledby="submit-h" className="scroll-mt-32 rounded-lg border border-ink-line bg-paper-raised p-4">
        <h2 id="submit-h" className="text-xl font-semibold">
          Submit for approval
        </h2>
        {problems.length ? (
          <>
            <p className="mt-1 text-sm text-ink-soft">Before the chief engineer can approve this record:</p>
            <ul className="mt-2 space-y-1 text-sm">
              {problems.map((p) => (
                <li key={p.field + p.message} className="flex gap-2">
                  <span aria-hidden="true">○</span>
                  <span>{p.message}</span>
                </li>
              ))}
            </ul>
          </>
        ) : (
          <p className="mt-1 font-medium text-steady">✓ Complete: every reading, ring and checklist item is in.</p>
        )}
        {submitError ? (
          <div role="alert" className="mt-3 rounded-md border border-caution bg-caution-tint p-3 text-sm font-medium text-caution">
            {typeof submitError === "string" ? submitError : submitError.map((p) => <p key={p.message}>⚠ {p.message}</p>)}
          </div>
        ) : null}
        {canSubmit ? (
          <Button type="button" size="lg" className="mt-4" disabled={problems.length > 0 || submitting || !!conflict} onClick={submit}>
            {submitting ? "Submitting…" : "Submit for approval"}
          </Button>
        ) : (
          <p className="mt-3 text-sm text-ink-faint">Your role cannot submit inspections.</p>
        )}
      </section>
    </div>
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
