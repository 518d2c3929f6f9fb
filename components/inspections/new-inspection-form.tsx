"use client";

import { useRouter } from "next/navigation";
import { useEffect, useRef, useState } from "react";
import { useForm, type Resolver } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { enterMovesToNextField, FieldError, Input, Label } from "@/components/ui/field";
import { ApiError, apiJson, NetworkError } from "@/lib/inspections/api-client";
import type { InspectionContext } from "@/lib/inspections/context";
import { parseDecimal, randomToken } from "@/lib/inspections/form";
import { checkHours, derivedLinerHours, linerHoursDiffer } from "@/lib/inspections/hours-rules";
import type { newInspectionFormSchema } from "@/lib/inspections/schemas";
import { day } from "@/lib/format";
import { formatRunningHours } from "@/lib/wear/calendar";
import { OverLimitMark, CautionMark } from "./marks";

type FormIn = z.input<typeof newInspectionFormSchema>;
type FormOut = z.output<typeof newInspectionFormSchema>;

/** The validator (zod and its form adapter) loads just after the form, not with it. */
const loadValidator = () => Promise.all([import("@hookform/resolvers/zod"), import("@/lib/inspections/schemas")]);

/** The same schema the server parses with, fetched on first use (and prefetched on mount). */
const resolver: Resolver<FormIn, unknown, FormOut> = async (values, context, options) => {
  const [{ zodResolver }, { newInspectionFormSchema: schema }] = await loadValidator();
  return zodResolver(schema)(values, context, options);
};

/**
 * Text → number for the schema; text that is not a number goes through as text so the schema names it.
 * `expected` settles a typed "65,950" (an hours counter is never a fraction of its last reading).
 */
const asNumber = (v: unknown, expected?: number | null) => {
  if (typeof v !== "string") return v;
  const n = parseDecimal(v, expected);
  return n === "invalid" ? v : n;
};

const pendingKey = (unitId: number) => `kalibore:new-inspection:${unitId}`;

/**
 * The first screen of a new inspection: date, running hours (checked against the
 * previous inspection and the running-hours log), liner hours derived from the liner's
 * fitting (editable with a reason), crew and temperatures. Creating is idempotent on a
 * token, so a retry after a dropped network never makes two drafts.
 */
