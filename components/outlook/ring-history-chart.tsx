"use client";

import { useState } from "react";
import { AxisBottom, AxisLeft } from "@visx/axis";
import { GridRows } from "@visx/grid";
import { Group } from "@visx/group";
import { scaleLinear, scaleUtc } from "@visx/scale";
import { Line, LinePath } from "@visx/shape";
import { useWidth } from "@/components/charts/use-width";
import { day, fixed } from "@/lib/format";

export type RingSeriesPoint = { date: string; valueMm: number; renewed: boolean };
export type RingSeries = { position: number; label: string; limitMm: number; points: RingSeriesPoint[] };

// Four to six rings, told apart by colour and by dash, so the chart reads in greyscale too.
const COLOURS = ["#0a5c73", "#8a5a00", "#5b3c88", "#2f6b2f", "#7a2e2e", "#3a4a5c"];
const DASHES = ["", "6 3", "2 3", "8 3 2 3", "1 2", "10 4"];
const LIMIT = "#a3161b";
const FAINT = "#5f6875";
const LINE = "#c9c6bc";
const ms = (iso: string) => Date.parse(`${iso}T00:00:00Z`);

/**
 * One measure (closed gap or groove clearance) of every ring over time, one line per ring, with
 * each ring's limit as a dashed red tick at the right and renewed rings marked by a hollow point.
 * A tooltip line under the chart names the point under the pointer; the table on the page
 * carries every figure.
 */
export function RingHistoryChart({ title, series }: { title: string; series: RingSeries[] }) {
  const [ref, width] = useWidth<HTMLDivElement>();
  const [tip, setTip] = useState<string | null>(null);
  return (
    <figure className="print:break-inside-avoid">
      <div ref={ref} className="h-56 w-full overflow-hidden" role="img" aria-label={`${title} of each ring over time, with each ring's limit`}>
        {width > 0 ? <Chart series={series} width={width} height={224} onTip={setTip} /> : null}
      </div>
      <figcaption className="mt-1 flex flex-wrap gap-x-3 gap-y-1 text-xs text-ink-soft">
        {series.map((s, i) => (
          <span key={s.position}>
            <svg width="24" height="10" aria-hidden><line x1="1" x2="23" y1="5" y2="5" stroke={COLOURS[i % COLOURS.length]} strokeWidth="2" strokeDasharray={DASHES[i % DASHES.length]} /></svg> {s.label}
          </span>
        ))}
        <span><svg width="24" height="10" aria-hidden><line x1="1" x2="23" y1="5" y2="5" stroke={LIMIT} strokeWidth="2" strokeDasharray="4 3" /></svg> limit</span>
        <span>○ renewed</span>
        <span className="min-h-5 font-medium text-ink" aria-live="polite">{tip ?? ""}</span>
      </figcaption>
    </figure>
  );
}

function Chart({ series, width, height, onTip }: { series: RingSeries[]; width: number; height: number; onTip: (t: string | null) => void }) {
  const margin = { top: 10, right: 16, bottom: 28, left: 48 };
  const w = Math.max(10, width - margin.left - margin.right);
  const h = Math.max(10, height - margin.top - margin.bottom);
  const all = series.flatMap((s) => s.points);
  if (!all.length) return null;
  const dates = all.map((p) => ms(p.date));
  const x = scaleUtc({ domain: [new Date(Math.min(...dates)), new Date(Math.max(...dates) + 86_400_000)], range: [0, w] });
  const y = scaleLinear({ domain: [0, Math.max(...all.map((p) => p.valueMm), ...series.map((s) => s.limitMm)) * 1.1], range: [h, 0], nice: true });
  return (
    <svg width={width} height={height}>
      <Group left={margin.left} top={margin.top}>
        <GridRows scale={y} width={w} stroke={LINE} strokeOpacity={0.6} numTicks={4} />
        {series.map((s, i) => (
          <g key={s.position}>
            <Line from={{ x: w - 24 + i * 3, y: y(s.limitMm) }} to={{ x: w, y: y(s.limitMm) }} stroke={LIMIT} strokeWidth={2} strokeDasharray="4 3" />
            <LinePath data={s.points} x={(p) => x(new Date(ms(p.date)))} y={(p) => y(p.valueMm)} stroke={COLOURS[i % COLOURS.length]} strokeWidth={2} strokeDasharray={DASHES[i % DASHES.length]} />
            {s.points.map((p, j) => {
              const text = `${s.label}, ${day(p.date)}: ${fixed(p.valueMm)} mm (limit ${fixed(s.limitMm)} mm)${p.renewed ? ", renewed" : ""}`;
              return (
                <circle key={j} cx={x(new Date(ms(p.date)))} cy={y(p.valueMm)} r={4} fill={p.renewed ? "#fff" : COLOURS[i % COLOURS.length]} stroke={COLOURS[i % COLOURS.length]} strokeWidth={2} tabIndex={-1} onMouseEnter={() => onTip(text)} onMouseLeave={() => onTip(null)}>
                  <title>{text}</title>
                </circle>
              );
            })}
          </g>
        ))}
        <AxisLeft scale={y} numTicks={4} stroke={LINE} tickStroke={LINE} tickLabelProps={{ fontSize: 11, fill: FAINT }} label="mm" labelProps={{ fontSize: 11, fill: FAINT }} />
        <AxisBottom top={h} scale={x} numTicks={width < 500 ? 3 : 6} stroke={LINE} tickStroke={LINE} tickLabelProps={{ fontSize: 11, fill: FAINT, textAnchor: "middle" }} tickFormat={(d) => (d as Date).toISOString().slice(0, 7)} />
      </Group>
    </svg>
  );
}
