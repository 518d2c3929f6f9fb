import type { Metadata } from "next";
import Link from "next/link";
import { AcceptInvitationForm } from "@/components/auth/accept-invitation-form";
import { AuthCard } from "@/components/auth/auth-card";
import { RequestInvitationButton } from "@/components/auth/request-invitation-button";
import { buttonClass } from "@/components/ui/button";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { day } from "@/lib/format";
import { getInvitationByToken } from "@/lib/invitations/queries";

export const metadata: Metadata = { title: "Set up your account", robots: { index: false } };
export const dynamic = "force-dynamic";

export default async function InvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const valid = /^[A-Za-z0-9_-]{20,128}$/.test(token);
  const inv = valid ? await getInvitationByToken(token) : null;

  if (!inv) {
    return (
      <AuthCard
        title="This link does not work"
        lead="The invitation link is incomplete or unknown. Open it again from the e-mail — long links sometimes break across lines — or ask your administrator to send a new invitation."
      >
        <Link href="/sign-in" className={`${buttonClass("secondary")} mt-6 w-full`}>Go to sign-in</Link>
      </AuthCard>
    );
  }

  if (inv.status === "used") {
    return (
      <AuthCard title="Invitation already used" lead={`An account for ${inv.email} was set up with this link. Sign in with your password, or choose a new one if you have forgotten it.`}>
        <div className="mt-6 grid gap-3">
          <Link href="/sign-in" className={buttonClass("primary", "lg")}>Sign in</Link>
          <Link href="/forgot-password" className={buttonClass("secondary")}>Forgot your password?</Link>
        </div>
      </AuthCard>
    );
  }

  if (inv.status === "expired" || inv.status === "revoked") {
    return (
      <AuthCard
        title={inv.status === "expired" ? "This invitation has expired" : "This invitation was withdrawn"}
        lead={
          <>
            {inv.status === "expired"
              ? `Invitation links work for seven days; this one ended on ${day(inv.expiresAt.toISOString())}.`
              : "The administrator withdrew this link, or sent a newer one — check your inbox for a later e-mail."}{" "}
            {inv.inviter ? `We can ask ${inv.inviter.name}, who invited you, to send a new one.` : "We can ask your administrator to send a new one."}
          </>
        }
      >
        <RequestInvitationButton token={token} />
      </AuthCard>
    );
  }

  return (
    <AuthCard
      title={`Welcome, ${inv.name}`}
      lead={
        <>
          <p>
            {inv.inviter ? `${inv.inviter.name} invited you` : "You are invited"} to Kalibore as{" "}
            <strong className="font-semibold text-ink">{ROLE_LABELS[inv.role].toLowerCase()}</strong>
            {inv.vesselNames.length ? <> for {inv.vesselNames.join(", ")}</> : null}.
          </p>
          <p className="mt-2">
            Your sign-in address is <span className="font-medium text-ink">{inv.email}</span>. Choose a password to finish. This link works once, until{" "}
            <span className="num">{day(inv.expiresAt.toISOString())}</span>.
          </p>
        </>
      }
    >
      <AcceptInvitationForm token={token} />
    </AuthCard>
  );
}
