import { cn } from "@/lib/utils";

/** The one-line outcome of a form: a confirmation, or a refusal with a warning mark. */
export function FormMessage({ ok, message, className }: { ok: boolean; message: string | null | undefined; className?: string }) {
  if (!message) return null;
  return (
    <p
      role={ok ? "status" : "alert"}
      className={cn(
        "rounded-md border px-3 py-2 text-sm font-medium",
        ok ? "border-steady/50 bg-steady-tint text-steady" : "border-limit/60 bg-limit-tint text-limit",
        className,
      )}
    >
      <span aria-hidden="true">{ok ? "✓ " : "⚠ "}</span>
      {message}
    </p>
  );
}
