import Link from "next/link";
import { Card } from "@/components/ui/card";
import { day } from "@/lib/format";
import type { HomeInspectionRow } from "@/lib/home/queries";

const STATE_WORDS: Record<string, string> = { draft: "Draft", returned: "Returned for correction", submitted: "Awaiting approval" };

export function InspectionList({ rows, empty, showBy = false }: { rows: HomeInspectionRow[]; empty: string; showBy?: boolean }) {
  if (!rows.length) return <Card className="p-4 text-sm text-ink-soft">{empty}</Card>;
  return (
    <ul className="divide-y divide-ink-line/70 rounded-lg border border-ink-line bg-paper-raised">
      {rows.map((r) => (
        <li key={r.id}>
          <Link href={`/inspections/${r.id}`} className="flex min-h-12 flex-wrap items-center justify-between gap-x-4 gap-y-1 px-4 py-3 hover:bg-signal-tint/40">
            <span className="min-w-0">
              <span className="font-medium">
                {r.vesselName} · Cyl. {r.cylinderNo}
              </span>{" "}
              <span className="num text-sm text-ink-soft">gauged {day(r.inspectedOn)}</span>
              {r.state === "returned" && r.returnComment ? <span className="block text-sm text-caution">“{r.returnComment}”</span> : null}
            </span>
            <span className="text-sm text-ink-soft">
              {r.state === "returned" ? <span className="font-medium text-caution">↩ {STATE_WORDS[r.state]}</span> : STATE_WORDS[r.state] ?? r.state}
              {showBy && r.byName ? ` · by ${r.byName}` : ""}
              {r.at ? <span className="num"> · {day(r.at)}</span> : null}
            </span>
          </Link>
        </li>
      ))}
    </ul>
  );
}
