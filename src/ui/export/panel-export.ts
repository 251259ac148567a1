/**
 * Exports a panel's figure(s) as SVG or PNG, entirely in the page (blob downloads; nothing leaves the
 * machine). Every `<svg>` and `<canvas>` inside the panel is placed at its on-screen offset in one SVG
 * document: SVG plots are copied as nested `<svg>` elements (XMLSerializer), canvases become PNG `<image>`s
 * (data URLs, allowed by the CSP's img-src), and HTML `<table>`s (the evidence table) are drawn as SVG text
 * rows (table-figure.ts). The panel's captions (its `.note` paragraphs) are kept as text lines under the
 * figures, so an exported figure says what it shows. The PNG is that SVG drawn onto a canvas at 2× and saved
 * with `toBlob`. Browser only.
 */
import type { PanelFormat } from './export-names.ts';
import { saveBlob } from '../layout/download.ts';
import { tableFigure, type TableFigureRow } from './table-figure.ts';

const SVG_NS = 'http://www.w3.org/2000/svg';

/**
 * Greedy word wrap of a caption into lines of at most `maxChars` characters (a word longer than that keeps
 * its own line).
 */
export function wrapCaption(text: string, maxChars: number): string[] {
  const words = text.replace(/\s+/g, ' ').trim().split(' ').filter(Boolean);
  const lines: string[] = [];
  let line = '';
  for (const w of words) {
    if (line && line.length + 1 + w.length > maxChars) {
      lines.push(line);
      line = w;
    } else line = line ? `${line} ${w}` : w;
  }
  if (line) lines.push(line);
  return lines;
}

const CAPTION_LINE_H = 14;

/** Builds one standalone SVG document string from the figures inside `panel`. */
export function panelToSvg(panel: HTMLElement, title?: string): { svg: string; width: number; height: number } {
  const figures = Array.from(panel.querySelectorAll<SVGSVGElement | HTMLCanvasElement | HTMLTableElement>('svg, canvas, table')).filter(
    // nested svgs are copied with their parent
    (el) => !(el instanceof SVGSVGElement && el.parentElement?.closest('svg')),
  );
  const origin = panel.getBoundingClientRect();
  const titleH = title ? 18 : 0;
  let width = 1;
  let height = titleH + 1;
  const doc = document.implementation.createDocument(SVG_NS, 'svg', null);
  const root = doc.documentElement;
  root.setAttribute('font-family', 'system-ui, sans-serif');
  const bg = doc.createElementNS(SVG_NS, 'rect');
  bg.setAttribute('fill', '#ffffff');
  root.appendChild(bg);
  if (title) {
    const t = doc.createElementNS(SVG_NS, 'text');
    t.setAttribute('x', '4');
    t.setAttribute('y', '13');
    t.setAttribute('font-size', '12');
    t.textContent = title; // text node: never parsed as markup
    root.appendChild(t);
  }
  for (const el of figures) {
    const r = el.getBoundingClientRect();
    if (r.width === 0 || r.height === 0) continue;
    const x = Math.round(r.left - origin.left);
    const y = Math.round(r.top - origin.top) + titleH;
    width = Math.max(width, x + r.width);
    height = Math.max(height, y + r.height);
    if (el instanceof HTMLTableElement) {
      const fig = tableFigure(readTable(el));
      const copy = doc.importNode(new DOMParser().parseFromString(fig.svg, 'image/svg+xml').documentElement, true);
      copy.setAttribute('x', String(x));
      copy.setAttribute('y', String(y));
      width = Math.max(width, x + fig.width);
      height = Math.max(height, y + fig.height);
      root.appendChild(copy);
    } else if (el instanceof HTMLCanvasElement) {
      const img = doc.createElementNS(SVG_NS, 'image');
      img.setAttribute('x', String(x));
      img.setAttribute('y', String(y));
      img.setAttribute('width', String(r.width));
      img.setAttribute('height', String(r.height));
      img.setAttribute('href', el.toDataURL('image/png'));
      root.appendChild(img);
    } else {
      const copy = doc.importNode(el, true) as SVGSVGElement;
      copy.setAttribute('x', String(x));
      copy.setAttribute('y', String(y));
      copy.setAttribute('width', String(r.width));
      copy.setAttribute('height', String(r.height));
      root.appendChild(copy);
    }
  }
  width = Math.ceil(Math.max(width, 240));
  // Captions: the panel's notes, wrapped to the figure's width (about 6 px per character at 11 px).
  const captions = Array.from(panel.querySelectorAll<HTMLElement>('.note'))
    .map((n) => {
      // what the reader sees: hidden test hooks inside a note stay out of the caption
      const copy = n.cloneNode(true) as HTMLElement;
      copy.querySelectorAll('[hidden]').forEach((h) => h.remove());
      return (copy.textContent ?? '').replace(/\s+/g, ' ').trim();
    })
    .filter(Boolean);
  let y = height + 6;
  for (const c of captions) {
    for (const line of wrapCaption(c, Math.max(30, Math.floor((width - 8) / 6)))) {
      y += CAPTION_LINE_H;
      const t = doc.createElementNS(SVG_NS, 'text');
      t.setAttribute('x', '4');
      t.setAttribute('y', String(y - 3));
      t.setAttribute('font-size', '11');
      t.setAttribute('fill', '#333333');
      t.textContent = line; // text node: never parsed as markup
      root.appendChild(t);
    }
  }
  height = Math.ceil(captions.length ? y + 4 : height);
  root.setAttribute('width', String(width));
  root.setAttribute('height', String(height));
  root.setAttribute('viewBox', `0 0 ${width} ${height}`);
  bg.setAttribute('width', String(width));
  bg.setAttribute('height', String(height));
  return { svg: new XMLSerializer().serializeToString(doc), width, height };
}

