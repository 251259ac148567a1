/**
 * Pure helpers of the study screen: sorting rows, a per-column dot strip (one dot per recording on a
 * common 0…max axis), the study table as TSV and as an SVG figure. No DOM here.
 */
import type { StudyRow } from '../../core/study/study-overview.ts';

export type StudySortKey = 'key' | 'state' | 'decided' | 'removed' | 'removedVariance' | 'flags';

const STATE_ORDER = { 'not started': 0, 'in progress': 1, done: 2 } as const;

export function sortStudyRows<R extends StudyRow>(rows: readonly R[], key: StudySortKey, descending: boolean): R[] {
  const value = (r: R): number | string => {
    switch (key) {
      case 'key':
        return r.key;
      case 'state':
        return STATE_ORDER[r.state];
      case 'decided':
        return r.decided;
      case 'removed':
        return r.removed;
      case 'removedVariance':
        return r.removedVariance ?? -1;
      case 'flags':
        return r.flags.length;
    }
  };
  const out = [...rows].sort((a, b) => {
    const va = value(a);
    const vb = value(b);
    const c = typeof va === 'string' ? va.localeCompare(vb as string) : va - (vb as number);
    return c !== 0 ? c : a.key.localeCompare(b.key);
  });
  return descending ? out.reverse() : out;
}

/** x positions (0…1) of each value on a 0…max axis; null values are left out (NaN). */
export function dotStrip(values: readonly (number | null)[]): { x: number[]; max: number } {
  const finite = values.filter((v): v is number => v !== null && Number.isFinite(v));
  const max = Math.max(1e-12, ...finite);
  return { x: values.map((v) => (v === null || !Number.isFinite(v) ? NaN : v / max)), max };
}

const pct = (v: number | null) => (v === null ? 'n/a' : (Math.round(v * 1000) / 10).toFixed(1));

export const STUDY_COLUMNS = ['recording', 'state', 'decided', 'components', 'removed', 'removed_variance_percent', 'reasons', 'aim', 'reviewer', 'flags'] as const;

export function studyTableTsv(rows: readonly StudyRow[]): string {
  const esc = (t: string) => t.replace(/[\t\n\r]/g, ' ');
  const lines = [STUDY_COLUMNS.join('\t')];
  for (const r of rows)
    lines.push(
      [r.key, r.state, r.decided, r.components ?? 'n/a', r.removed, pct(r.removedVariance), r.reasons.join(',') || 'n/a', r.aim ?? 'n/a', r.reviewer || 'n/a', r.flags.map((f) => f.rule).join(',') || 'n/a']
        .map((v) => esc(String(v)))
        .join('\t'),
    );
  return lines.join('\n') + '\n';
}

const xml = (t: string) => t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** The study table as a standalone SVG figure (text rows, a caption with the study's name). */
export function studyTableSvg(rows: readonly StudyRow[], caption: string): string {
  const cols = ['Recording', 'State', 'Decided', 'Removed', 'Variance removed (%)', 'Reasons', 'Flags'];
  const widths = [220, 90, 70, 70, 150, 200, 260];
  const lineH = 20;
  const width = widths.reduce((a, b) => a + b, 0) + 20;
  const height = 40 + lineH * (rows.length + 1) + 30;
  const cells = (vals: string[], y: number, bold: boolean) => {
    let x = 10;
    return vals
      .map((v, i) => {
        const t = `<text x="${x}" y="${y}"${bold ? ' font-weight="600"' : ''}>${xml(v)}</text>`;
        x += widths[i];
        return t;
      })
      .join('');
  };
  const body = rows
    .map((r, i) => cells([r.key, r.state, String(r.decided), String(r.removed), pct(r.removedVariance), r.reasons.join(', ') || '—', r.flags.map((f) => f.rule).join(', ') || '—'], 40 + lineH * (i + 2), false))
    .join('');
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="system-ui, sans-serif" font-size="12">` +
    `<rect width="100%" height="100%" fill="#fff"/>` +
    `<text x="10" y="22" font-size="14" font-weight="600">${xml(caption)}</text>` +
    cells(cols, 40 + lineH, true) +
    `<line x1="10" x2="${width - 10}" y1="${46 + lineH}" y2="${46 + lineH}" stroke="#999"/>` +
    body +
    `<text x="10" y="${height - 10}" font-size="10" fill="#555">Winnow study table. Research tool, not for clinical diagnosis.</text>` +
    `</svg>\n`
  );
}
