/**
 * Focus view: the evidence for one component, organised around the four questions a reviewer asks of it —
 * where does it come from (scalp map, variance per channel, dipole), when does it happen (its time course
 * above the sensors, with events), is it locked to the task (the trial stack and its average, for any
 * event type chosen by BIDS events.tsv columns, optionally split by a column), which frequencies (the
 * spectrum). The questions are a list of tabs on the left, each with its short answer and how many
 * suggestion rules fired on it; the chosen answer shows its figures with its evidence rows and fired rules
 * beside them; the decision and the suggestion stay on the right. Previous/next keep the question and the
 * view settings.
 *
 * data-testid hooks for the end-to-end tests:
 *   focus-view          the whole view (section)
 *   focus-question-{where|when|locked|frequencies}   the question tabs (aria-selected shows the current one)
 *   focus-answer-{…}    the answer shown
 *   focus-topography, focus-variance-map, focus-trial-stack, focus-spectrum   the figures' panels
 *   focus-lock-type, focus-lock-only, focus-lock-split, focus-trial-order    trial stack controls
 *   focus-trial-summary (data-epochs, data-groups), focus-lock-words        what the trial stack shows
 *   focus-evidence-{where|when|locked|frequencies|other}, …-svg   an evidence table and its SVG export button
 *   focus-previous, focus-next   navigation buttons
 *   decision-keep, decision-remove, decision-undecided   verdict buttons (aria-pressed shows the current one)
 *   decision-reason     reason code <select> ('' = none)
 *   decision-note       note <textarea> (committed 400 ms after typing stops and on blur)
 */
import { useMemo, useState, type ReactNode } from 'react';
import { DEFAULT_EPOCH_WINDOW_S } from '../../core/evidence/compute-evidence.ts';
import { defaultEventType, describeSelection, parseSelectionKey } from '../../core/evidence/event-selection.ts';
import type { FiredRule } from '../../core/review/suggest.ts';
import { selectSuggestions, useWorkbench } from '../../state/index.ts';
import { componentContext } from '../export/export-names.ts';
import { evidenceRows } from '../plots/evidence-rows.ts';
import { decompositionMontage } from '../plots/montage-positions.ts';
import { ActivationPanel, type ActivationSettings } from './ActivationPanel.tsx';
import { AnswerPanel } from './AnswerPanel.tsx';
import { DecisionControls } from './DecisionControls.tsx';
import { DipolePanel } from './DipolePanel.tsx';
import { EvidenceExport } from './EvidenceExport.tsx';
import { MapPanel } from './MapPanel.tsx';
import { QuestionRail } from './QuestionRail.tsx';
import { SpectrumPanel } from './SpectrumPanel.tsx';
import { SuggestionReasons } from './SuggestionReasons.tsx';
import { TrialStackPanel, type EpochSettings } from './TrialStackPanel.tsx';
import { VarianceMapPanel } from './VarianceMapPanel.tsx';
import {
  answerLines, byQuestion, componentTrace, mixingColumn, neighbourIndex, QUESTIONS, questionOfMeasure, questionOfRow, type QuestionId,
} from './focus-logic.ts';
import './focus.css';

const describeKey = (key: string) => `“${describeSelection(parseSelectionKey(key))}”`;

