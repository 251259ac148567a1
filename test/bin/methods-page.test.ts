/**
 * The methods page: every "docs/methods.md §n" / "methods §n" cited anywhere in the code resolves to a
 * section of docs/methods.md, and the rendered page carries the anchor the UI links to.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { renderInline, renderMethodsFile, sectionId } from '../../bin/methods-page.mjs';

const root = join(import.meta.dirname, '..', '..');
const methods = readFileSync(join(root, 'docs', 'methods.md'), 'utf8');

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) return sourceFiles(p);
    return /\.(ts|tsx|mjs)$/.test(name) ? [p] : [];
  });
}

describe('methods page', () => {
  const headings = new Set([...methods.matchAll(/^#{2,3} §(\d+(?:\.\d+)*)/gm)].map((m) => m[1]));
  const anchors = new Set([...methods.matchAll(/<a id="(s[\d-]+)"><\/a>/g)].map((m) => m[1]));

  it('every heading §n has the anchor s<n> that links use', () => {
    expect(headings.size).toBeGreaterThan(10);
    for (const h of headings) expect(anchors, `§${h}`).toContain(`s${h.replace(/\./g, '-')}`);
  });

  it('every section the code and the UI cite exists in docs/methods.md', () => {
    const missing: string[] = [];
    for (const dir of ['src', 'workers', 'bin']) {
      for (const file of sourceFiles(join(root, dir))) {
        const text = readFileSync(file, 'utf8');
        for (const m of text.matchAll(/(?:docs\/methods\.md|methods) §(\d+(?:\.\d+)*)/g)) {
          if (!headings.has(m[1])) missing.push(`${file.slice(root.length + 1)}: §${m[1]}`);
        }
      }
    }
    expect(missing).toEqual([]);
  });

  it('renders one anchor per section, tables and escaped text', () => {
    const html = renderMethodsFile();
    for (const a of anchors) expect(html).toContain(`<a id="${a}"></a>`);
    expect(html).toContain('<table>');
    expect(html).toContain('not for clinical diagnosis');
    expect(renderInline('a `x < y` and **b** <script>')).toBe('a <code>x &lt; y</code> and <strong>b</strong> &lt;script&gt;');
    expect(sectionId('§7.2 Extended Infomax')).toBe('s7-2');
  });
});
