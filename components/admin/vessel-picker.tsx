"use client";

import type { UseFormRegisterReturn } from "react-hook-form";
import { FieldError } from "@/components/ui/field";

export type VesselChoice = { id: number; name: string; imoNumber: string; companyName: string };

/** Checkboxes for the vessels a person is assigned to, grouped by managing company. */
export function VesselPicker({ vessels, register, error, legend = "Vessels" }: { vessels: VesselChoice[]; register: UseFormRegisterReturn; error?: string[]; legend?: string }) {
  const companies = [...new Set(vessels.map((v) => v.companyName))];
  return (
    <fieldset aria-describedby="vessels-error">
      <legend className="text-sm font-medium text-ink-soft">{legend}</legend>
      {vessels.length === 0 ? <p className="mt-1 text-sm text-ink-soft">No vessels yet: add one under Vessels first.</p> : null}
      {companies.map((c) => (
        <div key={c} className="mt-2">
          {companies.length > 1 ? <div className="text-xs font-medium uppercase tracking-wide text-ink-faint">{c}</div> : null}
          <ul className="mt-1 grid gap-1 sm:grid-cols-2">
            {vessels
              .filter((v) => v.companyName === c)
              .map((v) => (
                <li key={v.id}>
                  <label className="flex min-h-11 items-center gap-3 rounded-md border border-ink-line bg-paper-raised px-3 text-sm has-[:checked]:border-signal has-[:checked]:bg-signal-tint">
                    <input type="checkbox" value={String(v.id)} className="h-5 w-5 shrink-0 accent-signal" {...register} />
                    <span className="min-w-0">
                      <span className="font-medium">{v.name}</span> <span className="num text-xs text-ink-faint">IMO {v.imoNumber}</span>
                    </span>
                  </label>
                </li>
              ))}
          </ul>
        </div>
      ))}
      <FieldError id="vessels-error" messages={error} />
    </fieldset>
  );
}