export function FocusView() {
  const selected = useWorkbench((s) => s.selected);
  const recording = useWorkbench((s) => s.recording);
  const decomposition = useWorkbench((s) => s.decomposition);
  const evidenceList = useWorkbench((s) => s.evidence);
  const aim = useWorkbench((s) => s.aim);
  // The suggestions for the current aim and threshold overrides (memoised in the store's selector).
  const suggestions = useWorkbench(selectSuggestions);
  const roiWindow = useWorkbench((s) => s.roi.windowS);
  const select = useWorkbench((s) => s.select);
  const setScreen = useWorkbench((s) => s.setScreen);
  const [question, setQuestion] = useState<QuestionId>('where');
  const [epochSettings, setEpochSettings] = useState<EpochSettings>({ sort: 'order', smoothing: 1, amplitudeWindowS: roiWindow, lockTo: null, splitBy: null });
  const [activation, setActivation] = useState<ActivationSettings>({ startS: 0, lengthS: 10, sensors: null, markers: null });

  const n = decomposition?.nComponents ?? 0;
  const index = selected ?? (n > 0 ? 1 : null);
  const evidence = useMemo(() => evidenceList?.find((e) => e.index === index) ?? null, [evidenceList, index]);
  const montage = useMemo(() => (recording && decomposition ? decompositionMontage(recording, decomposition) : null), [recording, decomposition]);
  const map = useMemo(
    () => evidence?.map ?? (decomposition && index ? mixingColumn(decomposition.mixing, decomposition.nChannels, n, index - 1) : null),
    [evidence, decomposition, index, n],
  );
  const suggestion = index === null ? null : suggestions.get(index) ?? null;
  const rows = useMemo(() => (evidence ? evidenceRows(evidence, suggestion) : []), [evidence, suggestion]);
  const rowsBy = useMemo(() => byQuestion(rows, (r) => questionOfRow(r.key)), [rows]);
  const rulesBy = useMemo(() => byQuestion<FiredRule>(suggestion?.rules ?? [], (r) => questionOfMeasure(r.measure)), [suggestion]);
  const events = recording?.events ?? null;
  const defaultLockTo = useMemo(() => evidence?.erp?.event ?? (events ? defaultEventType(events) : null), [evidence, events]);
  // The component's trace at its strongest channel over the whole recording (µV), for the trial stack;
  // computed only while that answer is open (one pass over the recording).
  const lockedOpen = question === 'locked';
  const trace = useMemo(() => {
    if (!lockedOpen || !recording || !decomposition || !montage || index === null || !evidence) return null;
    const k = decomposition.nComponents;
    const nd = decomposition.nChannels;
    const i = index - 1;
    const c = evidence.strongestChannel.index;
    return componentTrace(
      recording.signals.data, recording.signals.nSamples, montage.rows, decomposition.unmixing.subarray(i * nd, (i + 1) * nd),
      decomposition.channelMeans, decomposition.mixing[c * k + i],
    );
  }, [lockedOpen, recording, decomposition, montage, index, evidence]);

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
  const current = QUESTIONS.find((q) => q.id === question) ?? QUESTIONS[0];
  const ruleCounts = { where: rulesBy.where.length, when: rulesBy.when.length, locked: rulesBy.locked.length, frequencies: rulesBy.frequencies.length };
  const answers = evidence
    ? answerLines(evidence, describeKey)
    : { where: 'evidence not computed yet', when: '', locked: '', frequencies: '' };

  let figures: ReactNode = null;
  if (current.id === 'where') {
    figures = (
      <div className="figures-where">
        {map && montage ? (
          <MapPanel index={index} map={map} positions={montage.positions} drawable={montage.drawable} labels={decomposition.channels} context={context} size={165} />
        ) : null}
        {evidence && montage ? (
          <VarianceMapPanel
            index={index} shares={evidence.variancePerChannel} positions={montage.positions} drawable={montage.drawable} labels={decomposition.channels} context={context}
          />
        ) : null}
        {evidence ? <DipolePanel dipole={evidence.dipole} context={context} /> : null}
      </div>
    );
  } else if (current.id === 'when') {
    figures = montage ? (
      <ActivationPanel
        index={index}
        recording={recording}
        decomposition={decomposition}
        rows={montage.rows}
        positions={montage.drawable ? montage.positions : null}
        settings={activation}
        onSettings={(p) => setActivation((s) => ({ ...s, ...p }))}
        context={context}
      />
    ) : null;
  } else if (current.id === 'locked') {
    figures = (
      <TrialStackPanel
        trace={trace}
        sampleRate={recording.signals.sampleRate}
        events={recording.events}
        defaultLockTo={defaultLockTo}
        window={DEFAULT_EPOCH_WINDOW_S}
        channel={evidence?.strongestChannel.label ?? '?'}
        settings={epochSettings}
        onSettings={(p) => setEpochSettings((s) => ({ ...s, ...p }))}
        context={context}
      />
    );
  } else {
    figures = evidence ? <SpectrumPanel evidence={evidence} context={context} /> : null;
  }

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
        <p className="focus-summary">
          {evidence
            ? `${(evidence.varianceShare * 100).toFixed(1)}\u00a0% of the data's variance · strongest at ${evidence.strongestChannel.label}`
            : 'Evidence is not computed yet.'}
        </p>
        <button type="button" onClick={() => setScreen('board')} className="back">back to the board</button>
      </header>
      <div className="focus-layout">
        <nav className="focus-questions" aria-label="Questions">
          <QuestionRail current={current.id} onChoose={setQuestion} answers={answers} ruleCounts={ruleCounts} />
        </nav>
        <div className="focus-answer">
          <AnswerPanel question={current} rows={rowsBy[current.id]} rules={rulesBy[current.id]} context={context}>
            {figures}
          </AnswerPanel>
        </div>
        <div className="focus-decision">
          <section className="panel panel-decision" aria-label="Decision">
            <header className="panel-header"><h3>Decision</h3></header>
            <div className="panel-body">
              <DecisionControls index={index} />
              {evidence ? <SuggestionReasons index={index} suggestion={suggestion} aim={aim} onQuestion={setQuestion} /> : null}
            </div>
          </section>
          {rowsBy.other.length ? (
            <details className="panel focus-other">
              <summary>Other measures ({rowsBy.other.length})</summary>
              <EvidenceExport rows={rowsBy.other} name="Evidence other" context={context} testId="focus-evidence-other" />
            </details>
          ) : null}
        </div>
      </div>
    </section>
  );
}