/** The text of a table's header cells and body rows as shown (a row with class "flagged" is flagged). */
function readTable(table: HTMLTableElement): { header: string[]; rows: TableFigureRow[] } {
  const text = (cell: Element) => (cell.textContent ?? '').replace(/\s+/g, ' ').trim();
  const headRow = table.tHead?.rows[0] ?? table.rows[0];
  const header = headRow ? Array.from(headRow.cells, text) : [];
  const bodyRows = Array.from(table.tBodies).flatMap((b) => Array.from(b.rows));
  return { header, rows: bodyRows.map((r) => ({ cells: Array.from(r.cells, text), flagged: r.classList.contains('flagged') })) };
}

/** Rasterises an SVG document string to a PNG blob at `scale` × its size. */
export async function svgToPng(svg: string, width: number, height: number, scale = 2): Promise<Blob> {
  const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    img.decoding = 'sync';
    const loaded = new Promise<void>((resolve, reject) => {
      img.onload = () => resolve();
      img.onerror = () => reject(new Error('the panel picture could not be drawn'));
    });
    img.src = url;
    await loaded;
    const canvas = document.createElement('canvas');
    canvas.width = Math.max(1, Math.round(width * scale));
    canvas.height = Math.max(1, Math.round(height * scale));
    const ctx = canvas.getContext('2d');
    if (!ctx) throw new Error('no 2-D canvas available');
    ctx.scale(scale, scale);
    ctx.drawImage(img, 0, 0, width, height);
    return await new Promise<Blob>((resolve, reject) =>
      canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('PNG encoding failed'))), 'image/png'),
    );
  } finally {
    URL.revokeObjectURL(url);
  }
}

/** Exports `panel` in `format` and starts the download. */
export async function exportPanel(panel: HTMLElement, format: PanelFormat, fileName: string, title?: string): Promise<void> {
  const { svg, width, height } = panelToSvg(panel, title);
  const blob = format === 'svg' ? new Blob([svg], { type: 'image/svg+xml' }) : await svgToPng(svg, width, height);
  saveBlob(blob, fileName, 1000);
}
