import type { Metadata } from "next";
import Link from "next/link";
import { kindLabel, openablePath } from "@/components/notifications/kinds";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { requirePermission } from "@/lib/auth/session";
import { listFailedAddresses, listNotifications, type NotificationRow } from "@/lib/notifications/queries";
import { notificationFilterSchema, type NotificationState } from "@/lib/notifications/schemas";
import { cn } from "@/lib/utils";

export const metadata: Metadata = { title: "Notifications" };
export const dynamic = "force-dynamic";

const FILTERS: { state: NotificationState | undefined; label: string }[] = [
  { state: undefined, label: "All" },
  { state: "queued", label: "Queued" },
  { state: "sent", label: "Sent" },
  { state: "failed", label: "Failed" },
];

const when = (iso: string) => `${iso.slice(0, 16).replace("T", " ")} UTC`;

function StateLine({ n }: { n: NotificationRow }) {
  if (n.state === "sent") return <span className="text-steady">✓ Sent {n.sentAt ? <time dateTime={n.sentAt} className="num">{when(n.sentAt)}</time> : null}</span>;
  if (n.state === "failed") {
    return (
      <span className="font-medium text-limit">
        ⚠ {n.failure === "bounced" ? "Refused by the receiving mail server (bounced); not retried" : `Not delivered after ${n.attempts} attempts; not retried`}
      </span>
    );
  }
  return (
    <span className="text-ink-soft">
      ◷ Queued{n.attempts ? ` (${n.attempts} ${n.attempts === 1 ? "attempt" : "attempts"} so far, next ` : " (sending "}
      {n.nextAttemptAt ? <time dateTime={n.nextAttemptAt} className="num">{when(n.nextAttemptAt)}</time> : "soon"})
    </span>
  );
}

export default async function NotificationsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePermission("account.self");
  const { state } = notificationFilterSchema.parse(await searchParams);
  const admin = user.role === "admin";
  const [rows, failedAddresses] = await Promise.all([listNotifications(user, { state }), admin ? listFailedAddresses() : Promise.resolve([])]);
  return (
    <>
      <PageHeader eyebrow="E-mail" title="Notifications">
        <Link href="/notifications/preferences" className={buttonClass("secondary")}>
          Choose your e-mails
        </Link>
      </PageHeader>
      <p className="mb-4 max-w-3xl text-sm text-ink-soft">
        {admin
          ? "Every e-mail Kalibore has queued, to whom and when, and whether it was delivered."
          : "E-mails to you, and the alerts about your vessels, with whether they were delivered."}{" "}
        E-mails wait in a queue and are retried with growing pauses while the mail server does not answer.
      </p>

      {admin && failedAddresses.length ? (
        <section aria-labelledby="undelivered" className="mb-6">
          <h2 id="undelivered" className="mb-2 text-lg font-semibold">
            Addresses that did not receive their e-mail
          </h2>
          <Card>
            <ul className="divide-y divide-ink-line/70">
              {failedAddresses.map((a) => (
                <li key={a.address} className="px-4 py-3 text-sm">
                  <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1">
                    <span className="min-w-0 break-all font-medium">
                      {a.recipientName ? `${a.recipientName} · ` : ""}
                      {a.address}
                    </span>
                    <span className="num text-xs text-ink-soft">
                      {a.failed} undelivered · last <time dateTime={a.lastAt}>{when(a.lastAt)}</time>
                    </span>
                  </div>
                  <div className="mt-0.5 text-limit">
                    ⚠ {a.bounced ? "Bounced: the receiving server refuses this address. Correct it in the users page." : "The mail server did not accept the e-mail after every retry."}
                  </div>
                  {a.lastError ? <div className="mt-0.5 break-all font-mono text-xs text-ink-soft">{a.lastError}</div> : null}
                </li>
              ))}
            </ul>
          </Card>
        </section>
      ) : null}

      <nav aria-label="Filter by state" className="-mx-4 mb-4 overflow-x-auto px-4 sm:mx-0 sm:px-0">
        <ul className="flex min-w-max gap-1">
          {FILTERS.map((f) => (
            <li key={f.label}>
              <Link
                href={f.state ? `/notifications?state=${f.state}` : "/notifications"}
                aria-current={f.state === state ? "page" : undefined}
                className={cn(
                  "inline-flex min-h-11 min-w-11 items-center justify-center rounded-md border px-4 text-sm font-medium",
                  f.state === state ? "border-signal bg-signal-tint text-signal" : "border-ink-line bg-paper-raised text-ink-soft hover:border-ink-soft",
                )}
              >
                {f.label}
              </Link>
            </li>
          ))}
        </ul>
      </nav>

      {rows.length === 0 ? (
        <p className="text-sm text-ink-soft">{state ? `No ${state} e-mails.` : "No e-mails yet."}</p>
      ) : (
        <Card>
          <ol className="divide-y divide-ink-line/70" aria-label="E-mails, newest first">
            {rows.map((n) => {
              const open = openablePath(n.linkPath);
              return (
                <li key={n.id} className="px-4 py-3 text-sm" data-state={n.state}>
                  <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1">
                    <span className="min-w-0 font-medium">{n.subject}</span>
                    <time dateTime={n.createdAt} className="num shrink-0 text-xs text-ink-soft">
                      {when(n.createdAt)}
                    </time>
                  </div>
                  <div className="mt-0.5 text-ink-soft">
                    <span className="break-all">
                      To {n.recipientName ? `${n.recipientName} <${n.to}>` : n.to}
                    </span>
                    {" · "}
                    {kindLabel(n.kind)}
                    {n.vesselName ? ` · ${n.vesselName}` : ""}
                  </div>
                  <div className="mt-0.5 flex flex-wrap items-center justify-between gap-x-4">
                    <StateLine n={n} />
                    {open ? (
                      <Link href={open} className="inline-flex min-h-11 items-center font-medium text-signal underline-offset-2 hover:underline">
                        Open the page
                      </Link>
                    ) : null}
                  </div>
                  {admin && n.lastError && n.state !== "sent" ? <div className="mt-0.5 break-all font-mono text-xs text-ink-soft">{n.lastError}</div> : null}
                </li>
              );
            })}
          </ol>
        </Card>
      )}
    </>
  );
}
