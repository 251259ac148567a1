/**
 * Focus view: every piece of evidence for the selected component at a useful size, with the decision
 * controls. Previous/next keep the layout and the view settings (epoch sort, smoothing, time window).
 *
 * data-testid hooks for the end-to-end tests:
 *   focus-view          the whole view (section)
 *   focus-topography    scalp map panel
 *   focus-trial-stack   trial stack + average panel
 *   focus-spectrum      spectrum panel
 *   focus-previous, focus-next   navigation buttons
 *   decision-keep, decision-remove, decision-undecided   verdict buttons (aria-pressed shows the current one)
 *   decision-reason     reason code <select> ('' = none)
 *   decision-note       note <textarea> (committed 400 ms after typing stops and on blur)
 */
import { useMemo, useState } from 'react';
import { useWorkbench } from '../../state/index.ts';
import { componentContext } from '../export/export-names.ts';
import { EvidenceTable } from '../plots/EvidenceTable.tsx';
import { evidenceRows } from '../plots/evidence-rows.ts';
import { decompositionMontage } from '../plots/montage-positions.ts';
import { ExportablePanel } from '../export/ExportablePanel.tsx';
import { ActivationPanel, type ActivationSettings } from './ActivationPanel.tsx';
import { DecisionControls } from './DecisionControls.tsx';
import { DipolePanel } from './DipolePanel.tsx';
import { TrialStackPanel, type EpochSettings } from './TrialStackPanel.tsx';
import { MapPanel } from './MapPanel.tsx';
import { SpectrumPanel } from './SpectrumPanel.tsx';
import { SuggestionReasons } from './SuggestionReasons.tsx';
import { mixingColumn, neighbourIndex } from './focus-logic.ts';
import './focus.css';

export function FocusView() {
  const selected = useWorkbench((s) => s.selected);
  const recording = useWorkbench((s) => s.recording);
  const decomposition = useWorkbench((s) => s.decomposition);
  const evidenceList = useWorkbench((s) => s.evidence);
  const aim = useWorkbench((s) => s.aim);
  const roiWindow = useWorkbench((s) => s.roi.windowS);
  const select = useWorkbench((s) => s.select);
  const setScreen = useWorkbench((s) => s.setScreen);
  const [epochSettings, setEpochSettings] = useState<EpochSettings>({ sort: 'order', smoothing: 1, amplitudeWindowS: roiWindow });
  const [activation, setActivation] = useState<ActivationSettings>({ startS: 0, lengthS: 10, sensors: null, markers: null });

  const n = decomposition?.nComponents ?? 0;
  const index = selected ?? (n > 0 ? 1 : null);
  const evidence = useMemo(() => evidenceList?.find((e) => e.index === index) ?? null, [evidenceList, index]);
  const montage = useMemo(() => (recording && decomposition ? decompositionMontage(recording, decomposition) : null), [recording, decomposition]);
  const map = useMemo(
    () => evidence?.map ?? (decomposition && index ? mixingColumn(decomposition.mixing, decomposition.nChannels, n, index - 1) : null),
    [evidence, decomposition, index, n],
  );
  const rows = useMemo(() => (evidence ? evidenceRows(evidence) : []), [evidence]);

  if (!recording || !decomposition || index === null) {
    return (
      <section className="focus-view" data-testid="focus-view" aria-label="Component focus">
        <p>Open a participant and choose a component on the board to see its evidence here.</p>
      </section>
    );
  }
  const context = componentContext(index);
  const go = (step: number) => {
    const next = neighbourIndex(index, n, step);
    if (next !== null) select(next);
  };

  return (
    <section className="focus-view" data-testid="focus-view" aria-label={`Component ${index} focus`}>
      <header className="focus-header">
        <button type="button" onClick={() => go(-1)} disabled={index <= 1} data-testid="focus-previous" aria-label="Previous component">
          ← previous
        </button>
        <h2>
          Component {index} <span className="of">of {n}</span>
        </h2>
        <button type="button" onClick={() => go(1)} disabled={index >= n} data-testid="focus-next" aria-label="Next component">
          next →
        </button>
        {evidence ? (
          <p className="focus-summary">
            {(evidence.varianceShare * 100).toFixed(1)} % of the data's variance · strongest at {evidence.strongestChannel.label}
          </p>
        ) : (
          <p className="focus-summary">Evidence is not computed yet.</p>
        )}
        <button type="button" onClick={() => setScreen('board')} className="back">back to the board</button>
      </header>
      <div className="focus-grid">
        <div className="focus-column">
          {map && montage ? (
            <MapPanel index={index} map={map} positions={montage.positions} drawable={montage.drawable} labels={decomposition.channels} context={context} />
          ) : null}
          {evidence ? <DipolePanel dipole={evidence.dipole} context={context} /> : null}
        </div>
        <div className="focus-column focus-wide">
          {montage ? (
            <ActivationPanel
              index={index}
              recording={recording}
              decomposition={decomposition}
              rows={montage.rows}
              settings={activation}
              onSettings={(p) => setActivation((s) => ({ ...s, ...p }))}
              context={context}
            />
          ) : null}
          {evidence ? (
            <TrialStackPanel evidence={evidence} settings={epochSettings} onSettings={(p) => setEpochSettings((s) => ({ ...s, ...p }))} context={context} />
          ) : null}
        </div>
        <div className="focus-column">
          <section className="panel panel-decision" aria-label="Decision">
            <header className="panel-header"><h3>Decision</h3></header>
            <div className="panel-body">
              <DecisionControls index={index} />
              {evidence ? <SuggestionReasons evidence={evidence} aim={aim} /> : null}
            </div>
          </section>
          {evidence ? <SpectrumPanel evidence={evidence} context={context} /> : null}
        </div>
      </div>
      {evidence ? (
        <ExportablePanel title="Evidence" context={context} className="panel-evidence">
          <EvidenceTable rows={rows} />
        </ExportablePanel>
      ) : null}
    </section>
  );
}
