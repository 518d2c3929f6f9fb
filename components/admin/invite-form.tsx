"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Input, Select } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { inviteUserAction } from "@/lib/admin/actions";
import { inviteUserSchema, type InviteUserInput } from "@/lib/admin/schemas";
import { ROLE_LABELS, ROLES } from "@/lib/auth/roles";
import { FormField } from "./form-field";
import { errorAt, useActionForm } from "./use-action-form";
import { VesselPicker, type VesselChoice } from "./vessel-picker";

const ROLE_HELP = {
  engineer: "Enters readings, photos and gauge files for their vessels; reads their history.",
  chief_engineer: "Also approves or returns records, amends with a reason, keeps the running-hours log.",
  superintendent: "Reads every assigned vessel, comments, plans renewals and spares, exports. Cannot change readings.",
  admin: "Users, vessels, engines and profiles. Sees all vessels; cannot approve readings.",
} as const;

export function InviteForm({ vessels }: { vessels: VesselChoice[] }) {
  const form = useForm<InviteUserInput>({
    resolver: zodResolver(inviteUserSchema) as never,
    defaultValues: { name: "", email: "", role: "engineer", vesselIds: [] },
  });
  const { register, watch, reset, formState } = form;
  const { state, submit, pending } = useActionForm(form, inviteUserAction, () => reset({ name: "", email: "", role: watch("role"), vesselIds: [] }));
  const role = watch("role");
  const e = formState.errors;
  return (
    <form onSubmit={submit} noValidate className="max-w-2xl space-y-5">
      <div className="grid gap-4 sm:grid-cols-2">
        <FormField id="name" label="Full name" error={errorAt(e, "name")}>
          <Input id="name" autoComplete="off" aria-invalid={!!e.name} {...register("name")} />
        </FormField>
        <FormField id="email" label="E-mail address" error={errorAt(e, "email")}>
          <Input id="email" type="email" inputMode="email" autoComplete="off" aria-invalid={!!e.email} {...register("email")} />
        </FormField>
      </div>
      <FormField id="role" label="Role" hint={ROLE_HELP[role as keyof typeof ROLE_HELP]} error={errorAt(e, "role")}>
        <Select id="role" {...register("role")}>
          {ROLES.map((r) => (
            <option key={r} value={r}>{ROLE_LABELS[r]}</option>
          ))}
        </Select>
      </FormField>
      {role === "admin" ? (
        <p className="text-sm text-ink-soft">Admins see every vessel; no assignment needed.</p>
      ) : (
        <VesselPicker vessels={vessels} register={register("vesselIds")} error={errorAt(e, "vesselIds")} />
      )}
      <FormMessage ok={state.ok} message={state.message} />
      <div className="flex flex-wrap gap-3">
        <Button type="submit" size="lg" disabled={pending}>
          {pending ? "Sending…" : "Send invitation"}
        </Button>
      </div>
      <p className="text-xs text-ink-faint">The link in the e-mail works once, for seven days. The person chooses their own password.</p>
    </form>
  );
}
