"use client";

import { Button } from "@/components/ui/button";
import type { ApprovalFigures } from "@/lib/inspections/approval";
import { formatFixed } from "@/lib/units/length";

/**
 * The chief engineer's last look before approving: the figures the record commits the unit
 * to and every caution still open, then one deliberate tap. An approved record is never
 * edited in place, only amended with a reason.
 */
export function ApproveConfirm({ figures, busy, onApprove, onCancel }: { figures?: ApprovalFigures; busy: boolean; onApprove: () => void; onCancel: () => void }) {
  return (
    <section aria-labelledby="approve-h" className="space-y-3 rounded-lg border-2 border-ink bg-paper-raised p-4" data-testid="approve-confirm">
      <h2 id="approve-h" className="font-semibold">
        Approve this record?
      </h2>
      {figures ? (
        <>
          <dl className="grid gap-x-6 gap-y-1 text-sm tabular-nums sm:grid-cols-2">
            <div>
              <dt className="inline text-ink-soft">Maximum wear: </dt>
              <dd className="inline font-semibold">
                {formatFixed(figures.maxWearMm, 2)} mm{figures.maxWearAt ? ` at ${figures.maxWearAt}` : ""} (limit {formatFixed(figures.wearLimitMm, 2)} mm)
              </dd>
            </div>
            <div>
              <dt className="inline text-ink-soft">Wear rate since the previous gauging: </dt>
              <dd className="inline font-semibold">{figures.rateMmPer1000h === null ? "—" : `${formatFixed(figures.rateMmPer1000h, 3)} mm/1000 h`}</dd>
            </div>
            <div className="sm:col-span-2">
              <dt className="inline text-ink-soft">Limit: </dt>
              <dd className="inline font-semibold">{figures.limitText}</dd>
            </div>
          </dl>
          {figures.cautions.length ? (
            <div>
              <p className="text-sm font-medium">Open cautions ({figures.cautions.length}):</p>
              <ul className="mt-1 space-y-1 text-sm" data-testid="approve-cautions">
                {figures.cautions.map((c) => (
                  <li key={c} className="flex gap-2 text-caution">
                    <span aria-hidden="true">⚠</span>
                    <span>{c}</span>
                  </li>
                ))}
              </ul>
            </div>
          ) : (
            <p className="text-sm">No open cautions.</p>
          )}
        </>
      ) : null}
      <p className="text-sm text-ink-soft">Once approved, the record counts in the unit&apos;s analysis and can be changed only by an amendment with a reason.</p>
      <div className="flex flex-wrap gap-2">
        <Button size="lg" disabled={busy} onClick={onApprove}>
          Approve this record
        </Button>
        <Button size="lg" variant="secondary" disabled={busy} onClick={onCancel}>
          Not yet
        </Button>
      </div>
    </section>
  );
}
