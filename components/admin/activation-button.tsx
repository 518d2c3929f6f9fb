"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { deactivateUserAction, reactivateUserAction } from "@/lib/admin/actions";

/** Deactivate (two clicks, it ends their sessions) or reactivate a user. */
export function ActivationButton({ userId, name, active, size = "sm" }: { userId: string; name: string; active: boolean; size?: "sm" | "md" }) {
  const router = useRouter();
  const [confirming, setConfirming] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [pending, start] = useTransition();
  const run = (deactivate: boolean) =>
    start(async () => {
      const r = deactivate ? await deactivateUserAction(undefined, { userId }) : await reactivateUserAction(undefined, { userId });
      setConfirming(false);
      setMessage(r.ok ? null : r.message);
      router.refresh();
    });
  const cls = size === "sm" ? "min-h-9 px-3" : "";
  return (
    <div className="inline-flex flex-col items-end gap-1">
      {active ? (
        confirming ? (
          <span className="inline-flex flex-wrap justify-end gap-1">
            <Button type="button" variant="danger" className={cls} disabled={pending} onClick={() => run(true)} aria-label={`Confirm: deactivate ${name}`}>
              {pending ? "…" : "Deactivate now"}
            </Button>
            <Button type="button" variant="quiet" className={cls} disabled={pending} onClick={() => setConfirming(false)}>
              Cancel
            </Button>
          </span>
        ) : (
          <Button type="button" variant="secondary" className={cls} onClick={() => setConfirming(true)} aria-label={`Deactivate ${name}`}>
            Deactivate
          </Button>
        )
      ) : (
        <Button type="button" variant="secondary" className={cls} disabled={pending} onClick={() => run(false)} aria-label={`Reactivate ${name}`}>
          {pending ? "…" : "Reactivate"}
        </Button>
      )}
      {message ? <span role="alert" className="text-xs text-limit">⚠ {message}</span> : null}
    </div>
  );
}
