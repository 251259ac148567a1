/**
 * The fitted equivalent dipole in three small orthogonal head views (top, side, back), with its residual
 * variance and approximate region. Carries the caution that this is an approximate model estimate once, as
 * its caption.
 */
import type { DipoleEvidence } from '../../core/evidence/types.ts';
import { DIPOLE_VIEWS, drawingRadiusMm, projectDipole, type DipoleViewName } from './dipole-projection.ts';
import { formatNumber } from './format-number.ts';

export interface DipoleViewsProps {
  readonly dipole: DipoleEvidence;
  /** Size of each view in px (default 88). */
  readonly size?: number;
}

/** The caution shown with every dipole (plain text). */
export const DIPOLE_CAUTION =
  'Approximate model estimate: one equivalent dipole in a spherical head model, not an anatomical location.';

const VIEW_TITLES: Record<DipoleViewName, string> = { top: 'from above', side: 'from the right', back: 'from behind' };

/** Inner (brain) sphere of the three-shell model at 0.87 of the outer radius (Rush & Driscoll 1969, issue 3). */
const BRAIN_FRACTION = 0.87;

function HeadSketch({ view, r }: { view: DipoleViewName; r: number }) {
  // Nose marks the front: up in the top view, right in the side view; the back view shows both ears.
  return (
    <g fill="none" stroke="#555" strokeWidth={1}>
      <circle r={r} />
      <circle r={r * BRAIN_FRACTION} strokeDasharray="2 2" stroke="#aaa" />
      {view === 'top' ? <path d={`M${-0.1 * r},${-0.99 * r} L0,${-1.12 * r} L${0.1 * r},${-0.99 * r}`} /> : null}
      {view === 'side' ? <path d={`M${0.99 * r},${-0.1 * r} L${1.12 * r},0 L${0.99 * r},${0.1 * r}`} /> : null}
      {view !== 'side' ? (
        <>
          <path d={`M${-r},${-0.15 * r} q${-0.1 * r},${0.15 * r} 0,${0.3 * r}`} />
          <path d={`M${r},${-0.15 * r} q${0.1 * r},${0.15 * r} 0,${0.3 * r}`} />
        </>
      ) : (
        <ellipse cx={0} cy={0} rx={0.06 * r} ry={0.14 * r} />
      )}
    </g>
  );
}

export function DipoleViews({ dipole, size = 96 }: DipoleViewsProps) {
  const R = drawingRadiusMm(dipole.position);
  const r = size * 0.4;
  const width = size * 3;
  const height = size + 28;
  return (
    <figure className="dipole-views">
      <svg width={width} height={height} viewBox={`0 0 ${width} ${height}`} role="img" aria-label="equivalent dipole, three views">
        <defs>
          <marker id="dipole-arrow" viewBox="0 0 6 6" refX={5} refY={3} markerWidth={5} markerHeight={5} orient="auto">
            <path d="M0,0 L6,3 L0,6 z" fill="#b3401a" />
          </marker>
        </defs>
        {DIPOLE_VIEWS.map((view, i) => {
          const p = projectDipole(view, dipole.position, dipole.moment, R);
          return (
            <g key={view} transform={`translate(${i * size + size / 2},${size / 2 + 2})`}>
              <HeadSketch view={view} r={r} />
              <line x1={p.at[0] * r} y1={p.at[1] * r} x2={p.tip[0] * r} y2={p.tip[1] * r} stroke="#b3401a" strokeWidth={1.8} markerEnd="url(#dipole-arrow)" />
              <circle cx={p.at[0] * r} cy={p.at[1] * r} r={3} fill="#b3401a" stroke="#fff" strokeWidth={0.8} />
              <text y={size / 2 + 8} textAnchor="middle" fontSize={9} fill="#333">{VIEW_TITLES[view]}</text>
            </g>
          );
        })}
        <text x={4} y={height - 6} fontSize={9} fill="#333">
          RV {formatNumber(dipole.residualVariance * 100, 1)}{'\u00a0'}% · {dipole.region}
        </text>
      </svg>
      <figcaption>
        <div>
          Residual variance <strong>{formatNumber(dipole.residualVariance * 100, 1)}{'\u00a0'}%</strong>
          {dipole.atBoundary ? ' · fit stopped at the brain boundary' : ''}
        </div>
        <div>Approximate region: {dipole.region}</div>
        <div>
          Position (mm, right/anterior/up): {dipole.position.map((v) => formatNumber(v, 0)).join(', ')}
        </div>
        {/* The caution once per figure (a caption, so exported figures keep it). */}
        <p className="caution note">{DIPOLE_CAUTION}</p>
      </figcaption>
    </figure>
  );
}
