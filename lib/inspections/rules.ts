import { inspectionAnalysisInput, toGauging } from "@/lib/analysis/input";
import { gapLinerIncrease, normaliseClosedGap, ringState, type RingState } from "@/lib/rings/rings";
import { temperatureCorrection } from "@/lib/wear/correction";
import { checkGauging, checkLinerDiameter, checkRingValue, linerDiameterBounds, type Finding } from "@/lib/wear/plausibility";
import { formatMm } from "@/lib/units/length";
import { plainNumber } from "@/lib/units/parse-number";
import { cellKey, toWearProfile, type ContextProfile, type InspectionContext } from "./context";
import { lengthText } from "./form";
import type { ChecklistInput, InspectionDraft, RingReadingInput, TallyItem } from "./schemas";

/*
 * The rules of a good inspection record, pure, so the entry form shows them as the
 * engineer types and the server applies exactly the same ones on save and submit.
 * Two tiers: structural errors a correct client never sends (a station the profile
 * lacks) refuse a save; everything else is a problem that only blocks submission, so a
 * draft always keeps what was typed.
 */

export { checkHours, derivedLinerHours, expectedEngineHours, LINER_HOURS_TOLERANCE_H, linerHoursDiffer, type ExpectedHours, type HoursCheck, type Problem } from "./hours-rules";
import { checkHours, type Problem } from "./hours-rules";

/** Readings and rings that name a station, direction or ring the profile lacks: a save is refused. */
export function structuralErrors(profile: ContextProfile, draft: InspectionDraft): Problem[] {
  const out: Problem[] = [];
  const stations = new Set(profile.stations.map((s) => s.key));
  const axes = new Set(profile.axes.map((a) => a.key));
  draft.readings.forEach((r, i) => {
    if (!stations.has(r.stationKey)) {
      out.push({ field: `readings.${i}.stationKey`, message: `Station "${r.stationKey}" is not in the engine profile ${profile.name}.` });
    } else if (!axes.has(r.axisKey)) {
      out.push({ field: `readings.${i}.axisKey`, message: `Direction "${r.axisKey}" is not in the engine profile ${profile.name}.` });
    }
  });
  const rings = new Set(profile.rings.map((r) => r.position));
  draft.rings.forEach((r, i) => {
    if (!rings.has(r.position)) out.push({ field: `rings.${i}.position`, message: `Ring ${r.position} is not in the engine profile ${profile.name}.` });
  });
  return out;
}

/** The multiplier referring this inspection's readings to 20 °C (1 when it cannot be applied). */
export function correctionFactor(profile: ContextProfile, gaugeTempC: number | null, linerTempC: number | null): number {
  return temperatureCorrection(profile, gaugeTempC, linerTempC).factor;
}

/**
 * A closed gap read in a worn part of the liner, referred to a gauge ring of nominal bore: the
 * liner diameter where it was read is first referred to 20 °C with the inspection's factor
 * (gapLinerIncrease), as the server's checks do, then π × the increase comes off. Null when
 * either figure is missing or the diameter is refused as under the nominal bore.
 */
export function referredWornGap(boreMm: number, gapMm: number | null, linerDiameterMm: number | null, factor = 1): number | null {
  if (gapMm === null || linerDiameterMm === null) return null;
  const inc = gapLinerIncrease(boreMm, linerDiameterMm, factor);
  return inc.kind === "ok" ? normaliseClosedGap(gapMm, "liner_worn", inc.increaseMm).gapMm : null;
}

export type ReadingChecks = {
  /** Findings per cell (key "station|axis"): errors cannot be confirmed, warnings can. */
  cells: Map<string, Finding[]>;
  /** Findings about the whole gauging (every cell the same, directions swapped). */
  sheet: Finding[];
};

/** What the engineer typed for a stored reading, with its unit, as the messages quote it. */
export function typedReading(r: Pick<InspectionDraft["readings"][number], "diameterMm" | "enteredUnit">): string {
  return `${lengthText(r.diameterMm, r.enteredUnit)} ${r.enteredUnit}`;
}

