"use client";

import { useState } from "react";
import { AxisTop } from "@visx/axis";
import { Group } from "@visx/group";
import { scaleUtc } from "@visx/scale";
import { useWidth } from "@/components/charts/use-width";
import { day } from "@/lib/format";
import type { OutlookRow, ScheduleEntry } from "@/lib/outlook/types";

const INK = "#111720";
const FAINT = "#5f6875";
const LINE = "#c9c6bc";
const SIGNAL = "#0a5c73";
const LIMIT = "#a3161b";
const CAUTION = "#8a5a00";
const ROW = 26;

const ms = (iso: string) => Date.parse(`${iso}T00:00:00Z`);

/**
 * One ship's units on a calendar from today to the horizon: a bar to each unit's projected day
 * at the wear limit with the 95 % interval as whiskers, its coming overhauls (ticks) and open
 * plans (diamonds), and the ship's port stays and dockings as bands across all rows. The
 * legend is printed below; a tooltip names what is under the pointer; the table that follows
 * the chart on the page says the same in words.
 */
export function TimelineChart({ vesselName, rows, schedule, today, until }: { vesselName: string; rows: OutlookRow[]; schedule: ScheduleEntry[]; today: string; until: string }) {
  const [ref, width] = useWidth<HTMLDivElement>();
  const [tip, setTip] = useState<string | null>(null);
  const height = 36 + rows.length * ROW + 8;
  return (
    <figure className="print:break-inside-avoid">
      <div ref={ref} className="w-full overflow-hidden" role="img" aria-label={`Timeline of ${vesselName}: each cylinder's projected day at the wear limit with its 95 % interval, coming overhauls, plans, port stays and dockings`}>
        {width > 0 ? <Chart rows={rows} schedule={schedule} today={today} until={until} width={width} height={height} onTip={setTip} /> : <div style={{ height }} />}
      </div>
      <figcaption className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-soft">
        <span><svg width="22" height="10" aria-hidden><line x1="1" x2="21" y1="5" y2="5" stroke={SIGNAL} strokeWidth="4" /></svg> to the projected limit</span>
        <span><svg width="22" height="10" aria-hidden><line x1="1" x2="21" y1="5" y2="5" stroke={INK} strokeWidth="1.5" /><line x1="1" x2="1" y1="0" y2="10" stroke={INK} /><line x1="21" x2="21" y1="0" y2="10" stroke={INK} /></svg> 95 % interval</span>
        <span><svg width="10" height="12" aria-hidden><line x1="5" x2="5" y1="0" y2="12" stroke={CAUTION} strokeWidth="2" /></svg> overhaul</span>
        <span><svg width="12" height="12" aria-hidden><rect x="2" y="2" width="8" height="8" transform="rotate(45 6 6)" fill={LIMIT} /></svg> plan</span>
        <span><svg width="14" height="10" aria-hidden><rect width="14" height="10" fill={SIGNAL} opacity="0.15" /></svg> port stay</span>
        <span><svg width="14" height="10" aria-hidden><rect width="14" height="10" fill={CAUTION} opacity="0.25" /></svg> docking</span>
        <span className="min-h-5 font-medium text-ink" aria-live="polite">{tip ?? ""}</span>
      </figcaption>
    </figure>
  );
}

