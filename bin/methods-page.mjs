/**
 * Renders docs/methods.md into a self-contained methods.html page served beside the app, so the evidence
 * table's "methods §n" links open the right section offline. A deliberately small Markdown subset — the
 * one the document uses: ATX headings, paragraphs, "*"/"-" bullet lists, pipe tables, inline code, bold,
 * italics, links and the raw `<a id="sN"></a>` anchors. Everything else is escaped as text.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

export const METHODS_SOURCE = fileURLToPath(new URL('../docs/methods.md', import.meta.url));

const escapeHtml = (t) => t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

/** Inline markup of one line of text (code spans first, so their content is never re-interpreted). */
export function renderInline(text) {
  const parts = text.split(/(`[^`]*`)/);
  return parts
    .map((p) => {
      if (p.length >= 2 && p.startsWith('`') && p.endsWith('`')) return `<code>${escapeHtml(p.slice(1, -1))}</code>`;
      let h = escapeHtml(p);
      h = h.replace(/\*\*([^*]+)\*\*/g, '<strong>$1</strong>');
      h = h.replace(/(^|[^*\w])\*([^*\s][^*]*)\*(?=[^*\w]|$)/g, '$1<em>$2</em>');
      h = h.replace(/\[([^\]]+)\]\((#[\w-]+|https?:\/\/[^)\s]+)\)/g, '<a href="$2">$1</a>');
      return h;
    })
    .join('');
}

/** The id of a "§7.2 …" heading: "s7-2" (the anchors the document and the UI links use). */
export function sectionId(heading) {
  const m = /^§(\d+(?:\.\d+)*)/.exec(heading.trim());
  return m ? `s${m[1].replace(/\./g, '-')}` : null;
}

export function renderMethodsHtml(markdown) {
  const lines = markdown.replace(/\r\n?/g, '\n').split('\n');
  const out = [];
  let para = [];
  let list = null; // array of item strings
  const flushPara = () => {
    if (para.length) out.push(`<p>${renderInline(para.join(' '))}</p>`);
    para = [];
  };
  const flushList = () => {
    if (list) out.push(`<ul>${list.map((i) => `<li>${renderInline(i)}</li>`).join('')}</ul>`);
    list = null;
  };
  const cells = (row) => row.trim().replace(/^\|/, '').replace(/\|$/, '').split('|').map((c) => c.trim());
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i];
    const anchor = /^<a id="([\w-]+)"><\/a>\s*$/.exec(line);
    if (anchor) {
      flushPara();
      flushList();
      out.push(`<a id="${anchor[1]}"></a>`);
      continue;
    }
    const h = /^(#{1,6})\s+(.*)$/.exec(line);
    if (h) {
      flushPara();
      flushList();
      const id = sectionId(h[2]);
      const level = h[1].length;
      out.push(`<h${level}${id ? ` id="h-${id}"` : ''}>${renderInline(h[2])}</h${level}>`);
      continue;
    }
    if (/^\s*\|/.test(line) && i + 1 < lines.length && /^\s*\|?\s*-{3,}/.test(lines[i + 1])) {
      flushPara();
      flushList();
      const head = cells(line);
      const body = [];
      i += 2;
      while (i < lines.length && /^\s*\|/.test(lines[i])) body.push(cells(lines[i++]));
      i--;
      out.push(
        `<table><thead><tr>${head.map((c) => `<th>${renderInline(c)}</th>`).join('')}</tr></thead><tbody>` +
          body.map((r) => `<tr>${r.map((c) => `<td>${renderInline(c)}</td>`).join('')}</tr>`).join('') +
          '</tbody></table>',
      );
      continue;
    }
    const item = /^[*-]\s+(.*)$/.exec(line);
    if (item) {
      flushPara();
      if (!list) list = [];
      list.push(item[1]);
      continue;
    }
    if (list && /^\s{2,}\S/.test(line)) {
      list[list.length - 1] += ' ' + line.trim();
      continue;
    }
    if (line.trim() === '') {
      flushPara();
      flushList();
      continue;
    }
    flushList();
    para.push(line.trim());
  }
  flushPara();
  flushList();
  return (
    '<!doctype html>\n<html lang="en"><head><meta charset="utf-8">' +
    '<meta name="viewport" content="width=device-width, initial-scale=1">' +
    '<title>Winnow — methods</title><style>' +
    'body{font:15px/1.5 system-ui,sans-serif;max-width:52rem;margin:2rem auto;padding:0 1rem;color:#1d2a2e}' +
    'code{font:13px ui-monospace,monospace;background:#eef2f1;padding:0 .2em}' +
    'table{border-collapse:collapse;margin:1rem 0}td,th{border:1px solid #c6d0ce;padding:.25rem .5rem;vertical-align:top;text-align:left}' +
    'h2{border-top:1px solid #c6d0ce;padding-top:1rem}:target+h2,:target+h3{background:#fff4d6}' +
    '</style></head><body>\n' +
    '<p><em>Winnow is a research tool, not for clinical diagnosis; dipole locations are approximate model estimates.</em></p>\n' +
    out.join('\n') +
    '\n</body></html>\n'
  );
}

export function renderMethodsFile(path = METHODS_SOURCE) {
  return renderMethodsHtml(readFileSync(path, 'utf8'));
}

/** Vite plugin: serves /methods.html in dev and emits it into the build. */
export function methodsPagePlugin() {
  return {
    name: 'winnow-methods-page',
    configureServer(server) {
      server.watcher.add(METHODS_SOURCE);
      server.middlewares.use((req, res, next) => {
        if (!req.url || !req.url.split('?')[0].endsWith('/methods.html')) return next();
        res.setHeader('Content-Type', 'text/html; charset=utf-8');
        res.end(renderMethodsFile());
      });
    },
    generateBundle() {
      this.emitFile({ type: 'asset', fileName: 'methods.html', source: renderMethodsFile() });
    },
  };
}
