import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { memoryIo } from '../../src/cli/cli-support.ts';
import { parseValidateArgs } from '../../src/cli/validate.ts';
import { main } from '../../src/cli/winnow.ts';

const dir = mkdtempSync(join(tmpdir(), 'winnow-validate-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('winnow validate', () => {
  it('refuses bad options with exit 2 and a message naming the option', async () => {
    for (const [args, word] of [
      [['--scenarios', '0'], '--scenarios'],
      [['--seed', '-3'], '--seed'],
      [['--channels', '19,48'], '--channels'],
      [['--max-minutes', '1', '--min-minutes', '2'], '--min-minutes'],
      [['extra'], 'unexpected argument'],
    ] as const) {
      const io = memoryIo();
      expect(await main(['validate', ...args], io)).toBe(2);
      expect(io.err.startsWith('error: ')).toBe(true);
      expect(io.err).toContain(word);
    }
  });

  it('defaults to held-out seeds from 1001', () => {
    expect(parseValidateArgs([])).toMatchObject({ scenarios: 6, seed: 1001, out: null });
  });

  it('prints the per-aim tables and writes the report atomically, naming tuning and held-out seeds', async () => {
    const out = join(dir, 'report.json');
    const io = memoryIo();
    // One short 19-channel recording at 250 Hz keeps the test small (the full run is in bench/validate.bench.ts).
    const code = await main(['validate', '--scenarios', '1', '--seed', '3001', '--channels', '19', '--min-minutes', '1', '--max-minutes', '1', '--out', out], io);
    expect(code).toBe(0);
    expect(io.out).toContain('aim oscillations: remove precision');
    expect(io.out).toContain('true \\ reason');
    expect(io.out).toMatch(/tuning seeds 1–999, held out ≥ 1001/);
    const report = JSON.parse(readFileSync(out, 'utf8'));
    expect(report.format).toBe('winnow-validation-report');
    expect(report.seeds).toMatchObject({ used: [3001], tuning: '1–999', heldOut: '≥ 1001', roles: { 'held-out': [3001], tuning: [] } });
    expect(report.scenarios[0].params.channels).toBe(19);
    expect(Object.keys(report.summary.aims)).toEqual(['erp', 'oscillations', 'conservative']);
  }, 240_000);
});
