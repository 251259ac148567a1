/**
 * The reason-code field: "(none)" plus every reason code of the vocabulary, in its order. Shared by the
 * board's decision panel and the focus view's decision controls, which differ only in test hook and title.
 * Given the verdict beside it, a pair that contradicts itself (keep + blink, remove + neural) gets a small
 * flag under the field; the choice is never refused (verdict-reason.ts).
 */
import { REASON_CODES, type ReasonCode, type Verdict } from '../../core/review/vocabulary.ts';
import { verdictReasonConflict } from './verdict-reason.ts';
import './decision.css';

export interface ReasonSelectProps {
  readonly reason: ReasonCode | null;
  /** Called with the chosen code, or null for "(none)". */
  readonly onChoose: (reason: ReasonCode | null) => void;
  readonly testId: string;
  /** Tooltip (e.g. the keys that cycle the codes); none when absent. */
  readonly title?: string;
  /** The verdict beside the field; when given, a contradicting pair is flagged (data-testid `${testId}-conflict`). */
  readonly verdict?: Verdict;
}

export function ReasonSelect({ reason, onChoose, testId, title, verdict }: ReasonSelectProps) {
  const conflict = verdict ? verdictReasonConflict(verdict, reason) : null;
  return (
    <>
      <label className="field">
        Reason
        <select
          value={reason ?? ''}
          onChange={(e) => onChoose(e.target.value === '' ? null : (e.target.value as ReasonCode))}
          data-testid={testId}
          title={title}
        >
          <option value="">(none)</option>
          {REASON_CODES.map((r) => (
            <option key={r} value={r}>{r}</option>
          ))}
        </select>
      </label>
      {conflict ? (
        <p className="verdict-reason-flag" role="status" data-testid={`${testId}-conflict`}>
          <span aria-hidden="true">⚑</span> Check: {conflict}. Allowed; the export lists it.
        </p>
      ) : null}
    </>
  );
}
