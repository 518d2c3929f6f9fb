"use client";

import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { FieldError, Input, Label, Select } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { useJsonSubmit } from "./json-form";

export type SpareValues = {
  id?: number;
  revision?: number;
  profileId: number | "";
  part: "liner" | "ring_set";
  vesselId: number | null;
  onHand: string;
  onOrder: string;
  onOrderDue: string;
  leadTimeDays: string;
  unitCost: string;
  jobCost: string;
};

/**
 * A stock line: counts on hand and on order, lead time, unit and job cost. New lines also choose
 * the engine profile, the part and the place (a ship, or the company store). A refusal keeps
 * what was typed and marks the field the server named.
 */
export function SpareForm({ initial, profiles, vessels, currency }: { initial: SpareValues; profiles: { id: number; name: string }[]; vessels: { id: number; name: string }[]; currency: string }) {
  const id = useId();
  const [v, setV] = useState(initial);
  const { busy, outcome, send } = useJsonSubmit();
  const err = (f: string) => (outcome && !outcome.ok && outcome.field === f ? [outcome.text] : undefined);
  const isNew = initial.id === undefined;
  const field = (name: keyof SpareValues, label: string, props: React.InputHTMLAttributes<HTMLInputElement> = {}) => (
    <div>
      <Label htmlFor={`${id}-${name}`}>{label}</Label>
      <Input id={`${id}-${name}`} value={String(v[name] ?? "")} onChange={(e) => setV({ ...v, [name]: e.target.value })} aria-invalid={!!err(name)} inputMode="decimal" {...props} />
      <FieldError messages={err(name)} />
    </div>
  );
  return (
    <form
      className="grid grid-cols-2 gap-3 md:grid-cols-4"
      aria-label={isNew ? "Add a stock line" : "Change this stock line"}
      onSubmit={async (e) => {
        e.preventDefault();
        const body = { ...v, id: undefined };
        const ok = isNew ? await send("POST", "/api/spares", body, "Stock line added.") : await send("PUT", `/api/spares/${v.id}`, body, "Saved.");
        if (ok && !isNew) setV({ ...v, revision: (v.revision ?? 1) + 1 });
      }}
    >
      {isNew ? (
        <>
          <div>
            <Label htmlFor={`${id}-profile`}>Engine profile</Label>
            <Select id={`${id}-profile`} value={v.profileId} onChange={(e) => setV({ ...v, profileId: e.target.value ? Number(e.target.value) : "" })} aria-invalid={!!err("profileId")}>
              <option value="">Choose…</option>
              {profiles.map((p) => (
                <option key={p.id} value={p.id}>{p.name}</option>
              ))}
            </Select>
            <FieldError messages={err("profileId")} />
          </div>
          <div>
            <Label htmlFor={`${id}-part`}>Part</Label>
            <Select id={`${id}-part`} value={v.part} onChange={(e) => setV({ ...v, part: e.target.value as SpareValues["part"] })}>
              <option value="liner">Liner</option>
              <option value="ring_set">Ring set</option>
            </Select>
          </div>
          <div className="col-span-2">
            <Label htmlFor={`${id}-place`}>Kept</Label>
            <Select id={`${id}-place`} value={v.vesselId ?? ""} onChange={(e) => setV({ ...v, vesselId: e.target.value ? Number(e.target.value) : null })} aria-invalid={!!err("vesselId")}>
              <option value="">In the company store</option>
              {vessels.map((s) => (
                <option key={s.id} value={s.id}>On board {s.name}</option>
              ))}
            </Select>
            <FieldError messages={err("vesselId")} />
          </div>
        </>
      ) : null}
      {field("onHand", "On hand", { inputMode: "numeric" })}
      {field("onOrder", "On order", { inputMode: "numeric" })}
      {field("onOrderDue", "Order due", { type: "date" })}
      {field("leadTimeDays", "Lead time (days)", { inputMode: "numeric" })}
      {field("unitCost", `Unit cost${currency ? ` (${currency})` : ""}`)}
      {field("jobCost", `Job cost${currency ? ` (${currency})` : ""}`)}
      <div className="col-span-2 flex flex-wrap items-end gap-2">
        <Button type="submit" disabled={busy}>{busy ? "Saving…" : isNew ? "Add line" : "Save"}</Button>
        {outcome && (outcome.ok || !outcome.field) ? <FormMessage ok={outcome.ok} message={outcome.text} /> : null}
      </div>
    </form>
  );
}
