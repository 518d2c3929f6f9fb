"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Input, Select } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { saveVesselAction } from "@/lib/admin/actions";
import { vesselSchema, type VesselInput } from "@/lib/admin/schemas";
import { FormField } from "./form-field";
import { errorAt, useActionForm } from "./use-action-form";

export function VesselForm({ companies, initial }: { companies: { id: number; name: string }[]; initial?: VesselInput }) {
  const router = useRouter();
  const form = useForm<VesselInput>({
    resolver: zodResolver(vesselSchema) as never,
    defaultValues: initial ?? {
      vesselId: null,
      name: "",
      imoNumber: "",
      companyId: companies.length === 1 ? String(companies[0].id) : "",
      newCompanyName: "",
      vesselType: "",
      flag: "",
      builtYear: "",
    },
  });
  const { register, watch, formState } = form;
  const editing = !!initial?.vesselId;
  const { state, submit, pending } = useActionForm(form, saveVesselAction, () => {
    router.push("/admin/vessels");
    router.refresh();
  });
  const e = formState.errors;
  const companyId = watch("companyId");
  return (
    <form onSubmit={submit} noValidate className="max-w-2xl space-y-5">
      <input type="hidden" {...register("vesselId")} />
      <div className="grid gap-4 sm:grid-cols-2">
        <FormField id="name" label="Vessel name" error={errorAt(e, "name")}>
          <Input id="name" aria-invalid={!!e.name} {...register("name")} />
        </FormField>
        <FormField id="imoNumber" label="IMO number" hint="Seven digits; the last one is a check digit." error={errorAt(e, "imoNumber")}>
          <Input id="imoNumber" inputMode="numeric" autoComplete="off" placeholder="e.g. 1234567" className="num" aria-invalid={!!e.imoNumber} {...register("imoNumber")} />
        </FormField>
      </div>
      <div className="grid gap-4 sm:grid-cols-2">
        <FormField id="companyId" label="Managing company" error={errorAt(e, "companyId")}>
          <Select id="companyId" aria-invalid={!!e.companyId} {...register("companyId")}>
            <option value="">New company…</option>
            {companies.map((c) => (
              <option key={c.id} value={String(c.id)}>{c.name}</option>
            ))}
          </Select>
        </FormField>
        {!companyId ? (
          <FormField id="newCompanyName" label="New company name" error={errorAt(e, "newCompanyName")}>
            <Input id="newCompanyName" {...register("newCompanyName")} />
          </FormField>
        ) : null}
      </div>
      <div className="grid gap-4 sm:grid-cols-3">
        <FormField id="vesselType" label="Type" hint="e.g. bulk carrier" error={errorAt(e, "vesselType")}>
          <Input id="vesselType" {...register("vesselType")} />
        </FormField>
        <FormField id="flag" label="Flag" error={errorAt(e, "flag")}>
          <Input id="flag" {...register("flag")} />
        </FormField>
        <FormField id="builtYear" label="Year built" error={errorAt(e, "builtYear")}>
          <Input id="builtYear" inputMode="numeric" className="num" {...register("builtYear")} />
        </FormField>
      </div>
      <FormMessage ok={state.ok} message={state.message} />
      <Button type="submit" size="lg" disabled={pending}>
        {pending ? "Saving…" : editing ? "Save vessel" : "Add vessel"}
      </Button>
    </form>
  );
}
