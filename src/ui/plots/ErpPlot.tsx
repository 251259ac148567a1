/**
 * Event-locked average(s) with an optional confidence band, the event at 0 s and an optional shaded
 * measurement window. Before/after comparisons pass two series; line styles differ (solid / dashed) so the
 * plot reads without colour.
 */
import { Axis } from './Axis.tsx';
import { erpGeometry, type ErpSeries } from './erp-geometry.ts';

export interface ErpPlotProps {
  /** Seconds relative to the event. */
  readonly times: ArrayLike<number>;
  readonly series: readonly ErpSeries[];
  /** Confidence band around the first series (e.g. 95 % = mean ± 1.96 SEM). */
  readonly band?: { lower: ArrayLike<number>; upper: ArrayLike<number> } | null;
  /** Shaded measurement window [t0, t1] s. */
  readonly windowS?: readonly [number, number] | null;
  readonly width?: number;
  readonly height?: number;
  /** y-axis title (default "µV"). */
  readonly unit?: string;
  readonly title?: string;
}

const STYLES = [
  { stroke: '#1d232b', dash: undefined, width: 1.6 },
  { stroke: '#b3401a', dash: '5 3', width: 1.6 },
  { stroke: '#3b6ea8', dash: '2 2', width: 1.4 },
];

export function ErpPlot({ times, series, band = null, windowS = null, width = 360, height = 150, unit = 'µV', title }: ErpPlotProps) {
  const frame = { width, height, margin: { top: 8, right: 8, bottom: 28, left: 42 } };
  const g = erpGeometry(times, series, frame, band);
  const [y0, y1] = g.y.range();
  return (
    <svg className="erp-plot" width={width} height={height} viewBox={`0 0 ${width} ${height}`} role="img" aria-label={title ?? 'event-locked average'}>
      {title ? <title>{title}</title> : null}
      {windowS ? (
        <rect x={g.x(windowS[0])} width={Math.max(0, g.x(windowS[1]) - g.x(windowS[0]))} y={y1} height={y0 - y1} fill="#e9e4d4" />
      ) : null}
      {g.band ? <path d={g.band} fill="#1d232b" fillOpacity={0.15} stroke="none" /> : null}
      <line x1={g.x.range()[0]} x2={g.x.range()[1]} y1={g.y(0)} y2={g.y(0)} stroke="#999" strokeWidth={0.6} />
      <line x1={g.x(0)} x2={g.x(0)} y1={y0} y2={y1} stroke="#999" strokeWidth={0.8} strokeDasharray="2 2" />
      {g.lines.map((d, i) => {
        const s = STYLES[i % STYLES.length];
        return <path key={i} d={d} fill="none" stroke={s.stroke} strokeWidth={s.width} strokeDasharray={s.dash} />;
      })}
      <g transform={`translate(0,${y0})`}><Axis scale={g.x} side="bottom" label="time from event (s)" /></g>
      <g transform={`translate(${g.x.range()[0]},0)`}><Axis scale={g.y} side="left" ticks={4} label={unit} /></g>
      {series.length > 1 ? (
        <g fontSize={9} transform={`translate(${g.x.range()[1] - 90},${y1 + 4})`}>
          {series.map((s, i) => (
            <g key={s.label} transform={`translate(0,${i * 12})`}>
              <line x2={18} y1={4} y2={4} stroke={STYLES[i % STYLES.length].stroke} strokeDasharray={STYLES[i % STYLES.length].dash} strokeWidth={1.6} />
              <text x={22} y={7}>{s.label}</text>
            </g>
          ))}
        </g>
      ) : null}
    </svg>
  );
}
