import { cn } from "@/lib/utils";
import { BAND_LABELS, type BandKey } from "@/lib/wear/bands";

// The band keys and their words live with the band rules in lib/wear/bands.ts.

export { BAND_LABELS, type BandKey };

const styles: Record<BandKey, string> = {
  over_limit: "bg-limit text-white border-limit",
  renew_before_next: "bg-caution-tint text-caution border-caution",
  watch: "bg-paper-raised text-caution border-caution",
  steady: "bg-paper-raised text-steady border-steady/60",
  unknown: "bg-paper-sunk text-ink-soft border-ink-line",
};

/** A shape per band so colour is never the only signal (also prints in black and white). */
export function BandIcon({ band, className }: { band: BandKey; className?: string }) {
  const c = cn("h-4 w-4 shrink-0", className);
  switch (band) {
    case "over_limit":
      return (
        <svg viewBox="0 0 16 16" className={c} aria-hidden="true">
          <rect x="1.5" y="1.5" width="13" height="13" rx="2" fill="none" stroke="currentColor" strokeWidth="2" />
          <path d="M5 5l6 6M11 5l-6 6" stroke="currentColor" strokeWidth="2" />
        </svg>
      );
    case "renew_before_next":
      return (
        <svg viewBox="0 0 16 16" className={c} aria-hidden="true">
          <path d="M8 1.5l7 13H1z" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinejoin="round" />
          <path d="M8 6v4M8 11.5v1.5" stroke="currentColor" strokeWidth="1.8" />
        </svg>
      );
    case "watch":
      return (
        <svg viewBox="0 0 16 16" className={c} aria-hidden="true">
          <circle cx="8" cy="8" r="6.2" fill="none" stroke="currentColor" strokeWidth="1.8" />
          <circle cx="8" cy="8" r="2.2" fill="currentColor" />
        </svg>
      );
    case "steady":
      return (
        <svg viewBox="0 0 16 16" className={c} aria-hidden="true">
          <path d="M2.5 8.5l3.5 3.5 7.5-8" fill="none" stroke="currentColor" strokeWidth="2" />
        </svg>
      );
    default:
      return (
        <svg viewBox="0 0 16 16" className={c} aria-hidden="true">
          <circle cx="8" cy="8" r="6.2" fill="none" stroke="currentColor" strokeWidth="1.6" strokeDasharray="2.5 2" />
        </svg>
      );
  }
}

export function BandBadge({ band, label, className }: { band: BandKey; label?: string; className?: string }) {
  return (
    <span
      className={cn(
        "inline-flex items-center gap-1.5 rounded border px-2 py-0.5 text-sm font-medium whitespace-nowrap",
        styles[band],
        className,
      )}
    >
      <BandIcon band={band} />
      {label ?? BAND_LABELS[band]}
    </span>
  );
}

export function isBandKey(v: unknown): v is BandKey {
  return typeof v === "string" && v in BAND_LABELS;
}
