import { describe, expect, it } from 'vitest';
import { commands, main } from '../../src/cli/winnow.ts';
import { memoryIo } from '../../src/cli/cli-support.ts';
import { wantsHelp } from '../../src/cli/help.ts';
import { usage as demoDataUsage } from '../../src/cli/demo-data.ts';

describe('winnow <command> --help', () => {
  const names = Object.keys(commands);

  it('registers the agree command', () => {
    expect(names).toContain('agree');
  });

  for (const name of names) {
    for (const flag of ['--help', '-h']) {
      it(`${name} ${flag}: usage on stdout, exit 0`, async () => {
        const io = memoryIo();
        const code = await main([name, flag], io);
        expect(code).toBe(0);
        expect(io.out.startsWith(`usage: winnow ${name}`)).toBe(true);
        expect(io.out).toContain('--help');
        expect(io.err).toBe('');
      });
    }
  }

  it('answers --help even after other arguments, and not after a -- terminator', () => {
    expect(wantsHelp(['rec.edf', '--out', 'x.json', '--help'])).toBe(true);
    expect(wantsHelp(['--', '--help'])).toBe(false);
    expect(wantsHelp(['rec.edf'])).toBe(false);
  });

  it('demo-data exports its usage too', () => {
    expect(demoDataUsage.startsWith('usage: winnow demo-data')).toBe(true);
  });

  it('the top-level usage still lists every command', async () => {
    const io = memoryIo();
    expect(await main(['--help'], io)).toBe(0);
    for (const name of names) expect(io.out).toContain(`  ${name} `);
  });
});
