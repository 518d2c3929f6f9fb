"use client";

import { useRef } from "react";
import { cellKey, type ContextProfile, type PreviousInspection } from "@/lib/inspections/context";
import { expectedIn, lengthText, parseDecimal, toMm, type CellEntry } from "@/lib/inspections/form";
import { confirmable, warningText, type ReadingChecks } from "@/lib/inspections/rules";
import { formatFixed, type LengthUnit } from "@/lib/units/length";
import type { InspectionAnalysis } from "@/lib/wear/inspection";
import { WEAR_RULES } from "@/lib/wear/types";
import { cn } from "@/lib/utils";
import { OverLimitMark, CautionMark, OkMark } from "./marks";
import { ParsedEcho } from "./parsed-echo";

export type GridProps = {
  profile: ContextProfile;
  cells: Record<string, CellEntry>;
  entryUnit: LengthUnit;
  analysis: InspectionAnalysis;
  checks: ReadingChecks;
  previous: PreviousInspection | null;
  readOnly?: boolean;
  onChange: (key: string, text: string) => void;
  onConfirm: (key: string, confirmed: string | null) => void;
  /** Confirms (or, with null, withdraws) one warning that stands for every cell, such as "every cell holds the same value". */
  onConfirmAll?: (keys: string[], confirmed: string | null) => void;
  /** Exchanges the two directions' typed values at every station. */
  onSwapDirections?: () => void;
  /** Where Enter goes after the last cell of the last column. */
  afterLastId?: string;
};

const mm2 = (v: number | null | undefined) => formatFixed(v, 2);

/** What the input shows: the text as typed, or — when the sheet's unit was switched since — the value converted. */
export function cellDisplayText(cell: CellEntry | undefined, unit: LengthUnit): string {
  if (!cell) return "";
  if (cell.unit === unit) return cell.text;
  const v = parseDecimal(cell.text);
  return typeof v === "number" ? lengthText(toMm(v, cell.unit), unit) : cell.text;
}

export const cellInputId = (station: number, axis: number) => `cell-${station}-${axis}`;

/**
 * The liner gauging sheet: one row per station (with its depth), one column per
 * direction. Enter moves down the column and then to the top of the next, the order a
 * gauge is read. Under each value: the wear at 20 °C against the limit in words, the
 * plausibility warnings to confirm or correct, and last time's reading.
 */
