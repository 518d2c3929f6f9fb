"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { updateUserAccessAction } from "@/lib/admin/actions";
import { updateUserAccessSchema, type UpdateUserAccessInput } from "@/lib/admin/schemas";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/auth/roles";
import { FormField } from "./form-field";
import { errorAt, useActionForm } from "./use-action-form";
import { VesselPicker, type VesselChoice } from "./vessel-picker";

export function UserAccessForm({ userId, role, vesselIds, vessels }: { userId: string; role: Role | null; vesselIds: number[]; vessels: VesselChoice[] }) {
  const router = useRouter();
  const form = useForm<UpdateUserAccessInput>({
    resolver: zodResolver(updateUserAccessSchema) as never,
    defaultValues: { userId, role: role ?? "engineer", vesselIds: vesselIds.map(String) },
  });
  const { state, submit, pending } = useActionForm(form, updateUserAccessAction, () => router.refresh());
  const e = form.formState.errors;
  const current = form.watch("role");
  return (
    <form onSubmit={submit} noValidate className="space-y-5">
      <input type="hidden" {...form.register("userId")} />
      <FormField id="role" label="Role" error={errorAt(e, "role")} className="max-w-sm">
        <Select id="role" {...form.register("role")}>
          {ROLES.map((r) => (
            <option key={r} value={r}>{ROLE_LABELS[r]}</option>
          ))}
        </Select>
      </FormField>
      {current === "admin" ? (
        <p className="text-sm text-ink-soft">Admins see every vessel.</p>
      ) : (
        <VesselPicker vessels={vessels} register={form.register("vesselIds")} error={errorAt(e, "vesselIds")} legend="Assigned vessels" />
      )}
      <FormMessage ok={state.ok} message={state.message} />
      <Button type="submit" disabled={pending}>{pending ? "Saving…" : "Save role and vessels"}</Button>
    </form>
  );
}
