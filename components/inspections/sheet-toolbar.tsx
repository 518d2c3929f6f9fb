"use client";

import type { FormState } from "@/lib/inspections/form";
import type { LengthUnit } from "@/lib/units/length";
import { cn } from "@/lib/utils";
import { SaveStatusBadge } from "./save-status";
import type { SaveStatus } from "./use-draft-autosave";

/** The sticky bar over the sheet: save status, how many cells are read, the entry unit and the section links. */
export function SheetToolbar({
  status,
  invalidCount,
  filled,
  totalCells,
  entryUnit,
  onUnit,
}: {
  status: SaveStatus;
  invalidCount: number;
  filled: number;
  totalCells: number;
  entryUnit: FormState["entryUnit"];
  onUnit: (u: LengthUnit) => void;
}) {
  const sections = (
    [
      ["#hours", "Hours"],
      ["#liner", "Liner"],
      ["#rings", "Rings"],
      ["#checklist", "Checklist"],
      ["#photos", "Photos"],
      ["#submit", "Submit"],
    ] as const
  ).map(([href, label]) => (
    <a key={href} href={href} className="flex min-h-11 min-w-11 items-center justify-center rounded px-2 font-medium text-signal hover:bg-signal-tint">
      {label}
    </a>
  ));
  // On a phone the bar holds one row (status, count, unit) so the sheet keeps the screen;
  // the section links sit below it, wrapped onto lines, and scroll away with the page.
  return (
    <>
      <div className="no-print sticky top-0 z-20 -mx-4 border-b border-ink-line bg-paper/95 px-4 py-2 backdrop-blur sm:-mx-6 sm:px-6" data-testid="sheet-toolbar">
        <div className="flex items-center justify-between gap-x-3 sm:flex-wrap sm:gap-x-4 sm:gap-y-2">
          <div className="min-w-0 flex-1">
            <SaveStatusBadge status={status} invalidCount={invalidCount} />
          </div>
          <div className="flex shrink-0 items-center gap-3">
            <span className="num text-sm text-ink-soft">
              {filled}/{totalCells} read
            </span>
            <div role="radiogroup" aria-label="Entry unit" className="inline-flex overflow-hidden rounded-md border border-ink-line">
              {(["mm", "in"] as const).map((u) => (
                <button
                  key={u}
                  type="button"
                  role="radio"
                  aria-checked={entryUnit === u}
                  onClick={() => onUnit(u)}
                  className={cn("min-h-11 min-w-12 px-3 text-sm font-semibold", entryUnit === u ? "bg-signal text-white" : "bg-paper-raised text-ink")}
                >
                  {u === "mm" ? "mm" : "inch"}
                </button>
              ))}
            </div>
          </div>
        </div>
        <nav aria-label="Sections" className="mt-1 hidden flex-wrap gap-1 text-sm sm:flex">
          {sections}
        </nav>
      </div>
      <nav aria-label="Sections" className="no-print -mt-6 flex flex-wrap gap-x-1 text-sm sm:hidden">
        {sections}
      </nav>
    </>
  );
}
