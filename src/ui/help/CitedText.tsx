/** Text whose "methods §n" citations are links to that section of the methods page. */
import { methodsHref, splitMethodsCitations } from './methods-link.ts';

export function CitedText({ text }: { text: string }) {
  return (
    <>
      {splitMethodsCitations(text).map((p, i) =>
        p.section ? (
          <a key={i} href={methodsHref(p.section)} target="_blank" rel="noopener" data-testid="methods-link">
            {p.text}
          </a>
        ) : (
          <span key={i}>{p.text}</span>
        ),
      )}
    </>
  );
}
