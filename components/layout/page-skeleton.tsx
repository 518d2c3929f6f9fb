// Shown at once on navigation while the server reads the record, so a slow ship's link
// never looks like a dead tap. Each route segment's loading.tsx shows it; none sits above
// a record's own check, so a missing record still answers HTTP 404 (see lib/auth/record-scope.ts).
export function PageSkeleton() {
  return (
    <div role="status" aria-live="polite" className="animate-pulse py-8">
      <div className="h-4 w-40 rounded bg-ink-line/60" />
      <div className="mt-3 h-8 w-72 max-w-full rounded bg-ink-line/60" />
      <div className="mt-8 grid gap-4 md:grid-cols-3">
        <div className="h-28 rounded-lg bg-ink-line/40" />
        <div className="h-28 rounded-lg bg-ink-line/40" />
        <div className="h-28 rounded-lg bg-ink-line/40" />
      </div>
      <span className="sr-only">Loading…</span>
    </div>
  );
}