function Chart({ rows, schedule, today, until, width, height, onTip }: { rows: OutlookRow[]; schedule: ScheduleEntry[]; today: string; until: string; width: number; height: number; onTip: (t: string | null) => void }) {
  const margin = { top: 28, right: 12, bottom: 4, left: 64 };
  const w = Math.max(10, width - margin.left - margin.right);
  const x = scaleUtc({ domain: [new Date(ms(today)), new Date(ms(until))], range: [0, w], clamp: true });
  const inside = (iso: string | null) => iso !== null && iso >= today && iso <= until;
  const at = (iso: string) => x(new Date(ms(iso))) ?? 0;
  const tip = (text: string) => ({ onMouseEnter: () => onTip(text), onMouseLeave: () => onTip(null), onFocus: () => onTip(text), onBlur: () => onTip(null) });
  return (
    <svg width={width} height={height}>
      <Group left={margin.left} top={margin.top}>
        <AxisTop scale={x} numTicks={width < 500 ? 3 : 6} stroke={LINE} tickStroke={LINE} tickLabelProps={{ fontSize: 11, fill: FAINT, textAnchor: "middle" }} tickFormat={(d) => (d as Date).toISOString().slice(0, 7)} />
        {schedule
          .filter((s) => s.endsOn >= today && s.startsOn <= until)
          .map((s) => {
            const x0 = at(s.startsOn < today ? today : s.startsOn);
            const x1 = Math.max(x0 + 3, at(s.endsOn > until ? until : s.endsOn));
            return (
              <rect key={s.id} x={x0} y={0} width={x1 - x0} height={rows.length * ROW} fill={s.kind === "docking" ? CAUTION : SIGNAL} opacity={s.kind === "docking" ? 0.25 : 0.15} {...tip(`${s.kind === "docking" ? "Docking" : "Port stay"} at ${s.place}, ${day(s.startsOn)} – ${day(s.endsOn)}`)} />
            );
          })}
        {rows.map((r, i) => {
          const y = i * ROW + ROW / 2;
          const limitX = r.limitOn ? at(r.limitOn > until ? until : r.limitOn < today ? today : r.limitOn) : null;
          const lo = r.limitOnEarliest ? at(r.limitOnEarliest < today ? today : r.limitOnEarliest > until ? until : r.limitOnEarliest) : null;
          const hi = r.limitOnLatest ? at(r.limitOnLatest > until ? until : r.limitOnLatest < today ? today : r.limitOnLatest) : limitX !== null ? w : null;
          return (
            <g key={r.unitId}>
              <text x={-8} y={y + 4} textAnchor="end" fontSize={11} fill={INK}>cyl. {r.cylinderNo}</text>
              <line x1={0} x2={w} y1={y} y2={y} stroke={LINE} strokeWidth={1} />
              {limitX !== null ? (
                <g {...tip(`Cylinder ${r.cylinderNo}: limit about ${day(r.limitOn)} (95 %: ${r.limitOnEarliest ? day(r.limitOnEarliest) : "open"} – ${r.limitOnLatest ? day(r.limitOnLatest) : "open"})`)}>
                  <line x1={0} x2={limitX} y1={y} y2={y} stroke={SIGNAL} strokeWidth={6} strokeLinecap="butt" />
                  {lo !== null && hi !== null ? (
                    <g stroke={INK} strokeWidth={1.5}>
                      <line x1={lo} x2={hi} y1={y} y2={y} />
                      <line x1={lo} x2={lo} y1={y - 6} y2={y + 6} />
                      <line x1={hi} x2={hi} y1={y - 6} y2={y + 6} />
                    </g>
                  ) : null}
                  {r.limitOn && r.limitOn <= until ? <circle cx={limitX} cy={y} r={4} fill="#fff" stroke={LIMIT} strokeWidth={2} /> : null}
                </g>
              ) : null}
              {r.overhauls
                .filter((o) => inside(o.date))
                .map((o) => (
                  <line key={o.ordinal} x1={at(o.date!)} x2={at(o.date!)} y1={y - 9} y2={y + 9} stroke={CAUTION} strokeWidth={2} {...tip(`Cylinder ${r.cylinderNo}: piston overhaul ${o.ordinal} about ${day(o.date)}`)} />
                ))}
              {r.plans
                .filter((p) => inside(p.plannedOn) || p.missed)
                .map((p) => {
                  const px = at(p.plannedOn < today ? today : p.plannedOn);
                  return (
                    <rect key={p.id} x={px - 5} y={y - 5} width={10} height={10} transform={`rotate(45 ${px} ${y})`} fill={p.missed ? "#fff" : LIMIT} stroke={LIMIT} strokeWidth={2} {...tip(`Cylinder ${r.cylinderNo}: ${p.part === "liner" ? "liner" : "ring set"} renewal ${p.state}, ${day(p.plannedOn)}${p.missed ? " — opportunity passed" : ""}`)} />
                  );
                })}
            </g>
          );
        })}
      </Group>
    </svg>
  );
}