/**
 * The plausibility checks of a gauging, per cell and for the whole sheet, against the
 * nominal bore, the hard limits and the same cell at the previous inspection of this liner,
 * all referred to 20 °C. When every cell holds the same value, that one warning stands in
 * for the per-cell warnings (errors stay), so the engineer reads the cause once.
 */
export function readingChecks(ctx: InspectionContext, draft: Pick<InspectionDraft, "header" | "readings">): ReadingChecks {
  const profile = toWearProfile(ctx.profile);
  const factor = correctionFactor(ctx.profile, draft.header.gaugeTempC, draft.header.linerTempC);
  const prev = ctx.previous && ctx.previous.linerId === ctx.liner.id ? ctx.previous : null;
  const prevFactor = prev ? correctionFactor(ctx.profile, prev.gaugeTempC, prev.linerTempC) : 1;
  const prevCells = (prev?.readings ?? []).map((r) => ({ stationKey: r.stationKey, axisKey: r.axisKey, diameterMm: r.diameterMm * prevFactor }));
  const prevMap = new Map(prevCells.map((r) => [cellKey(r.stationKey, r.axisKey), r.diameterMm]));
  const { asFittedReadings } = inspectionAnalysisInput(profile, toGauging("draft", draft.header, draft.readings), ctx.asFitted);
  const asFitted = new Map((asFittedReadings ?? []).map((r) => [cellKey(r.stationKey, r.axisKey), r.diameterMm]));
  const hoursSince = prev && Number.isFinite(draft.header.linerHours) ? draft.header.linerHours - prev.linerHours : null;
  const cells = new Map<string, Finding[]>();
  for (const r of draft.readings) {
    const key = cellKey(r.stationKey, r.axisKey);
    const found = checkLinerDiameter(r.diameterMm, {
      profile,
      stationKey: r.stationKey,
      axisKey: r.axisKey,
      typed: typedReading(r),
      correctionFactor: factor,
      previousMm: prevMap.get(key) ?? null,
      hoursSincePrevious: hoursSince,
      asFittedMm: asFitted.get(key) ?? null,
    });
    if (found.length) cells.set(key, found);
  }
  const sheet = checkGauging(
    profile,
    draft.readings.map((r) => ({ stationKey: r.stationKey, axisKey: r.axisKey, diameterMm: r.diameterMm * factor })),
    prevCells,
  );
  const same = sheet.find((f) => f.code === "same_value_everywhere");
  if (same) {
    for (const r of draft.readings) {
      const key = cellKey(r.stationKey, r.axisKey);
      cells.set(key, [...(cells.get(key) ?? []).filter((f) => f.level === "error"), same]);
    }
  }
  return { cells, sheet };
}

/** The warnings of one cell that the engineer may confirm (errors never can). */
export function confirmable(findings: readonly Finding[] | undefined): Finding[] {
  return (findings ?? []).filter((f) => f.level === "warning");
}

/** The text stored in `warning_confirmed`: the warnings the engineer saw and confirmed (at most 255 characters). */
export function warningText(findings: readonly Finding[]): string {
  const text = confirmable(findings)
    .map((w) => w.message)
    .join(" ");
  return text.length > 255 ? `${text.slice(0, 254)}…` : text;
}

/** The checks on one ring's typed values: gap and groove clearance within 0 … 5 × limit, the liner diameter of a worn-liner gap within the bore's bounds, and where the gap was measured. */
export function ringFindings(profile: ContextProfile, spec: ContextProfile["rings"][number], r: RingReadingInput | undefined): Finding[] {
  if (!r) return [];
  const out = [
    ...checkRingValue(r.closedGapMm, { what: "closed gap", limitMm: spec.gapLimitMm }),
    ...checkRingValue(r.grooveClearanceMm, { what: "groove clearance", limitMm: spec.grooveLimitMm }),
  ];
  if (r.closedGapMm != null && r.gapMeasuredIn === "liner_worn" && r.gapLinerDiameterMm != null) {
    const { minMm, maxMm } = linerDiameterBounds(profile);
    if (r.gapLinerDiameterMm < minMm || r.gapLinerDiameterMm > maxMm) {
      out.push({
        level: "error",
        code: "impossible_diameter",
        message: `A liner diameter of ${formatMm(r.gapLinerDiameterMm)} where the gap was measured cannot be right: this liner reads between ${formatMm(minMm)} and ${formatMm(maxMm)}.`,
      });
    }
  }
  return out;
}

