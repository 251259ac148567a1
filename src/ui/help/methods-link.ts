/**
 * Links into the methods page (docs/methods.md rendered as methods.html beside the app by
 * bin/methods-page.mjs), so every "methods §n" a panel cites opens that section, offline too.
 */

/** "7.2" → "methods.html#s7-2" (relative to the page, so it works from any folder the site is served from). */
export function methodsHref(section?: string): string {
  return section ? `methods.html#s${section.replace(/\./g, '-')}` : 'methods.html';
}

export interface TextPiece {
  readonly text: string;
  /** Section number when the piece is a "methods §n" citation. */
  readonly section?: string;
}

/** Splits text into plain pieces and "methods §n" / "docs/methods.md §n" citations. */
export function splitMethodsCitations(text: string): TextPiece[] {
  const out: TextPiece[] = [];
  const re = /(?:docs\/methods\.md|methods) §(\d+(?:\.\d+)*)/g;
  let last = 0;
  for (let m = re.exec(text); m; m = re.exec(text)) {
    if (m.index > last) out.push({ text: text.slice(last, m.index) });
    out.push({ text: m[0], section: m[1] });
    last = m.index + m[0].length;
  }
  if (last < text.length) out.push({ text: text.slice(last) });
  return out;
}
