import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { DEMO_OPTIONS } from '../../src/cli/demo-data.ts';
import { simulateSession } from '../../src/core/simulate/simulate.ts';
import { channelsTsv, eventsTsv, sessionEdf } from '../../src/core/simulate/session-files.ts';

const demo = (path: string) => readFileSync(new URL(`../../demo-data/${path}`, import.meta.url));
const sha = (b: Uint8Array | string) => createHash('sha256').update(b).digest('hex');

describe('the bundled demo participant', () => {
  it('is exactly what the simulator writes for the demo settings (regenerate with src/cli/demo-data.ts)', () => {
    const s = simulateSession(DEMO_OPTIONS);
    expect(sha(demo('sub-01/eeg/sub-01_task-walkoddball_eeg.edf'))).toBe(sha(sessionEdf(s, 'data')));
    expect(demo('sub-01/eeg/sub-01_task-walkoddball_events.tsv').toString('utf8')).toBe(eventsTsv(s));
    expect(demo('sub-01/eeg/sub-01_task-walkoddball_channels.tsv').toString('utf8')).toBe(channelsTsv(s));
  });

  it('declares the mains frequency and stays under 10 MB', () => {
    const eeg = JSON.parse(demo('sub-01/eeg/sub-01_task-walkoddball_eeg.json').toString('utf8'));
    expect(eeg.PowerLineFrequency).toBe(50);
    expect(eeg.SamplingFrequency).toBe(250);
    expect(demo('sub-01/eeg/sub-01_task-walkoddball_eeg.edf').length).toBeLessThan(10e6);
    expect(demo('README.md').toString('utf8')).toMatch(/simulated/i);
  });
});