export type TallyStatus = "incomplete" | "match" | "mismatch";

export function tallyStatus(item: Pick<TallyItem, "countIn" | "countOut">): TallyStatus {
  if (item.countIn == null || item.countOut == null) return "incomplete";
  return item.countIn === item.countOut ? "match" : "mismatch";
}

/** Every tool and rag taken in has come out: the crankcase may be closed. */
export function tallyComplete(checklist: Pick<ChecklistInput, "tally">): boolean {
  return checklist.tally.length > 0 && checklist.tally.every((t) => tallyStatus(t) === "match");
}

/** The rod nut pressure's relative difference from the profile's figure, when both are known. */
export function rodNutDeviation(profile: ContextProfile, bar: number | null): number | null {
  if (bar == null || profile.rodNutPressureBar == null || profile.rodNutPressureBar <= 0) return null;
  return (bar - profile.rodNutPressureBar) / profile.rodNutPressureBar;
}

/** Deviation beyond which the recorded rod nut pressure is a caution for the chief (common practice; the maker's manual governs). */
export const ROD_NUT_TOLERANCE = 0.02;

/** Deviation beyond which the rod nut pressure blocks submission, unless the profile sets its own (common practice). */
export const ROD_NUT_DEFAULT_BLOCK_PCT = 10;

/** The profile's blocking tolerance for the rod nut pressure, as a fraction. */
export function rodNutBlockTolerance(profile: Pick<ContextProfile, "rodNutTolerancePct">): number {
  const pct = profile.rodNutTolerancePct;
  return (pct != null && Number.isFinite(pct) && pct > 0 ? pct : ROD_NUT_DEFAULT_BLOCK_PCT) / 100;
}

/**
 * The rod nut tightening pressure against the profile's figure: beyond the profile's
 * tolerance (±10 % unless it sets its own) an error that blocks submission, since a nut
 * tightened to the wrong pressure can come loose or overstretch the stud; beyond 2 % a
 * caution the chief sees. Null when it matches or cannot be judged.
 */
export function rodNutCheck(profile: ContextProfile, bar: number | null): Finding | null {
  const dev = rodNutDeviation(profile, bar);
  if (dev === null || bar === null) return null;
  const block = rodNutBlockTolerance(profile);
  const pct = `${dev > 0 ? "+" : "−"}${Math.abs(dev * 100).toFixed(1)} %`;
  const figure = `${plainNumber(profile.rodNutPressureBar!)} bar`;
  if (Math.abs(dev) > block) {
    return {
      level: "error",
      code: "rod_nut_pressure_off",
      message: `Rod nut pressure ${plainNumber(bar)} bar is ${pct} from the profile's ${figure}, beyond the ±${(block * 100).toFixed(0)} % allowed. Check the pump gauge and the figure in the maker's manual, and tighten again to the right pressure before submitting.`,
    };
  }
  if (Math.abs(dev) > ROD_NUT_TOLERANCE) {
    return {
      level: "warning",
      code: "rod_nut_pressure_off",
      message: `Rod nut pressure ${plainNumber(bar)} bar is ${pct} from the profile's ${figure} (within the ±${(block * 100).toFixed(0)} % allowed). Check it against the maker's manual.`,
    };
  }
  return null;
}

