/** The board: toolbar, a grid of component tiles in the chosen order, and the selected component's decision. */
import { selectDecompositionPositions, useWorkbench } from '../../state/index.ts';
import { BoardToolbar } from './BoardToolbar.tsx';
import { ComponentTile } from './ComponentTile.tsx';
import { DecisionPanel } from './DecisionPanel.tsx';
import { useBoardOrder } from './useBoardOrder.ts';

export function Board() {
  const order = useBoardOrder();
  const positions = useWorkbench(selectDecompositionPositions);
  return (
    <section className="board" aria-label="Component board" data-testid="board">
      <BoardToolbar shown={order.length} />
      <p className="key-hint" aria-label="Main keys">
        <kbd>←</kbd> <kbd>→</kbd> move · <kbd>u</kbd> next undecided · <kbd>k</kbd> keep · <kbd>x</kbd> remove · <kbd>0</kbd> undecided ·{' '}
        <kbd>r</kbd> reason · <kbd>a</kbd> take suggestion · <kbd>n</kbd> note · <kbd>Enter</kbd> focus · <kbd>p</kbd> preview · <kbd>?</kbd> all keys
      </p>
      <div className="board-body">
        <ol className="tile-grid" aria-label="Components">
          {order.map((i) => (
            <li key={i}>
              <ComponentTile index={i} positions={positions} />
            </li>
          ))}
        </ol>
        <DecisionPanel />
      </div>
    </section>
  );
}
