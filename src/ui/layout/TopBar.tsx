/** Title, caution and privacy note, participant, aim, screens, undo/redo, export and help. */
import { AIMS, type Aim } from '../../core/review/vocabulary.ts';
import { ThresholdsButton } from '../thresholds/ThresholdsPanel.tsx';
import { selectCanRedo, selectCanUndo, selectComponentCount, selectDecidedCount, useWorkbench, type Screen } from '../../state/index.ts';

export const AIM_LABELS: Record<Aim, string> = {
  erp: 'ERP (event-related averages)',
  oscillations: 'Oscillations (spectral power)',
  conservative: 'Conservative (only the unmistakable)',
};

const SCREENS: { screen: Screen; label: string; key: string }[] = [
  { screen: 'start', label: 'Open', key: 'O' },
  { screen: 'board', label: 'Board', key: 'B' },
  { screen: 'focus', label: 'Focus', key: 'F' },
  { screen: 'preview', label: 'Preview', key: 'P' },
];

export interface TopBarProps {
  readonly onHelp: () => void;
  readonly onExport: () => void;
  readonly helpOpen: boolean;
  readonly exportOpen: boolean;
}

export function TopBar({ onHelp, onExport, helpOpen, exportOpen }: TopBarProps) {
  const screen = useWorkbench((s) => s.screen);
  const setScreen = useWorkbench((s) => s.setScreen);
  const aim = useWorkbench((s) => s.aim);
  const setAim = useWorkbench((s) => s.setAim);
  const fileName = useWorkbench((s) => s.recording?.fileName ?? null);
  const total = useWorkbench(selectComponentCount);
  const decided = useWorkbench(selectDecidedCount);
  const canUndo = useWorkbench(selectCanUndo);
  const canRedo = useWorkbench(selectCanRedo);
  const undo = useWorkbench((s) => s.undo);
  const redo = useWorkbench((s) => s.redo);
  const hasEvidence = useWorkbench((s) => s.evidence !== null);

  return (
    <header className="shell-header">
      <div className="brand">
        <h1>Winnow</h1>
        <p className="caution">Research tool — not for clinical diagnosis.</p>
        <p className="privacy">Recordings stay on this machine: nothing is uploaded.</p>
      </div>
      {fileName && (
        <p className="participant" title="Recording under review">
          <span className="participant-file">{fileName}</span>
          {total > 0 && (
            <span className="counter" data-testid="decided-counter" aria-label={`${decided} of ${total} components decided`}>
              {decided} / {total} decided
            </span>
          )}
        </p>
      )}
      <nav className="screens" aria-label="Screens">
        {SCREENS.map((s) => (
          <button
            key={s.screen}
            type="button"
            aria-pressed={screen === s.screen}
            disabled={s.screen !== 'start' && !hasEvidence}
            onClick={() => setScreen(s.screen)}
            data-testid={`screen-${s.screen}`}
            title={`${s.label} (key ${s.key})`}
          >
            {s.label}
          </button>
        ))}
      </nav>
      <label className="aim">
        Aim{' '}
        <select value={aim} onChange={(e) => setAim(e.target.value as Aim)} data-testid="aim-select">
          {AIMS.map((a) => (
            <option key={a} value={a}>{AIM_LABELS[a]}</option>
          ))}
        </select>
      </label>
      <div className="history" role="group" aria-label="Undo and redo">
        <button type="button" onClick={undo} disabled={!canUndo} title="Undo (Ctrl+Z)" data-testid="undo">Undo</button>
        <button type="button" onClick={redo} disabled={!canRedo} title="Redo (Ctrl+Shift+Z or Ctrl+Y)" data-testid="redo">Redo</button>
      </div>
      <ThresholdsButton />
      <button type="button" onClick={onExport} aria-expanded={exportOpen} disabled={!hasEvidence} data-testid="export-open" title="Export and import (key E)">
        Export…
      </button>
      <button type="button" onClick={onHelp} aria-expanded={helpOpen} data-testid="help-open" title="Keys (key ?)">
        Keys ?
      </button>
    </header>
  );
}
