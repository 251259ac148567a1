/**
 * Scalp topography of one set of channel weights (a component's map, or variance removed per channel):
 * spherical-spline picture from the head-model plan, diverging palette symmetric about zero, head outline
 * with nose and ears, electrode dots. The picture is a PNG inside an SVG `<image>`, so the whole map exports
 * as one SVG. Polarity of a component map is arbitrary; the caller says so near the map.
 */
import { useMemo } from 'react';
import { divergingColor } from '../../core/headmodel/palette.ts';
import { symmetricLimit, gridToRgba } from './colour-scale.ts';
import { headOutlinePaths } from './head-outline.ts';
import { rgbaToDataUrl } from './raster-image.ts';
import { topographyPlanFor } from './topography-plans.ts';
import { ColourScale } from './ColourScale.tsx';

export interface TopographyMapProps {
  /** One weight per channel, in the order of `positionsUnit`. NaN = unknown (drawn as a hollow dot). */
  readonly weights: Float64Array;
  /** n×3 electrode unit vectors, RAS, row-major. */
  readonly positionsUnit: Float64Array;
  /** Drawn width and height of the head in CSS pixels (default 96, a board tile). */
  readonly size?: number;
  /** Accessible title, also shown as a tooltip. */
  readonly title?: string;
  /** Draw electrode dots (default true). */
  readonly electrodes?: boolean;
  /** Electrode labels, for tooltips on the dots (optional). */
  readonly labels?: readonly string[];
  /** Draw a colour bar to the right of the head (default false). */
  readonly colourBar?: boolean;
  /** Unit written under the colour bar (e.g. "a.u.", "µV²"). */
  readonly unit?: string;
  /** Fixed ±limit of the palette; default: the largest |value| in the picture. */
  readonly maxAbs?: number;
}

/** Grid resolution for a drawn size: half the pixels, between 32 and 128 (the browser smooths the rest). */
export function topographyResolution(size: number): number {
  return Math.max(32, Math.min(128, Math.round(size / 2)));
}

export function TopographyMap({
  weights, positionsUnit, size = 96, title, electrodes = true, labels, colourBar = false, unit, maxAbs,
}: TopographyMapProps) {
  const resolution = topographyResolution(size);
  const plan = useMemo(() => topographyPlanFor(positionsUnit, resolution), [positionsUnit, resolution]);
  const grid = useMemo(() => plan.render(weights), [plan, weights]);
  const limit = maxAbs ?? symmetricLimit(grid);
  const href = useMemo(
    () => rgbaToDataUrl(gridToRgba(grid, limit, divergingColor), plan.size, plan.size),
    [grid, limit, plan],
  );
  const scale = size / plan.size;
  const frame = { cx: size / 2, cy: size / 2, radius: size / 2 / plan.extent };
  const outline = headOutlinePaths(frame);
  const pad = size * 0.08;
  const barWidth = colourBar ? Math.max(44, size * 0.22) : 0;
  const dotR = Math.max(1.2, size / 90);
  const nElectrodes = Math.floor(plan.electrodePx.length / 2);

  return (
    <svg
      className="topography-map"
      width={size + 2 * pad + barWidth}
      height={size + 2 * pad}
      viewBox={`${-pad} ${-pad} ${size + 2 * pad + barWidth} ${size + 2 * pad}`}
      role="img"
      aria-label={title ?? 'scalp topography'}
    >
      {title ? <title>{title}</title> : null}
      <image href={href} x={0} y={0} width={size} height={size} preserveAspectRatio="none" />
      <g fill="none" stroke="#333" strokeWidth={Math.max(1, size / 160)}>
        <path d={outline.head} />
        <path d={outline.nose} />
        <path d={outline.ears} />
      </g>
      {electrodes ? (
        <g className="electrodes">
          {Array.from({ length: nElectrodes }, (_, i) => {
            const x = plan.electrodePx[2 * i];
            const y = plan.electrodePx[2 * i + 1];
            if (!Number.isFinite(x) || !Number.isFinite(y)) return null;
            const known = Number.isFinite(weights[i]);
            return (
              <circle
                key={i}
                cx={x * scale}
                cy={y * scale}
                r={dotR}
                fill={known ? '#111' : 'none'}
                stroke="#111"
                strokeWidth={0.6}
              >
                {labels?.[i] ? <title>{labels[i]}</title> : null}
              </circle>
            );
          })}
        </g>
      ) : null}
      {colourBar ? (
        <g transform={`translate(${size + pad}, ${size * 0.1})`}>
          <ColourScale maxAbs={limit} height={size * 0.8} unit={unit} />
        </g>
      ) : null}
    </svg>
  );
}
