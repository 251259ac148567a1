/**
 * An evidence table of the focus view with its own export: a heading line with an "SVG" button that saves
 * the table as a real SVG figure (drawn by the panel export's table figure, src/ui/export/table-figure.ts),
 * titled and named after the participant's BIDS entities, the component and the question, as every other
 * exported figure is (issue 14 item 11).
 *
 * data-testid hooks: `{testId}` the wrapper, `{testId}-svg` the button.
 */
import { useRef, useState } from 'react';
import { useWorkbench } from '../../state/index.ts';
import { panelFigureTitle, panelFileName, participantPrefix } from '../export/export-names.ts';
import { exportPanel } from '../export/panel-export.ts';
import type { EvidenceRow } from '../plots/evidence-rows.ts';
import { EvidenceTable } from '../plots/EvidenceTable.tsx';

export interface EvidenceExportProps {
  readonly rows: readonly EvidenceRow[];
  /** The figure's name, e.g. "Evidence: where does it come from". */
  readonly name: string;
  /** "component-07" */
  readonly context: string;
  readonly testId: string;
  /** Heading shown beside the button (omitted where the surrounding element already names the table). */
  readonly heading?: string;
}

export function EvidenceExport({ rows, name, context, testId, heading }: EvidenceExportProps) {
  const table = useRef<HTMLDivElement>(null);
  const [error, setError] = useState<string | null>(null);
  const recordingName = useWorkbench((s) => s.recording?.fileName ?? null);
  const save = () => {
    if (!table.current) return;
    setError(null);
    const participant = participantPrefix(recordingName);
    exportPanel(table.current, 'svg', panelFileName(name, 'svg', context, participant), panelFigureTitle(name, context, participant)).catch((e: unknown) =>
      setError(e instanceof Error ? e.message : String(e)),
    );
  };
  return (
    <div className="evidence-export" data-testid={testId}>
      <div className="evidence-export-head">
        {heading ? <h4>{heading}</h4> : null}
        <button type="button" className="evidence-export-svg" onClick={save} title={`Save “${name}” as SVG`} data-testid={`${testId}-svg`}>
          SVG
        </button>
      </div>
      <div ref={table}>
        <EvidenceTable rows={rows} compact />
      </div>
      {error ? <p role="alert" className="panel-error">Export failed: {error}</p> : null}
    </div>
  );
}
