"use client";

import type { ContextProfile } from "@/lib/inspections/context";
import { emptyRing, expectedIn, lengthText, parseDecimal, toMm, type RingEntry } from "@/lib/inspections/form";
import { referredWornGap, RING_STATE_TEXT, ringLive } from "@/lib/inspections/rules";
import { GAP_MEASURED_IN, GAP_MEASURED_IN_LABELS } from "@/lib/inspections/constants";
import type { RingState } from "@/lib/rings/rings";
import { checkRingValue, linerDiameterBounds, type Finding } from "@/lib/wear/plausibility";
import { formatFixed, type LengthUnit } from "@/lib/units/length";
import { cn } from "@/lib/utils";
import { OverLimitMark, CautionMark, OkMark } from "./marks";
import { ParsedEcho } from "./parsed-echo";

const mm = (v: number) => formatFixed(v, 2);

function StateLine({ state, newMin, newMax, limit }: { state: RingState | null; newMin: number; newMax: number; limit: number }) {
  const ranges = (
    <span className="text-ink-faint">
      new {mm(newMin)}–{mm(newMax)} mm · limit {mm(limit)} mm
    </span>
  );
  if (!state) return <p className="text-sm tabular-nums">{ranges}</p>;
  const over = state === "at_or_over_limit";
  const odd = state === "below_new_range";
  return (
    <p className="text-sm tabular-nums">
      <span className={cn(over ? "font-semibold text-limit" : odd ? "font-medium text-caution" : state === "worn" ? "text-ink" : "text-ink-soft")}>
        {over ? <OverLimitMark /> : odd ? <CautionMark /> : <OkMark />}
        {RING_STATE_TEXT[state]}
      </span>
      <br />
      {ranges}
    </p>
  );
}

/** A length typed on the ring sheet: big, right-aligned, decimal keypad, marked when it is not a number. */
function LengthInput({
  invalid,
  className,
  onText,
  ...props
}: Omit<React.InputHTMLAttributes<HTMLInputElement>, "onChange"> & { invalid: boolean; onText: (text: string) => void }) {
  return (
    <input
      type="text"
      inputMode="decimal"
      autoComplete="off"
      aria-invalid={invalid || undefined}
      onChange={(e) => onText(e.target.value)}
      className={cn(
        "num mt-1 block min-h-12 w-full rounded-md border border-ink-line bg-paper-raised px-3 text-right text-lg aria-[invalid=true]:border-2 aria-[invalid=true]:border-caution",
        className,
      )}
      {...props}
    />
  );
}

const notANumber = <p className="text-sm font-medium text-caution">⚠ Not a number — kept on this device, not saved.</p>;

function Errors({ items }: { items: Finding[] }) {
  if (!items.length) return null;
  return (
    <div role="alert" className="mt-1 text-sm font-medium text-limit">
      {items.map((f) => (
        <p key={f.message}>
          <OverLimitMark />
          {f.message} This cannot be confirmed.
        </p>
      ))}
    </div>
  );
}

export const ringInputId = (position: number, what: "gap" | "groove" | "linerd") => `ring-${position}-${what}`;

