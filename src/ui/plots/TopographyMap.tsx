/**
 * Scalp topography of one set of channel weights (a component's map, or variance removed per channel):
 * spherical-spline picture from the head-model plan, painted over the electrodes' hull plus a small margin
 * with a smooth edge (topography-plans.ts MAP_CLIP), diverging palette symmetric about zero (or sequential
 * from 0 for shares), head outline with nose and ears, electrode dots. The picture is a PNG inside an SVG `<image>`, so the whole map exports
 * as one SVG. Polarity of a component map is arbitrary; the caller says so near the map.
 */
import { useMemo } from 'react';
import { divergingColor, sequentialColor } from './palette.ts';
import { gridToRgba, sequentialLimit, symmetricLimit } from './colour-scale.ts';
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
  /** Fixed ±limit of the palette (top of a sequential one); default: the largest |value| in the picture. */
  readonly maxAbs?: number;
  /** 'diverging' (default; signed maps, symmetric about 0) or 'sequential' (0 … max, e.g. a share per channel). */
  readonly scale?: 'diverging' | 'sequential';
}

/** Grid resolution for a drawn size: half the pixels, between 32 and 128 (the browser smooths the rest). */
export function topographyResolution(size: number): number {
  return Math.max(32, Math.min(128, Math.round(size / 2)));
}

export function TopographyMap({
  weights, positionsUnit, size = 96, title, electrodes = true, labels, colourBar = false, unit, maxAbs, scale = 'diverging',
}: TopographyMapProps) {
  const sequential = scale === 'sequential';
  const resolution = topographyResolution(size);
  const plan = useMemo(() => topographyPlanFor(positionsUnit, resolution), [positionsUnit, resolution]);
  const grid = useMemo(() => plan.render(weights), [plan, weights]);
  const limit = maxAbs ?? (sequential ? sequentialLimit(grid) : symmetricLimit(grid));
  const href = useMemo(
    () => rgbaToDataUrl(gridToRgba(grid, limit, sequential ? sequentialColor : divergingColor, undefined, plan.alpha), plan.size, plan.size),
    [grid, limit, plan, sequential],
  );
  const px = size / plan.size;
  const frame = { cx: size / 2, cy: size / 2, radius: size / 2 / plan.extent };
  const outline = headOutlinePaths(frame);
  const pad = size * 0.08;
  const barWidth = colourBar ? Math.max(44, size * 0.22) : 0;
  const dotR = Math.max(1.2, size / 90);
  const nElectrodes = Math.floor(plan.electrodePx.length / 2);

  return (
    <svg
      className="topography-map"
      data-scale={scale}
      width={size + 2 * pad + barWidth}
      height={size + 2 * pad}
      viewBox={`${-pad} ${-pad} ${size + 2 * pad + barWidth} ${size + 2 * pad}`}
      role="img"
      aria-label={title ?? 'scalp topography'}
    >
      {title ? <title>{title}</title> : null}
      <image href={href || undefined} x={0} y={0} width={size} height={size} preserveAspectRatio="none" />
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
                cx={x * px}
                cy={y * px}
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
          <ColourScale maxAbs={limit} height={size * 0.8} unit={unit} kind={scale} />
        </g>
      ) : null}
    </svg>
  );
}
