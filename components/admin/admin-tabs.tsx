"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { cn } from "@/lib/utils";

const TABS = [
  { href: "/admin", label: "Overview" },
  { href: "/admin/users", label: "Users" },
  { href: "/admin/companies", label: "Companies" },
  { href: "/admin/vessels", label: "Vessels" },
  { href: "/admin/engines", label: "Engines" },
  { href: "/admin/profiles", label: "Engine profiles" },
];

export function AdminTabs() {
  const path = usePathname();
  return (
    <nav aria-label="Administration" className="no-print -mx-4 mb-6 overflow-x-auto border-b border-ink-line px-4 sm:mx-0 sm:px-0">
      <ul className="flex min-w-max gap-1">
        {TABS.map((t) => {
          const active = t.href === "/admin" ? path === "/admin" : path.startsWith(t.href);
          return (
            <li key={t.href}>
              <Link
                href={t.href}
                aria-current={active ? "page" : undefined}
                className={cn(
                  "inline-flex min-h-11 items-center border-b-2 px-3 text-sm font-medium",
                  active ? "border-signal text-signal" : "border-transparent text-ink-soft hover:text-ink",
                )}
              >
                {t.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
