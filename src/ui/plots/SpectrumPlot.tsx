/**
 * Power spectral density at a useful size: log10 power against frequency with axes, the 1/f fit
 * (dashed) and the alpha peak (labelled tick). Several series (before/after) share the axes and differ
 * in dash pattern as well as colour.
 */
import { Axis } from './Axis.tsx';
import { formatNumber } from './format-number.ts';
import { placeLegend } from './legend-placement.ts';
import { logPower, spectrumGeometry, type OneOverFLine, type SpectrumSeries } from './spectrum-geometry.ts';

export interface LabelledSpectrum extends SpectrumSeries {
  readonly label: string;
}

export interface SpectrumPlotProps {
  readonly series: readonly LabelledSpectrum[];
  readonly oneOverF?: OneOverFLine | null;
  readonly alphaPeakHz?: number | null;
  /** Frequency range in Hz (default 1–45 Hz or the highest bin). */
  readonly rangeHz?: readonly [number, number];
  readonly width?: number;
  readonly height?: number;
  /** Unit of power for the axis title (default "µV²/Hz"). */
  readonly unit?: string;
  readonly title?: string;
}

const STYLES = [
  { stroke: '#1d232b', dash: undefined },
  { stroke: '#b3401a', dash: '5 3' },
];

export function SpectrumPlot({
  series, oneOverF = null, alphaPeakHz = null, rangeHz, width = 360, height = 170, unit = 'µV²/Hz', title,
}: SpectrumPlotProps) {
  const margin = { top: 10, right: 10, bottom: 28, left: 42 };
  const g = spectrumGeometry(series, { width, height, margin, rangeHz }, oneOverF, alphaPeakHz);
  const [y0, y1] = g.y.range();
  // The legend goes in the corner the lines leave free: top right, else top left of centre, bottom left, bottom right.
  const rows = (series.length > 1 ? series.length : 0) + (g.fit ? 1 : 0);
  const legendW = 70;
  const legendH = rows * 12 + 2;
  const [xl, xr] = g.x.range();
  const points: [number, number][] = [];
  const [f0, f1] = g.x.domain();
  for (const s of series)
    for (let k = 0; k < s.frequencies.length; k++) {
      const f = s.frequencies[k];
      const lp = logPower(s.power[k]);
      if (f >= f0 && f <= f1 && Number.isFinite(lp)) points.push([g.x(f), g.y(lp)]);
    }
  const legend = placeLegend(points, [
    { x: xr - legendW, y: y1 + 2, width: legendW, height: legendH },
    { x: (xl + xr) / 2 - legendW / 2, y: y1 + 2, width: legendW, height: legendH },
    { x: xl + 4, y: y0 - legendH - 2, width: legendW, height: legendH },
    { x: xr - legendW, y: y0 - legendH - 2, width: legendW, height: legendH },
  ]);
  return (
    <svg className="spectrum-plot" width={width} height={height} viewBox={`0 0 ${width} ${height}`} role="img" aria-label={title ?? 'power spectrum'}>
      {title ? <title>{title}</title> : null}
      {g.lines.map((d, i) => (
        <path key={i} d={d} fill="none" stroke={STYLES[i % 2].stroke} strokeDasharray={STYLES[i % 2].dash} strokeWidth={1.5} />
      ))}
      {g.fit ? <path d={g.fit} fill="none" stroke="#8a6d00" strokeWidth={1.2} strokeDasharray="2 3" /> : null}
      {g.alphaX !== null ? (
        <g>
          <line x1={g.alphaX} x2={g.alphaX} y1={y0} y2={y1 + 12} stroke="#555" strokeDasharray="1 2" />
          <text x={g.alphaX + 3} y={y1 + 10} fontSize={9}>alpha {formatNumber(alphaPeakHz, 1)} Hz</text>
        </g>
      ) : null}
      <g transform={`translate(0,${y0})`}><Axis scale={g.x} side="bottom" label="frequency (Hz)" /></g>
      <g transform={`translate(${g.x.range()[0]},0)`}><Axis scale={g.y} side="left" ticks={4} format=".2~f" label={`log₁₀ ${unit}`} /></g>
      <g fontSize={9} transform={`translate(${legend.x},${legend.y})`} className="spectrum-legend">
        {series.length > 1
          ? series.map((s, i) => (
              <g key={s.label} transform={`translate(0,${i * 12})`}>
                <line x2={18} y1={4} y2={4} stroke={STYLES[i % 2].stroke} strokeDasharray={STYLES[i % 2].dash} strokeWidth={1.5} />
                <text x={22} y={7}>{s.label}</text>
              </g>
            ))
          : null}
        {g.fit ? (
          <g transform={`translate(0,${(series.length > 1 ? series.length : 0) * 12})`}>
            <line x2={18} y1={4} y2={4} stroke="#8a6d00" strokeDasharray="2 3" strokeWidth={1.2} />
            <text x={22} y={7}>1/f fit</text>
          </g>
        ) : null}
      </g>
    </svg>
  );
}
