/** Sort, filters, the decided/total counter and the list of components still undecided. */
import { useShallow } from 'zustand/react/shallow';
import { REASON_CODES, VERDICTS, type ReasonCode, type Verdict } from '../../core/review/vocabulary.ts';
import { BOARD_SORTS, selectComponentCount, selectDecidedCount, selectUndecidedIndices, useWorkbench, type BoardSort } from '../../state/index.ts';

export const SORT_LABELS: Record<BoardSort, string> = {
  index: 'component number',
  variance: 'variance share',
  impact: 'impact on the aim',
  suggestion: 'suggestion (remove first)',
};

/** How many undecided components are listed by number before "and N more". */
const UNDECIDED_LISTED = 24;

export function BoardToolbar({ shown }: { shown: number }) {
  const sort = useWorkbench((s) => s.boardSort);
  const setSort = useWorkbench((s) => s.setBoardSort);
  const filter = useWorkbench((s) => s.boardFilter);
  const setFilter = useWorkbench((s) => s.setBoardFilter);
  const total = useWorkbench(selectComponentCount);
  const decided = useWorkbench(selectDecidedCount);
  const undecided = useWorkbench(useShallow(selectUndecidedIndices));
  const select = useWorkbench((s) => s.select);

  return (
    <div className="board-toolbar" role="toolbar" aria-label="Board order and filters">
      <label>
        Sort by{' '}
        <select value={sort} onChange={(e) => setSort(e.target.value as BoardSort)} data-testid="sort-select" title="Key s cycles">
          {BOARD_SORTS.map((s) => <option key={s} value={s}>{SORT_LABELS[s]}</option>)}
        </select>
      </label>
      <label>
        Verdict{' '}
        <select value={filter.verdict} onChange={(e) => setFilter({ verdict: e.target.value as Verdict | 'all' })} data-testid="filter-verdict">
          <option value="all">all</option>
          {VERDICTS.map((v) => <option key={v} value={v}>{v}</option>)}
        </select>
      </label>
      <label>
        Reason{' '}
        <select value={filter.reason} onChange={(e) => setFilter({ reason: e.target.value as ReasonCode | 'all' })} data-testid="filter-reason">
          <option value="all">all</option>
          {REASON_CODES.map((r) => <option key={r} value={r}>{r}</option>)}
        </select>
      </label>
      <span className="board-count" data-testid="board-counter">
        <strong>{decided} / {total}</strong> decided{shown !== total ? ` · ${shown} shown` : ''}
      </span>
      <span className="undecided-list" aria-label="Still undecided">
        {undecided.length === 0 ? (
          'All components decided.'
        ) : (
          <>
            Undecided:{' '}
            {undecided.slice(0, UNDECIDED_LISTED).map((i) => (
              <button key={i} type="button" className="link-button" onClick={() => select(i)} data-testid={`undecided-${i}`}>{i}</button>
            ))}
            {undecided.length > UNDECIDED_LISTED ? ` and ${undecided.length - UNDECIDED_LISTED} more` : ''}
          </>
        )}
      </span>
    </div>
  );
}