export function LinerGrid({ profile, cells, entryUnit, analysis, checks, previous, readOnly, onChange, onConfirm, onConfirmAll, onSwapDirections, afterLastId }: GridProps) {
  const root = useRef<HTMLDivElement>(null);
  const stations = profile.stations;
  const axes = profile.axes;
  const limit = profile.linerWearLimitMm;
  const prevMap = new Map((previous?.readings ?? []).map((r) => [cellKey(r.stationKey, r.axisKey), r.diameterMm]));
  const cellResult = new Map(analysis.cells.map((c) => [cellKey(c.stationKey, c.axisKey), c]));

  function onKeyDown(e: React.KeyboardEvent<HTMLInputElement>, si: number, ai: number) {
    if (e.key !== "Enter") return;
    e.preventDefault();
    const next = si + 1 < stations.length ? cellInputId(si + 1, ai) : ai + 1 < axes.length ? cellInputId(0, ai + 1) : afterLastId;
    if (!next) return;
    const el = document.getElementById(next) as HTMLInputElement | null;
    el?.focus();
    el?.select?.();
  }

  const same = checks.sheet.find((f) => f.code === "same_value_everywhere");
  const sameKeys = same ? [...checks.cells.entries()].filter(([, list]) => list.some((f) => f.code === "same_value_everywhere")).map(([k]) => k) : [];
  const sameText = same ? warningText([same]) : null;
  const sameConfirmed = !!same && sameKeys.length > 0 && sameKeys.every((k) => cells[k]?.confirmed === sameText);
  const swapped = checks.sheet.find((f) => f.code === "directions_swapped");

  return (
    <>
    {same || swapped ? (
      <div className="mb-3 max-w-5xl space-y-2" data-testid="sheet-findings">
        {same ? (
          <div role="alert" className={cn("rounded-lg border-2 p-3", sameConfirmed ? "border-ink-line bg-paper-raised" : "border-caution bg-caution-tint")}>
            <p className={sameConfirmed ? "text-ink-soft" : "font-medium text-caution"}>
              {sameConfirmed ? <OkMark /> : <CautionMark />}
              {same.message}
            </p>
            {readOnly || !onConfirmAll ? null : sameConfirmed ? (
              <button type="button" className="mt-1 min-h-11 text-sm font-medium text-signal underline" onClick={() => onConfirmAll(sameKeys, null)}>
                Confirmed as read — undo
              </button>
            ) : (
              <button
                type="button"
                className="mt-2 min-h-12 rounded-md border border-ink-line bg-paper-raised px-3 text-sm font-medium text-ink hover:border-signal"
                onClick={() => onConfirmAll(sameKeys, sameText)}
              >
                The readings are right — confirm once for every cell
              </button>
            )}
          </div>
        ) : null}
        {swapped ? (
          <div role="alert" className="rounded-lg border-2 border-caution bg-caution-tint p-3">
            <p className="font-medium text-caution">
              <CautionMark />
              {swapped.message}
            </p>
            {readOnly || !onSwapDirections ? null : (
              <button
                type="button"
                className="mt-2 min-h-12 rounded-md border border-ink-line bg-paper-raised px-3 text-sm font-semibold text-ink hover:border-signal"
                onClick={onSwapDirections}
              >
                Swap {axes[0].label.toLowerCase()} and {axes[1].label.toLowerCase()}
              </button>
            )}
          </div>
        ) : null}
      </div>
    ) : null}
    <div ref={root} role="group" aria-label="Liner gauging sheet" className="max-w-5xl rounded-lg border border-ink-line bg-paper-raised">
      <div className="hidden grid-cols-[minmax(9rem,1fr)_minmax(12rem,1.5fr)_minmax(12rem,1.5fr)_minmax(8rem,0.9fr)] gap-x-3 border-b border-ink-line bg-paper-sunk px-3 py-2 text-xs font-medium tracking-wide text-ink-soft uppercase md:grid">
        <div>Station · depth</div>
        {axes.map((a) => (
          <div key={a.key}>
            {a.label} ({entryUnit})
          </div>
        ))}
        <div>Ovality</div>
      </div>
      <ol className="divide-y divide-ink-line/70">
        {stations.map((s, si) => {
          const ov = analysis.ovality.find((o) => o.stationKey === s.key)?.ovalityMm ?? null;
          const ovOver = ov !== null && ov >= profile.ovalityLimitMm;
          const ovNear = ov !== null && !ovOver && ov >= WEAR_RULES.watchFractionOfLimit * profile.ovalityLimitMm;
          return (
            <li
              key={s.key}
              className="grid grid-cols-2 gap-x-3 gap-y-2 px-3 py-3 md:grid-cols-[minmax(9rem,1fr)_minmax(12rem,1.5fr)_minmax(12rem,1.5fr)_minmax(8rem,0.9fr)]"
            >
              <div className="col-span-2 flex items-baseline justify-between gap-2 md:col-span-1 md:block">
                <div className="font-semibold">
                  <span className="font-mono">{s.key}</span> <span className="font-normal text-ink-soft">{s.label}</span>
                </div>
                <div className="num text-sm text-ink-faint">depth {formatFixed(s.depthMm, 0)} mm</div>
              </div>
              {axes.map((a, ai) => {
                const key = cellKey(s.key, a.key);
                const cell = cells[key];
                const text = cellDisplayText(cell, entryUnit);
                const parsed = cell ? parseDecimal(cell.text) : null;
                const bad = parsed === "invalid" || (typeof parsed === "number" && parsed <= 0);
                const result = cellResult.get(key);
                const findings = checks.cells.get(key) ?? [];
                const errors = findings.filter((f) => f.level === "error");
                // A warning standing for every cell is shown once, above the grid.
                const ws = confirmable(findings).filter((f) => f.code !== "same_value_everywhere");
                const wText = ws.length ? warningText(ws) : null;
                const confirmed = !!cell?.confirmed && cell.confirmed === wText;
                const wear = result?.wearMm ?? null;
                const over = wear !== null && result?.usable && wear >= limit;
                const near = wear !== null && result?.usable && !over && wear >= WEAR_RULES.watchFractionOfLimit * limit;
                const prev = prevMap.get(key);
                const inputId = cellInputId(si, ai);
                const helpId = `${inputId}-help`;
                return (
                  <div key={a.key} className="min-w-0">
                    <label htmlFor={inputId} className="mb-1 block text-xs font-medium text-ink-soft md:sr-only">
                      {a.label} ({entryUnit})
                    </label>
                    <input
                      id={inputId}
                      data-cell={key}
                      type="text"
                      inputMode="decimal"
                      enterKeyHint="next"
                      autoComplete="off"
                      spellCheck={false}
                      readOnly={readOnly}
                      aria-label={`${s.label}, ${a.label}, in ${entryUnit === "mm" ? "millimetres" : "inches"}`}
                      aria-describedby={helpId}
                      aria-invalid={bad || errors.length > 0 || (ws.length > 0 && !confirmed) || undefined}
                      value={text}
                      onChange={(e) => onChange(key, e.target.value)}
                      onKeyDown={(e) => onKeyDown(e, si, ai)}
                      onFocus={(e) => e.currentTarget.select()}
                      className={cn(
                        "num block min-h-12 w-full rounded-md border bg-paper-raised px-3 text-right text-lg text-ink",
                        "focus:border-signal focus:ring-2 focus:ring-signal/30 focus:outline-none",
                        bad || errors.length ? "border-2 border-limit" : ws.length && !confirmed ? "border-caution" : "border-ink-line",
                      )}
                    />
                    <div id={helpId} className="mt-1 space-y-1 text-sm leading-snug" aria-live="polite">
                      {cell && !readOnly ? (
                        <ParsedEcho
                          text={text}
                          expected={expectedIn(profile.boreMm, entryUnit)}
                          unit={entryUnit}
                          decimals={entryUnit === "mm" ? 3 : 4}
                          onChoose={(t) => onChange(key, t)}
                        />
                      ) : null}
                      {bad ? (
                        <p className="font-medium text-caution">
                          <span aria-hidden="true">⚠ </span>Not a diameter — kept on this device, not saved. Type digits and a decimal point.
                        </p>
                      ) : null}
                      {errors.length && !bad ? (
                        <div role="alert" className="rounded border-2 border-limit p-2" data-testid="cell-error">
                          {errors.map((f) => (
                            <p key={f.code} className="font-medium text-limit">
                              <OverLimitMark />
                              {f.message}
                            </p>
                          ))}
                          <p className="mt-1 text-ink-soft">This cannot be confirmed: retype the reading.</p>
                        </div>
                      ) : null}
                      {result && !bad && !errors.length ? (
                        <p className={cn("tabular-nums", over ? "font-semibold text-limit" : near ? "font-medium text-caution" : "text-ink-soft")}>
                          {over ? <OverLimitMark /> : near ? <CautionMark /> : null}
                          wear {mm2(wear)} mm
                          {result.usable ? (
                            (wear ?? 0) >= 0.005 ? (
                              <>
                                {" "}
                                · {over ? "over the" : `${Math.round(((wear ?? 0) / limit) * 100)} % of the`} {mm2(limit)} mm limit
                              </>
                            ) : null
                          ) : (
                            " · implausible, not counted"
                          )}
                          {cell && cell.unit === "in" ? <span className="block text-ink-faint">= {formatFixed(result.rawMm, 3)} mm as read</span> : null}
                        </p>
                      ) : null}
                      {ws.length && !bad && !errors.length ? (
                        <div className={cn("rounded border p-2", confirmed ? "border-ink-line bg-paper" : "border-caution bg-caution-tint")}>
                          {ws.map((w) => (
                            <p key={w.code} className={confirmed ? "text-ink-soft" : "font-medium text-caution"}>
                              {confirmed ? <OkMark /> : <CautionMark />}
                              {w.message}
                            </p>
                          ))}
                          {readOnly ? null : confirmed ? (
                            <button type="button" className="mt-1 min-h-11 text-sm font-medium text-signal underline" onClick={() => onConfirm(key, null)}>
                              Confirmed as read — undo
                            </button>
                          ) : (
                            <button
                              type="button"
                              className="mt-2 min-h-12 w-full rounded-md border border-ink-line bg-paper-raised px-3 text-sm font-medium text-ink hover:border-signal"
                              onClick={() => onConfirm(key, wText)}
                            >
                              The reading is right — confirm
                            </button>
                          )}
                        </div>
                      ) : null}
                      {prev !== undefined ? (
                        <p className="num text-xs text-ink-faint">
                          last time {entryUnit === "mm" ? `${formatFixed(prev, 2)} mm` : `${formatFixed(prev / 25.4, 4)} in`}
                        </p>
                      ) : null}
                    </div>
                  </div>
                );
              })}
              <div className="col-span-2 text-sm md:col-span-1 md:pt-3">
                <span className="text-ink-faint md:hidden">Ovality </span>
                {ov === null ? (
                  <span className="text-ink-faint">—</span>
                ) : (
                  <span className={cn("tabular-nums", ovOver ? "font-semibold text-limit" : ovNear ? "font-medium text-caution" : "")}>
                    {ovOver ? <OverLimitMark /> : ovNear ? <CautionMark /> : null}
                    {mm2(ov)} mm
                    <span className="text-ink-faint"> {ovOver ? "over the" : "of"} {mm2(profile.ovalityLimitMm)} mm limit</span>
                  </span>
                )}
              </div>
            </li>
          );
        })}
      </ol>
    </div>
    </>
  );
}
