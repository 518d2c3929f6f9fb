import { AppShell, type NavItem } from "@/components/layout/app-shell";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";

// The layout only builds the navigation; every page below checks access itself.
export default async function SignedInLayout({ children }: { children: React.ReactNode }) {
  const user = await requireUser();
  const nav: NavItem[] = [{ href: "/fleet", label: "Fleet" }];
  if (can(user.role, "fleet.read")) nav.push({ href: "/outlook", label: "Outlook" });
  if (can(user.role, "import.create") || can(user.role, "inspection.approve")) nav.push({ href: "/imports", label: "Imports" });
  if (can(user.role, "admin.users")) nav.push({ href: "/admin", label: "Admin" });
  nav.push({ href: "/notifications", label: "Notifications" });
  return (
    <AppShell user={user} nav={nav}>
      {children}
    </AppShell>
  );
}
