/**
 * The study screen: one row per recording (review state, removals, variance removed, reasons, aim,
 * reviewer, flags), sortable, with a dot strip per numeric column; the study's flags, each saying why and
 * opening that recording; export of the study; a second reviewer's decisions with Cohen's kappa and a
 * walk through the disagreements.
 */
import { useMemo, useState } from 'react';
import { useShallow } from 'zustand/react/shallow';
import { selectStudyRows, studyExport, studyStore, studyZip, useStudy } from '../../state/study-hooks.ts';
import { useWorkbench } from '../../state/index.ts';
import { downloadBlob } from '../layout/download.ts';
import { dotStrip, sortStudyRows, studyTableSvg, studyTableTsv, type StudySortKey } from './study-figures.ts';
import { SecondReviewerPanel } from './SecondReviewerPanel.tsx';
import { writeIntoDatasetFolder } from './write-folder.ts';
import './study.css';

const pct = (v: number | null) => (v === null ? '—' : `${(100 * v).toFixed(1)}\u00a0%`);

function DotStrip({ values, label }: { values: readonly (number | null)[]; label: string }) {
  const { x, max } = dotStrip(values);
  return (
    <svg className="dot-strip" width="96" height="14" role="img" aria-label={`${label}: one dot per recording, 0 to ${Number.isInteger(max) ? max : max.toFixed(2)}`}>
      <line x1="3" x2="93" y1="7" y2="7" stroke="currentColor" strokeOpacity="0.3" />
      {x.map((v, i) => (Number.isFinite(v) ? <circle key={i} cx={3 + 90 * v} cy="7" r="2.5" /> : null))}
    </svg>
  );
}

