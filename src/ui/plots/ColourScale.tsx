/**
 * A vertical colour bar for a diverging palette symmetric about zero, with ticks. Rendered as SVG
 * (stacked rects, no gradient ids, so several bars on one page never clash).
 */
import { scaleLinear, format } from 'd3';
import { divergingColor } from '../../core/headmodel/palette.ts';
import { colourTicks } from './colour-scale.ts';

export interface ColourScaleProps {
  /** The palette runs from −maxAbs (bottom) to +maxAbs (top). */
  readonly maxAbs: number;
  readonly height: number;
  /** Bar width in px (default 10). */
  readonly width?: number;
  /** Unit printed under the bar. */
  readonly unit?: string;
  /** Number of colour steps drawn (default 32). */
  readonly steps?: number;
}

export function ColourScale({ maxAbs, height, width = 10, unit, steps = 32 }: ColourScaleProps) {
  const y = scaleLinear().domain([-maxAbs, maxAbs]).range([height, 0]);
  const ticks = colourTicks(maxAbs, 4);
  const fmt = format('.2~g');
  const step = height / steps;
  return (
    <g className="colour-scale">
      {Array.from({ length: steps }, (_, i) => {
        const v = maxAbs - ((i + 0.5) / steps) * 2 * maxAbs;
        const [r, g, b] = divergingColor(v, maxAbs);
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
