"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { resendInvitationAction, revokeInvitationAction } from "@/lib/admin/actions";
import { ROLE_LABELS, isRole } from "@/lib/auth/roles";

export type InvitationListRow = {
  id: number;
  name: string;
  email: string;
  role: string;
  vesselNames: string[];
  status: "valid" | "expired" | "used" | "revoked";
  expiresAt: string;
  invitedByName: string | null;
};

const STATUS: Record<InvitationListRow["status"], string> = {
  valid: "Waiting",
  expired: "Expired",
  revoked: "Withdrawn",
  used: "Accepted",
};

export function InvitationsList({ invitations }: { invitations: InvitationListRow[] }) {
  const router = useRouter();
  const [busy, setBusy] = useState<number | null>(null);
  const [notes, setNotes] = useState<Record<number, { ok: boolean; text: string }>>({});
  const [, start] = useTransition();
  const run = (id: number, kind: "resend" | "revoke") =>
    start(async () => {
      setBusy(id);
      const r = kind === "resend" ? await resendInvitationAction(undefined, { invitationId: id }) : await revokeInvitationAction(undefined, { invitationId: id });
      setNotes((n) => ({ ...n, [id]: { ok: r.ok, text: r.message ?? "" } }));
      setBusy(null);
      router.refresh();
    });
  if (!invitations.length) return <p className="text-sm text-ink-soft">No invitations waiting.</p>;
  return (
    <ul className="divide-y divide-ink-line/70 rounded-lg border border-ink-line bg-paper-raised">
      {invitations.map((i) => (
        <li key={i.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3 text-sm">
          <div className="min-w-0">
            <div className="font-medium">
              {i.name} <span className="font-normal text-ink-faint">{i.email}</span>
            </div>
            <div className="text-xs text-ink-soft">
              {isRole(i.role) ? ROLE_LABELS[i.role] : i.role}
              {i.vesselNames.length ? ` · ${i.vesselNames.join(", ")}` : ""} · {STATUS[i.status]}
              {i.status === "valid" ? <> until <span className="num">{i.expiresAt.slice(0, 10)}</span></> : null}
              {i.invitedByName ? ` · by ${i.invitedByName}` : ""}
            </div>
            {notes[i.id] ? (
              <div role={notes[i.id].ok ? "status" : "alert"} className={notes[i.id].ok ? "text-xs text-steady" : "text-xs text-limit"}>
                {notes[i.id].ok ? "✓ " : "⚠ "}
                {notes[i.id].text}
              </div>
            ) : null}
          </div>
          <div className="flex gap-2">
            <Button type="button" variant="secondary" className="min-h-9 px-3" disabled={busy === i.id} onClick={() => run(i.id, "resend")}>
              Send again
            </Button>
            {i.status === "valid" ? (
              <Button type="button" variant="quiet" className="min-h-9 px-3" disabled={busy === i.id} onClick={() => run(i.id, "revoke")}>
                Withdraw
              </Button>
            ) : null}
          </div>
        </li>
      ))}
    </ul>
  );
}