export function checklistProblems(checklist: ChecklistInput, profile?: ContextProfile): Problem[] {
  const out: Problem[] = [];
  if (checklist.tally.length === 0) {
    out.push({ field: "checklist.tally", message: "List every tool and rag taken into the crankcase, with the counts in and out." });
  }
  checklist.tally.forEach((t, i) => {
    const name = t.label || `Tally item ${i + 1}`;
    const status = tallyStatus(t);
    if (status === "incomplete") {
      out.push({ field: `checklist.tally.${i}`, message: `${name}: enter the count taken in and the count brought out.` });
    } else if (status === "mismatch") {
      out.push({
        field: `checklist.tally.${i}`,
        message: `${name}: ${t.countIn} taken in, ${t.countOut} brought out. Find the difference before the crankcase is closed.`,
      });
    }
  });
  if (!checklist.closing.signedName || !checklist.closing.signedAt) {
    out.push({ field: "checklist.closing", message: "Sign the closing inspection with a name and the time." });
  }
  if (checklist.rodNutPressureBar == null) {
    out.push({ field: "checklist.rodNutPressureBar", message: "Record the piston rod nut tightening pressure." });
  } else if (profile) {
    const rod = rodNutCheck(profile, checklist.rodNutPressureBar);
    if (rod?.level === "error") out.push({ field: "checklist.rodNutPressureBar", message: rod.message });
  }
  if (!checklist.stuffingBox.done) out.push({ field: "checklist.stuffingBox", message: "Tick the stuffing box item when it is overhauled and checked." });
  if (!checklist.cylinderLubrication.done) {
    out.push({ field: "checklist.cylinderLubrication", message: "Tick the cylinder lubrication item when it is checked." });
  }
  return out;
}

/**
 * Everything that stands between a draft and submission, in the order of the form:
 * hours, every station in both directions, confirmed warnings, every ring, the checklist.
 */
export function submissionProblems(ctx: InspectionContext, draft: InspectionDraft): Problem[] {
  const out: Problem[] = [...structuralErrors(ctx.profile, draft), ...checkHours(ctx, draft.header).errors];
  const readings = new Map(draft.readings.map((r) => [cellKey(r.stationKey, r.axisKey), r]));
  const missing: string[] = [];
  for (const s of ctx.profile.stations) {
    for (const a of ctx.profile.axes) if (!readings.has(cellKey(s.key, a.key))) missing.push(`${s.label} ${a.label.toLowerCase()}`);
  }
  if (missing.length) {
    out.push({ field: "readings", message: `No reading yet at ${missing.length === 1 ? "" : `${missing.length} points: `}${missing.slice(0, 4).join(", ")}${missing.length > 4 ? ", …" : "."}` });
  }
  const checks = readingChecks(ctx, draft);
  const cellName = (key: string) => {
    const [stationKey, axisKey] = key.split("|");
    const st = ctx.profile.stations.find((s) => s.key === stationKey);
    const ax = ctx.profile.axes.find((a) => a.key === axisKey);
    return `${st?.label ?? stationKey} ${ax?.label.toLowerCase() ?? axisKey}`;
  };
  const asked = new Set<string>();
  for (const [key, list] of checks.cells) {
    for (const e of list.filter((f) => f.level === "error")) out.push({ field: `readings.${key}`, message: `${cellName(key)}: ${e.message}` });
    const warnings = confirmable(list);
    const r = readings.get(key);
    if (!warnings.length || !r || r.warningConfirmed) continue;
    if (warnings.length === 1 && warnings[0].code === "same_value_everywhere") {
      if (!asked.has(warnings[0].code)) out.push({ field: "readings", message: `Confirm or correct: ${warnings[0].message}` });
      asked.add(warnings[0].code);
      continue;
    }
    out.push({ field: `readings.${key}`, message: `${cellName(key)}: confirm or correct the warning (${warnings[0].message})` });
  }
  const rings = new Map(draft.rings.map((r) => [r.position, r]));
  for (const spec of ctx.profile.rings) {
    const r = rings.get(spec.position);
    if (!r || r.closedGapMm == null) out.push({ field: `rings.${spec.position}.closedGapMm`, message: `${spec.label}: enter the closed gap.` });
    else if (r.gapMeasuredIn == null) out.push({ field: `rings.${spec.position}.gapMeasuredIn`, message: `${spec.label}: say where the closed gap was measured (gauge ring, unworn or worn liner).` });
    if (!r || r.grooveClearanceMm == null) out.push({ field: `rings.${spec.position}.grooveClearanceMm`, message: `${spec.label}: enter the groove clearance.` });
    for (const e of ringFindings(ctx.profile, spec, r)) out.push({ field: `rings.${spec.position}`, message: `${spec.label}: ${e.message}` });
    if (r && r.gapMeasuredIn === "liner_worn") {
      const inc = gapLinerIncrease(ctx.profile.boreMm, r.gapLinerDiameterMm, correctionFactor(ctx.profile, draft.header.gaugeTempC, draft.header.linerTempC));
      if (inc.kind === "invalid") out.push({ field: `rings.${spec.position}.gapLinerDiameterMm`, message: `${spec.label}: ${inc.message}` });
    }
  }
  out.push(...checklistProblems(draft.checklist, ctx.profile));
  return out;
}

