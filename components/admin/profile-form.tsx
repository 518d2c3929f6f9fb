"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { Fragment } from "react";
import { useFieldArray, useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { FieldError, Input, Select, Textarea } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { saveProfileAction } from "@/lib/admin/actions";
import { MAX_LIMIT_SHARE_OF_BORE, profileSchema, STATION_ROLE_LABELS, STATION_ROLES, type ProfileInput } from "@/lib/admin/schemas";
import { FormField } from "./form-field";
import { errorAt, useActionForm } from "./use-action-form";

function Section({ title, lead, children }: { title: string; lead?: React.ReactNode; children: React.ReactNode }) {
  return (
    <Card className="p-4 sm:p-5">
      <h2 className="text-lg font-semibold">{title}</h2>
      {lead ? <p className="mt-1 text-sm text-ink-soft">{lead}</p> : null}
      <div className="mt-4">{children}</div>
    </Card>
  );
}

const Unit = ({ children }: { children: React.ReactNode }) => <span className="font-normal text-ink-faint"> ({children})</span>;

export function ProfileForm({ initial, stationsWithReadings = [], engineCount = 0 }: { initial: ProfileInput; stationsWithReadings?: string[]; engineCount?: number }) {
  const router = useRouter();
  const form = useForm<ProfileInput>({ resolver: zodResolver(profileSchema) as never, defaultValues: initial, mode: "onBlur" });
  const { register, control, formState, watch } = form;
  const stations = useFieldArray({ control, name: "stations" as never });
  const rings = useFieldArray({ control, name: "rings" as never });
  const editing = !!initial.profileId;
  const { state, submit, pending } = useActionForm(form, saveProfileAction, (r) => {
    const id = (r.data as { profileId?: number } | undefined)?.profileId;
    if (!editing && id) router.push(`/admin/profiles/${id}`);
    router.refresh();
  });
  const e = formState.errors;
  const bore = Number(String(watch("boreMm") ?? "").replace(",", "."));
  const maxLimit = bore > 0 ? Math.round(bore * MAX_LIMIT_SHARE_OF_BORE * 1000) / 1000 : null;
  const tempCorrection = watch("temperatureCorrection");
  const num = "num text-right";

  return (
    <form onSubmit={submit} noValidate className="space-y-5">
      <input type="hidden" {...register("profileId")} />
      {engineCount > 0 ? (
        <p className="rounded-md border border-ink-line bg-paper-sunk px-3 py-2 text-sm text-ink-soft">
          <span className="num">{engineCount}</span> {engineCount === 1 ? "engine uses" : "engines use"} this profile. Changed limits apply to their units from the next analysis.
        </p>
      ) : null}

      <Section title="Engine design">
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <FormField id="name" label="Profile name" error={errorAt(e, "name")} className="sm:col-span-2">
            <Input id="name" aria-invalid={!!e.name} {...register("name")} />
          </FormField>
          <FormField id="designation" label="Engine designation" hint="as on the maker's plate" error={errorAt(e, "designation")} className="sm:col-span-2">
            <Input id="designation" aria-invalid={!!e.designation} {...register("designation")} />
          </FormField>
          <FormField id="boreMm" label={<>Nominal bore<Unit>mm</Unit></>} error={errorAt(e, "boreMm")}>
            <Input id="boreMm" inputMode="decimal" className={num} aria-invalid={!!e.boreMm} {...register("boreMm")} />
          </FormField>
          <FormField id="strokeMm" label={<>Stroke<Unit>mm</Unit></>} hint="optional" error={errorAt(e, "strokeMm")}>
            <Input id="strokeMm" inputMode="decimal" className={num} {...register("strokeMm")} />
          </FormField>
        </div>
      </Section>

      <Section
        title="Liner limits"
        lead="Copy the figures from the engine maker's manual. Kalibore's bands and projections follow these limits; they never replace the manual or class rules."
      >
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <FormField id="linerWearLimitMm" label={<>Wear limit<Unit>mm on diameter</Unit></>} hint={maxLimit ? `above 0, at most ${maxLimit} mm (2 % of bore)` : "above 0, at most 2 % of the bore"} error={errorAt(e, "linerWearLimitMm")}>
            <Input id="linerWearLimitMm" inputMode="decimal" className={num} aria-invalid={!!e.linerWearLimitMm} {...register("linerWearLimitMm")} />
          </FormField>
          <FormField id="ovalityLimitMm" label={<>Ovality limit<Unit>mm</Unit></>} error={errorAt(e, "ovalityLimitMm")}>
            <Input id="ovalityLimitMm" inputMode="decimal" className={num} aria-invalid={!!e.ovalityLimitMm} {...register("ovalityLimitMm")} />
          </FormField>
          <FormField id="wearReference" label="Wear measured from" error={errorAt(e, "wearReference")}>
            <Select id="wearReference" {...register("wearReference")}>
              <option value="nominal">Nominal bore</option>
              <option value="as_fitted">As-fitted reading</option>
            </Select>
          </FormField>
          <FormField id="minPointsForProjection" label="Readings for a projection" hint="3 or more" error={errorAt(e, "minPointsForProjection")}>
            <Input id="minPointsForProjection" inputMode="numeric" className={num} {...register("minPointsForProjection")} />
          </FormField>
        </div>
      </Section>

      <Section title="Gauging directions">
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <FormField id="axisAKey" label="First direction key" error={errorAt(e, "axisAKey")}>
            <Input id="axisAKey" className="font-mono" {...register("axisAKey")} />
          </FormField>
          <FormField id="axisALabel" label="First direction name" error={errorAt(e, "axisALabel")}>
            <Input id="axisALabel" {...register("axisALabel")} />
          </FormField>
          <FormField id="axisBKey" label="Second direction key" error={errorAt(e, "axisBKey")}>
            <Input id="axisBKey" className="font-mono" {...register("axisBKey")} />
          </FormField>
          <FormField id="axisBLabel" label="Second direction name" error={errorAt(e, "axisBLabel")}>
            <Input id="axisBLabel" {...register("axisBLabel")} />
          </FormField>
        </div>
      </Section>

      <Section title="Gauging stations" lead="From the top of the liner down; each depth deeper than the one before. At least one station marks a ring position at top dead centre.">
        <FieldError messages={errorAt(e, "stations")} />
        <div className="hidden grid-cols-[2rem_6rem_1fr_8rem_15rem_5.5rem] gap-2 px-1 pb-1 text-xs font-medium uppercase tracking-wide text-ink-faint lg:grid">
          <span>#</span><span>Key</span><span>Label</span><span className="text-right">Depth, mm</span><span>Station is</span><span />
        </div>
        <ol className="space-y-3 lg:space-y-2">
          {stations.fields.map((f, i) => {
            const key = String(watch(`stations.${i}.key` as never) ?? "");
            const locked = stationsWithReadings.includes(key) && initial.stations.some((s) => s.key === key);
            return (
              <li key={f.id} className="grid grid-cols-2 gap-2 rounded-md border border-ink-line p-3 sm:grid-cols-4 lg:grid-cols-[2rem_6rem_1fr_8rem_15rem_5.5rem] lg:items-start lg:border-0 lg:p-1">
                <span className="num pt-2 text-sm font-semibold text-ink-soft sm:col-span-2 lg:order-1 lg:col-span-1">{i + 1}</span>
                <div className="flex justify-end gap-1 sm:col-span-2 lg:order-6 lg:col-span-1">
                  <Button type="button" variant="quiet" className="min-h-11 px-2" disabled={i === 0} onClick={() => stations.move(i, i - 1)} aria-label={`Move station ${i + 1} up`}>↑</Button>
                  <Button type="button" variant="quiet" className="min-h-11 px-2" disabled={locked || stations.fields.length <= 3} onClick={() => stations.remove(i)} aria-label={`Remove station ${i + 1}`} title={locked ? "This station has readings." : undefined}>✕</Button>
                </div>
                <FormField id={`stations.${i}.key`} label={<span className="lg:sr-only">Key</span>} error={errorAt(e, `stations.${i}.key`)} className="lg:order-2">
                  <Input id={`stations.${i}.key`} className="font-mono" readOnly={locked} title={locked ? "This station has readings; its key stays." : undefined} {...register(`stations.${i}.key` as never)} />
                </FormField>
                <FormField id={`stations.${i}.depthMm`} label={<span className="lg:sr-only">Depth, mm</span>} error={errorAt(e, `stations.${i}.depthMm`)} className="lg:order-4">
                  <Input id={`stations.${i}.depthMm`} inputMode="decimal" className={num} {...register(`stations.${i}.depthMm` as never)} />
                </FormField>
                <FormField id={`stations.${i}.label`} label={<span className="lg:sr-only">Label</span>} error={errorAt(e, `stations.${i}.label`)} className="col-span-2 lg:order-3 lg:col-span-1">
                  <Input id={`stations.${i}.label`} {...register(`stations.${i}.label` as never)} />
                </FormField>
                <FormField id={`stations.${i}.role`} label={<span className="lg:sr-only">Station is</span>} error={errorAt(e, `stations.${i}.role`)} className="col-span-2 sm:col-span-4 lg:order-5 lg:col-span-1">
                  <Select id={`stations.${i}.role`} {...register(`stations.${i}.role` as never)}>
                    {STATION_ROLES.map((r) => (
                      <option key={r} value={r}>{STATION_ROLE_LABELS[r]}</option>
                    ))}
                  </Select>
                </FormField>
              </li>
            );
          })}
        </ol>
        <Button
          type="button"
          variant="secondary"
          className="mt-3"
          disabled={stations.fields.length >= 16}
          onClick={() => stations.append({ key: `s${stations.fields.length + 1}`, label: "", depthMm: "", role: "intermediate" } as never)}
        >
          Add station
        </Button>
      </Section>

      <Section title="Piston rings" lead="Closed gap and groove axial clearance for each ring, top ring first. A limit must be above the new maximum.">
        <FieldError messages={errorAt(e, "rings")} />
        <div className="hidden grid-cols-[1fr_repeat(6,6.5rem)_2.5rem] gap-2 px-1 pb-1 text-xs font-medium uppercase tracking-wide text-ink-faint xl:grid">
          <span>Ring</span>
          <span className="text-right">Gap new min</span><span className="text-right">Gap new max</span><span className="text-right">Gap limit</span>
          <span className="text-right">Groove new min</span><span className="text-right">Groove new max</span><span className="text-right">Groove limit</span><span />
        </div>
        <ol className="space-y-3 xl:space-y-2">
          {rings.fields.map((f, i) => (
            <li key={f.id} className="grid grid-cols-3 gap-2 rounded-md border border-ink-line p-3 sm:grid-cols-6 xl:grid-cols-[1fr_repeat(6,6.5rem)_2.5rem] xl:items-start xl:border-0 xl:p-1">
              <FormField id={`rings.${i}.label`} label={<span className="xl:sr-only">Ring {i + 1}</span>} error={errorAt(e, `rings.${i}.label`)} className="col-span-2 sm:col-span-5 xl:col-span-1">
                <Input id={`rings.${i}.label`} {...register(`rings.${i}.label` as never)} />
              </FormField>
              <div className="flex items-end justify-end xl:hidden">
                <Button type="button" variant="quiet" className="min-h-11 px-2" disabled={rings.fields.length <= 1} onClick={() => rings.remove(i)} aria-label={`Remove ring ${i + 1}`}>✕</Button>
              </div>
              {(
                [
                  ["gapNewMinMm", "new min", "Closed gap, mm"],
                  ["gapNewMaxMm", "new max", null],
                  ["gapLimitMm", "limit", null],
                  ["grooveNewMinMm", "new min", "Groove clearance, mm"],
                  ["grooveNewMaxMm", "new max", null],
                  ["grooveLimitMm", "limit", null],
                ] as const
              ).map(([field, label, group]) => (
                <Fragment key={field}>
                  {group ? <p className="col-span-3 -mb-1 mt-1 text-xs font-semibold uppercase tracking-wide text-ink-faint sm:col-span-6 xl:hidden">{group}</p> : null}
                  <FormField
                    id={`rings.${i}.${field}`}
                    label={
                      <>
                        <span className="sr-only">{field.startsWith("gap") ? "Closed gap" : "Groove clearance"} </span>
                        <span className="text-xs xl:sr-only">{label}</span>
                        <span className="sr-only">, mm</span>
                      </>
                    }
                    error={errorAt(e, `rings.${i}.${field}`)}
                    className="sm:col-span-2 xl:col-span-1"
                  >
                    <Input id={`rings.${i}.${field}`} inputMode="decimal" className={num} aria-invalid={!!errorAt(e, `rings.${i}.${field}`)} {...register(`rings.${i}.${field}` as never)} />
                  </FormField>
                </Fragment>
              ))}
              <div className="hidden items-start justify-end xl:flex">
                <Button type="button" variant="quiet" className="min-h-11 px-2" disabled={rings.fields.length <= 1} onClick={() => rings.remove(i)} aria-label={`Remove ring ${i + 1}`}>✕</Button>
              </div>
            </li>
          ))}
        </ol>
        <p className="mt-2 text-sm text-ink-soft">
          Ring count: <span className="num font-semibold">{rings.fields.length}</span>
        </p>
        <Button
          type="button"
          variant="secondary"
          className="mt-2"
          disabled={rings.fields.length >= 8}
          onClick={() =>
            rings.append({ label: `Ring ${rings.fields.length + 1}`, gapNewMinMm: "", gapNewMaxMm: "", gapLimitMm: "", grooveNewMinMm: "", grooveNewMaxMm: "", grooveLimitMm: "" } as never)
          }
        >
          Add ring
        </Button>
      </Section>

      <Section title="Temperature correction" lead="Readings are corrected to 20 °C from the gauge and liner temperatures, using each material's expansion coefficient.">
        <label className="mb-4 flex min-h-11 items-center gap-3 text-sm font-medium">
          <input type="checkbox" className="h-5 w-5 accent-signal" {...register("temperatureCorrection")} />
          Correct readings to 20 °C
        </label>
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <FormField id="linerMaterial" label="Liner material" error={errorAt(e, "linerMaterial")}>
            <Input id="linerMaterial" disabled={!tempCorrection} {...register("linerMaterial")} />
          </FormField>
          <FormField id="alphaLinerPpmPerK" label={<>Liner α<Unit>10⁻⁶/K</Unit></>} error={errorAt(e, "alphaLinerPpmPerK")}>
            <Input id="alphaLinerPpmPerK" inputMode="decimal" className={num} disabled={!tempCorrection} {...register("alphaLinerPpmPerK")} />
          </FormField>
          <FormField id="gaugeMaterial" label="Gauge material" error={errorAt(e, "gaugeMaterial")}>
            <Input id="gaugeMaterial" disabled={!tempCorrection} {...register("gaugeMaterial")} />
          </FormField>
          <FormField id="alphaGaugePpmPerK" label={<>Gauge α<Unit>10⁻⁶/K</Unit></>} error={errorAt(e, "alphaGaugePpmPerK")}>
            <Input id="alphaGaugePpmPerK" inputMode="decimal" className={num} disabled={!tempCorrection} {...register("alphaGaugePpmPerK")} />
          </FormField>
        </div>
      </Section>

      <Section title="Running and overhaul">
        <div className="grid gap-4 sm:grid-cols-3">
          <FormField id="runningInHours" label={<>Running-in<Unit>h</Unit></>} hint="wear rate ignores this early period" error={errorAt(e, "runningInHours")}>
            <Input id="runningInHours" inputMode="numeric" className={num} {...register("runningInHours")} />
          </FormField>
          <FormField id="overhaulIntervalHours" label={<>Overhaul interval<Unit>h</Unit></>} error={errorAt(e, "overhaulIntervalHours")}>
            <Input id="overhaulIntervalHours" inputMode="numeric" className={num} {...register("overhaulIntervalHours")} />
          </FormField>
          <FormField id="rodNutPressureBar" label={<>Rod nut tightening pressure<Unit>bar</Unit></>} hint="optional; follow the maker's procedure" error={errorAt(e, "rodNutPressureBar")}>
            <Input id="rodNutPressureBar" inputMode="decimal" className={num} {...register("rodNutPressureBar")} />
          </FormField>
          <FormField
            id="rodNutTolerancePct"
            label={<>Rod nut pressure tolerance<Unit>± %</Unit></>}
            hint="a record further off is refused; empty means ±10 %"
            error={errorAt(e, "rodNutTolerancePct")}
          >
            <Input id="rodNutTolerancePct" inputMode="decimal" className={num} {...register("rodNutTolerancePct")} />
          </FormField>
        </div>
        <FormField id="notes" label="Notes" error={errorAt(e, "notes")} className="mt-4">
          <Textarea id="notes" rows={3} {...register("notes")} />
        </FormField>
      </Section>

      <div className="sticky bottom-0 -mx-4 flex flex-wrap items-center gap-3 border-t border-ink-line bg-paper/95 px-4 py-3 backdrop-blur sm:mx-0 sm:rounded-b-lg">
        <Button type="submit" size="lg" disabled={pending}>{pending ? "Saving…" : editing ? "Save profile" : "Add profile"}</Button>
        <FormMessage ok={state.ok} message={state.message} className="flex-1" />
      </div>
    </form>
  );
}
