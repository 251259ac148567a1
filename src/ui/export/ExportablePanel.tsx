/**
 * A titled panel with two small buttons that save its figure(s) as SVG or PNG. Used by every panel of the
 * focus and preview views.
 */
import { useRef, useState, type ReactNode } from 'react';
import { useWorkbench } from '../../state/index.ts';
import { panelFigureTitle, panelFileName, participantPrefix, type PanelFormat } from './export-names.ts';
import { exportPanel } from './panel-export.ts';
import './panel.css';

export interface ExportablePanelProps {
  readonly title: string;
  /** Context for file names, e.g. "component-07" or "preview". */
  readonly context?: string;
  readonly className?: string;
  readonly testId?: string;
  /** Controls shown in the panel header (sort, smoothing, …); not exported. */
  readonly controls?: ReactNode;
  readonly children: ReactNode;
}

export function ExportablePanel({ title, context, className, testId, controls, children }: ExportablePanelProps) {
  const body = useRef<HTMLDivElement>(null);
  const [error, setError] = useState<string | null>(null);
  const recordingName = useWorkbench((s) => s.recording?.fileName ?? null);
  const save = (format: PanelFormat) => {
    if (!body.current) return;
    setError(null);
    // Named and titled after the participant (BIDS entities), the context and the panel; captions kept.
    const participant = participantPrefix(recordingName);
    exportPanel(body.current, format, panelFileName(title, format, context, participant), panelFigureTitle(title, context, participant)).catch((e: unknown) =>
      setError(e instanceof Error ? e.message : String(e)),
    );
  };
  return (
    <section className={`panel ${className ?? ''}`} data-testid={testId} aria-label={title}>
      <header className="panel-header">
        <h3>{title}</h3>
        {controls ? <div className="panel-controls">{controls}</div> : null}
        <div className="panel-export">
          <button type="button" onClick={() => save('svg')} title={`Save “${title}” as SVG`}>SVG</button>
          <button type="button" onClick={() => save('png')} title={`Save “${title}” as PNG`}>PNG</button>
        </div>
      </header>
      <div className="panel-body" ref={body}>{children}</div>
      {error ? <p role="alert" className="panel-error">Export failed: {error}</p> : null}
    </section>
  );
}