export function NewInspectionForm({ ctx, today }: { ctx: InspectionContext; today: string }) {
  const router = useRouter();
  const token = useRef<string>("");
  const [serverError, setServerError] = useState<string | null>(null);
  // About how large the hours typed here are: the last counter reading on record.
  const hoursScale = ctx.previous?.engineHours ?? ctx.hoursLog.at(-1)?.engineHours ?? (ctx.liner.installedEngineHours || null);
  const [offline, setOffline] = useState(false);
  const [pending, setPending] = useState(false);
  const linerTouched = useRef(false);

  const form = useForm<FormIn, unknown, FormOut>({
    resolver,
    defaultValues: {
      inspectedOn: today,
      engineHours: undefined as unknown as number,
      linerHours: undefined as unknown as number,
      linerHoursReason: null,
      crew: null,
      gaugeTempC: null,
      linerTempC: null,
    },
    mode: "onTouched",
  });
  const { register, handleSubmit, watch, setValue, formState, setError } = form;
  const values = watch();

  useEffect(() => {
    void loadValidator().catch(() => undefined);
  }, []);

  useEffect(() => {
    // A create that was interrupted by a lost network resumes with the same token.
    const saved = localStorage.getItem(pendingKey(ctx.unit.id));
    if (saved) {
      try {
        const p = JSON.parse(saved) as { token: string; values: FormOut };
        token.current = p.token;
        for (const [k, v] of Object.entries(p.values)) setValue(k as keyof FormIn, v as never);
        setOffline(true);
      } catch {
        localStorage.removeItem(pendingKey(ctx.unit.id));
      }
    }
    if (!token.current) token.current = randomToken(24);
  }, [ctx.unit.id, setValue]);

  const engineHours = asNumber(values.engineHours, hoursScale);
  const linerHoursValue = asNumber(values.linerHours, hoursScale);
  const derived = typeof engineHours === "number" ? derivedLinerHours(ctx.liner, engineHours) : null;

  useEffect(() => {
    if (!linerTouched.current && derived !== null) setValue("linerHours", derived);
  }, [derived, setValue]);

  const hours =
    typeof engineHours === "number" && /^\d{4}-\d{2}-\d{2}$/.test(String(values.inspectedOn))
      ? checkHours(ctx, {
          inspectedOn: String(values.inspectedOn),
          engineHours,
          linerHours: typeof linerHoursValue === "number" ? linerHoursValue : NaN,
          linerHoursReason: values.linerHoursReason ? String(values.linerHoursReason) : null,
        })
      : null;
  const needsReason = derived !== null && typeof linerHoursValue === "number" && linerHoursDiffer(derived, linerHoursValue);

  async function create(input: FormOut) {
    setServerError(null);
    setPending(true);
    try {
      const res = await apiJson<{ id: number; existing?: boolean }>("/api/inspections", { method: "POST", body: { ...input, unitId: ctx.unit.id, clientToken: token.current } });
      localStorage.removeItem(pendingKey(ctx.unit.id));
      // The unit already had an open draft (another device, a crew mate): that one opens, not a second.
      router.push(res.existing ? `/inspections/${res.id}/edit?opened=existing` : `/inspections/${res.id}/edit`);
    } catch (err) {
      setPending(false);
      if (err instanceof NetworkError) {
        localStorage.setItem(pendingKey(ctx.unit.id), JSON.stringify({ token: token.current, values: input }));
        setOffline(true);
      } else if (err instanceof ApiError) {
        const field = err.body.details?.field as keyof FormIn | undefined;
        if (field && field in values) setError(field, { message: err.message.replace(/ \(field: .*\)$/, "") });
        else setServerError(err.message);
      } else {
        setServerError("Something went wrong. Your entries are still here; try again.");
      }
    }
  }

  useEffect(() => {
    if (!offline) return;
    const retry = () => handleSubmit(create)();
    window.addEventListener("online", retry);
    const t = window.setInterval(() => navigator.onLine && retry(), 15_000);
    return () => {
      window.removeEventListener("online", retry);
      window.clearInterval(t);
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [offline]);

  const err = formState.errors;
  const num = { inputMode: "decimal" as const, autoComplete: "off", className: "mt-1 num min-h-12 pr-12 text-right text-lg" };
  return (
    <form onSubmit={handleSubmit(create)} onKeyDown={enterMovesToNextField} noValidate className="space-y-6">
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-lg font-semibold">Date and running hours</legend>
        <div>
          <Label htmlFor="inspectedOn">Date of the inspection</Label>
          <Input id="inspectedOn" type="date" max={today} className="mt-1 min-h-12 text-lg" aria-invalid={!!err.inspectedOn} {...register("inspectedOn")} />
          <FieldError messages={err.inspectedOn?.message ? [err.inspectedOn.message] : undefined} />
        </div>
        <div>
          <Label htmlFor="engineHours">Engine running hours (counter)</Label>
          <div className="relative">
            <Input id="engineHours" {...num} aria-invalid={!!err.engineHours || !!hours?.errors.length} aria-describedby="engineHours-help" {...register("engineHours", { setValueAs: (v) => asNumber(v, hoursScale) })} />
            <span className="pointer-events-none absolute top-1/2 right-3 -translate-y-1/2 text-ink-faint">h</span>
          </div>
          <FieldError messages={err.engineHours?.message ? [err.engineHours.message] : undefined} />
          <div id="engineHours-help" className="mt-1 space-y-1 text-sm">
            {ctx.previous ? (
              <p className="text-ink-faint">
                Previous inspection {day(ctx.previous.inspectedOn)}: <span className="num">{formatRunningHours(ctx.previous.engineHours)}</span>
              </p>
            ) : (
              <p className="text-ink-faint">No earlier approved inspection of this unit.</p>
            )}
            {hours?.errors
              .filter((e) => e.field === "header.engineHours")
              .map((e) => (
                <p key={e.message} className="font-medium text-limit" role="alert">
                  <OverLimitMark />
                  {e.message}
                </p>
              ))}
            {hours?.warnings.map((w) => (
              <p key={w.message} className="font-medium text-caution">
                <CautionMark />
                {w.message}
              </p>
            ))}
            {hours?.expected && !hours.warnings.length ? (
              <p className="text-ink-faint">
                Agrees with the running-hours log (about <span className="num">{formatRunningHours(hours.expected.hours)}</span>).
              </p>
            ) : null}
          </div>
        </div>
        <div>
          <Label htmlFor="linerHours">Liner hours</Label>
          <div className="relative">
            <Input
              id="linerHours"
              {...num}
              aria-invalid={!!err.linerHours}
              {...register("linerHours", {
                setValueAs: (v) => asNumber(v, hoursScale),
                onChange: () => {
                  linerTouched.current = true;
                },
              })}
            />
            <span className="pointer-events-none absolute top-1/2 right-3 -translate-y-1/2 text-ink-faint">h</span>
          </div>
          <FieldError messages={err.linerHours?.message ? [err.linerHours.message] : undefined} />
          <p className="mt-1 text-sm text-ink-faint">
            Liner <span className="font-mono">{ctx.liner.serial}</span> fitted at <span className="num">{formatRunningHours(ctx.liner.installedEngineHours)}</span> engine hours
            {ctx.liner.linerHoursAtInstall ? (
              <>
                {" "}
                with <span className="num">{formatRunningHours(ctx.liner.linerHoursAtInstall)}</span> already run
              </>
            ) : null}
            {derived !== null ? (
              <>
                : derived <span className="num font-medium text-ink">{formatRunningHours(derived)}</span>
              </>
            ) : null}
            .
          </p>
        </div>
        {needsReason ? (
          <div>
            <Label htmlFor="linerHoursReason">Why do the liner hours differ from the derived value?</Label>
            <Input id="linerHoursReason" className="mt-1 min-h-12" aria-invalid={!!hours?.errors.some((e) => e.field === "header.linerHoursReason")} {...register("linerHoursReason")} />
            <FieldError messages={err.linerHoursReason?.message ? [err.linerHoursReason.message] : hours?.errors.filter((e) => e.field === "header.linerHoursReason").map((e) => e.message)} />
          </div>
        ) : null}
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-lg font-semibold">Crew and temperatures</legend>
        <div className="sm:col-span-3">
          <Label htmlFor="crew">Crew (who gauged)</Label>
          <Input id="crew" autoComplete="off" className="mt-1 min-h-12" placeholder="e.g. 3/E and fitter" {...register("crew")} />
        </div>
        <div>
          <Label htmlFor="gaugeTempC">Micrometer temperature</Label>
          <div className="relative">
            <Input id="gaugeTempC" {...num} aria-invalid={!!err.gaugeTempC} {...register("gaugeTempC", { setValueAs: asNumber })} />
            <span className="pointer-events-none absolute top-1/2 right-3 -translate-y-1/2 text-ink-faint">°C</span>
          </div>
          <FieldError messages={err.gaugeTempC?.message ? [err.gaugeTempC.message] : undefined} />
        </div>
        <div>
          <Label htmlFor="linerTempC">Liner temperature</Label>
          <div className="relative">
            <Input id="linerTempC" {...num} aria-invalid={!!err.linerTempC} {...register("linerTempC", { setValueAs: asNumber })} />
            <span className="pointer-events-none absolute top-1/2 right-3 -translate-y-1/2 text-ink-faint">°C</span>
          </div>
          <FieldError messages={err.linerTempC?.message ? [err.linerTempC.message] : undefined} />
        </div>
        <p className="self-end text-sm text-ink-faint sm:pb-3">
          {ctx.profile.temperatureCorrection ? "Readings are referred to 20 °C from both temperatures." : "Temperature correction is off for this engine profile."}
        </p>
      </fieldset>

      {offline ? (
        <p className="rounded-md border border-ink-line bg-paper-sunk p-3 text-sm font-medium" role="status">
          Offline — kept on this device. The inspection is created as soon as the network is back.
        </p>
      ) : null}
      {serverError ? <FieldError messages={[serverError]} /> : null}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" size="lg" disabled={pending || !!hours?.errors.length}>
          {pending ? "Opening…" : "Open the gauging sheet"}
        </Button>
      </div>
    </form>
  );
}
