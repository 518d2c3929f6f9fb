import { DataTable } from "@/components/wear/data-table";
import { day } from "@/lib/format";
import type { ShortfallLine } from "@/lib/outlook/numbers";
import { PART_LABELS } from "@/lib/outlook/types";

/** Spares needed within the horizon against stock, the shortfall and the order-by day (late in red). */
export function ShortfallTable({ lines, profileName, testId }: { lines: ShortfallLine[]; profileName: Map<number, string>; testId: string }) {
  return (
    <DataTable
      testId={testId}
      caption="Spares needed, available and short, with order-by dates"
      dense
      rows={lines}
      rowKey={(l) => `${l.profileId}-${l.part}`}
      columns={[
        { key: "part", header: "Part", rowHeader: true, cell: (l) => <>{PART_LABELS[l.part]}<span className="block text-xs text-ink-faint">{profileName.get(l.profileId) ?? ""}</span></> },
        { key: "needed", header: "Needed", align: "right", numeric: true, cell: (l) => l.needed },
        { key: "available", header: "Stock", align: "right", numeric: true, hideBelow: "sm", cell: (l) => l.available },
        { key: "short", header: "Short", align: "right", numeric: true, cell: (l) => <span data-testid="short-count" className={l.short ? "font-semibold text-limit" : ""}>{l.short}</span> },
        {
          key: "orderBy",
          header: "Order by",
          numeric: true,
          cell: (l) =>
            l.orderBy ? (
              <span className={l.late ? "font-semibold text-limit" : ""}>
                {day(l.orderBy)}
                {l.late ? " — late" : ""}
                <span className="block text-xs font-normal text-ink-faint">needed {day(l.firstShortOn)}, {l.leadTimeDays} days&apos; lead time</span>
              </span>
            ) : (
              "–"
            ),
        },
      ]}
    />
  );
}
