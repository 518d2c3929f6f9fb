"use client";

import Link from "next/link";
import { Group } from "@visx/group";
import { scaleLinear } from "@visx/scale";
import { Line, LinePath } from "@visx/shape";
import { fixed, hoursText, rate } from "@/lib/format";
import type { UnitTrend } from "@/lib/outlook/engine-trends";

const SIGNAL = "#0a5c73";
const LIMIT = "#a3161b";
const LINE = "#c9c6bc";
const FAINT = "#5f6875";

/** "73rd" for 0.73. */
export function ordinalPercent(p: number): string {
  const n = Math.round(p * 100);
  const s = n % 100 >= 11 && n % 100 <= 13 ? "th" : ["th", "st", "nd", "rd"][n % 10] ?? "th";
  return `${n}${s}`;
}

/**
 * Every unit's wear trend side by side, all on one scale (the same liner hours across and the
 * same millimetres up, with the limit drawn in each), so a unit wearing faster than its sisters
 * stands out at a glance. Each panel says its rate and its percentile among all units of the
 * profile in the fleet in words, which is also the panel's text alternative.
 */
export function TrendMultiples({ units, limitMm }: { units: UnitTrend[]; limitMm: number }) {
  const all = units.flatMap((u) => u.points.filter((p) => p.maxWearMm !== null));
  const xMax = Math.max(1000, ...all.map((p) => p.linerHours)) * 1.05;
  const yMax = Math.max(limitMm, ...all.map((p) => p.maxWearMm!)) * 1.1;
  const W = 220;
  const H = 120;
  const m = { top: 8, right: 8, bottom: 18, left: 30 };
  const x = scaleLinear({ domain: [0, xMax], range: [0, W - m.left - m.right] });
  const y = scaleLinear({ domain: [0, yMax], range: [H - m.top - m.bottom, 0] });
  return (
    <div>
      <ul className="grid grid-cols-1 gap-3 min-[420px]:grid-cols-2 lg:grid-cols-4" data-testid="trend-multiples">
        {units.map((u) => {
          const words = `Cylinder ${u.cylinderNo}: ${u.wearRate === null ? "no wear rate yet" : `${rate(u.wearRate)} mm/1000 h`}${u.percentile === null ? "" : `, ${ordinalPercent(u.percentile)} percentile of ${u.among} units of this design in the fleet`}.`;
          const valid = u.points.filter((p): p is { linerHours: number; maxWearMm: number; steady: boolean } => p.maxWearMm !== null);
          return (
            <li key={u.unitId} className="rounded-lg border border-ink-line bg-paper-raised p-2 print:break-inside-avoid">
              <Link href={`/units/${u.unitId}`} className="inline-flex min-h-11 items-center font-semibold text-signal hover:underline">Cyl. {u.cylinderNo}</Link>
              <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full" role="img" aria-label={words}>
                <title>{words}</title>
                <Group left={m.left} top={m.top}>
                  <Line from={{ x: 0, y: y(0) }} to={{ x: x(xMax), y: y(0) }} stroke={LINE} />
                  <Line from={{ x: 0, y: y(0) }} to={{ x: 0, y: y(yMax) }} stroke={LINE} />
                  <Line from={{ x: 0, y: y(limitMm) }} to={{ x: x(xMax), y: y(limitMm) }} stroke={LIMIT} strokeWidth={1.5} strokeDasharray="5 3" />
                  {u.fit ? <LinePath data={[0, xMax].map((hx) => ({ hx, v: u.fit!.intercept + u.fit!.slope * hx }))} x={(d) => x(d.hx)} y={(d) => y(Math.max(0, Math.min(yMax, d.v)))} stroke={SIGNAL} strokeWidth={1.5} strokeOpacity={0.7} /> : null}
                  {valid.map((p, i) => (
                    <circle key={i} cx={x(p.linerHours)} cy={y(p.maxWearMm)} r={2.5} fill={p.steady ? SIGNAL : "#fff"} stroke={SIGNAL} />
                  ))}
                  <text x={-4} y={y(limitMm) + 3} textAnchor="end" fontSize={9} fill={LIMIT}>{fixed(limitMm, 1)}</text>
                  <text x={x(xMax)} y={H - m.top - 4} textAnchor="end" fontSize={9} fill={FAINT}>{hoursText(xMax)}</text>
                </Group>
              </svg>
              <p className="text-xs text-ink-soft">{words.replace(/^Cylinder \d+: /, "")}</p>
            </li>
          );
        })}
      </ul>
      <p className="mt-2 text-xs text-ink-faint">
        Maximum wear (mm) against liner hours, every panel on the same scale; dashed red: the {fixed(limitMm)} mm limit; line: the least-squares trend;
        hollow points: running-in. The percentile counts the units of this engine design across the fleet wearing at or below this rate.
      </p>
    </div>
  );
}
