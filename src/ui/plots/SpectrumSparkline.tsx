/**
 * A small spectrum for a board tile: log10 power 1–45 Hz at the component's strongest channel, the
 * 1/f fit as a dashed line and the alpha peak as a short tick with a dot. No axes; the tooltip gives
 * the numbers so the sparkline stays readable without colour.
 */
import { useMemo } from 'react';
import type { ComponentEvidence } from '../../core/evidence/types.ts';
import { spectrumGeometry } from './spectrum-geometry.ts';

export interface SpectrumSparklineProps {
  readonly evidence: ComponentEvidence;
  /** Width in CSS pixels (default 120). */
  readonly width?: number;
  /** Height in CSS pixels (default 40). */
  readonly height?: number;
}

/** Tooltip text for the sparkline: exponent and alpha peak, with units. */
export function sparklineSummary(e: Pick<ComponentEvidence, 'oneOverF' | 'alphaPeakHz'>): string {
  const chi = Number.isFinite(e.oneOverF.exponent) ? `1/f exponent ${e.oneOverF.exponent.toFixed(2)}` : 'no 1/f fit';
  const alpha = e.alphaPeakHz === null ? 'no alpha peak' : `alpha peak ${e.alphaPeakHz.toFixed(1)} Hz`;
  return `Spectrum 1–45 Hz (log power): ${chi}; ${alpha}`;
}

export function SpectrumSparkline({ evidence, width = 120, height = 40 }: SpectrumSparklineProps) {
  const { spectrum, oneOverF, alphaPeakHz } = evidence;
  const g = useMemo(
    () => spectrumGeometry([spectrum], { width, height }, oneOverF, alphaPeakHz),
    [spectrum, oneOverF, alphaPeakHz, width, height],
  );
  const summary = sparklineSummary(evidence);
  return (
    <svg className="spectrum-sparkline" width={width} height={height} viewBox={`0 0 ${width} ${height}`} role="img" aria-label={summary}>
      <title>{summary}</title>
      <path d={g.lines[0]} fill="none" stroke="#1d232b" strokeWidth={1.2} />
      {g.fit ? <path d={g.fit} fill="none" stroke="#8a6d00" strokeWidth={1} strokeDasharray="3 2" /> : null}
      {g.alphaX !== null ? (
        <g>
          <line x1={g.alphaX} x2={g.alphaX} y1={height - 2} y2={height - 8} stroke="#1d232b" strokeWidth={1} />
          {g.alphaLogPower !== null ? <circle cx={g.alphaX} cy={g.y(g.alphaLogPower)} r={2.2} fill="none" stroke="#1d232b" /> : null}
        </g>
      ) : null}
    </svg>
  );
}
