/**
 * A vertical colour bar with ticks: the diverging palette symmetric about zero (−maxAbs … +maxAbs), or the
 * sequential one from 0 to maxAbs. Rendered as SVG (stacked rects, no gradient ids, so several bars on one
 * page never clash).
 */
import { scaleLinear, format } from 'd3';
import { withoutNegativeZero } from './format-number.ts';
import { divergingColor, sequentialColor } from './palette.ts';
import { colourTicks, sequentialTicks } from './colour-scale.ts';

export interface ColourScaleProps {
  /** The palette runs from −maxAbs (bottom) to +maxAbs (top); from 0 to maxAbs when sequential. */
  readonly maxAbs: number;
  /** Default 'diverging'. */
  readonly kind?: 'diverging' | 'sequential';
  readonly height: number;
  /** Bar width in px (default 10). */
  readonly width?: number;
  /** Unit printed under the bar. */
  readonly unit?: string;
  /** Number of colour steps drawn (default 32). */
  readonly steps?: number;
}

export function ColourScale({ maxAbs, height, width = 10, unit, steps = 32, kind = 'diverging' }: ColourScaleProps) {
  const sequential = kind === 'sequential';
  const lo = sequential ? 0 : -maxAbs;
  const y = scaleLinear().domain([lo, maxAbs]).range([height, 0]);
  const ticks = sequential ? sequentialTicks(maxAbs, 4) : colourTicks(maxAbs, 4);
  const fmt = withoutNegativeZero(format('.2~g'));
  const step = height / steps;
  return (
    <g className="colour-scale">
      {Array.from({ length: steps }, (_, i) => {
        const v = maxAbs - ((i + 0.5) / steps) * (maxAbs - lo);
        const [r, g, b] = sequential ? sequentialColor(v, maxAbs) : divergingColor(v, maxAbs);
        return <rect key={i} x={0} y={i * step} width={width} height={step + 0.5} fill={`rgb(${r},${g},${b})`} />;
      })}
      <rect x={0} y={0} width={width} height={height} fill="none" stroke="#555" strokeWidth={0.5} />
      {ticks.map((t) => (
        <g key={t} transform={`translate(${width}, ${y(t)})`}>
          <line x2={3} stroke="#555" />
          <text x={5} dy="0.32em" fontSize={9} fill="#333">{fmt(t)}</text>
        </g>
      ))}
      {unit ? <text x={0} y={height + 12} fontSize={9} fill="#333">{unit}</text> : null}
    </g>
  );
}
