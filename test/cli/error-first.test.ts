/**
 * Issue 14 item 9 and the binding rule "bad input: `error:` first on stderr, exit 2": when a command has
 * printed warnings and then fails, the error line is the first line of stderr, the warnings follow it.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { commands, main } from '../../src/cli/winnow.ts';
import { CliError, memoryIo } from '../../src/cli/cli-support.ts';
import { writeEdf } from '../../src/core/formats/edf-writer.ts';

const dir = mkdtempSync(join(tmpdir(), 'winnow-error-first-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A tiny EDF+C with 3 stray bytes after its last record: reading it gives a warning, not an error. */
function warningRecording(): string {
  const b = writeEdf({
    format: 'EDF+C', start: '2026-01-01T00:00:00', recordDurationSeconds: 1,
    channels: [{ label: 'Fz', unit: 'uV', sampleRate: 4, data: new Float32Array([0, 1, 2, 3, 4, 5, 6, 7]) }],
    annotations: [],
  });
  const out = new Uint8Array(b.length + 3);
  out.set(b);
  const path = join(dir, 'stray.edf');
  writeFileSync(path, out);
  return path;
}

describe('error line first on stderr (issue 14 item 9)', () => {
  it('a command that warned and then failed: error first, the warnings after, exit code kept', async () => {
    commands['test-warn-then-fail'] = {
      summary: 'test only',
      load: async () => ({
        run: async (_args, io) => {
          io.stderr('warning: first thing\n');
          io.stderr('progress line\n');
          io.stderr('warning: second thing\n');
          throw new CliError('input.edf: the fault');
        },
      }),
    };
    try {
      const io = memoryIo();
      expect(await main(['test-warn-then-fail'], io)).toBe(2);
      expect(io.err).toBe('progress line\nerror: input.edf: the fault\nwarning: first thing\nwarning: second thing\n');
      expect(io.err.split('\n').find((l) => l.startsWith('warning:') || l.startsWith('error:'))).toBe('error: input.edf: the fault');
    } finally {
      delete commands['test-warn-then-fail'];
    }
  });

  it('a command that succeeds still prints its warnings, in their order', async () => {
    const io = memoryIo();
    expect(await main(['inspect', warningRecording()], io)).toBe(0);
    expect(io.err).toMatch(/^warning: .*stray\.edf: 3 bytes after the last of 2 data records are ignored\n$/);
  });

  it('winnow decompose, then winnow evidence with an event that does not exist: the error line comes first', async () => {
    const rec = warningRecording();
    const dec = join(dir, 'dec.json');
    const io1 = memoryIo();
    expect(await main(['decompose', rec, '--out', dec], io1)).toBe(0);
    const io = memoryIo();
    expect(await main(['evidence', rec, dec, '--epoch-event', 'NoSuch', '--out', join(dir, 'ev.json')], io)).toBe(2);
    const lines = io.err.split('\n').filter((l) => l !== '');
    expect(lines[0]).toMatch(/^error: .*--epoch-event "NoSuch" matches no event/);
    expect(lines.slice(1).some((l) => /^warning: .*stray\.edf: 3 bytes after the last/.test(l))).toBe(true);
  });
});
