import type { ReactNode } from "react";
import { cn } from "@/lib/utils";

/** One column of a record table. */
export type Column<T> = {
  key: string;
  header: ReactNode;
  cell: (row: T) => ReactNode;
  /** Figures are right-aligned so they line up on the decimal point. */
  align?: "left" | "right";
  /** Hidden below this width; its value should then appear in another column's cell. */
  hideBelow?: "sm" | "md";
  /** The cell that names the row (a <th scope="row">). */
  rowHeader?: boolean;
  /** Tabular figures. */
  numeric?: boolean;
  className?: string;
};

const HIDE = { sm: "hidden sm:table-cell", md: "hidden md:table-cell" } as const;

/**
 * The one table of the record screens (unit history, inspection record): a bordered card
 * with a quiet header row, right-aligned figures and columns that give way on a phone, so
 * no table scrolls sideways at 390 px. Rendered on the server; cells are plain functions.
 */
export function DataTable<T>({
  columns,
  rows,
  rowKey,
  minWidthClass,
  caption,
  testId,
  dense,
}: {
  columns: Column<T>[];
  rows: readonly T[];
  rowKey: (row: T) => string | number;
  /** A minimum width from the small breakpoint up, e.g. "sm:min-w-[640px]". */
  minWidthClass?: string;
  caption?: ReactNode;
  testId?: string;
  /** Narrower side padding on a phone, for tables that must fit 390 px. */
  dense?: boolean;
}) {
  const pad = dense ? "px-2 py-2 sm:px-3" : "px-3 py-2";
  return (
    // Focusable and named, so a table wider than a phone can be scrolled from the keyboard too.
    <div
      className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised focus-visible:outline-2 focus-visible:outline-signal"
      data-testid={testId}
      tabIndex={0}
      role="region"
      aria-label={typeof caption === "string" ? caption : "Table"}
    >
      <table className={cn("w-full text-sm", minWidthClass)}>
        {caption ? <caption className="sr-only">{caption}</caption> : null}
        <thead className="bg-paper-sunk text-left text-xs tracking-wide text-ink-soft uppercase">
          <tr>
            {columns.map((c) => (
              <th key={c.key} scope="col" className={cn(pad, c.align === "right" && "text-right", c.hideBelow && HIDE[c.hideBelow], c.className)}>
                {c.header}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-line/70">
          {rows.map((row) => (
            <tr key={rowKey(row)}>
              {columns.map((c) => {
                const cls = cn(pad, "align-top", c.align === "right" ? "text-right" : "text-left", c.numeric && "num", c.hideBelow && HIDE[c.hideBelow], c.className);
                return c.rowHeader ? (
                  <th key={c.key} scope="row" className={cn(cls, "font-medium")}>
                    {c.cell(row)}
                  </th>
                ) : (
                  <td key={c.key} className={cls}>
                    {c.cell(row)}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
