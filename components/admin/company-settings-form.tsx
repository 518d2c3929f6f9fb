"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { saveCompanySettingsAction } from "@/lib/admin/actions";
import { ALERT_HORIZON_DAYS, ALERT_PERCENT, companySettingsSchema, type CompanySettingsInput } from "@/lib/company/schemas";
import { FormField } from "./form-field";
import { errorAt, useActionForm } from "./use-action-form";

/** One company's currency and alert settings. */
export function CompanySettingsForm({ initial }: { initial: CompanySettingsInput }) {
  const router = useRouter();
  const form = useForm<CompanySettingsInput>({ resolver: zodResolver(companySettingsSchema) as never, defaultValues: initial });
  const { register, formState } = form;
  const { state, submit, pending } = useActionForm(form, saveCompanySettingsAction, () => router.refresh());
  const e = formState.errors;
  const f = (name: string) => `company-${initial.companyId}-${name}`;
  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      <input type="hidden" {...register("companyId")} />
      <div className="grid gap-4 sm:grid-cols-3">
        <FormField id={f("currency")} label="Currency" hint="ISO 4217 code of every cost: spares, renewal jobs, budgets." error={errorAt(e, "currencyCode")}>
          <Input id={f("currency")} autoComplete="off" autoCapitalize="characters" maxLength={3} className="uppercase" aria-invalid={!!e.currencyCode} {...register("currencyCode")} />
        </FormField>
        <FormField
          id={f("horizon")}
          label="Alert horizon (days)"
          hint={`Tell people when the early end of a unit's projected interval comes this close (${ALERT_HORIZON_DAYS.min}–${ALERT_HORIZON_DAYS.max}).`}
          error={errorAt(e, "alertHorizonDays")}
        >
          <Input id={f("horizon")} inputMode="numeric" className="num" aria-invalid={!!e.alertHorizonDays} {...register("alertHorizonDays")} />
        </FormField>
        <FormField
          id={f("percent")}
          label="Alert threshold (%)"
          hint={`Tell people when the chance of passing the limit by the next overhaul reaches this (${ALERT_PERCENT.min}–${ALERT_PERCENT.max} %).`}
          error={errorAt(e, "alertPercent")}
        >
          <Input id={f("percent")} inputMode="numeric" className="num" aria-invalid={!!e.alertPercent} {...register("alertPercent")} />
        </FormField>
      </div>
      <FormMessage ok={state.ok} message={state.message} />
      <Button type="submit" disabled={pending}>
        {pending ? "Saving…" : "Save settings"}
      </Button>
    </form>
  );
}
