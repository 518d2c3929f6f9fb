import { cn } from "@/lib/utils";
import type { Problem } from "@/lib/inspections/rules";
import { OverLimitMark, CautionMark } from "./marks";

/* The field frame and message lines the gauging sheet's sections share. */

export const fieldCls = "mt-1 block min-h-12 w-full rounded-md border border-ink-line bg-paper-raised px-3 text-base";

export function Field({ id, label, unit, children }: { id: string; label: string; unit?: string; children: React.ReactNode }) {
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink-soft">
        {label}
        {unit ? <span className="text-ink-faint"> ({unit})</span> : null}
      </label>
      {children}
    </div>
  );
}

export function Messages({ items, tone }: { items: Problem[]; tone: "limit" | "caution" }) {
  if (!items.length) return null;
  return (
    <>
      {items.map((p) => (
        <p key={p.message} className={cn("mt-1 text-sm font-medium", tone === "limit" ? "text-limit" : "text-caution")} role={tone === "limit" ? "alert" : undefined}>
          {tone === "limit" ? <OverLimitMark /> : <CautionMark />}
          {p.message}
        </p>
      ))}
    </>
  );
}
