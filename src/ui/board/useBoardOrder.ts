/** The board's current order (sorted and filtered), memoised on its inputs. */
import { useMemo } from 'react';
import { selectComponentCount, selectSuggestions, useWorkbench } from '../../state/index.ts';
import { boardOrder } from './board-order.ts';

export function useBoardOrder(): number[] {
  const n = useWorkbench(selectComponentCount);
  const evidence = useWorkbench((s) => s.evidence);
  const decisions = useWorkbench((s) => s.decisions);
  const aim = useWorkbench((s) => s.aim);
  const sort = useWorkbench((s) => s.boardSort);
  const filter = useWorkbench((s) => s.boardFilter);
  const suggestions = useWorkbench(selectSuggestions);
  return useMemo(() => boardOrder(n, evidence, decisions, aim, sort, filter, suggestions), [n, evidence, decisions, aim, sort, filter, suggestions]);
}
