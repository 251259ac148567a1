/**
 * The reason-code field: "(none)" plus every reason code of the vocabulary, in its order. Shared by the
 * board's decision panel and the focus view's decision controls, which differ only in test hook and title.
 */
import { REASON_CODES, type ReasonCode } from '../../core/review/vocabulary.ts';

export interface ReasonSelectProps {
  readonly reason: ReasonCode | null;
  /** Called with the chosen code, or null for "(none)". */
  readonly onChoose: (reason: ReasonCode | null) => void;
  readonly testId: string;
  /** Tooltip (e.g. the keys that cycle the codes); none when absent. */
  readonly title?: string;
}

export function ReasonSelect({ reason, onChoose, testId, title }: ReasonSelectProps) {
  return (
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
  );
}
