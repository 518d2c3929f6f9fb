"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ApiError, apiJson } from "@/lib/inspections/api-client";
import type { ColumnMapping } from "@/lib/imports/layout";
import type { CsvOptions } from "@/lib/imports/parse";

type Props = {
  importId: number;
  mayCommit: boolean;
  mayApprove: boolean;
  approveRefusal: string | null;
  status: string;
  destination: "draft" | "history";
  errorLines: number[];
  warningCount: number;
  overwrites: number;
  /** What the re-check with rows left out sends again. */
  again: { fileId: number; vesselId: number; engineId: number | null; unitId: number | null; inspectionId: number | null; newDraft: unknown; mapping: ColumnMapping; options: CsvOptions; excludedLines: number[]; replacesImportId: number | null };
};

/** The buttons of an import's page: leave out rows, import, approve. Every refusal is shown in words. */
export function ImportActions(p: Props) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [confirm, setConfirm] = useState(false);
  const [typed, setTyped] = useState<"replace" | "keep" | null>(null);

  async function run(action: () => Promise<unknown>) {
    setBusy(true);
    setMessage(null);
    try {
      await action();
    } catch (err) {
      setMessage(err instanceof ApiError || err instanceof Error ? err.message : "Something went wrong; nothing was changed.");
    } finally {
      setBusy(false);
    }
  }

  const leaveOut = () =>
    run(async () => {
      const a = p.again;
      const dto = await apiJson<{ id: number }>("/api/imports", {
        method: "POST",
        body: {
          fileId: a.fileId,
          vesselId: a.vesselId,
          destination: p.destination,
          engineId: a.engineId,
          unitId: a.unitId,
          inspectionId: a.inspectionId,
          newDraft: a.newDraft ?? null,
          mapping: a.mapping,
          options: a.options,
          excludedLines: [...new Set([...a.excludedLines, ...p.errorLines])],
          replacesImportId: a.replacesImportId,
          saveMapping: false,
        },
      });
      router.push(`/imports/${dto.id}`);
    });

  const commit = () =>
    run(async () => {
      await apiJson(`/api/imports/${p.importId}/commit`, { method: "POST", body: { confirmWarnings: confirm, typedReadings: typed } });
      router.refresh();
    });

  const approve = () =>
    run(async () => {
      await apiJson(`/api/imports/${p.importId}/approve`, { method: "POST", body: {} });
      router.refresh();
    });

  return (
    <div className="space-y-3">
      {p.status === "previewed" && p.mayCommit ? (
        <>
          {p.errorLines.length ? (
            <div className="flex flex-wrap gap-3">
              <Button type="button" variant="secondary" onClick={() => void leaveOut()} disabled={busy}>
                Leave out the {p.errorLines.length} row{p.errorLines.length === 1 ? "" : "s"} with errors and check again
              </Button>
            </div>
          ) : (
            <>
              {p.warningCount ? (
                <label className="flex min-h-11 items-start gap-3">
                  <input type="checkbox" className="mt-1 size-5 shrink-0" checked={confirm} onChange={(e) => setConfirm(e.target.checked)} />
                  <span>I have checked the {p.warningCount} warning{p.warningCount === 1 ? "" : "s"}: import these values as read (the confirmation is stored with each value).</span>
                </label>
              ) : null}
              {p.overwrites ? (
                <fieldset className="rounded-md border border-ink-line p-3">
                  <legend className="px-1 font-medium">{p.overwrites} reading{p.overwrites === 1 ? " already typed differs" : "s already typed differ"} from the file</legend>
                  {([
                    ["replace", "Replace the typed readings with the file's"],
                    ["keep", "Keep the typed readings; take only the others from the file"],
                  ] as const).map(([v, label]) => (
                    <label key={v} className="flex min-h-11 items-center gap-3">
                      <input type="radio" name="typed" className="size-5" checked={typed === v} onChange={() => setTyped(v)} />
                      <span>{label}</span>
                    </label>
                  ))}
                </fieldset>
              ) : null}
              <Button type="button" size="lg" onClick={() => void commit()} disabled={busy || (p.warningCount > 0 && !confirm) || (p.overwrites > 0 && !typed)}>
                {busy ? "Importing…" : p.destination === "draft" ? "Import into the draft" : "Import the records"}
              </Button>
            </>
          )}
        </>
      ) : null}
      {p.status === "committed" && p.destination === "history" ? (
        p.mayApprove ? (
          <Button type="button" size="lg" onClick={() => void approve()} disabled={busy}>
            {busy ? "Approving…" : "Approve the imported records"}
          </Button>
        ) : p.approveRefusal ? (
          <p className="text-sm text-ink-soft">{p.approveRefusal}</p>
        ) : null
      ) : null}
      {message ? (
        <p role="alert" className="rounded-md border-2 border-limit bg-limit-tint p-3">
          {message}
        </p>
      ) : null}
    </div>
  );
}
