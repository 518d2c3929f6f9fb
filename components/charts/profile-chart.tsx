"use client";

import { useWidth } from "./use-width";
import { AxisLeft, AxisTop } from "@visx/axis";
import { GridColumns } from "@visx/grid";
import { Group } from "@visx/group";
import { scaleLinear } from "@visx/scale";
import { Line, LinePath } from "@visx/shape";

export type ProfileSeries = { id: string; label: string; points: { depthMm: number; wearMm: number }[] };

const FAINT = "#5f6875";
const LINE = "#c9c6bc";
const LIMIT = "#a3161b";
// Older inspections fade; the newest is full ink so it reads first.
const shade = (i: number, n: number) => (i === n - 1 ? "#111720" : `rgba(10, 92, 115, ${0.25 + (0.5 * i) / Math.max(1, n - 1)})`);

/**
 * The liner profile: wear at each station down the bore (depth downwards, as the liner
 * stands), the larger of the two directions, one line per inspection, with the limit.
 */
export function ProfileChart({ series, limitMm }: { series: ProfileSeries[]; limitMm: number }) {
  const [ref, width] = useWidth<HTMLDivElement>();
  return (
    <div ref={ref} className="h-80 w-full overflow-hidden" role="img" aria-label="Liner wear against depth from the liner top, one line per inspection, with the wear limit">
      {width > 0 ? <Chart series={series} limitMm={limitMm} width={width} height={320} /> : null}
    </div>
  );
}

function Chart({ series, limitMm, width, height }: { series: ProfileSeries[]; limitMm: number; width: number; height: number }) {
  const margin = { top: 36, right: 20, bottom: 12, left: 64 };
  const w = Math.max(10, width - margin.left - margin.right);
  const h = Math.max(10, height - margin.top - margin.bottom);
  const depths = series.flatMap((s) => s.points.map((p) => p.depthMm));
  const wears = series.flatMap((s) => s.points.map((p) => p.wearMm));
  const x = scaleLinear({ domain: [Math.min(0, ...wears), Math.max(limitMm * 1.1, ...wears)], range: [0, w], nice: true });
  const y = scaleLinear({ domain: [0, Math.max(100, ...depths)], range: [0, h], nice: true });
  return (
    <svg width={width} height={height}>
      <Group left={margin.left} top={margin.top}>
        <GridColumns scale={x} height={h} stroke={LINE} strokeOpacity={0.6} numTicks={5} />
        <Line from={{ x: x(limitMm), y: 0 }} to={{ x: x(limitMm), y: h }} stroke={LIMIT} strokeWidth={2.5} strokeDasharray="8 4" />
        <text x={x(limitMm) - 6} y={h - 6} textAnchor="end" fontSize={12} fontWeight={600} fill={LIMIT}>
          Limit {limitMm.toFixed(2)} mm
        </text>
        {series.map((s, i) => (
          <g key={s.id}>
            <LinePath data={s.points} x={(p) => x(p.wearMm)} y={(p) => y(p.depthMm)} stroke={shade(i, series.length)} strokeWidth={i === series.length - 1 ? 2.5 : 1.5} />
            {s.points.map((p, j) => (
              <circle key={j} cx={x(p.wearMm)} cy={y(p.depthMm)} r={i === series.length - 1 ? 3.5 : 2.5} fill={shade(i, series.length)}>
                <title>{`${s.label}: ${p.wearMm.toFixed(2)} mm at ${Math.round(p.depthMm)} mm depth`}</title>
              </circle>
            ))}
          </g>
        ))}
        <AxisTop scale={x} numTicks={5} stroke={FAINT} tickStroke={FAINT} tickFormat={(v) => Number(v).toFixed(1)} tickLabelProps={{ fill: FAINT, fontSize: 11 }} label="wear, mm" labelProps={{ fill: FAINT, fontSize: 11, textAnchor: "middle" }} />
        <AxisLeft scale={y} numTicks={6} stroke={FAINT} tickStroke={FAINT} tickLabelProps={{ fill: FAINT, fontSize: 11 }} label="depth from liner top, mm" labelProps={{ fill: FAINT, fontSize: 11, textAnchor: "middle" }} />
      </Group>
    </svg>
  );
}
