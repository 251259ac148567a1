/**
 * One component on the board: number, current verdict, scalp map, spectrum sparkline, three evidence
 * figures with units, variance share, impact on the aim and the suggestion. Click selects; Enter or a
 * double click opens the focus view.
 */
import { memo, useEffect, useRef } from 'react';
import { selectComponentEvidence, selectDecision, selectSuggestion, useWorkbench } from '../../state/index.ts';
import { TopographyMap } from '../plots/TopographyMap.tsx';
import { SpectrumSparkline } from '../plots/SpectrumSparkline.tsx';
import { VerdictMark } from './VerdictMark.tsx';
import { formatPercent, tileFigures } from './tile-figures.ts';
import { IMPACT_MEANING, impactOnAim } from './board-order.ts';

export interface ComponentTileProps {
  readonly index: number;
  readonly positions: Float64Array | null;
}

export const ComponentTile = memo(function ComponentTile({ index, positions }: ComponentTileProps) {
  const decision = useWorkbench(selectDecision(index));
  const evidence = useWorkbench(selectComponentEvidence(index));
  const suggested = useWorkbench(selectSuggestion(index));
  const aim = useWorkbench((s) => s.aim);
  const selected = useWorkbench((s) => s.selected === index);
  const select = useWorkbench((s) => s.select);
  const setScreen = useWorkbench((s) => s.setScreen);
  const ref = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    if (!selected || !ref.current) return;
    ref.current.scrollIntoView({ block: 'nearest' });
    const active = document.activeElement;
    if (!active || active === document.body || active.classList.contains('tile')) ref.current.focus({ preventScroll: true });
  }, [selected]);

  const suggestion = suggested?.suggestion ?? null;
  const figures = evidence ? tileFigures(evidence, suggested) : [];
  const label = `Component ${index}: ${decision.verdict}${decision.reason ? `, ${decision.reason}` : ''}${
    suggestion ? `; suggested ${suggestion.verdict} (${suggestion.reason})` : ''}`;

  return (
    <button
      ref={ref}
      type="button"
      className={`tile tile-${decision.verdict}${selected ? ' tile-selected' : ''}`}
      aria-pressed={selected}
      aria-label={label}
      data-testid={`tile-${index}`}
      data-verdict={decision.verdict}
      onClick={() => select(index)}
      onDoubleClick={() => { select(index); setScreen('focus'); }}
      onKeyDown={(e) => {
        if (e.key === 'Enter') { e.preventDefault(); e.stopPropagation(); select(index); setScreen('focus'); }
      }}
    >
      <span className="tile-head">
        <span className="tile-number">IC {index}</span>
        <VerdictMark verdict={decision.verdict} />
      </span>
      <span className="tile-plots">
        {evidence && positions ? (
          <TopographyMap weights={evidence.map} positionsUnit={positions} size={84} title={`Scalp map of component ${index} (polarity arbitrary)`} />
        ) : (
          <span className="plot-placeholder" style={{ width: 84, height: 84 }}>no map</span>
        )}
        {evidence ? <SpectrumSparkline evidence={evidence} width={112} height={48} /> : <span className="plot-placeholder">no spectrum</span>}
      </span>
      {evidence && (
        <span className="tile-figures">
          <span className="figure" title="Share of the data's variance carried by this component">
            <span className="figure-label">variance</span> <span className="figure-value">{formatPercent(evidence.varianceShare)}</span>
          </span>
          <span className="figure" title={`Impact on the aim (${aim}): ${IMPACT_MEANING[aim]}`}>
            <span className="figure-label">impact ({aim})</span> <span className="figure-value">{formatPercent(impactOnAim(evidence, aim))}</span>
          </span>
          {figures.map((f) => (
            <span className="figure" key={f.label} title={f.title}>
              <span className="figure-label">{f.label}</span> <span className="figure-value">{f.value}</span>
            </span>
          ))}
        </span>
      )}
      {suggestion && (
        <span className="tile-suggestion" title={suggestion.because.join('; ')}>
          suggested <VerdictMark verdict={suggestion.verdict} kind="suggested" /> <span className="reason">{suggestion.reason}</span>
        </span>
      )}
      {decision.reason && <span className="tile-reason">reason: {decision.reason}</span>}
      {decision.note && <span className="tile-note" title={decision.note}>note: {decision.note}</span>}
    </button>
  );
});
