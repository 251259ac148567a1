/**
 * The trial stack: one row per trial, time left to right, amplitude as colour (diverging, symmetric about
 * zero) with its colour bar. When rows are sorted by response time the response of each trial is marked;
 * when the trials are split by an events.tsv column, each block of rows is fenced and named.
 * Rendered as a PNG inside an SVG so the panel exports as one SVG.
 */
import { useMemo } from 'react';
import { scaleLinear } from 'd3';
import { divergingColor } from './palette.ts';
import { Axis } from './Axis.tsx';
import { ColourScale } from './ColourScale.tsx';
import { gridToRgba } from './colour-scale.ts';
import type { TrialStackRows } from './trial-stack-rows.ts';
import { rgbaToDataUrl } from './raster-image.ts';

export interface TrialStackProps {
  readonly rows: TrialStackRows;
  readonly nEpochs: number;
  readonly length: number;
  readonly times: Float64Array;
  /** ± colour limit (µV). */
  readonly maxAbs: number;
  readonly width?: number;
  readonly height?: number;
  readonly unit?: string;
  /** Blocks of rows (split by a column): first row, row count and the value that names them. */
  readonly groups?: readonly { readonly label: string; readonly start: number; readonly count: number }[];
}

export function TrialStack({ rows, nEpochs, length, times, maxAbs, width = 380, height = 220, unit = 'µV', groups }: TrialStackProps) {
  const margin = { top: 6, right: 58, bottom: 28, left: 42 };
  const href = useMemo(() => rgbaToDataUrl(gridToRgba(rows.rows, maxAbs, divergingColor), length, nEpochs), [rows, maxAbs, length, nEpochs]);
  const t0 = times.length ? times[0] : 0;
  const t1 = times.length ? times[times.length - 1] : 1;
  const x = scaleLinear().domain([t0, t1]).range([margin.left, width - margin.right]);
  const y = scaleLinear().domain([0, Math.max(1, nEpochs)]).range([margin.top, height - margin.bottom]);
  const plotH = height - margin.top - margin.bottom;
  const showRt = rows.sortApplied === 'response-time';
  return (
    <svg className="trial-stack" width={width} height={height} viewBox={`0 0 ${width} ${height}`} role="img" aria-label={`trial stack, ${nEpochs} trials`}>
      <image href={href || undefined} x={x(t0)} y={margin.top} width={x(t1) - x(t0)} height={plotH} preserveAspectRatio="none" style={{ imageRendering: 'pixelated' }} />
      <line x1={x(0)} x2={x(0)} y1={margin.top} y2={margin.top + plotH} stroke="#000" strokeDasharray="2 2" />
      {showRt
        ? Array.from(rows.keys, (k, r) =>
            Number.isFinite(k) && k >= t0 && k <= t1 ? <circle key={r} cx={x(k)} cy={y(r + 0.5)} r={1} fill="#000" /> : null,
          )
        : null}
      {groups?.map((g, i) => (
        <g key={`${g.label}-${i}`}>
          {i > 0 ? <line x1={x(t0)} x2={x(t1)} y1={y(g.start)} y2={y(g.start)} stroke="#1d232b" strokeWidth={1.5} /> : null}
          <text x={x(t0) + 3} y={y(g.start) + 10} fontSize={9} fill="#1d232b" stroke="#fffdf8" strokeWidth={2.5} paintOrder="stroke">
            {g.label} ({g.count})
          </text>
        </g>
      ))}
      <g transform={`translate(0,${height - margin.bottom})`}><Axis scale={x} side="bottom" label="time from event (s)" /></g>
      <g transform={`translate(${margin.left},0)`}><Axis scale={y} side="left" ticks={4} format="d" label="trial" /></g>
      <g transform={`translate(${width - margin.right + 8},${margin.top})`}>
        <ColourScale maxAbs={maxAbs} height={plotH - 12} unit={unit} />
      </g>
    </svg>
  );
}
