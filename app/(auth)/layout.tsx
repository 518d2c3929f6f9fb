import { Wordmark } from "@/components/ui/logo";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="flex min-h-dvh flex-col bg-night text-paper">
      <header className="px-6 py-5">
        <Wordmark className="text-paper [&_span_span]:text-[#5fc2d6]" />
      </header>
      <main className="flex flex-1 items-start justify-center px-4 pb-16 pt-6 sm:items-center sm:pt-0">{children}</main>
      <footer className="px-6 py-4 text-xs text-paper/60">
        Wear records and projections support the engine maker&apos;s manual and your company&apos;s safety
        management system; they never replace them.
      </footer>
    </div>
  );
}