/**
 * What the chief should look at, though it does not block submission: warnings the engineer
 * confirmed as read, findings about the whole gauging, rings under their new range or at the
 * limit, a rod nut pressure off the profile's figure, running hours far from the log. The
 * sheet says "complete" only when this list and the problems are both empty.
 */
export function openCautions(ctx: InspectionContext, draft: InspectionDraft): Problem[] {
  const out: Problem[] = checkHours(ctx, draft.header).warnings.map((w) => ({ ...w }));
  const checks = readingChecks(ctx, draft);
  for (const f of checks.sheet) if (f.code !== "same_value_everywhere") out.push({ field: "readings", message: f.message });
  const seen = new Set<string>();
  for (const r of draft.readings) {
    const key = cellKey(r.stationKey, r.axisKey);
    if (!r.warningConfirmed || !confirmable(checks.cells.get(key)).length || seen.has(r.warningConfirmed)) continue;
    // One line for a confirmation shared by every cell (the same value everywhere).
    if (confirmable(checks.cells.get(key)).every((f) => f.code === "same_value_everywhere")) seen.add(r.warningConfirmed);
    const st = ctx.profile.stations.find((s) => s.key === r.stationKey);
    const ax = ctx.profile.axes.find((a) => a.key === r.axisKey);
    out.push({ field: `readings.${key}`, message: `${st?.label ?? r.stationKey} ${ax?.label.toLowerCase() ?? r.axisKey}: confirmed as read: ${r.warningConfirmed}` });
  }
  for (const spec of ctx.profile.rings) {
    const r = draft.rings.find((x) => x.position === spec.position);
    if (!r) continue;
    // A gap read in a worn part of the liner is judged as if in a gauge ring of nominal bore.
    // The liner diameter there is referred to 20 °C like the bore readings.
    const inc = gapLinerIncrease(ctx.profile.boreMm, r.gapLinerDiameterMm, correctionFactor(ctx.profile, draft.header.gaugeTempC, draft.header.linerTempC));
    const referred =
      r.closedGapMm != null && r.gapMeasuredIn === "liner_worn" && inc.kind === "ok"
        ? normaliseClosedGap(r.closedGapMm, "liner_worn", inc.increaseMm).gapMm
        : r.closedGapMm;
    const live = ringLive(spec, referred, r.grooveClearanceMm);
    for (const [what, state] of [
      ["closed gap", live.gap],
      ["groove clearance", live.groove],
    ] as const) {
      if (state === "at_or_over_limit" || state === "below_new_range") out.push({ field: `rings.${spec.position}`, message: `${spec.label}: ${what} ${RING_STATE_TEXT[state]}.` });
    }
  }
  const rod = rodNutCheck(ctx.profile, draft.checklist.rodNutPressureBar);
  if (rod?.level === "warning") out.push({ field: "checklist.rodNutPressureBar", message: rod.message });
  return out;
}

export type RingLive = { gap: RingState | null; groove: RingState | null };

/** Where a ring's typed values sit against the profile's new range and limit. */
export function ringLive(spec: ContextProfile["rings"][number], closedGapMm: number | null, grooveClearanceMm: number | null): RingLive {
  return {
    gap: closedGapMm == null ? null : ringState(closedGapMm, spec.gapNewMinMm, spec.gapNewMaxMm, spec.gapLimitMm),
    groove: grooveClearanceMm == null ? null : ringState(grooveClearanceMm, spec.grooveNewMinMm, spec.grooveNewMaxMm, spec.grooveLimitMm),
  };
}

export const RING_STATE_TEXT: Record<RingState, string> = {
  below_new_range: "under the new range — check",
  within_new_range: "within the new range",
  worn: "worn, under the limit",
  at_or_over_limit: "at or over the limit",
};
