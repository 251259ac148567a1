/** The keys, listed from the same table the key handler uses. */
import { useEffect, useRef } from 'react';
import { KEY_BINDINGS } from '../layout/review-keys.ts';
import { methodsHref } from './methods-link.ts';

export function HelpPanel({ onClose }: { onClose: () => void }) {
  const ref = useRef<HTMLButtonElement>(null);
  useEffect(() => ref.current?.focus(), []);
  return (
    <section className="help-panel" role="dialog" aria-label="Keys" data-testid="help-panel">
      <h2>Keys</h2>
      <p>Every control is also reachable with Tab and Shift+Tab. Keys do nothing while you type in a field.</p>
      <table>
        <tbody>
          {KEY_BINDINGS.map((b) => (
            <tr key={b.keys.join(' ')}>
              <th scope="row">{b.keys.map((k, i) => <span key={k}>{i > 0 ? ' / ' : ''}<kbd>{k}</kbd></span>)}</th>
              <td>{b.does}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p>
        In the focus view, the four questions (where from, when, locked to the task, which frequencies) are tabs: with one of them
        focused, <kbd>↑</kbd> / <kbd>↓</kbd> move between them and <kbd>Home</kbd> / <kbd>End</kbd> go to the first and last.
      </p>
      <p>
        Every measure, threshold and formula, with its published source:{' '}
        <a href={methodsHref()} target="_blank" rel="noopener" data-testid="methods-page-link">methods and sources</a>.
        Winnow is a research tool, not for clinical diagnosis; dipole locations are approximate model estimates.
      </p>
      <button ref={ref} type="button" onClick={onClose} data-testid="help-close">Close (Escape)</button>
    </section>
  );
}
