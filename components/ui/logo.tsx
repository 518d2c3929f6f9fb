import { cn } from "@/lib/utils";

/**
 * The Kalibore mark: a bore seen from above, gauged across two perpendicular
 * diameters — the one measurement the product exists for.
 */
export function LogoMark({ className, title = "Kalibore" }: { className?: string; title?: string }) {
  return (
    <svg
      viewBox="0 0 32 32"
      className={cn("h-8 w-8", className)}
      // Beside the word "Kalibore" the mark is decoration; alone it is an image with a name.
      {...(title ? { role: "img", "aria-label": title } : { "aria-hidden": true })}
    >
      <rect width="32" height="32" rx="6" fill="#111720" />
      <circle cx="16" cy="16" r="10.5" fill="none" stroke="#f6f5f1" strokeWidth="2.5" />
      <path d="M16 3.5v7M16 21.5v7" stroke="#5fc2d6" strokeWidth="2.5" strokeLinecap="round" />
      <path d="M9.5 16h13" stroke="#f6f5f1" strokeWidth="2" strokeDasharray="2 2" />
    </svg>
  );
}

export function Wordmark({ className }: { className?: string }) {
  return (
    <span className={cn("inline-flex items-center gap-2", className)}>
      <LogoMark className="h-7 w-7" title="" />
      <span className="text-lg font-semibold tracking-[0.02em]">
        Kali<span className="text-signal">bore</span>
      </span>
    </span>
  );
}
