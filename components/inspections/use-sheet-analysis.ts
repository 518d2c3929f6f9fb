import { useMemo } from "react";
import { toWearProfile, type InspectionContext } from "@/lib/inspections/context";
import { toDraft, type FormState } from "@/lib/inspections/form";
import { checkHours, readingWarnings, submissionProblems } from "@/lib/inspections/rules";
import type { InspectionDto } from "@/lib/inspections/schemas";
import { analyseInspection } from "@/lib/wear/inspection";

/**
 * What the sheet shows beside what is typed: the draft as the server would store it, the
 * live wear analysis, per-cell warnings, the hours check and what still blocks submission.
 * Recomputed only when the form changes.
 */
export function useSheetAnalysis(form: FormState, initial: InspectionDto, ctx: InspectionContext) {
  const profile = ctx.profile;
  const { draft } = useMemo(() => toDraft(form, profile, initial.draft.header), [form, profile, initial.draft.header]);
  const wearProfile = useMemo(() => toWearProfile(profile), [profile]);
  const analysis = useMemo(
    () =>
      analyseInspection(
        wearProfile,
        {
          id: String(initial.id),
          date: draft.header.inspectedOn,
          engineHours: draft.header.engineHours,
          linerHours: draft.header.linerHours,
          gaugeTempC: draft.header.gaugeTempC,
          linerTempC: draft.header.linerTempC,
          readings: draft.readings,
        },
        ctx.asFitted ?? undefined,
      ),
    [wearProfile, draft, initial.id, ctx.asFitted],
  );
  const warnings = useMemo(() => readingWarnings(ctx, draft), [ctx, draft]);
  const hours = useMemo(() => checkHours(ctx, draft.header), [ctx, draft.header]);
  const problems = useMemo(() => submissionProblems(ctx, draft), [ctx, draft]);
  return { draft, analysis, warnings, hours, problems };
}
