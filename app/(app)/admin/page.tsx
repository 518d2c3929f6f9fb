import type { Metadata } from "next";
import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { countAdminOverview, listRecentAudit } from "@/lib/admin/queries";
import { requirePermission } from "@/lib/auth/session";
import { countFailedMail } from "@/lib/notifications/queries";

export const metadata: Metadata = { title: "Administration" };

const ACTION_WORDS: Record<string, string> = {
  "invitation.create": "invited",
  "invitation.reissue": "re-sent an invitation to",
  "invitation.revoke": "withdrew an invitation",
  "invitation.accept": "accepted an invitation",
  "user.update_access": "changed role or vessels of",
  "user.deactivate": "deactivated",
  "user.reactivate": "reactivated",
  "user.password_reset": "reset their password",
  "notifications.preferences": "changed their e-mail choices",
  "vessel.create": "added vessel",
  "vessel.update": "edited vessel",
  "engine.create": "added engine",
  "profile.create": "added profile",
  "profile.update": "edited profile",
};

export default async function AdminHomePage() {
  await requirePermission("admin.users");
  const [counts, audit, failedMail] = await Promise.all([countAdminOverview(), listRecentAudit(12), countFailedMail()]);
  const tiles = [
    { label: "Active users", value: counts.activeUsers, href: "/admin/users", hint: `${counts.openInvitations} open invitations` },
    { label: "Vessels", value: counts.vessels, href: "/admin/vessels" },
    { label: "Main engines", value: counts.engines, href: "/admin/engines" },
    { label: "Engine profiles", value: counts.profiles, href: "/admin/profiles" },
    { label: "Undelivered e-mail", value: failedMail, href: "/notifications?state=failed", hint: failedMail ? "bounced or given up: see who" : "none" },
  ];
  return (
    <>
      <PageHeader eyebrow="Administration" title="People, vessels and engines">
        <Link href="/admin/users/invite" className={buttonClass("primary")}>Invite a person</Link>
      </PageHeader>
      <ul className="grid grid-cols-2 gap-3 lg:grid-cols-4">
        {tiles.map((t) => (
          <li key={t.label}>
            <Link href={t.href} className="block h-full rounded-lg border border-ink-line bg-paper-raised p-4 hover:border-signal">
              <span className="block text-xs font-medium uppercase tracking-wide text-ink-faint">{t.label}</span>
              <span className="num mt-1 block text-2xl font-semibold">{t.value}</span>
              {t.hint ? <span className="block text-xs text-ink-faint">{t.hint}</span> : null}
            </Link>
          </li>
        ))}
      </ul>
      <h2 className="mb-3 mt-8 text-lg font-semibold">Recent changes</h2>
      <Card>
        {audit.length === 0 ? (
          <p className="p-4 text-sm text-ink-soft">Nothing recorded yet.</p>
        ) : (
          <ol className="divide-y divide-ink-line/70">
            {audit.map((a) => (
              <li key={a.id} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-0.5 px-4 py-2.5 text-sm">
                <span className="min-w-0">
                  <span className="font-medium">{a.actorName ?? "Someone"}</span> {ACTION_WORDS[a.action] ?? a.action}{" "}
                  <span className="text-ink-faint">
                    {a.entityType.replace("_", " ")} #{a.entityId.length > 12 ? a.entityId.slice(0, 8) : a.entityId}
                  </span>
                </span>
                <time dateTime={a.at} className="num text-xs text-ink-faint">
                  {a.at.slice(0, 16).replace("T", " ")} UTC
                </time>
              </li>
            ))}
          </ol>
        )}
      </Card>
    </>
  );
}
