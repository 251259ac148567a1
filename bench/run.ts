/**
 * `npm run bench`: runs every bench/*.bench.ts (or those named on the command line) and prints one table
 * of our times against reference implementations run on the same machine in the same run.
 * Speed is measured here, never asserted in tests.
 */
import { readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { BenchModule, BenchRow } from './bench-types.ts';

const dir = fileURLToPath(new URL('.', import.meta.url));
const only = process.argv.slice(2);
const files = readdirSync(dir)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => only.length === 0 || only.some((o) => f.includes(o)))
  .sort();

const rows: BenchRow[] = [];
for (const f of files) {
  process.stderr.write(`bench: ${f} …\n`);
  const mod = (await import(new URL(f, import.meta.url).href)) as BenchModule;
  try {
    rows.push(...(await mod.bench()));
  } catch (e) {
    rows.push({ area: f, case: 'failed', oursMs: NaN, referenceMs: null, reference: String((e as Error).message) });
  }
}

const fmt = (v: number | null) => (v === null || !Number.isFinite(v) ? '—' : v < 10 ? v.toFixed(2) : v.toFixed(0));
const header = ['area', 'case', 'ours ms', 'reference ms', 'ratio', 'reference', 'note'];
const table = rows.map((r) => [
  r.area,
  r.case,
  fmt(r.oursMs),
  fmt(r.referenceMs),
  r.referenceMs ? (r.oursMs / r.referenceMs).toFixed(2) : '—',
  r.reference,
  r.note ?? '',
]);
const widths = header.map((h, i) => Math.max(h.length, ...table.map((row) => row[i].length)));
const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i])).join('  ');
console.log(line(header));
console.log(widths.map((w) => '-'.repeat(w)).join('  '));
for (const row of table) console.log(line(row));
