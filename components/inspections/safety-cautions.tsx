/**
 * The usual cautions for crankcase and cylinder work, lifts and hydraulic tools. They
 * remind; they do not replace the engine maker's manual, the company's safety
 * management system or the flag and class rules, and the text says so.
 */
export function SafetyCautions({ open = false }: { open?: boolean }) {
  return (
    <details open={open} className="rounded-lg border-2 border-ink bg-paper-raised p-4 [&_summary]:cursor-pointer">
      <summary className="min-h-10 text-base font-semibold">
        <span aria-hidden="true">⚠ </span>Safety before and during the overhaul
      </summary>
      <div className="mt-3 grid gap-4 text-sm leading-relaxed md:grid-cols-2">
        <section>
          <h4 className="font-semibold">Before opening up or entering</h4>
          <ul className="mt-1 list-disc space-y-1 pl-5">
            <li>Turning gear engaged and blocked; starting air shut off, blocked and vented; indicator cocks open.</li>
            <li>Lock-out and tag-out of the engine and its auxiliaries, with the tags on the control stations.</li>
            <li>
              After an oil-mist alarm, stop and wait at least about 20 minutes before opening any crankcase door; keep clear of the relief valves.
            </li>
            <li>
              Ventilate the crankcase or scavenge space and test the atmosphere before anyone enters; follow the IMO enclosed-space entry
              recommendations and your permit-to-work, with a standby person outside.
            </li>
            <li>Count every tool and rag in and out; inspect before the door is closed.</li>
          </ul>
        </section>
        <section>
          <h4 className="font-semibold">Lifting and hydraulic tools</h4>
          <ul className="mt-1 list-disc space-y-1 pl-5">
            <li>Never stand or reach under a suspended load; use lifting gear marked with its safe working load and examined in date.</li>
            <li>Hydraulic tensioning tools work at up to about 1500 bar: never stand in line with the stud, wear eye protection, rope off the area.</li>
            <li>Relieve the pressure before disconnecting any hose or fitting.</li>
            <li>Fluid injected into the skin is a surgical emergency, even when the wound looks small: get medical help at once.</li>
          </ul>
        </section>
      </div>
      <p className="mt-3 text-sm text-ink-soft">
        These are reminders only. The engine maker&apos;s manual, your company&apos;s safety management system and the flag and class rules govern the
        work and its values.
      </p>
    </details>
  );
}