/** Rings by position: closed gap (and where it was measured), groove clearance, renewed, condition — each against the profile. */
export function RingTable({
  profile,
  rings,
  unit = "mm",
  correctionFactor = 1,
  readOnly,
  onChange,
}: {
  profile: ContextProfile;
  rings: Record<string, RingEntry>;
  /** The gauging's factor to 20 °C, applied to the liner diameter where a gap was read, as the server does. */
  correctionFactor?: number;
  /** The sheet's entry unit; limits and the comparison are always shown in mm. */
  unit?: LengthUnit;
  readOnly?: boolean;
  onChange: (position: number, patch: Partial<RingEntry>) => void;
}) {
  return (
    <ol className="grid gap-3 lg:grid-cols-2">
      {profile.rings.map((spec, i) => {
        const r = rings[spec.position] ?? emptyRing;
        // Typed in the ring's unit, judged in mm.
        const inMm = (v: number | null | "invalid") => (typeof v === "number" ? toMm(v, r.unit ?? "mm") : v);
        const ru = r.unit ?? "mm";
        const gap = inMm(parseDecimal(r.closedGap, expectedIn(spec.gapLimitMm, ru)));
        const groove = inMm(parseDecimal(r.groove, expectedIn(spec.grooveLimitMm, ru)));
        const linerD = r.gapMeasuredIn === "liner_worn" ? inMm(parseDecimal(r.gapLinerDiameter ?? "", expectedIn(profile.boreMm, ru))) : null;
        const gapErrors = checkRingValue(typeof gap === "number" ? gap : null, { what: "closed gap", limitMm: spec.gapLimitMm });
        const grooveErrors = checkRingValue(typeof groove === "number" ? groove : null, { what: "groove clearance", limitMm: spec.grooveLimitMm });
        const bounds = linerDiameterBounds(profile);
        const linerDOut = typeof linerD === "number" && (linerD < bounds.minMm || linerD > bounds.maxMm);
        const placeMissing = typeof gap === "number" && !r.gapMeasuredIn;
        const unitText = unit === "mm" ? "mm" : "in";
        // A gap read in a worn part of the liner is judged as if in a gauge ring of nominal bore.
        const referred = typeof gap === "number" && typeof linerD === "number" ? referredWornGap(profile.boreMm, gap, linerD, correctionFactor) : null;
        const live = ringLive(spec, referred ?? (typeof gap === "number" ? gap : null), typeof groove === "number" ? groove : null);
        const next = profile.rings[i + 1];
        const focusNext = (e: React.KeyboardEvent<HTMLInputElement>, id: string | null) => {
          if (e.key !== "Enter" || !id) return;
          e.preventDefault();
          (document.getElementById(id) as HTMLInputElement | null)?.focus();
        };
        return (
          <li key={spec.position} className="rounded-lg border border-ink-line bg-paper-raised p-3">
            <h3 className="mb-2 font-semibold">{spec.label}</h3>
            <div className="grid gap-3 sm:grid-cols-2">
              <div>
                <label htmlFor={ringInputId(spec.position, "gap")} className="block text-sm font-medium text-ink-soft">
                  Closed gap ({unitText})
                </label>
                <LengthInput
                  id={ringInputId(spec.position, "gap")}
                  enterKeyHint="next"
                  readOnly={readOnly}
                  value={r.closedGap}
                  invalid={gap === "invalid"}
                  onText={(closedGap) => onChange(spec.position, { closedGap })}
                  onKeyDown={(e) => focusNext(e, ringInputId(spec.position, "groove"))}
                />
                {gap === "invalid" ? notANumber : null}
                {readOnly ? null : (
                  <ParsedEcho text={r.closedGap} expected={expectedIn(spec.gapLimitMm, ru)} unit={ru} decimals={ru === "mm" ? 3 : 4} onChoose={(closedGap) => onChange(spec.position, { closedGap })} />
                )}
                <Errors items={gapErrors} />
                {unit === "in" && typeof gap === "number" ? <p className="num text-sm text-ink-faint">= {gap.toFixed(3)} mm as read</p> : null}
                <StateLine state={live.gap} newMin={spec.gapNewMinMm} newMax={spec.gapNewMaxMm} limit={spec.gapLimitMm} />
              </div>
              <div>
                <label htmlFor={ringInputId(spec.position, "groove")} className="block text-sm font-medium text-ink-soft">
                  Groove axial clearance ({unitText})
                </label>
                <LengthInput
                  id={ringInputId(spec.position, "groove")}
                  enterKeyHint="next"
                  readOnly={readOnly}
                  value={r.groove}
                  invalid={groove === "invalid"}
                  onText={(groove) => onChange(spec.position, { groove })}
                  onKeyDown={(e) => focusNext(e, next ? ringInputId(next.position, "gap") : null)}
                />
                {groove === "invalid" ? notANumber : null}
                {readOnly ? null : (
                  <ParsedEcho text={r.groove} expected={expectedIn(spec.grooveLimitMm, ru)} unit={ru} decimals={ru === "mm" ? 3 : 4} onChoose={(groove) => onChange(spec.position, { groove })} />
                )}
                <Errors items={grooveErrors} />
                {unit === "in" && typeof groove === "number" ? <p className="num text-sm text-ink-faint">= {groove.toFixed(3)} mm</p> : null}
                <StateLine state={live.groove} newMin={spec.grooveNewMinMm} newMax={spec.grooveNewMaxMm} limit={spec.grooveLimitMm} />
              </div>
            </div>
            <fieldset className="mt-3">
              <legend className="text-sm font-medium text-ink-soft">
                Gap measured in{typeof gap === "number" ? <span className="text-limit"> (required)</span> : null}
              </legend>
              <div className="mt-1 grid grid-cols-3 gap-1">
                {GAP_MEASURED_IN.map((m) => (
                  <label
                    key={m}
                    className={cn(
                      "flex min-h-12 cursor-pointer items-center justify-center rounded-md border px-2 text-center text-sm",
                      r.gapMeasuredIn === m ? "border-signal bg-signal-tint font-semibold text-signal-strong" : "border-ink-line bg-paper",
                    )}
                  >
                    <input
                      type="radio"
                      className="sr-only"
                      name={`ring-${spec.position}-measured`}
                      value={m}
                      checked={r.gapMeasuredIn === m}
                      disabled={readOnly}
                      onChange={() => onChange(spec.position, { gapMeasuredIn: m })}
                    />
                    {GAP_MEASURED_IN_LABELS[m]}
                  </label>
                ))}
              </div>
              {placeMissing ? (
                <p role="alert" className="mt-1 text-sm font-medium text-caution" data-testid={`ring-${spec.position}-place-missing`}>
                  <CautionMark />
                  Say where the gap was measured: the same gap means different wear in a gauge ring and in a worn liner.
                </p>
              ) : null}
              {r.gapMeasuredIn === "liner_worn" ? (
                <div className="mt-2">
                  <label htmlFor={ringInputId(spec.position, "linerd")} className="block text-sm font-medium text-ink-soft">
                    Liner diameter where the gap was measured ({unitText})
                  </label>
                  <LengthInput
                    id={ringInputId(spec.position, "linerd")}
                    readOnly={readOnly}
                    value={r.gapLinerDiameter ?? ""}
                    invalid={linerD === "invalid"}
                    onText={(gapLinerDiameter) => onChange(spec.position, { gapLinerDiameter })}
                    placeholder={`e.g. ${lengthText(profile.boreMm + 1, unit)}`}
                    className="sm:w-1/2"
                  />
                  {linerDOut ? (
                    <p role="alert" className="mt-1 text-sm font-medium text-limit">
                      <OverLimitMark />
                      This liner reads between {bounds.minMm.toFixed(2)} and {bounds.maxMm.toFixed(2)} mm: retype the diameter. This cannot be confirmed.
                    </p>
                  ) : null}
                  <p className="mt-1 text-sm text-ink-soft">
                    {referred !== null && typeof gap === "number" && typeof linerD === "number" ? (
                      <>
                        Referred to a gauge ring: <span className="num font-semibold text-ink">{referred.toFixed(2)} mm</span> ({gap.toFixed(2)} − π ×{" "}
                        {((gap - referred) / Math.PI).toFixed(2)} mm at 20 °C).
                      </>
                    ) : (
                      "A gap read in a worn part of the liner is larger than in a gauge ring by π × the diameter increase there. Give the diameter to refer it back; without it the gap is judged as read (the safe side)."
                    )}
                  </p>
                </div>
              ) : null}
            </fieldset>
            <div className="mt-3 grid gap-3 sm:grid-cols-[auto_1fr] sm:items-end">
              <label className="flex min-h-12 cursor-pointer items-center gap-3 rounded-md border border-ink-line bg-paper px-3">
                <input
                  type="checkbox"
                  className="h-6 w-6 accent-[#0a5c73]"
                  checked={r.renewed}
                  disabled={readOnly}
                  onChange={(e) => onChange(spec.position, { renewed: e.target.checked })}
                />
                <span className="font-medium">Renewed</span>
              </label>
              <div>
                <label htmlFor={`ring-${spec.position}-condition`} className="block text-sm font-medium text-ink-soft">
                  Condition
                </label>
                <input
                  id={`ring-${spec.position}-condition`}
                  type="text"
                  autoComplete="off"
                  readOnly={readOnly}
                  value={r.condition}
                  placeholder="e.g. free in groove, light scuffing"
                  onChange={(e) => onChange(spec.position, { condition: e.target.value })}
                  className="mt-1 block min-h-12 w-full rounded-md border border-ink-line bg-paper-raised px-3"
                />
              </div>
            </div>
          </li>
        );
      })}
    </ol>
  );
}
