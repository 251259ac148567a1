/**
 * Every number of one component's evidence: value, unit, threshold and source. Values past an artifact
 * threshold carry a "▲" mark as well as a colour, so the table reads without colour. `compact` folds the
 * source under the row's name and the unit into the value, for the narrow column beside a figure.
 */
import type { EvidenceRow } from './evidence-rows.ts';
import { CitedText } from '../help/CitedText.tsx';

export function EvidenceTable({ rows, compact = false }: { rows: readonly EvidenceRow[]; compact?: boolean }) {
  if (compact) {
    return (
      <table className="evidence-table evidence-compact">
        <thead>
          <tr>
            <th scope="col">Evidence</th>
            <th scope="col">Value · threshold</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.key} className={r.flagged ? 'flagged' : undefined} data-row={r.key}>
              <th scope="row">
                {r.label}
                <span className="source"><CitedText text={r.source} /></span>
              </th>
              <td>
                <span className="num">{r.flagged ? '▲ ' : ''}{r.value}{r.unit ? `\u00a0${r.unit}` : ''}</span>
                {r.threshold ? <span className="threshold">{r.threshold}</span> : null}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    );
  }
  return (
    <table className="evidence-table">
      <thead>
        <tr>
          <th scope="col">Evidence</th>
          <th scope="col">Value</th>
          <th scope="col">Unit</th>
          <th scope="col">Threshold</th>
          <th scope="col">Source</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.key} className={r.flagged ? 'flagged' : undefined}>
            <th scope="row">{r.label}</th>
            <td className="num">{r.flagged ? '▲ ' : ''}{r.value}</td>
            <td>{r.unit}</td>
            <td>{r.threshold}</td>
            <td className="source"><CitedText text={r.source} /></td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
