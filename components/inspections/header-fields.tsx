"use client";

import type { InspectionContext } from "@/lib/inspections/context";
import { parseDecimal, type FormState } from "@/lib/inspections/form";
import { derivedLinerHours, linerHoursDiffer, type HoursCheck } from "@/lib/inspections/rules";
import { day } from "@/lib/format";
import { formatRunningHours } from "@/lib/wear/calendar";
import { cn } from "@/lib/utils";
import { ParsedEcho } from "./parsed-echo";
import { Field, fieldCls, Messages } from "./sheet-fields";

/** The sheet's header section: date, engine and liner hours (with the derived liner hours), crew, temperatures, notes. */
export function HeaderFields({
  header,
  setHeader,
  ctx,
  hours,
  saved,
}: {
  header: FormState["header"];
  /** The header as last saved: its hours settle a typed "65,950" the way the draft reads it. */
  saved: { engineHours: number; linerHours: number };
  setHeader: (patch: Partial<FormState["header"]>) => void;
  ctx: InspectionContext;
  hours: HoursCheck;
}) {
  const engineScale = saved.engineHours || null;
  const linerScale = saved.linerHours || null;
  const engineParsed = parseDecimal(header.engineHours, engineScale);
  const derived = typeof engineParsed === "number" ? derivedLinerHours(ctx.liner, engineParsed) : null;
  const linerParsed = parseDecimal(header.linerHours, linerScale);
  const linerDiffers = derived !== null && typeof linerParsed === "number" && linerHoursDiffer(derived, linerParsed);

  return (
    <section id="hours" aria-labelledby="hours-h" className="scroll-mt-32">
      <h2 id="hours-h" className="mb-3 text-xl font-semibold">
        Date, hours and temperatures
      </h2>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <Field id="h-date" label="Date">
          <input id="h-date" type="date" className={fieldCls} value={header.inspectedOn} onChange={(e) => setHeader({ inspectedOn: e.target.value })} />
        </Field>
        <Field id="h-engine" label="Engine running hours" unit="h">
          <input
            id="h-engine"
            inputMode="decimal"
            autoComplete="off"
            className={cn(fieldCls, "num text-right text-lg")}
            value={header.engineHours}
            aria-invalid={hours.errors.some((e) => e.field === "header.engineHours") || undefined}
            onChange={(e) => setHeader({ engineHours: e.target.value })}
          />
          <ParsedEcho text={header.engineHours} expected={engineScale} unit="h" decimals={1} onChoose={(engineHours) => setHeader({ engineHours })} />
        </Field>
        <Field id="h-liner" label="Liner hours" unit="h">
          <input
            id="h-liner"
            inputMode="decimal"
            autoComplete="off"
            className={cn(fieldCls, "num text-right text-lg")}
            value={header.linerHours}
            onChange={(e) => setHeader({ linerHours: e.target.value })}
          />
          <ParsedEcho text={header.linerHours} expected={linerScale} unit="h" decimals={1} onChoose={(linerHours) => setHeader({ linerHours })} />
        </Field>
        <Field id="h-crew" label="Crew">
          <input id="h-crew" autoComplete="off" className={fieldCls} value={header.crew} onChange={(e) => setHeader({ crew: e.target.value })} />
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
              <input id="h-reason" className={fieldCls} value={header.linerHoursReason} onChange={(e) => setHeader({ linerHoursReason: e.target.value })} />
            </Field>
            <Messages items={hours.errors.filter((e) => e.field === "header.linerHoursReason")} tone="limit" />
          </div>
        ) : null}
        <Field id="h-gauge" label="Micrometer temperature" unit="°C">
          <input id="h-gauge" inputMode="decimal" autoComplete="off" className={cn(fieldCls, "num text-right text-lg")} value={header.gaugeTempC} onChange={(e) => setHeader({ gaugeTempC: e.target.value })} />
          <ParsedEcho text={header.gaugeTempC} expected={20} unit="°C" decimals={1} onChoose={(gaugeTempC) => setHeader({ gaugeTempC })} />
        </Field>
        <Field id="h-linert" label="Liner temperature" unit="°C">
          <input id="h-linert" inputMode="decimal" autoComplete="off" className={cn(fieldCls, "num text-right text-lg")} value={header.linerTempC} onChange={(e) => setHeader({ linerTempC: e.target.value })} />
          <ParsedEcho text={header.linerTempC} expected={20} unit="°C" decimals={1} onChoose={(linerTempC) => setHeader({ linerTempC })} />
        </Field>
        <div className="sm:col-span-2">
          <Field id="h-notes" label="Notes">
            <textarea id="h-notes" rows={2} className={cn(fieldCls, "py-2")} value={header.notes} onChange={(e) => setHeader({ notes: e.target.value })} />
          </Field>
        </div>
      </div>
    </section>
  );
}
