"use client";

import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { FieldError, Input, Label, Select } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { useJsonSubmit } from "./json-form";

/** Adds a port stay or docking to one ship's schedule. */
export function ScheduleForm({ vesselId, vesselName }: { vesselId: number; vesselName: string }) {
  const id = useId();
  const [v, setV] = useState({ kind: "port_stay", place: "", startsOn: "", endsOn: "" });
  const { busy, outcome, send } = useJsonSubmit();
  const err = (f: string) => (outcome && !outcome.ok && outcome.field === f ? [outcome.text] : undefined);
  return (
    <form
      className="grid grid-cols-2 gap-3 md:grid-cols-5"
      aria-label={`Add a port stay or docking for ${vesselName}`}
      onSubmit={async (e) => {
        e.preventDefault();
        if (await send("POST", `/api/vessels/${vesselId}/schedule`, v, "Added to the schedule.")) setV({ kind: "port_stay", place: "", startsOn: "", endsOn: "" });
      }}
    >
      <div>
        <Label htmlFor={`${id}-kind`}>Kind</Label>
        <Select id={`${id}-kind`} value={v.kind} onChange={(e) => setV({ ...v, kind: e.target.value })}>
          <option value="port_stay">Port stay</option>
          <option value="docking">Docking</option>
        </Select>
      </div>
      <div>
        <Label htmlFor={`${id}-place`}>Port or yard</Label>
        <Input id={`${id}-place`} value={v.place} maxLength={120} onChange={(e) => setV({ ...v, place: e.target.value })} aria-invalid={!!err("place")} />
        <FieldError messages={err("place")} />
      </div>
      <div>
        <Label htmlFor={`${id}-from`}>First day</Label>
        <Input id={`${id}-from`} type="date" value={v.startsOn} onChange={(e) => setV({ ...v, startsOn: e.target.value })} aria-invalid={!!err("startsOn")} />
        <FieldError messages={err("startsOn")} />
      </div>
      <div>
        <Label htmlFor={`${id}-to`}>Last day</Label>
        <Input id={`${id}-to`} type="date" value={v.endsOn} onChange={(e) => setV({ ...v, endsOn: e.target.value })} aria-invalid={!!err("endsOn")} />
        <FieldError messages={err("endsOn")} />
      </div>
      <div className="col-span-2 flex items-end md:col-span-1">
        <Button type="submit" disabled={busy}>{busy ? "Adding…" : "Add"}</Button>
      </div>
      {outcome && (outcome.ok || !outcome.field) ? <FormMessage ok={outcome.ok} message={outcome.text} className="col-span-2 md:col-span-5" /> : null}
    </form>
  );
}

/** Removes one schedule entry after the person confirms. */
export function DeleteEntryButton({ vesselId, entryId, label }: { vesselId: number; entryId: number; label: string }) {
  const { busy, outcome, send } = useJsonSubmit();
  return (
    <>
      <Button
        type="button"
        variant="danger"
        disabled={busy}
        aria-label={`Remove the ${label}`}
        onClick={() => {
          if (window.confirm(`Remove the ${label} from the schedule? Plans that named it keep their day.`)) void send("DELETE", `/api/vessels/${vesselId}/schedule/${entryId}`, undefined, "Removed.");
        }}
      >
        Remove
      </Button>
      {outcome && !outcome.ok ? <FormMessage ok={false} message={outcome.text} /> : null}
    </>
  );
}
