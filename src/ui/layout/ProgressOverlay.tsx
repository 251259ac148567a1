/** The long task in flight: name, bar, percentage, estimated time left, cancel. */
import { useWorkbench } from '../../state/index.ts';

export function formatEta(seconds: number | null): string {
  if (seconds === null || !Number.isFinite(seconds)) return 'estimating time left…';
  if (seconds < 1) return 'less than a second left';
  if (seconds < 90) return `about ${Math.round(seconds)} s left`;
  return `about ${Math.round(seconds / 60)} min left`;
}

export function ProgressOverlay() {
  const progress = useWorkbench((s) => s.progress);
  if (!progress) return null;
  const pct = Math.round(progress.fraction * 100);
  return (
    <div className="progress-panel" role="status" aria-live="polite" data-testid="progress">
      <span className="progress-task">{progress.task}</span>
      <progress max={100} value={pct} aria-label={`${progress.task}: ${pct} %`} />
      <span className="progress-numbers">{pct} % · {formatEta(progress.etaSeconds)}</span>
      {progress.cancel && (
        <button type="button" onClick={progress.cancel} data-testid="progress-cancel">Cancel</button>
      )}
    </div>
  );
}
