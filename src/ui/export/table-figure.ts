/**
 * A table drawn as an SVG figure: one line of text per row (long cells wrap onto further lines), a bold header
 * row with a rule under it, light rules between rows. Used to export HTML tables (the evidence table) as real
 * figures, since the panel export otherwise copies only `<svg>` and `<canvas>` (issue 14 item 11).
 *
 * Pure string building (no DOM), so it is tested in node. Text is escaped as XML character data. Column widths
 * come from the longest line of each column at an estimated average glyph width of 0.6 × the font size
 * (ours; a sans-serif's average advance is about half to two thirds of its size), so the figure is wide
 * enough for its text without measuring it.
 */

export interface TableFigureRow {
  readonly cells: readonly string[];
  /** Past an artifact threshold: the first data column (its text carries the "▲" as on screen) is drawn bold in the flag colour. */
  readonly flagged?: boolean;
}

export interface TableFigureInput {
  readonly header: readonly string[];
  readonly rows: readonly TableFigureRow[];
  /** Drawn above the table. */
  readonly title?: string;
}

export interface TableFigure {
  readonly svg: string;
  readonly width: number;
  readonly height: number;
  /** Text lines drawn per body row (≥ 1), for tests and layout. */
  readonly rowLines: readonly number[];
}

const FONT = 11;
const LINE = 15;
const PAD_X = 8;
const PAD_Y = 4;
const CHAR = 0.6 * FONT;
/** Cells longer than this many characters wrap at spaces. */
const WRAP = 56;
/** Colours of the on-screen table (src/ui/focus/focus.css). */
const INK = '#1f2328';
const SOURCE_INK = '#4a525c';
const FLAG_INK = '#8b2c14';
const RULE = '#efebe1';
const HEAD_RULE = '#c9c4b6';

/** XML character data: &, < and > escaped, and characters XML 1.0 forbids (C0 controls but TAB/LF/CR) dropped. */
export function xmlText(s: string): string {
  return s
    .replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g, '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;');
}

/** Splits `text` into lines of at most `width` characters at spaces (a longer word gets a line of its own). */
export function wrapText(text: string, width = WRAP): string[] {
  const words = text.replace(/\s+/g, ' ').trim().split(' ');
  const lines: string[] = [];
  let cur = '';
  for (const w of words) {
    if (cur === '') cur = w;
    else if (cur.length + 1 + w.length <= width) cur += ' ' + w;
    else {
      lines.push(cur);
      cur = w;
    }
  }
  lines.push(cur);
  return lines;
}

/** Draws `input` as a standalone SVG document (XML declaration omitted; width/height/viewBox set). */
export function tableFigure(input: TableFigureInput): TableFigure {
  const nCols = input.header.length;
  const body = input.rows.map((r) =>
    Array.from({ length: nCols }, (_, c) => {
      return wrapText(r.cells[c] ?? '');
    }),
  );
  const head = input.header.map((h) => wrapText(h));
  const colChars = Array.from({ length: nCols }, (_, c) =>
    Math.max(...[head[c], ...body.map((r) => r[c])].map((lines) => Math.max(...lines.map((l) => [...l].length)))),
  );
  const colX: number[] = [];
  let x = 0;
  for (let c = 0; c < nCols; c++) {
    colX.push(x);
    x += Math.ceil(colChars[c] * CHAR) + 2 * PAD_X;
  }
  const width = Math.max(1, x);
  const titleH = input.title ? LINE + 2 * PAD_Y : 0;
  const parts: string[] = [];
  let y = titleH;
  if (input.title) parts.push(`<text x="${PAD_X}" y="${PAD_Y + FONT + 1}" font-size="12" font-weight="600" fill="${INK}">${xmlText(input.title)}</text>`);

  const rowBlock = (cells: string[][], kind: 'head' | 'body', flagged: boolean): number => {
    const lines = Math.max(...cells.map((l) => l.length));
    const h = lines * LINE + 2 * PAD_Y;
    cells.forEach((cellLines, c) => {
      const fill = kind === 'head' ? INK : c === 1 && flagged ? FLAG_INK : c === nCols - 1 ? SOURCE_INK : INK;
      const weight = kind === 'head' || c === 0 || (c === 1 && flagged) ? ' font-weight="600"' : '';
      cellLines.forEach((line, k) => {
        if (line === '') return;
        parts.push(`<text x="${colX[c] + PAD_X}" y="${y + PAD_Y + (k + 1) * LINE - 4}" fill="${fill}"${weight}>${xmlText(line)}</text>`);
      });
    });
    y += h;
    parts.push(`<line x1="0" x2="${width}" y1="${y - 0.5}" y2="${y - 0.5}" stroke="${kind === 'head' ? HEAD_RULE : RULE}"/>`);
    return lines;
  };
  rowBlock(head, 'head', false);
  const rowLines = body.map((cells, i) => rowBlock(cells, 'body', input.rows[i].flagged === true));
  const height = Math.max(1, Math.ceil(y));
  const svg =
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" ` +
    `font-family="system-ui, sans-serif" font-size="${FONT}">` +
    `<rect width="${width}" height="${height}" fill="#ffffff"/>` +
    parts.join('') +
    '</svg>';
  return { svg, width, height, rowLines };
}
