"use client";

import { parseNumberInput, plainNumber } from "@/lib/units/parse-number";
import { cn } from "@/lib/utils";

/**
 * How a typed number was read, shown beside the input as it is typed ("= 65 950 h"), so a
 * comma read the wrong way is seen at once. A comma followed by exactly three digits that the
 * field's expected size cannot settle ("1,250") is asked about, with one tap for each reading.
 */
export function ParsedEcho({
  text,
  expected,
  unit,
  decimals = 3,
  onChoose,
  className,
}: {
  text: string;
  expected?: number | null;
  /** The unit the value is typed in, printed after it. */
  unit: string;
  decimals?: number;
  /** Rewrites the input with the chosen reading; without it the question is shown without buttons. */
  onChoose?: (text: string) => void;
  className?: string;
}) {
  const p = parseNumberInput(text, { expected });
  if (p.kind === "number") {
    return (
      <p className={cn("num text-sm text-ink-soft", className)} data-testid="parsed-echo">
        = {plainNumber(p.value, decimals)} {unit}
      </p>
    );
  }
  if (p.kind !== "ambiguous") return null;
  const a = `${plainNumber(p.grouped, decimals)} ${unit}`;
  const b = `${plainNumber(p.decimal, decimals)} ${unit}`;
  return (
    <div role="alert" className={cn("mt-1 rounded border border-caution bg-caution-tint p-2 text-sm", className)}>
      <p className="font-medium text-caution">
        <span aria-hidden="true">⚠ </span>“{text.trim()}”: {a} or {b}? Not saved until you choose.
      </p>
      {onChoose ? (
        <div className="mt-1 flex flex-wrap gap-2">
          <button type="button" className="min-h-11 min-w-11 rounded-md border border-ink-line bg-paper-raised px-3 font-medium" onClick={() => onChoose(String(p.grouped))}>
            {a}
          </button>
          <button type="button" className="min-h-11 min-w-11 rounded-md border border-ink-line bg-paper-raised px-3 font-medium" onClick={() => onChoose(String(p.decimal))}>
            {b}
          </button>
        </div>
      ) : null}
    </div>
  );
}
