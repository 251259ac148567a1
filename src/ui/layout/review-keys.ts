/**
 * Keyboard-first review: the key map (shown in the help panel) and the pure function that turns a key
 * press into an action. Keys are ignored while typing in a text field, except Escape (leaves the field).
 */
export type ReviewAction =
  | 'next' | 'previous' | 'row-down' | 'row-up' | 'first' | 'last' | 'next-undecided'
  | 'keep' | 'remove' | 'undecided' | 'accept-suggestion'
  | 'reason-next' | 'reason-previous' | 'note'
  | 'open-focus' | 'open-board' | 'open-preview' | 'open-start'
  | 'undo' | 'redo' | 'export' | 'help' | 'escape' | 'sort-next';

export interface KeyBinding {
  readonly keys: readonly string[];
  readonly action: ReviewAction;
  readonly does: string;
}

/** The key map, in the order the help panel lists it. */
export const KEY_BINDINGS: readonly KeyBinding[] = [
  { keys: ['→', ']'], action: 'next', does: 'next component' },
  { keys: ['←', '['], action: 'previous', does: 'previous component' },
  { keys: ['↓', '↑'], action: 'row-down', does: 'board: the component below / above (elsewhere: next / previous)' },
  { keys: ['Home', 'End'], action: 'first', does: 'first / last component' },
  { keys: ['u'], action: 'next-undecided', does: 'jump to the next undecided component' },
  { keys: ['k', '1'], action: 'keep', does: 'verdict: keep' },
  { keys: ['x', '2'], action: 'remove', does: 'verdict: remove' },
  { keys: ['0'], action: 'undecided', does: 'verdict: undecided' },
  { keys: ['a'], action: 'accept-suggestion', does: 'take the suggested verdict and reason' },
  { keys: ['r', 'Shift+R'], action: 'reason-next', does: 'next / previous reason code' },
  { keys: ['n'], action: 'note', does: 'write a note (Escape leaves the note field)' },
  { keys: ['Enter', 'f'], action: 'open-focus', does: 'open the focus view of the selected component' },
  { keys: ['b', 'Escape'], action: 'open-board', does: 'back to the board' },
  { keys: ['p'], action: 'open-preview', does: 'before/after preview' },
  { keys: ['o'], action: 'open-start', does: 'open another participant' },
  { keys: ['s'], action: 'sort-next', does: 'board: next sort order' },
  { keys: ['Ctrl+Z'], action: 'undo', does: 'undo the last decision change' },
  { keys: ['Ctrl+Shift+Z', 'Ctrl+Y'], action: 'redo', does: 'redo' },
  { keys: ['e'], action: 'export', does: 'export and import panel' },
  { keys: ['?'], action: 'help', does: 'show or hide these keys' },
  { keys: ['Tab'], action: 'escape', does: 'move between every control (Shift+Tab goes back)' },
];

export interface KeyPress {
  readonly key: string;
  readonly ctrlKey: boolean;
  readonly metaKey: boolean;
  readonly shiftKey: boolean;
  readonly altKey: boolean;
}

export type KeyTarget = 'text' | 'button' | 'other';

/** The action for a key press, or null (leave the key to the browser). */
export function reviewActionForKey(e: KeyPress, target: KeyTarget): ReviewAction | null {
  const mod = e.ctrlKey || e.metaKey;
  if (mod && !e.altKey) {
    const k = e.key.toLowerCase();
    if (k === 'z') return e.shiftKey ? 'redo' : target === 'text' ? null : 'undo';
    if (k === 'y') return 'redo';
    return null;
  }
  if (e.key === 'Escape') return 'escape';
  if (target === 'text' || e.altKey || mod) return null;
  switch (e.key) {
    case 'ArrowRight': case ']': return 'next';
    case 'ArrowLeft': case '[': return 'previous';
    case 'ArrowDown': return 'row-down';
    case 'ArrowUp': return 'row-up';
    case 'Home': return 'first';
    case 'End': return 'last';
    case 'u': return 'next-undecided';
    case 'k': case '1': return 'keep';
    case 'x': case '2': return 'remove';
    case '0': return 'undecided';
    case 'a': return 'accept-suggestion';
    case 'r': return 'reason-next';
    case 'R': return 'reason-previous';
    case 'n': return 'note';
    case 'f': return 'open-focus';
    case 'Enter': return target === 'button' ? null : 'open-focus';
    case 'b': return 'open-board';
    case 'p': return 'open-preview';
    case 'o': return 'open-start';
    case 's': return 'sort-next';
    case 'e': return 'export';
    case '?': return 'help';
    default: return null;
  }
}

/** Next index after `current` in 1…n moving by `step` (clamped, not wrapped). */
export function stepIndex(current: number | null, n: number, step: number): number | null {
  if (n <= 0) return null;
  if (current === null) return step >= 0 ? 1 : n;
  return Math.min(n, Math.max(1, current + step));
}
