import Link from "next/link";
import { Wordmark } from "@/components/ui/logo";
import { ROLE_LABELS, type Role } from "@/lib/auth/roles";
import { OfflineSupport } from "./offline-support";
import { SignOutButton } from "./sign-out-button";

export type NavItem = { href: string; label: string };

export function AppShell({
  user,
  nav,
  children,
}: {
  user: { name: string; role: Role };
  nav: NavItem[];
  children: React.ReactNode;
}) {
  return (
    <div className="flex min-h-dvh flex-col">
      <header className="no-print bg-night text-paper">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3 sm:px-6">
          <Link href="/" className="shrink-0 [&_span_span]:text-[#5fc2d6]" aria-label="Kalibore home">
            <Wordmark />
          </Link>
          <nav aria-label="Main" className="order-3 flex w-full gap-1 overflow-x-auto sm:order-none sm:w-auto">
            {nav.map((item) => (
              <Link
                key={item.href}
                href={item.href}
                className="inline-flex min-h-11 items-center rounded-md px-3 py-2 text-sm font-medium text-paper/85 hover:bg-white/10 hover:text-paper"
              >
                {item.label}
              </Link>
            ))}
          </nav>
          <div className="ml-auto flex items-center gap-3 text-sm">
            <span className="hidden text-right leading-tight sm:block">
              <span className="block font-medium">{user.name}</span>
              <span className="block text-xs text-paper/65">{ROLE_LABELS[user.role]}</span>
            </span>
            <SignOutButton />
          </div>
        </div>
      </header>
      {/* The render time travels with the page, so a copy kept for use offline says when it was taken. */}
      <OfflineSupport renderedAt={new Date().toISOString()} />
      <main className="mx-auto w-full max-w-7xl flex-1 px-4 py-6 sm:px-6">{children}</main>
      {/* On paper, say where and when the page came from, so a filed copy is never taken for the live record. */}
      <footer className="mx-auto hidden w-full max-w-7xl px-4 pb-4 text-xs text-ink-soft sm:px-6 print:block">
        From Kalibore, as it stood at {new Date().toISOString().slice(0, 16).replace("T", " ")} UTC, for {user.name}. The maker&apos;s
        manual and the company&apos;s safety management system govern the work; this record supports them.
      </footer>
    </div>
  );
}
