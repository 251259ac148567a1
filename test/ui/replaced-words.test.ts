/**
 * Issue 15: the words Winnow replaced with its own vocabulary (reasons blink, gaze, muscle, cardiac, contact,
 * mains, movement, neural, mixed, unclear; "trial stack"; "1/f fit" / "1/f exponent"; `winnow clean` and
 * `winnow dipole`; events by BIDS columns; method labels with their measured time) appear nowhere a user reads:
 * the screens (src/ui), the state's messages (src/state), the CLI's output (src/cli) and the user documents.
 * The decisions-file reader keeps the legacy codes in src/core/review (it maps them on load).
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
const REPLACED: readonly [RegExp, string][] = [
  [/eye-movement/i, 'gaze'],
  [/line-noise|line noise/i, 'mains'],
  [/epoch image/i, 'trial stack'],
  [/aperiodic/i, '1/f fit, 1/f exponent'],
  [/\((faster|slower)\)/i, 'the measured time on the loaded recording'],
  [/fit-dipole|winnow apply\b/i, 'winnow dipole, winnow clean'],
  [/reason[^.\n]{0,40}['"](electrode|motion)['"]/i, 'contact, movement'],
];

function files(dir: string, ext: RegExp): string[] {
  return readdirSync(dir).flatMap((n) => {
    const p = join(dir, n);
    return statSync(p).isDirectory() ? files(p, ext) : ext.test(n) ? [p] : [];
  });
}

describe('replaced words stay out of what users read (issue 15)', () => {
  const targets = [
    ...files(join(root, 'src', 'ui'), /\.(ts|tsx|css)$/),
    ...files(join(root, 'src', 'state'), /\.ts$/),
    ...files(join(root, 'src', 'cli'), /\.ts$/),
    join(root, 'README.md'),
    join(root, 'DEVELOPERS.md'),
    join(root, 'docs', 'methods.md'),
    join(root, 'docs', 'batch.md'),
    join(root, 'docs', 'suggestion-rules.md'),
    ...files(join(root, 'docs', 'validation'), /\.md$/),
  ];
  it.each(REPLACED.map(([re, instead]) => [String(re), re, instead] as const))('%s', (_name, re, instead) => {
    const hits: string[] = [];
    for (const f of targets) {
      readFileSync(f, 'utf8')
        .split('\n')
        .forEach((line, i) => {
          if (re.test(line)) hits.push(`${f.slice(root.length + 1)}:${i + 1}: ${line.trim().slice(0, 100)} (say: ${instead})`);
        });
    }
    expect(hits).toEqual([]);
  });
});
