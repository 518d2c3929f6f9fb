"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { FieldError, Input, Label, Select } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { day } from "@/lib/format";
import type { OutlookRow, ScheduleEntry, StockOption } from "@/lib/outlook/types";

type Choice = { value: string; label: string; date: string; scheduleId: number | null; opportunity: string | null };

/**
 * Turns a unit's recommendation into a plan: the part, the opportunity (a port stay or docking
 * of the ship, a coming overhaul, or a day of one's own), the spare it takes. A refusal keeps
 * what was chosen and names the field; a plan someone else opened meanwhile is said in words.
 */
export function PlanForm({ row, today, schedule, stock, onDone }: { row: OutlookRow; today: string; schedule: ScheduleEntry[]; stock: StockOption[]; onDone: () => void }) {
  const router = useRouter();
  const id = useId();
  const choices: Choice[] = [
    ...schedule
      .filter((s) => s.endsOn >= today)
      .map((s) => ({ value: `s${s.id}`, label: `${s.kind === "docking" ? "Docking" : "Port stay"} at ${s.place}, ${day(s.startsOn)}`, date: s.startsOn < today ? today : s.startsOn, scheduleId: s.id, opportunity: null })),
    ...row.overhauls
      .filter((o): o is typeof o & { date: string } => !!o.date && o.date >= today)
      .map((o) => ({ value: `o${o.ordinal}`, label: `Piston overhaul ${o.ordinal}, about ${day(o.date)}`, date: o.date, scheduleId: null, opportunity: `Piston overhaul ${o.ordinal}` })),
  ].sort((a, b) => a.date.localeCompare(b.date));
  const recommended = row.recommendation.opportunity;
  const initial = recommended ? (choices.find((c) => (recommended.scheduleId ? c.scheduleId === recommended.scheduleId : c.date === recommended.date))?.value ?? "") : (choices[0]?.value ?? "");
  const [part, setPart] = useState<"liner" | "ring_set">(row.ringsDue && row.recommendation.kind === "run_on" ? "ring_set" : "liner");
  const [choice, setChoice] = useState(initial || "own");
  const [ownDay, setOwnDay] = useState("");
  const [spare, setSpare] = useState("");
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ ok: boolean; text: string; field?: string } | null>(null);
  const picked = choices.find((c) => c.value === choice) ?? null;
  const spares = stock.filter((s) => s.part === part);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    if (busy) return;
    setBusy(true);
    setMessage(null);
    try {
      const res = await fetch(`/api/units/${row.unitId}/plans`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({
          part,
          plannedOn: picked ? picked.date : ownDay,
          scheduleId: picked?.scheduleId ?? null,
          opportunity: picked?.opportunity ?? "",
          spareId: spare ? Number(spare) : null,
        }),
      });
      const body = await res.json().catch(() => ({}));
      if (!res.ok) {
        const field = body?.details?.field as string | undefined;
        setMessage({ ok: false, text: body?.error ?? "The plan was not saved.", field: field === "plannedOn" && picked ? undefined : field });
        return;
      }
      setMessage({ ok: true, text: "Plan saved, pencilled in." });
      router.refresh();
      onDone();
    } catch {
      setMessage({ ok: false, text: "No answer from the server; nothing was saved. Try again when the network is back." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4" aria-label={`Plan a renewal for ${row.vesselName} cylinder ${row.cylinderNo}`} data-testid="plan-form">
      <div>
        <Label htmlFor={`${id}-part`}>Part</Label>
        <Select id={`${id}-part`} value={part} onChange={(e) => setPart(e.target.value as "liner" | "ring_set")}>
          <option value="liner">Liner</option>
          <option value="ring_set">Ring set</option>
        </Select>
      </div>
      <div>
        <Label htmlFor={`${id}-when`}>Opportunity</Label>
        <Select id={`${id}-when`} value={choice} onChange={(e) => setChoice(e.target.value)}>
          {choices.map((c) => (
            <option key={c.value} value={c.value}>{c.label}</option>
          ))}
          <option value="own">Another day…</option>
        </Select>
      </div>
      {choice === "own" ? (
        <div>
          <Label htmlFor={`${id}-day`}>Day of the renewal</Label>
          <Input id={`${id}-day`} type="date" value={ownDay} onChange={(e) => setOwnDay(e.target.value)} aria-invalid={message?.field === "plannedOn"} />
          <FieldError messages={message?.field === "plannedOn" ? [message.text] : undefined} />
        </div>
      ) : null}
      <div>
        <Label htmlFor={`${id}-spare`}>Spare</Label>
        <Select id={`${id}-spare`} value={spare} onChange={(e) => setSpare(e.target.value)}>
          <option value="">Not chosen yet</option>
          {spares.map((s) => (
            <option key={s.id} value={s.id}>
              {s.vesselName ? `On board ${s.vesselName}` : "Company store"} — {s.onHand} on hand{s.onOrder ? `, ${s.onOrder} on order` : ""}
            </option>
          ))}
        </Select>
      </div>
      <div className="flex items-end gap-2 sm:col-span-2 lg:col-span-4">
        <Button type="submit" disabled={busy}>{busy ? "Saving…" : "Save plan"}</Button>
        <Button type="button" variant="quiet" onClick={onDone}>Cancel</Button>
        <FormMessage ok={message?.ok ?? false} message={message?.text} />
      </div>
    </form>
  );
}
