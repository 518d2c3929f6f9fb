"use client";

import { useState } from "react";
import type { ContextProfile } from "@/lib/inspections/context";
import { parseDecimal, randomToken, type FormState } from "@/lib/inspections/form";
import { rodNutBlockTolerance, rodNutCheck, rodNutDeviation, tallyStatus } from "@/lib/inspections/rules";
import { formatFixed } from "@/lib/units/length";
import { cn } from "@/lib/utils";
import { SafetyCautions } from "./safety-cautions";
import { OverLimitMark, CautionMark } from "./marks";
import { ParsedEcho } from "./parsed-echo";

type Checklist = FormState["checklist"];

const count = (t: string): number | null => {
  const v = parseDecimal(t);
  return typeof v === "number" && Number.isInteger(v) && v >= 0 ? v : null;
};

/** An ISO instant as the value of a datetime-local input, in the device's time zone. */
function toLocalInput(iso: string): string {
  if (!iso) return "";
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return "";
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

const inputCls = "block min-h-12 w-full rounded-md border border-ink-line bg-paper-raised px-3";

/**
 * The overhaul's closing items: the crankcase tool and rag tally (the door may be
 * signed closed only when every count out equals the count in), the closing inspection
 * signature, the piston rod nut tightening pressure against the profile, and the
 * stuffing box and cylinder lubrication items.
 */
export function ChecklistForm({
  profile,
  checklist,
  readOnly,
  onChange,
}: {
  profile: ContextProfile;
  checklist: Checklist;
  readOnly?: boolean;
  onChange: (update: (c: Checklist) => Checklist) => void;
}) {
  const [newLabel, setNewLabel] = useState("");
  const statuses = checklist.tally.map((t) => tallyStatus({ countIn: count(t.countIn), countOut: count(t.countOut) }));
  const allMatch = checklist.tally.length > 0 && statuses.every((s) => s === "match");
  const expectedBar = profile.rodNutPressureBar ?? 1000;
  const pressure = parseDecimal(checklist.rodNutPressure, expectedBar);
  const dev = rodNutDeviation(profile, typeof pressure === "number" ? pressure : null);
  const rod = rodNutCheck(profile, typeof pressure === "number" ? pressure : null);
  const signed = !!(checklist.closingName.trim() && checklist.closingAt);

  const setTally = (i: number, patch: Partial<Checklist["tally"][number]>) =>
    onChange((c) => ({ ...c, tally: c.tally.map((t, j) => (j === i ? { ...t, ...patch } : t)) }));

  return (
    <div className="space-y-5">
      <SafetyCautions open />

      <section aria-labelledby="tally-h">
        <h3 id="tally-h" className="font-semibold">
          Crankcase tool and rag tally
        </h3>
        <p className="text-sm text-ink-soft">Count each kind of tool and rag as it goes in, and again as it comes out.</p>
        {/*
          One grid for every width: at a phone's width each item folds onto two lines (name and
          remove; in, out and the tally), so "still inside" stays on screen beside the counts.
        */}
        <div className="mt-2 rounded-lg border border-ink-line bg-paper-raised" role="group" aria-labelledby="tally-h">
          <div aria-hidden="true" className="hidden grid-cols-[minmax(0,1fr)_6rem_6rem_minmax(8rem,10rem)_3rem] gap-x-2 bg-paper-sunk px-3 py-2 text-left text-xs tracking-wide text-ink-soft uppercase sm:grid">
            <span>Tool or item</span>
            <span className="text-right">In</span>
            <span className="text-right">Out</span>
            <span>Tally</span>
            <span />
          </div>
          <ul className="divide-y divide-ink-line/70">
            {checklist.tally.map((t, i) => {
              const st = statuses[i];
              return (
                <li
                  key={t.key}
                  data-testid="tally-row"
                  className="grid grid-cols-[5.5rem_5.5rem_minmax(0,1fr)] items-center gap-x-2 gap-y-1 px-3 py-2 sm:grid-cols-[minmax(0,1fr)_6rem_6rem_minmax(8rem,10rem)_3rem] sm:py-1.5"
                >
                  <div className="col-span-2 sm:col-span-1">
                    <input aria-label={`Tool or item ${i + 1}`} className={inputCls} value={t.label} readOnly={readOnly} onChange={(e) => setTally(i, { label: e.target.value })} />
                  </div>
                  <div className="col-start-3 row-start-1 justify-self-end sm:col-start-5">
                    {readOnly ? null : (
                      <button
                        type="button"
                        className="min-h-12 min-w-12 rounded-md text-lg text-ink-soft hover:bg-paper-sunk"
                        aria-label={`Remove ${t.label || `item ${i + 1}`}`}
                        onClick={() => onChange((c) => ({ ...c, tally: c.tally.filter((_, j) => j !== i) }))}
                      >
                        ×
                      </button>
                    )}
                  </div>
                  <label className="block sm:col-start-2 sm:row-start-1">
                    <span className="text-sm text-ink-soft sm:sr-only">In</span>
                    <input
                      aria-label={`${t.label || `Item ${i + 1}`}: count taken in`}
                      inputMode="numeric"
                      className={cn(inputCls, "num text-right text-lg")}
                      value={t.countIn}
                      readOnly={readOnly}
                      onChange={(e) => setTally(i, { countIn: e.target.value })}
                    />
                  </label>
                  <label className="block sm:col-start-3 sm:row-start-1">
                    <span className="text-sm text-ink-soft sm:sr-only">Out</span>
                    <input
                      aria-label={`${t.label || `Item ${i + 1}`}: count brought out`}
                      inputMode="numeric"
                      className={cn(inputCls, "num text-right text-lg")}
                      value={t.countOut}
                      readOnly={readOnly}
                      onChange={(e) => setTally(i, { countOut: e.target.value })}
                    />
                  </label>
                  <div className="self-end pb-3 sm:col-start-4 sm:row-start-1 sm:self-center sm:pb-0" aria-live="polite">
                    {st === "match" ? (
                      <span className="font-medium text-steady">✓ all out</span>
                    ) : st === "mismatch" ? (
                      <span className="font-semibold text-limit" data-testid="tally-short">
                        <OverLimitMark />
                        {Math.abs((count(t.countIn) ?? 0) - (count(t.countOut) ?? 0))} {(count(t.countOut) ?? 0) < (count(t.countIn) ?? 0) ? "still inside" : "more out than in"}
                      </span>
                    ) : (
                      <span className="text-ink-soft">not counted</span>
                    )}
                  </div>
                </li>
              );
            })}
          </ul>
        </div>
        {readOnly ? null : (
          <form
            className="mt-2 flex flex-wrap gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              const label = newLabel.trim();
              if (!label) return;
              onChange((c) => ({ ...c, tally: [...c.tally, { key: `tally_${randomToken(10)}`, label, countIn: "", countOut: "" }] }));
              setNewLabel("");
            }}
          >
            <input aria-label="New tool or item" className={cn(inputCls, "max-w-sm flex-1")} placeholder="Add a tool or item…" value={newLabel} onChange={(e) => setNewLabel(e.target.value)} />
            <button type="submit" className="min-h-12 rounded-md border border-ink-line bg-paper-raised px-4 font-medium hover:border-signal">
              Add to tally
            </button>
          </form>
        )}
        <p className={cn("mt-2 text-sm font-medium", allMatch ? "text-steady" : "text-ink-soft")} role="status">
          {allMatch ? "✓ Every count out equals the count in." : "The closing inspection can be signed when every count out equals the count in."}
        </p>
      </section>

      <section aria-labelledby="closing-h" className="rounded-lg border border-ink-line bg-paper-raised p-3">
        <h3 id="closing-h" className="font-semibold">
          Closing inspection
        </h3>
        <p className="text-sm text-ink-soft">Looked inside once more: no tools, rags or loose parts; then the door is closed.</p>
        <div className="mt-2 grid gap-3 sm:grid-cols-[1fr_auto_auto] sm:items-end">
          <div>
            <label htmlFor="closing-name" className="block text-sm font-medium text-ink-soft">
              Signed by (name)
            </label>
            <input
              id="closing-name"
              className={cn(inputCls, "mt-1")}
              value={checklist.closingName}
              readOnly={readOnly || (!allMatch && !signed)}
              onChange={(e) => onChange((c) => ({ ...c, closingName: e.target.value }))}
            />
          </div>
          <div>
            <label htmlFor="closing-at" className="block text-sm font-medium text-ink-soft">
              Time
            </label>
            <input
              id="closing-at"
              type="datetime-local"
              className={cn(inputCls, "num mt-1")}
              value={toLocalInput(checklist.closingAt)}
              readOnly={readOnly || (!allMatch && !signed)}
              onChange={(e) => onChange((c) => ({ ...c, closingAt: e.target.value ? new Date(e.target.value).toISOString() : "" }))}
            />
          </div>
          {readOnly ? null : (
            <button
              type="button"
              disabled={!allMatch || !checklist.closingName.trim()}
              className="min-h-12 rounded-md border border-signal bg-signal px-4 font-medium text-white disabled:cursor-not-allowed disabled:opacity-50"
              onClick={() => onChange((c) => ({ ...c, closingAt: new Date().toISOString() }))}
            >
              Sign now
            </button>
          )}
        </div>
        {!allMatch ? <p className="mt-2 text-sm font-medium text-limit"><OverLimitMark />Not yet: the tally does not match, so the crankcase must not be closed.</p> : null}
        {signed && allMatch ? <p className="mt-2 text-sm font-medium text-steady">✓ Signed by {checklist.closingName.trim()}.</p> : null}
      </section>

      <section aria-labelledby="rodnut-h" className="rounded-lg border border-ink-line bg-paper-raised p-3">
        <h3 id="rodnut-h" className="font-semibold">
          Piston rod nut tightening pressure
        </h3>
        <div className="mt-2 grid gap-3 sm:grid-cols-[12rem_1fr] sm:items-center">
          <div className="relative">
            <input
              aria-label="Rod nut tightening pressure in bar"
              inputMode="decimal"
              className={cn(inputCls, "num pr-12 text-right text-lg")}
              value={checklist.rodNutPressure}
              readOnly={readOnly}
              onChange={(e) => onChange((c) => ({ ...c, rodNutPressure: e.target.value }))}
            />
            <span className="pointer-events-none absolute top-1/2 right-3 -translate-y-1/2 text-ink-faint">bar</span>
          </div>
          <div className="text-sm tabular-nums">
            {readOnly ? null : (
              <ParsedEcho text={checklist.rodNutPressure} expected={expectedBar} unit="bar" decimals={1} onChoose={(t) => onChange((c) => ({ ...c, rodNutPressure: t }))} />
            )}
            {profile.rodNutPressureBar == null ? (
              <p className="text-ink-faint">The engine profile has no rod nut pressure; use the maker&apos;s manual.</p>
            ) : pressure === "invalid" ? (
              <p className="font-medium text-caution">⚠ Not a number yet: not saved.</p>
            ) : dev === null ? (
              <p className="text-ink-faint">
                Profile: {formatFixed(profile.rodNutPressureBar, 0)} bar, within ±{formatFixed(rodNutBlockTolerance(profile) * 100, 0)} % (maker&apos;s manual governs).
              </p>
            ) : rod?.level === "error" ? (
              <p role="alert" className="font-semibold text-limit" data-testid="rodnut-error">
                <OverLimitMark />
                {rod.message}
              </p>
            ) : rod ? (
              <p className="font-semibold text-caution" data-testid="rodnut-warning">
                <CautionMark />
                {rod.message}
              </p>
            ) : (
              <p className="text-steady">
                ✓ Matches the profile&apos;s {formatFixed(profile.rodNutPressureBar, 0)} bar ({dev > 0 ? "+" : ""}
                {formatFixed(dev * 100, 1)} %).
              </p>
            )}
          </div>
        </div>
        <p className="mt-3 rounded-md border border-ink-line bg-paper p-2 text-sm" data-testid="rodnut-caution">
          <span aria-hidden="true">⚠ </span>Hydraulic tightening tools work at up to about 1500 bar: never stand in line with the stud, wear eye protection, rope
          off the area and relieve the pressure before disconnecting a hose. The pressure and the procedure are the maker&apos;s: follow the engine
          maker&apos;s manual and your company&apos;s safety system.
        </p>
      </section>

      {(
        [
          ["stuffingBox", "Piston rod stuffing box overhauled and checked", "stuffingBoxDone", "stuffingBoxNote"],
          ["lubrication", "Cylinder lubrication checked: quills, feed rate, oil", "lubricationDone", "lubricationNote"],
        ] as const
      ).map(([id, label, doneKey, noteKey]) => (
        <section key={id} className="rounded-lg border border-ink-line bg-paper-raised p-3">
          <label className="flex min-h-12 cursor-pointer items-center gap-3">
            <input
              type="checkbox"
              className="h-6 w-6 accent-[#0a5c73]"
              checked={checklist[doneKey]}
              disabled={readOnly}
              onChange={(e) => onChange((c) => ({ ...c, [doneKey]: e.target.checked }))}
            />
            <span className="font-semibold">{label}</span>
          </label>
          <input
            aria-label={`${label}: note`}
            className={cn(inputCls, "mt-2")}
            placeholder="Note (optional)"
            value={checklist[noteKey]}
            readOnly={readOnly}
            onChange={(e) => onChange((c) => ({ ...c, [noteKey]: e.target.value }))}
          />
        </section>
      ))}
    </div>
  );
}
