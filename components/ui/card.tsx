import { cn } from "@/lib/utils";

export function Card({ className, ...props }: React.HTMLAttributes<HTMLDivElement>) {
  return <div className={cn("rounded-lg border border-ink-line bg-paper-raised print:break-inside-avoid", className)} {...props} />;
}

export function PageHeader({
  eyebrow,
  title,
  children,
}: {
  eyebrow?: React.ReactNode;
  title: React.ReactNode;
  children?: React.ReactNode;
}) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-ink-line pb-4">
      <div className="min-w-0">
        {/* Breadcrumb links are tapped with a gloved finger: each gets a 44 px target. */}
        {eyebrow ? <div className="mb-1 text-sm text-ink-soft [&_a]:inline-flex [&_a]:min-h-11 [&_a]:min-w-11 [&_a]:items-center">{eyebrow}</div> : null}
        <h1 className="text-2xl font-semibold sm:text-3xl">{title}</h1>
      </div>
      {children ? <div className="flex flex-wrap items-center gap-2">{children}</div> : null}
    </header>
  );
}

export function Stat({ label, value, unit, hint }: { label: string; value: React.ReactNode; unit?: string; hint?: React.ReactNode }) {
  return (
    <div className="min-w-0">
      <div className="text-xs font-medium uppercase tracking-wide text-ink-faint">{label}</div>
      <div className="num mt-0.5 text-xl font-semibold">
        {value}
        {unit ? <span className="ml-1 text-sm font-normal text-ink-soft">{unit}</span> : null}
      </div>
      {hint ? <div className="text-xs text-ink-faint">{hint}</div> : null}
    </div>
  );
}
