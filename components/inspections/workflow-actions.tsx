"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { Button, buttonClass } from "@/components/ui/button";
import { ApiError, apiJson, NetworkError } from "@/lib/inspections/api-client";
import { randomToken } from "@/lib/inspections/form";
import type { InspectionState } from "@/lib/inspections/schemas";
import type { ApprovalFigures } from "@/lib/inspections/approval";
import { ApproveConfirm } from "./approve-confirm";
import { forgetWaitingPhotos } from "@/lib/photos/offline-queue";
import { cn } from "@/lib/utils";

/**
 * `edit`: may continue entry (for a returned record, the person who corrects it, not the chief
 * who returned it); `discard`: the draft's author, while it is a draft.
 */
export type WorkflowAllowed = { edit: boolean; approve: boolean; return: boolean; amend: boolean; discard?: boolean };

function messageOf(err: unknown): string {
  if (err instanceof NetworkError) return "No network: try again when you are back online.";
  if (err instanceof ApiError) {
    const problems = err.body.details?.problems;
    return problems?.length ? problems.map((p) => p.message).join(" ") : err.message;
  }
  return "Something went wrong; nothing was changed.";
}

/**
 * The workflow buttons a role may use in the record's current state. Hiding is only a
 * courtesy: the server checks the role, the vessel and the state on every call.
 */
export function WorkflowActions({
  inspectionId,
  state,
  allowed,
  approval,
}: {
  inspectionId: number;
  state: InspectionState;
  allowed: WorkflowAllowed;
  /** The figures the chief confirms before approving. */
  approval?: ApprovalFigures;
}) {
  const router = useRouter();
  const [mode, setMode] = useState<"none" | "return" | "amend" | "approve">("none");
  const [text, setText] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  const amendToken = useRef(randomToken(24));

  async function run(path: string, body: unknown, then: (res: { id: number }) => void) {
    setBusy(true);
    setError(null);
    try {
      const res = await apiJson<{ id: number }>(`/api/inspections/${inspectionId}/${path}`, { method: "POST", body });
      then(res);
    } catch (err) {
      setError(messageOf(err));
    } finally {
      setBusy(false);
    }
  }

  const canAct =
    ((state === "draft" || state === "returned") && (allowed.edit || allowed.discard)) ||
    (state === "submitted" && (allowed.approve || allowed.return)) ||
    (state === "approved" && allowed.amend);
  if (!canAct) {
    // The chief who just returned the record sees that it went back, not the engineer's next step.
    return done ? (
      <p role="status" className="no-print font-medium">
        {done}
      </p>
    ) : null;
  }

  return (
    <div className="no-print space-y-3">
      <div className="flex flex-wrap gap-2">
        {(state === "draft" || state === "returned") && allowed.edit ? (
          <Link href={`/inspections/${inspectionId}/edit`} className={buttonClass("primary", "lg")}>
            Continue entry
          </Link>
        ) : null}
        {state === "draft" && allowed.discard ? <DiscardDraft inspectionId={inspectionId} /> : null}
        {state === "submitted" && allowed.approve ? (
          <Button size="lg" disabled={busy} onClick={() => setMode(mode === "approve" ? "none" : "approve")}>
            Approve…
          </Button>
        ) : null}
        {state === "submitted" && allowed.return ? (
          <Button size="lg" variant="secondary" disabled={busy} onClick={() => setMode(mode === "return" ? "none" : "return")}>
            Return for correction…
          </Button>
        ) : null}
        {state === "approved" && allowed.amend ? (
          <Button size="lg" variant="secondary" disabled={busy} onClick={() => setMode(mode === "amend" ? "none" : "amend")}>
            Amend…
          </Button>
        ) : null}
      </div>
      {mode === "approve" ? (
        <ApproveConfirm
          figures={approval}
          busy={busy}
          onApprove={() => run("approve", {}, () => router.refresh())}
          onCancel={() => setMode("none")}
        />
      ) : null}
      {mode === "return" || mode === "amend" ? (
        <form
          className="space-y-2 rounded-lg border border-ink-line bg-paper-raised p-3"
          onSubmit={(e) => {
            e.preventDefault();
            if (mode === "return")
              run("return", { comment: text }, () => {
                // The form has done its job: close it, say so, and show the record as it now stands.
                setMode("none");
                setText("");
                setDone("Returned to the engineer with your comment. It comes back to you when it is submitted again.");
                router.refresh();
              });
            else run("amend", { reason: text, clientToken: amendToken.current }, (res) => router.push(`/inspections/${res.id}/edit`));
          }}
        >
          <label htmlFor="workflow-text" className="block text-sm font-medium text-ink-soft">
            {mode === "return" ? "What must be corrected?" : "Reason for the amendment (kept in the record)"}
          </label>
          <textarea id="workflow-text" rows={3} required className="block w-full rounded-md border border-ink-line bg-paper-raised p-3" value={text} onChange={(e) => setText(e.target.value)} />
          <p className="text-sm text-ink-faint">
            {mode === "amend"
              ? "The approved record stays as it is; a new version opens as a draft, and replaces it only when that version is approved."
              : "The engineer sees your comment on the gauging sheet."}
          </p>
          <Button type="submit" disabled={busy || text.trim().length < (mode === "amend" ? 5 : 3)}>
            {mode === "return" ? "Return with this comment" : "Open the amendment"}
          </Button>
        </form>
      ) : null}
      {done ? (
        <p role="status" className="font-medium">
          {done}
        </p>
      ) : null}
      {error ? (
        <p role="alert" className="text-sm font-medium text-caution">
          ⚠ {error}
        </p>
      ) : null}
    </div>
  );
}

/**
 * Discards a draft opened by mistake, after saying what goes with it. The server refuses
 * anyone but the author and anything but a draft; this device's unsent copy and photos
 * waiting to upload go too.
 */
export function DiscardDraft({ inspectionId, className }: { inspectionId: number; className?: string }) {
  const router = useRouter();
  const [asking, setAsking] = useState(false);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function discard() {
    setBusy(true);
    setError(null);
    try {
      await apiJson(`/api/inspections/${inspectionId}`, { method: "DELETE" });
      localStorage.removeItem(`kalibore:inspection:${inspectionId}`);
      await forgetWaitingPhotos(inspectionId);
      router.replace("/inspections/new?discarded=1");
      router.refresh();
    } catch (err) {
      setError(messageOf(err));
      setBusy(false);
    }
  }

  if (!asking) {
    return (
      <Button size="lg" variant="secondary" className={className} onClick={() => setAsking(true)}>
        Discard this draft…
      </Button>
    );
  }
  return (
    <div role="group" aria-label="Discard the draft" className={cn("w-full space-y-2 rounded-lg border-2 border-limit bg-paper-raised p-3", className)}>
      <p className="font-medium">Discard this draft?</p>
      <p className="text-sm text-ink-soft">
        Its readings, rings, checklist and photos are deleted and cannot be brought back. The record keeps a line saying that you discarded it.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button size="lg" variant="danger" disabled={busy} onClick={discard}>
          {busy ? "Discarding…" : "Discard the draft"}
        </Button>
        <Button size="lg" variant="secondary" disabled={busy} onClick={() => setAsking(false)}>
          Keep it
        </Button>
      </div>
      {error ? (
        <p role="alert" className="text-sm font-medium text-caution">
          ⚠ {error}
        </p>
      ) : null}
    </div>
  );
}
