/**
 * Every number of one component's evidence: value, unit, threshold and source. Values past an artifact
 * threshold carry a "▲" mark as well as a colour, so the table reads without colour.
 */
import type { EvidenceRow } from './evidence-rows.ts';
import { CitedText } from '../help/CitedText.tsx';

export function EvidenceTable({ rows }: { rows: readonly EvidenceRow[] }) {
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
