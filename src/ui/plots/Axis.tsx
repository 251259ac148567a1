/**
 * A plain SVG axis drawn by React from a d3 linear scale's ticks (d3 computes, React renders).
 * `side` says where the labels sit relative to the axis line.
 */
import { format as d3format, type ScaleLinear } from 'd3';
import { withoutNegativeZero } from './format-number.ts';

export interface AxisProps {
  readonly scale: ScaleLinear<number, number>;
  readonly side: 'bottom' | 'left';
  /** Approximate number of ticks (default 5). */
  readonly ticks?: number;
  /** d3-format specifier for tick labels (default ".3~g"). */
  readonly format?: string;
  /** Axis title, e.g. "time (s)". */
  readonly label?: string;
}

export function Axis({ scale, side, ticks = 5, format = '.3~g', label }: AxisProps) {
  const fmt = withoutNegativeZero(d3format(format));
  const values = scale.ticks(ticks);
  const [r0, r1] = scale.range();
  if (side === 'bottom') {
    return (
      <g className="axis axis-bottom" fontSize={9} fill="#333">
        <line x1={r0} x2={r1} stroke="#777" />
        {values.map((v) => (
          <g key={v} transform={`translate(${scale(v)},0)`}>
            <line y2={3} stroke="#777" />
            <text y={12} textAnchor="middle">{fmt(v)}</text>
          </g>
        ))}
        {label ? <text x={(r0 + r1) / 2} y={24} textAnchor="middle">{label}</text> : null}
      </g>
    );
  }
  return (
    <g className="axis axis-left" fontSize={9} fill="#333">
      <line y1={r0} y2={r1} stroke="#777" />
      {values.map((v) => (
        <g key={v} transform={`translate(0,${scale(v)})`}>
          <line x2={-3} stroke="#777" />
          <text x={-5} dy="0.32em" textAnchor="end">{fmt(v)}</text>
        </g>
      ))}
      {label ? (
        <text transform={`translate(-30,${(r0 + r1) / 2}) rotate(-90)`} textAnchor="middle">{label}</text>
      ) : null}
    </g>
  );
}
