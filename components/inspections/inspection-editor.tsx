"use client";

import Link from "next/link";
import { formatFixed, type LengthUnit } from "@/lib/units/length";
import type { InspectionContext } from "@/lib/inspections/context";
import { emptyRing, ringInUnit, swapDirections, type FormState } from "@/lib/inspections/form";
import type { InspectionDto } from "@/lib/inspections/schemas";
import { ChecklistForm } from "./checklist-form";
import { ConflictPanel } from "./conflict-panel";
import { HeaderFields } from "./header-fields";
import { LinerGrid } from "./liner-grid";
import { PhotoPanel } from "./photo-panel";
import { ringInputId, RingTable } from "./ring-table";
import { SheetToolbar } from "./sheet-toolbar";
import { SubmitPanel } from "./submit-panel";
import { useDraftAutosave } from "./use-draft-autosave";
import { useSheetAnalysis } from "./use-sheet-analysis";

/**
 * The gauging sheet of one draft: header, liner grid, rings, checklist and photos,
 * autosaved (to the device at once, to the server a moment later), with the live
 * checks the server applies on submit shown as the engineer types.
 */
export function InspectionEditor({ initial, ctx, canSubmit }: { initial: InspectionDto; ctx: InspectionContext; canSubmit: boolean }) {
  const { form, setForm, status, conflict, resolveConflict, showConflict, invalid, flush, forget, restored, revision } = useDraftAutosave(initial, ctx.profile);
  const profile = ctx.profile;
  const { draft, analysis, checks, hours, problems, cautions } = useSheetAnalysis(form, initial, ctx);

  const setHeader = (patch: Partial<FormState["header"]>) => setForm((f) => ({ ...f, header: { ...f.header, ...patch } }));
  const filled = draft.readings.length;
  const totalCells = profile.stations.length * profile.axes.length;

  // The switch applies to the whole sheet: ring lengths already typed are converted with it.
  const setUnit = (u: LengthUnit) =>
    setForm((f) => ({ ...f, entryUnit: u, rings: Object.fromEntries(Object.entries(f.rings).map(([k, r]) => [k, ringInUnit(r, u)])) }));

  return (
    <div className="space-y-8">
      <SheetToolbar status={status} invalidCount={invalid.length} filled={filled} totalCells={totalCells} entryUnit={form.entryUnit} onUnit={setUnit} />

      {restored && status.kind !== "conflict" ? (
        <p className="rounded-md border border-ink-line bg-paper-sunk p-3 text-sm">Unsaved entries from this device were restored.</p>
      ) : null}

      {conflict ? <ConflictPanel conflict={conflict} status={status} mine={draft} ctx={ctx} inspectionId={initial.id} resolveConflict={resolveConflict} /> : null}

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

      <HeaderFields header={form.header} setHeader={setHeader} ctx={ctx} hours={hours} saved={initial.draft.header} />

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
          checks={checks}
          previous={ctx.previous && ctx.previous.linerId === ctx.liner.id ? ctx.previous : null}
          afterLastId={profile.rings.length ? ringInputId(profile.rings[0].position, "gap") : undefined}
          onChange={(key, text) => setForm((f) => ({ ...f, cells: { ...f.cells, [key]: { text, unit: f.entryUnit, confirmed: null } } }))}
          onConfirm={(key, confirmed) => setForm((f) => ({ ...f, cells: { ...f.cells, [key]: { ...f.cells[key], confirmed } } }))}
          onConfirmAll={(keys, confirmed) =>
            setForm((f) => ({ ...f, cells: { ...f.cells, ...Object.fromEntries(keys.filter((k) => f.cells[k]).map((k) => [k, { ...f.cells[k], confirmed }])) } }))
          }
          onSwapDirections={() => setForm((f) => swapDirections(f, profile))}
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
          correctionFactor={analysis.correction.factor}
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

      <SubmitPanel
        inspectionId={initial.id}
        problems={problems}
        cautions={cautions}
        canSubmit={canSubmit}
        blocked={!!conflict}
        flush={flush}
        forget={forget}
        revision={revision}
        onConflict={showConflict}
      />
    </div>
  );
}
