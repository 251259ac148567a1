/**
 * The three verdict buttons (keep / remove / undecided), each with a symbol and the word so the choice reads
 * without colour; the current verdict is `aria-pressed`. Shared by the board's decision panel and the focus
 * view's decision controls, which differ only in their test hooks, group label and button titles.
 */
import { VERDICTS, type Verdict } from '../../core/review/vocabulary.ts';
import { VERDICT_GLYPH } from '../board/VerdictMark.tsx';

export interface VerdictButtonsProps {
  /** The verdict shown as pressed. */
  readonly verdict: Verdict;
  readonly onChoose: (verdict: Verdict) => void;
  /** Each button's data-testid is `${testIdPrefix}-${verdict}` (e2e and unit tests select by it). */
  readonly testIdPrefix: string;
  /** When given, the buttons form a labelled `role="group"`. */
  readonly groupLabel?: string;
  /** Tooltip per verdict (e.g. its key); none when absent. */
  readonly title?: (verdict: Verdict) => string;
}

export function VerdictButtons({ verdict, onChoose, testIdPrefix, groupLabel, title }: VerdictButtonsProps) {
  return (
    <div role={groupLabel === undefined ? undefined : 'group'} aria-label={groupLabel} className="verdict-buttons">
      {VERDICTS.map((v) => (
        <button
          key={v}
          type="button"
          aria-pressed={verdict === v}
          className={`verdict-button verdict-${v}`}
          onClick={() => onChoose(v)}
          data-testid={`${testIdPrefix}-${v}`}
          title={title?.(v)}
        >
          <span aria-hidden="true">{VERDICT_GLYPH[v]}</span> {v}
        </button>
      ))}
    </div>
  );
}
