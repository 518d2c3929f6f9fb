import Link from "next/link";
import { BandBadge, isBandKey } from "@/components/wear/band-badge";
import { Card } from "@/components/ui/card";
import { day, fixed, monthYear } from "@/lib/format";
import type { HomeEngine } from "@/lib/home/queries";

/** One engine's units as tappable tiles: band, max wear against the limit, limit date. */
export function EngineUnits({ engine }: { engine: HomeEngine }) {
  return (
    <Card className="p-4 sm:p-5">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold">
          <Link href={`/engines/${engine.engineId}`} className="hover:text-signal hover:underline">
            {engine.vesselName} · {engine.designation}
          </Link>
        </h3>
        <span className="text-xs text-ink-faint">
          wear limit <span className="num">{fixed(engine.linerWearLimitMm)} mm</span>
        </span>
      </div>
      <ul className="mt-3 grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-4">
        {engine.units.map((u) => (
          <li key={u.unitId} className="min-w-0">
            <Link href={`/units/${u.unitId}`} className="block h-full rounded-md border border-ink-line bg-paper p-3 hover:border-signal">
              <span className="block text-sm font-semibold">Cyl. {u.cylinderNo}</span>
              <span className="mt-1 block">
                {u.band && isBandKey(u.band) ? <BandBadge band={u.band} className="text-xs whitespace-normal!" /> : <span className="text-xs text-ink-faint">Not analysed</span>}
              </span>
              <span className="num mt-1 block text-xs text-ink-soft">max wear {fixed(u.maxWearMm)} mm</span>
              {u.limitOn ? <span className="num block text-xs text-ink-soft">at limit {monthYear(u.limitOn)}</span> : null}
              <span className="num block text-xs text-ink-faint">gauged {day(u.lastInspectedOn)}</span>
            </Link>
          </li>
        ))}
      </ul>
    </Card>
  );
}
