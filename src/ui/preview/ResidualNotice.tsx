/**
 * "What the decomposition missed" (issue 10 item 5): after the decisions, what remains on the cleaned
 * channels — eye-following slow activity at the frontal pole, mains-band power, a heartbeat — measured in a
 * worker (src/core/review/residual.ts) a moment after the removed set stops changing, with the figures.
 */
import { useEffect, useMemo, useState } from 'react';
import type { Decomposition } from '../../core/decomposition.ts';
import type { LoadedRecording } from '../../core/recording.ts';
import type { ResidualResult } from '../../core/review/residual.ts';
import { computeResidualInWorker } from '../../bridge/residual-client.ts';
import { recalledResidual, rememberResidual } from '../../state/residual-check.ts';

/** Wait after the last verdict change before measuring, ms (a toggle burst measures once). */
const SETTLE_MS = 600;

export interface ResidualNoticeProps {
  readonly recording: LoadedRecording;
  readonly decomposition: Decomposition;
  /** 0-based indices of the removed components (the preview's applied set). */
  readonly removed: ReadonlySet<number>;
}

export function ResidualNotice({ recording, decomposition, removed }: ResidualNoticeProps) {
  const list = useMemo(() => [...removed].map((i) => i + 1).sort((a, b) => a - b), [removed]);
  const key = list.join(',');
  const [state, setState] = useState<{ key: string; result: ResidualResult | null; failed: boolean } | null>(null);
  useEffect(() => {
    const hit = recalledResidual(recording, decomposition, list);
    if (hit) {
      setState({ key, result: hit, failed: false });
      return;
    }
    const controller = new AbortController();
    const timer = setTimeout(() => {
      computeResidualInWorker(recording, decomposition, list, controller.signal)
        .then((result) => {
          rememberResidual(recording, decomposition, list, result);
          setState({ key, result, failed: false });
        })
        .catch((e: Error) => {
          if (e?.name !== 'AbortError') setState({ key, result: null, failed: true });
        });
    }, SETTLE_MS);
    return () => {
      clearTimeout(timer);
      controller.abort();
    };
  }, [recording, decomposition, key]);

  const current = state && state.key === key ? state : null;
  return (
    <section className="residual-notice" data-testid="residual-notice" aria-label="What the decomposition missed" aria-live="polite">
      <ResidualNoticeBody checking={!current} failed={current?.failed ?? false} result={current?.result ?? null} />
    </section>
  );
}

/** The notice's text (pure, for tests): checking, failed, nothing found, or one line per warning. */
export function ResidualNoticeBody({ checking, failed, result }: { checking: boolean; failed: boolean; result: ResidualResult | null }) {
  if (checking) return <p className="hint">Checking what remains on the cleaned channels…</p>;
  if (failed || !result) return <p className="hint">What remains on the cleaned channels could not be measured.</p>;
  if (result.warnings.length === 0)
    return <p className="hint">No eye, mains or heartbeat artefact found on the cleaned channels (ours; methods §19).</p>;
  return (
    <div role="status">
      <p>
        <strong>▲ Artefact remains on the cleaned channels</strong> that no removed component held (methods §19):
      </p>
      <ul>
        {result.warnings.map((w) => (
          <li key={w.kind} data-kind={w.kind}>{w.text}</li>
        ))}
      </ul>
    </div>
  );
}
