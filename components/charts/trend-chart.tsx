"use client";

import { useWidth } from "./use-width";
import { AxisBottom, AxisLeft } from "@visx/axis";
import { GridRows } from "@visx/grid";
import { Group } from "@visx/group";
import { scaleLinear } from "@visx/scale";
import { Area, Line, LinePath } from "@visx/shape";
import { fixed, hoursText } from "@/lib/format";
import { predict, type PredictionFit } from "@/lib/stats/regression";

export type TrendPoint = {
  linerHours: number;
  valueMm: number | null;
  steady: boolean;
  outlier: boolean;
  date: string;
  /** The gauging's largest reading was judged impossible; the point is its next-largest. */
  maxExcluded?: boolean;
};

type Props = {
  points: TrendPoint[];
  fit: PredictionFit | null;
  limitMm: number;
  projection: { atLinerHours: number; lowerHours: number | null; upperHours: number | null } | null;
  runningInHours: number;
  label: string;
};

const INK = "#111720";
const FAINT = "#5f6875";
const LINE = "#c9c6bc";
const SIGNAL = "#0a5c73";
const LIMIT = "#a3161b";

/**
 * Wear (or ovality) against liner hours: the readings, the least-squares line over the
 * steady part, its 95 % prediction band, and the limit as a heavy dashed line labelled
 * in words. Running-in readings are drawn hollow because the fit leaves them out; a gauging
 * whose largest reading was judged impossible carries a square around its point (and the
 * caption under the chart says so in words), since the point shows its next-largest reading.
 */
export function TrendChart(props: Props) {
  const [ref, width] = useWidth<HTMLDivElement>();
  return (
    <div ref={ref} className="h-72 w-full overflow-hidden sm:h-80" role="img" aria-label={`${props.label} against liner hours, with the regression line, its 95 % prediction band and the limit`}>
      {width > 0 ? <Chart {...props} width={width} height={width < 500 ? 288 : 320} /> : null}
    </div>
  );
}

function Chart({ points, fit, limitMm, projection, runningInHours, width, height }: Props & { width: number; height: number }) {
  const margin = { top: 16, right: 16, bottom: 44, left: 56 };
  const w = Math.max(10, width - margin.left - margin.right);
  const h = Math.max(10, height - margin.top - margin.bottom);
  const valid = points.filter((p): p is TrendPoint & { valueMm: number } => p.valueMm !== null);
  const lastX = Math.max(1000, ...valid.map((p) => p.linerHours));
  const projX = projection ? (projection.upperHours ?? projection.atLinerHours * 1.15) : 0;
  const xMax = Math.min(Math.max(lastX * 1.1, projX * 1.05, projection ? projection.atLinerHours * 1.08 : 0), lastX * 4);
  const yMax = Math.max(limitMm * 1.12, ...valid.map((p) => p.valueMm * 1.1));
  const x = scaleLinear({ domain: [0, xMax], range: [0, w], nice: true });
  const y = scaleLinear({ domain: [0, yMax], range: [h, 0], nice: true });

  const steps = 60;
  const x0 = Math.max(runningInHours, 0);
  const band = fit
    ? Array.from({ length: steps + 1 }, (_, i) => x0 + ((x.domain()[1] - x0) * i) / steps)
        .map((hx) => predict(fit, hx))
        .filter((p): p is NonNullable<typeof p> => p !== null)
    : [];

  return (
    <svg width={width} height={height}>
      <Group left={margin.left} top={margin.top}>
        <GridRows scale={y} width={w} stroke={LINE} strokeOpacity={0.6} numTicks={5} />
        {runningInHours > 0 ? (
          <g>
            <rect x={0} y={0} width={Math.max(0, x(runningInHours))} height={h} fill="#ebe9e2" opacity={0.6} />
            <text x={4} y={12} fontSize={11} fill={FAINT}>running-in</text>
          </g>
        ) : null}
        {band.length ? (
          <>
            <Area
              data={band}
              x={(d) => x(d.x)}
              y0={(d) => y(Math.max(0, d.lower))}
              y1={(d) => y(Math.min(yMax * 1.2, d.upper))}
              fill={SIGNAL}
              fillOpacity={0.12}
            />
            <LinePath data={band} x={(d) => x(d.x)} y={(d) => y(d.yHat)} stroke={SIGNAL} strokeWidth={2} />
          </>
        ) : null}
        <Line from={{ x: 0, y: y(limitMm) }} to={{ x: w, y: y(limitMm) }} stroke={LIMIT} strokeWidth={2.5} strokeDasharray="8 4" />
        <text x={w - 4} y={y(limitMm) - 6} textAnchor="end" fontSize={12} fontWeight={600} fill={LIMIT}>
          Limit {fixed(limitMm)} mm
        </text>
        {projection ? (
          <g>
            {projection.lowerHours !== null || projection.upperHours !== null ? (
              <line
                x1={x(Math.max(0, projection.lowerHours ?? projection.atLinerHours))}
                x2={x(Math.min(x.domain()[1], projection.upperHours ?? x.domain()[1]))}
                y1={y(limitMm)}
                y2={y(limitMm)}
                stroke={INK}
                strokeWidth={6}
                strokeOpacity={0.25}
              />
            ) : null}
            <circle cx={x(projection.atLinerHours)} cy={y(limitMm)} r={5} fill="#fff" stroke={INK} strokeWidth={2} />
          </g>
        ) : null}
        {valid.map((p, i) => (
          <g key={i}>
            <circle
              cx={x(p.linerHours)}
              cy={y(p.valueMm)}
              r={p.outlier ? 6 : 4.5}
              fill={p.steady ? INK : "#fff"}
              stroke={INK}
              strokeWidth={1.5}
            >
              <title>{`${p.date}: ${fixed(p.valueMm)} mm at ${hoursText(p.linerHours)}${p.steady ? "" : " (running-in, not fitted)"}${p.outlier ? " — flagged as outlier" : ""}${p.maxExcluded ? " — largest reading judged impossible; next-largest shown" : ""}`}</title>
            </circle>
            {p.outlier ? <circle cx={x(p.linerHours)} cy={y(p.valueMm)} r={9} fill="none" stroke={INK} strokeDasharray="2 2" /> : null}
            {p.maxExcluded ? (
              <rect x={x(p.linerHours) - 10} y={y(p.valueMm) - 10} width={20} height={20} fill="none" stroke={LIMIT} strokeWidth={2} data-testid="trend-excluded-marker" />
            ) : null}
          </g>
        ))}
        <AxisLeft scale={y} numTicks={5} stroke={FAINT} tickStroke={FAINT} tickFormat={(v) => Number(v).toFixed(1)} tickLabelProps={{ fill: FAINT, fontSize: 11, fontFamily: "var(--font-sans)" }} label="mm" labelProps={{ fill: FAINT, fontSize: 11 }} />
        <AxisBottom top={h} scale={x} numTicks={Math.max(2, Math.floor(w / 90))} stroke={FAINT} tickStroke={FAINT} tickFormat={(v) => `${Math.round(Number(v) / 1000)}k`} tickLabelProps={{ fill: FAINT, fontSize: 11, fontFamily: "var(--font-sans)" }} label="liner running hours" labelProps={{ fill: FAINT, fontSize: 11, textAnchor: "middle" }} />
      </Group>
    </svg>
  );
}