export function StudyView() {
  const { name, recordings, reviews, message, headers } = useStudy(useShallow((s) => ({ name: s.name, recordings: s.recordings, reviews: s.reviews, message: s.message, headers: s.headers })));
  const reviewer = useWorkbench((s) => s.reviewer);
  const rows = useMemo(() => selectStudyRows({ recordings, reviews }), [recordings, reviews]);
  const [sort, setSort] = useState<{ key: StudySortKey; descending: boolean }>({ key: 'key', descending: false });
  const sorted = useMemo(() => sortStudyRows(rows, sort.key, sort.descending), [rows, sort]);
  const flags = rows.flatMap((r) => r.flags.map((f) => ({ ...f, path: r.path })));
  const open = (path: string) => void studyStore.getState().openRecording(path);
  const header = (key: StudySortKey, text: string) => (
    <th scope="col" aria-sort={sort.key === key ? (sort.descending ? 'descending' : 'ascending') : 'none'}>
      <button type="button" className="sort-head" onClick={() => setSort((s) => ({ key, descending: s.key === key ? !s.descending : false }))}>
        {text}
        {sort.key === key ? (sort.descending ? ' ▼' : ' ▲') : ''}
      </button>
    </th>
  );
  const exportZip = () => {
    const files = studyExport(studyStore.getState(), reviewer);
    downloadBlob(studyZip(files).slice().buffer as ArrayBuffer, `${(name ?? 'study').replace(/[^\w.-]+/g, '_')}_winnow.zip`, 'application/zip');
  };
  const canWriteFolder = typeof (window as unknown as { showDirectoryPicker?: unknown }).showDirectoryPicker === 'function';
  const writeIntoFolder = async () => {
    const files = studyExport(studyStore.getState(), reviewer);
    try {
      const written = await writeIntoDatasetFolder(files);
      studyStore.setState({ message: `Wrote ${written} files into the dataset folder (derivatives/winnow/).` });
    } catch (e) {
      if ((e as Error)?.name === 'AbortError') return;
      studyStore.setState({ message: `Could not write into the folder (${(e as Error)?.message ?? String(e)}); the zip export still works.` });
    }
  };
  const reviewed = rows.filter((r) => r.state !== 'not started').length;
  return (
    <section className="study-view" aria-label="Study" data-testid="study-view">
      <header className="study-head">
        <h2>{name}</h2>
        <p>
          {recordings.length} recordings · {reviewed} reviewed · {rows.filter((r) => r.state === 'done').length} done
        </p>
        <div className="study-actions">
          <button type="button" onClick={exportZip} disabled={reviewed === 0} data-testid="study-export">
            Export the study (zip of BIDS derivatives)
          </button>
          {canWriteFolder && (
            <button type="button" onClick={() => void writeIntoFolder()} disabled={reviewed === 0}>
              Write into the dataset folder…
            </button>
          )}
          <button type="button" onClick={() => downloadBlob(studyTableTsv(sorted), 'winnow_study_table.tsv', 'text/tab-separated-values')} data-testid="study-table-tsv">
            Study table (TSV)
          </button>
          <button type="button" onClick={() => downloadBlob(studyTableSvg(sorted, `${name ?? 'Study'}: review overview`), 'winnow_study_table.svg', 'image/svg+xml')}>
            Study table (figure)
          </button>
          <button type="button" onClick={() => studyStore.getState().closeStudy()}>Close the study</button>
        </div>
        {message && <p className="study-message" role="status">{message}</p>}
      </header>
      <table className="study-table" data-testid="study-table">
        <thead>
          <tr>
            {header('key', 'Recording')}
            <th scope="col">Recording length</th>
            {header('state', 'Review')}
            {header('decided', 'Decided')}
            {header('removed', 'Removed')}
            {header('removedVariance', 'Variance removed')}
            <th scope="col">Reasons</th>
            <th scope="col">Aim</th>
            <th scope="col">Reviewer</th>
            {header('flags', 'Flags')}
            <th scope="col"><span className="visually-hidden">Open</span></th>
          </tr>
          <tr className="strip-row" aria-hidden="true">
            <td />
            <td />
            <td />
            <td><DotStrip values={rows.map((r) => r.decided)} label="decided" /></td>
            <td><DotStrip values={rows.map((r) => (r.state === 'not started' ? null : r.removed))} label="removed" /></td>
            <td><DotStrip values={rows.map((r) => r.removedVariance)} label="variance removed" /></td>
            <td colSpan={5} />
          </tr>
        </thead>
        <tbody>
          {sorted.map((r) => (
            <tr key={r.path} data-testid="study-row" data-state={r.state} className={r.flags.length > 0 ? 'flagged' : undefined}>
              <th scope="row">{r.key}</th>
              <td data-testid="study-length">
                {headers[r.path] === undefined
                  ? '…'
                  : headers[r.path].error
                    ? <span className="study-error">cannot read: {headers[r.path].error}</span>
                    : `${headers[r.path].channels}\u00a0ch · ${((headers[r.path].seconds ?? 0) / 60).toFixed(1)}\u00a0min`}
              </td>
              <td>{r.state}</td>
              <td className="num">{r.components === null ? '—' : `${r.decided}\u00a0of\u00a0${r.components}`}</td>
              <td className="num">{r.state === 'not started' ? '—' : r.removed}</td>
              <td className="num">{pct(r.removedVariance)}</td>
              <td>{r.reasons.join(', ') || '—'}</td>
              <td>{r.aim ?? '—'}</td>
              <td>{r.reviewer || '—'}</td>
              <td className="num">{r.flags.length || '—'}</td>
              <td>
                <button type="button" onClick={() => open(r.path)} data-testid="study-open">
                  {r.state === 'not started' ? 'Review' : 'Open'}
                </button>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <section className="study-flags" aria-label="Flags">
        <h3>Flags</h3>
        {flags.length === 0 ? (
          <p>No recording stands out yet. Spread rules need at least four reviewed recordings (methods §19).</p>
        ) : (
          <ul>
            {flags.map((f, i) => (
              <li key={i} data-testid="study-flag" data-rule={f.rule}>
                <strong>{f.key}</strong>: {f.why}.{' '}
                <button type="button" onClick={() => open(f.path)} data-testid="study-flag-open">
                  Open {f.key}
                </button>
              </li>
            ))}
          </ul>
        )}
      </section>
      <SecondReviewerPanel />
    </section>
  );
}
