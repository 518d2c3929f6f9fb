import { useMemo } from "react";
import { toWearProfile, type InspectionContext } from "@/lib/inspections/context";
import { toDraft, type FormState } from "@/lib/inspections/form";
import { checkHours, openCautions, readingChecks, submissionProblems } from "@/lib/inspections/rules";
import type { InspectionDto } from "@/lib/inspections/schemas";
import { analyseGauging, toGauging } from "@/lib/analysis/input";

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
    () => analyseGauging(wearProfile, toGauging(initial.id, draft.header, draft.readings), ctx.asFitted),
    [wearProfile, draft, initial.id, ctx.asFitted],
  );
  const checks = useMemo(() => readingChecks(ctx, draft), [ctx, draft]);
  const hours = useMemo(() => checkHours(ctx, draft.header), [ctx, draft.header]);
  const problems = useMemo(() => submissionProblems(ctx, draft), [ctx, draft]);
  const cautions = useMemo(() => openCautions(ctx, draft), [ctx, draft]);
  return { draft, analysis, checks, hours, problems, cautions };
}
