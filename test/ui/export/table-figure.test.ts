/**
 * The evidence table exported as a real figure (issue 14 item 11): the HTML table becomes SVG text rows.
 * Checks against the SVG 1.1 / XML 1.0 rules a standalone SVG file must meet (W3C): one root <svg> in the SVG
 * namespace with width, height and viewBox; markup in text escaped as character data; every element closed.
 */
import { describe, expect, it } from 'vitest';
import { tableFigure, wrapText, xmlText } from '../../../src/ui/export/table-figure.ts';

const header = ['Evidence', 'Value', 'Unit', 'Threshold', 'Source'];
// rows shaped like the focus view's evidence table (src/ui/plots/EvidenceTable.tsx), 19 of them
const rows = Array.from({ length: 19 }, (_, i) => ({
  cells: [`Evidence row ${i + 1}`, i === 3 ? '▲ 0.70' : (i * 1.5).toFixed(1), '%', '≥ 60 %', `docs/methods.md §${i + 1}; common practice for the ${i}th figure, with a long source text that wraps`],
  flagged: i === 3,
}));

/** Element names in document order, checking that every start tag is closed (a minimal XML well-formedness check). */
function balancedTags(svg: string): string[] {
  const stack: string[] = [];
  const names: string[] = [];
  for (const m of svg.matchAll(/<(\/?)([a-zA-Z][\w:-]*)([^>]*?)(\/?)>/g)) {
    const [, close, name, , selfClose] = m;
    if (close) expect(stack.pop()).toBe(name);
    else {
      names.push(name);
      if (!selfClose) stack.push(name);
    }
  }
  expect(stack).toEqual([]);
  return names;
}

describe('evidence table as an SVG figure', () => {
  const fig = tableFigure({ header, rows });

  it('is a standalone SVG document sized to its rows, not a 1 × 19 px title strip', () => {
    expect(fig.svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(fig.svg).toContain(`width="${fig.width}" height="${fig.height}" viewBox="0 0 ${fig.width} ${fig.height}"`);
    expect(fig.rowLines).toHaveLength(19);
    // header + 19 rows of at least one 15-px line each
    expect(fig.height).toBeGreaterThanOrEqual(20 * 15);
    expect(fig.width).toBeGreaterThan(400);
    const names = balancedTags(fig.svg);
    expect(names[0]).toBe('svg');
    expect(names.filter((n) => n === 'svg')).toHaveLength(1);
  });

  it('draws every cell as text, one row per table row, with the header first', () => {
    const texts = [...fig.svg.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]);
    expect(texts.slice(0, 5)).toEqual(header);
    for (const r of rows) {
      expect(texts).toContain(r.cells[0]);
      expect(texts).toContain(r.cells[1]);
    }
    // long sources wrap onto more lines rather than running off the figure
    expect(fig.rowLines.every((n) => n >= 2)).toBe(true);
    const ys = [...fig.svg.matchAll(/<text x="8" y="([\d.]+)"/g)].map((m) => Number(m[1]));
    expect(ys).toEqual([...ys].sort((a, b) => a - b)); // first column top to bottom
  });

  it('marks a flagged value with ▲ and the flag colour, so it reads without colour too', () => {
    expect(fig.svg).toMatch(/<text [^>]*fill="#8b2c14" font-weight="600">▲ 0\.70<\/text>/);
    expect(fig.svg.match(/fill="#8b2c14"/g)).toHaveLength(1);
  });

  it('escapes markup that came from a file (XML 1.0 §2.4 character data)', () => {
    expect(xmlText('a < b & c > d')).toBe('a &lt; b &amp; c &gt; d');
    expect(xmlText('bell\u0007')).toBe('bell');
    const evil = tableFigure({ header: ['Evidence'], rows: [{ cells: ['<script>alert(1)</script>'] }], title: 'IC <1>' });
    expect(evil.svg).not.toContain('<script>');
    expect(evil.svg).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(evil.svg).toContain('IC &lt;1&gt;');
    balancedTags(evil.svg);
  });

  it('wraps at spaces within the width; a longer word keeps a line of its own', () => {
    expect(wrapText('one two three four', 9)).toEqual(['one two', 'three', 'four']);
    expect(wrapText('supercalifragilistic x', 5)).toEqual(['supercalifragilistic', 'x']);
    expect(wrapText('')).toEqual(['']);
  });
});
