/**
 * The same files give the same analysis inputs in the workbench and in the CLI: the workbench's path
 * (loadRecording over the picked files, as workers/recording.worker.ts runs it) against the CLI's
 * (openCliRecording with the sidecars as options, then readCliSignals), through the one adapter.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { memoryIo } from '../../src/cli/cli-support.ts';
import { openCliRecording, readCliSignals } from '../../src/cli/recording-files.ts';
import type { Decomposition } from '../../src/core/decomposition.ts';
import { bytesByteSource } from '../../src/core/formats/byte-source.ts';
import { writeEdf } from '../../src/core/formats/edf-writer.ts';
import { loadRecording } from '../../src/core/formats/recording-loader.ts';
import { decomposeInputOf, evidenceInputOf } from '../../src/core/recording-input.ts';

const dir = mkdtempSync(join(tmpdir(), 'winnow-recording-files-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

// EDF+D, 100 Hz, records of 1 s at 0, 1, 4, 5 s (one gap); six EEG channels, one VEOG, a 50 Hz channel;
// six electrodes (fewer than the 16 the workbench's former fit needed, enough for the one sphere fit).
const fs = 100;
const eeg = ['Fp1', 'Fp2', 'C3', 'C4', 'O1', 'O2'];
const channels = [...eeg, 'VEOG'].map((label, c) => ({ label, unit: 'uV', sampleRate: fs, data: Float32Array.from({ length: 4 * fs }, (_, t) => 10 * Math.sin(t / (3 + c))) }));
channels.push({ label: 'Resp', unit: 'uV', sampleRate: 50, data: new Float32Array(4 * 50) });
const edfPath = join(dir, 'sub-01_task-x_eeg.edf');
writeFileSync(
  edfPath,
  writeEdf({ format: 'EDF+D', start: '2026-03-04T10:21:00', recordDurationSeconds: 1, recordOnsets: Float64Array.of(0, 1, 4, 5), channels, annotations: [{ onset: 0.5, duration: 0, label: 'cue' }] }),
);
const sidecars = {
  channels: ['sub-01_task-x_channels.tsv', 'name\ttype\tunits\tstatus\n' + [...eeg.map((l) => `${l}\tEEG\tuV\t${l === 'C4' ? 'bad' : 'good'}`), 'VEOG\tVEOG\tuV\tgood', 'Resp\tRESP\tuV\tgood'].join('\n') + '\n'],
  // The hand-worked points of test/core/headmodel/sphere-fit.test.ts: centre (1, 2, 3) mm.
  electrodes: ['sub-01_electrodes.tsv', 'name\tx\ty\tz\nFp1\t6\t2\t3\nFp2\t-4\t2\t3\nC3\t1\t7\t3\nC4\t1\t-3\t3\nO1\t1\t2\t7\nO2\t1\t2\t-1\n'],
  events: ['sub-01_task-x_events.tsv', 'onset\tduration\ttrial_type\tcondition\n0.5\t0\tcue\trare\n4.5\t0\tcue\tfrequent\n'],
} as const;
for (const [name, text] of Object.values(sidecars)) writeFileSync(join(dir, name), text);
writeFileSync(join(dir, 'sub-01_task-x_eeg.json'), '{"PowerLineFrequency":60}');
writeFileSync(join(dir, 'sub-01_coordsystem.json'), '{"EEGCoordinateSystem":"Other","EEGCoordinateUnits":"mm","EEGCoordinateSystemDescription":"test"}');

const allNames = [basename(edfPath), ...Object.values(sidecars).map(([n]) => n), 'sub-01_task-x_eeg.json', 'sub-01_coordsystem.json'];

async function browserPath() {
  const files = allNames.map((n) => bytesByteSource(new Uint8Array(readFileSync(join(dir, n))), n));
  const r = await loadRecording(files);
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

async function cliPath() {
  const p = (k: keyof typeof sidecars) => join(dir, sidecars[k][0]);
  const { opened, close } = await openCliRecording(edfPath, { channels: p('channels'), electrodes: p('electrodes'), events: p('events') });
  try {
    return await readCliSignals(opened, memoryIo());
  } finally {
    await close();
  }
}

describe('workbench and CLI read the same files into the same analysis inputs', () => {
  it('gives identical positions, segments, decomposition and evidence inputs', async () => {
    const [b, c] = [await browserPath(), await cliPath()];
    // positions: the electrodes minus the fitted centre (1, 2, 3), normalised: the six axis directions
    const axes = [[1, 0, 0], [-1, 0, 0], [0, 1, 0], [0, -1, 0], [0, 0, 1], [0, 0, -1]];
    expect(Array.from(b.positions!.subarray(0, 18)).map((v) => Number(v.toFixed(12)) + 0)).toEqual(axes.flat());
    expect(Array.from(c.positions!)).toEqual(Array.from(b.positions!));
    const [db, dc] = [decomposeInputOf(b), decomposeInputOf(c)];
    expect(db.boundaries).toEqual([200]);
    expect(dc).toEqual(db);
    expect(db.status).toEqual(['good', 'good', 'good', 'bad', 'good', 'good', 'good']);
    const dec = { channels: eeg, nChannels: 6, nComponents: 6 } as unknown as Decomposition;
    const [eb, ec] = [evidenceInputOf(b, dec), evidenceInputOf(c, dec)];
    expect(ec).toEqual(eb);
    expect(eb.mains).toMatchObject({ hz: 60, origin: 'sidecar' });
    expect(eb.input.events).toEqual([
      { onset: 0.5, duration: 0, label: 'cue', columns: { condition: 'rare' } },
      { onset: 4.5, duration: 0, label: 'cue', columns: { condition: 'frequent' } },
    ]);
    expect(c.warnings).toEqual(b.warnings);
    expect(b.warnings).toContain('sub-01_task-x_eeg.edf: Resp (50 Hz) not loaded; the main rate is 100 Hz');
  });
});
