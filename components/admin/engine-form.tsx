"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Input, Select } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { createEngineAction } from "@/lib/admin/actions";
import { engineSchema, MAX_CYLINDERS, MIN_CYLINDERS, type EngineInput } from "@/lib/admin/schemas";
import { FormField } from "./form-field";
import { errorAt, useActionForm } from "./use-action-form";
import type { VesselChoice } from "./vessel-picker";

export function EngineForm({ vessels, profiles, vesselId }: { vessels: VesselChoice[]; profiles: { id: number; name: string; designation: string; boreMm: number }[]; vesselId?: number }) {
  const router = useRouter();
  const form = useForm<EngineInput>({
    resolver: zodResolver(engineSchema) as never,
    defaultValues: { vesselId: vesselId ? String(vesselId) : "", profileId: profiles.length === 1 ? String(profiles[0].id) : "", serial: "", cylinderCount: "", commissionedOn: "" },
  });
  const { register, formState, watch } = form;
  const { state, submit, pending } = useActionForm(form, createEngineAction, () => {
    router.push("/admin/engines");
    router.refresh();
  });
  const e = formState.errors;
  const n = Number(watch("cylinderCount"));
  return (
    <form onSubmit={submit} noValidate className="max-w-2xl space-y-5">
      <div className="grid gap-4 sm:grid-cols-2">
        <FormField id="vesselId" label="Vessel" error={errorAt(e, "vesselId")}>
          <Select id="vesselId" aria-invalid={!!e.vesselId} {...register("vesselId")}>
            <option value="">Choose a vessel</option>
            {vessels.map((v) => (
              <option key={v.id} value={String(v.id)}>{v.name} (IMO {v.imoNumber})</option>
            ))}
          </Select>
        </FormField>
        <FormField id="profileId" label="Engine profile" hint="Bore, stations and limits come from the profile." error={errorAt(e, "profileId")}>
          <Select id="profileId" aria-invalid={!!e.profileId} {...register("profileId")}>
            <option value="">Choose a profile</option>
            {profiles.map((p) => (
              <option key={p.id} value={String(p.id)}>{p.name} — {p.designation}, {p.boreMm} mm bore</option>
            ))}
          </Select>
        </FormField>
      </div>
      <div className="grid gap-4 sm:grid-cols-3">
        <FormField id="serial" label="Engine serial" error={errorAt(e, "serial")}>
          <Input id="serial" autoComplete="off" aria-invalid={!!e.serial} {...register("serial")} />
        </FormField>
        <FormField id="cylinderCount" label="Cylinders" hint={`${MIN_CYLINDERS} to ${MAX_CYLINDERS}`} error={errorAt(e, "cylinderCount")}>
          <Input id="cylinderCount" inputMode="numeric" className="num" aria-invalid={!!e.cylinderCount} {...register("cylinderCount")} />
        </FormField>
        <FormField id="commissionedOn" label="In service since" hint="optional" error={errorAt(e, "commissionedOn")}>
          <Input id="commissionedOn" type="date" className="num" {...register("commissionedOn")} />
        </FormField>
      </div>
      {Number.isInteger(n) && n >= MIN_CYLINDERS && n <= MAX_CYLINDERS ? (
        <p className="text-sm text-ink-soft">Creates cylinder units <span className="num">1 … {n}</span>.</p>
      ) : null}
      <FormMessage ok={state.ok} message={state.message} />
      <Button type="submit" size="lg" disabled={pending}>{pending ? "Adding…" : "Add engine"}</Button>
      <p className="text-xs text-ink-faint">The cylinder count cannot change later; it fixes the units that readings are kept against.</p>
    </form>
  );
}
