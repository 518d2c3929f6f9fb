"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ApiError, apiJson, NetworkError } from "@/lib/inspections/api-client";
import type { Problem } from "@/lib/inspections/rules";
import type { InspectionDto } from "@/lib/inspections/schemas";

/** What still blocks submission, and the submit button (which saves the latest changes first). */
export function SubmitPanel({
  inspectionId,
  problems,
  cautions,
  canSubmit,
  blocked,
  flush,
  forget,
  revision,
  onConflict,
}: {
  inspectionId: number;
  problems: Problem[];
  canSubmit: boolean;
  /** A conflict is open: nothing may be submitted until it is settled. */
  blocked: boolean;
  flush: () => Promise<boolean>;
  forget: () => void;
  /** Not blocking, but the chief should see them: confirmed warnings, ring and pressure cautions. */
  cautions: Problem[];
  /** The revision this device last saved: the submit names it, so a newer copy elsewhere is a conflict. */
  revision: () => number;
  onConflict: (server: InspectionDto | null, message: string) => void;
}) {
  const router = useRouter();
  const [submitError, setSubmitError] = useState<Problem[] | string | null>(null);
  const [submitting, setSubmitting] = useState(false);

  async function submit() {
    setSubmitError(null);
    setSubmitting(true);
    try {
      const ok = await flush();
      if (!ok) {
        setSubmitError("The latest changes are not on the server yet (see the status above). Nothing was submitted; your entries are kept.");
        return;
      }
      // The revision this device saved, never one fetched now: a copy saved meanwhile on
      // another device must come back as a conflict, not be submitted unseen.
      await apiJson(`/api/inspections/${inspectionId}/submit`, { method: "POST", body: { revision: revision() } });
      forget();
      router.push(`/inspections/${inspectionId}`);
      router.refresh();
    } catch (err) {
      if (err instanceof NetworkError) setSubmitError("No network: submit when you are back online. Everything is kept on this device.");
      else if (err instanceof ApiError && err.status === 409) {
        onConflict((err.body.details?.server as InspectionDto | undefined) ?? null, err.message);
        setSubmitError(`${err.message} Nothing was submitted; your entries are kept.`);
      } else if (err instanceof ApiError) setSubmitError(err.body.details?.problems ?? err.message);
      else setSubmitError("Something went wrong; nothing was submitted.");
    } finally {
      setSubmitting(false);
    }
  }

  return (
    <section id="submit" aria-labelledby="submit-h" className="scroll-mt-32 rounded-lg border border-ink-line bg-paper-raised p-4">
      <h2 id="submit-h" className="text-xl font-semibold">
        Submit for approval
      </h2>
      {problems.length ? (
        <>
          <p className="mt-1 text-sm text-ink-soft">Before this record can be submitted:</p>
          <ul className="mt-2 space-y-1 text-sm" data-testid="submit-problems">
            {problems.map((p) => (
              <li key={p.field + p.message} className="flex gap-2">
                <span aria-hidden="true">○</span>
                <span>{p.message}</span>
              </li>
            ))}
          </ul>
        </>
      ) : null}
      {cautions.length ? (
        <>
          <p className="mt-3 text-sm text-ink-soft">
            Open cautions ({cautions.length}): they do not stop the submission, and the chief engineer sees each one with the record.
          </p>
          <ul className="mt-2 space-y-1 text-sm" data-testid="submit-cautions">
            {cautions.map((p) => (
              <li key={p.field + p.message} className="flex gap-2 text-caution">
                <span aria-hidden="true">⚠</span>
                <span>{p.message}</span>
              </li>
            ))}
          </ul>
        </>
      ) : null}
      {!problems.length && !cautions.length ? (
        <p className="mt-1 font-medium text-steady" data-testid="submit-complete">
          ✓ Complete: every reading, ring and checklist item is in, with no open caution.
        </p>
      ) : !problems.length ? (
        <p className="mt-3 font-medium">Ready to submit, with the cautions above.</p>
      ) : null}
      {submitError ? (
        <div role="alert" className="mt-3 rounded-md border border-caution bg-caution-tint p-3 text-sm font-medium text-caution">
          {typeof submitError === "string" ? submitError : submitError.map((p) => <p key={p.message}>⚠ {p.message}</p>)}
        </div>
      ) : null}
      {canSubmit ? (
        <Button type="button" size="lg" className="mt-4" disabled={problems.length > 0 || submitting || blocked} onClick={submit}>
          {submitting ? "Submitting…" : "Submit for approval"}
        </Button>
      ) : (
        <p className="mt-3 text-sm text-ink-faint">Your role cannot submit inspections.</p>
      )}
    </section>
  );
}
