import { BandIcon } from "@/components/wear/band-badge";
import type { ProjectionSummary } from "@/lib/analysis/compute";
import { day, fixed, hours, monthYear, rateText } from "@/lib/format";

/**
 * Liner lives of up to about 90 000 h are quoted for modern engines (makers' published
 * guidelines); a projection past twice that says only that the limit is not in sight.
 */
const BEYOND_SERVICE_LIFE_H = 180_000;

/** One plain sentence for a projection, honest about what is not known. */
export function ProjectionText({ what, projection: p, limitMm }: { what: string; projection: ProjectionSummary; limitMm: number }) {
  switch (p.kind) {
    case "insufficient_data":
      return (
        <>
          {what}: not enough data to project — {p.have} of the {p.needed} readings past running-in that a projection needs.
        </>
      );
    case "not_wearing":
      return <>{what}: no rising trend ({rateText(p.slopeMmPer1000h)}), so no date to the limit.</>;
    case "already_over":
      return (
        <strong className="inline-flex items-center gap-1 text-limit">
          <BandIcon band="over_limit" /> {what} {fixed(p.valueMm)} mm has reached the {fixed(limitMm)} mm limit.
        </strong>
      );
    case "projected": {
      const d = p.dates;
      if (p.atLinerHours > BEYOND_SERVICE_LIFE_H) {
        return (
          <>
            {what}: at the present rate the {fixed(limitMm)} mm limit lies beyond {hours(BEYOND_SERVICE_LIFE_H)} liner hours, past any liner&apos;s
            service life.
          </>
        );
      }
      return (
        <>
          {what} reaches the {fixed(limitMm)} mm limit at about <span className="num font-semibold text-ink">{hours(p.atLinerHours)} h</span> on the liner
          {d?.kind === "dated" ? (
            <>
              , around <span className="num font-semibold text-ink">{monthYear(d.date)}</span> (95 %: {d.lower ? day(d.lower) : "open"} – {d.upper ? day(d.upper) : "open"})
            </>
          ) : (
            <> (no date: the running-hours log is too short to give a rate)</>
          )}
          .
        </>
      );
    }
  }
}
