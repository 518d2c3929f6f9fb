import type { Metadata } from "next";
import Link from "next/link";
import { PreferencesForm } from "@/components/notifications/preferences-form";
import { PageHeader } from "@/components/ui/card";
import { requirePermission } from "@/lib/auth/session";
import { savePreferencesAction } from "@/lib/notifications/actions";
import { getPreferences } from "@/lib/notifications/queries";

export const metadata: Metadata = { title: "Your e-mails" };
export const dynamic = "force-dynamic";

export default async function PreferencesPage() {
  const user = await requirePermission("account.self");
  const preferences = await getPreferences(user);
  return (
    <>
      <PageHeader eyebrow={<Link href="/notifications">Notifications</Link>} title="Your e-mails" />
      <div className="max-w-2xl space-y-4">
        {preferences.length ? (
          <>
            <p className="text-sm text-ink-soft">
              Alerts come once for each cause, about the vessels you are assigned to. Untick everything and Kalibore sends you no e-mail about
              records or units; password-reset e-mails you ask for still come.
            </p>
            <PreferencesForm action={savePreferencesAction} preferences={preferences} />
          </>
        ) : (
          <p className="text-sm text-ink-soft">
            Your role gets no alerts or digest. Undelivered e-mail is listed on the <Link href="/notifications?state=failed" className="text-signal underline">notifications page</Link>; the alert horizon and
            threshold are set in the company settings.
          </p>
        )}
      </div>
    </>
  );
}
