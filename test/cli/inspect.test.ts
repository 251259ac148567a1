import { afterAll, describe, expect, it } from 'vitest';
import { rmSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { main } from '../../src/cli/winnow.ts';
import { memoryIo } from '../../src/cli/cli-support.ts';
import { writeCliRecordings } from '../core/formats/cli-recordings.ts';

const files = writeCliRecordings();
afterAll(() => rmSync(files.dir, { recursive: true, force: true }));

async function inspect(path: string) {
  const io = memoryIo();
  const code = await main(['inspect', path], io);
  return { code, io };
}

describe('winnow inspect (issue 2 contract)', () => {
  it('prints format, signal channels, records, durations, start and events of a multi-rate EDF+C file', async () => {
    const { code, io } = await inspect(files.multiRate);
    expect(code).toBe(0);
    expect(io.err).toBe('');
    const j = JSON.parse(io.out);
    expect(Object.keys(j)).toEqual(['format', 'channels', 'records', 'recordDurationSeconds', 'durationSeconds', 'start', 'events']);
    expect(j.format).toBe('EDF+C');
    expect(j.channels).toEqual([
      { label: 'EEG Fz', unit: 'uV', sampleRate: 4, physicalMin: -32768, physicalMax: 32767, digitalMin: -32768, digitalMax: 32767, transducer: 'AgAgCl', prefilter: 'HP:0.1Hz' },
      { label: 'EEG Cz', unit: 'uV', sampleRate: 4, physicalMin: -32768, physicalMax: 32767, digitalMin: -32768, digitalMax: 32767, transducer: 'AgAgCl', prefilter: 'HP:0.1Hz' },
      // mV header, normalised to µV (ranges scaled like the values `winnow read` prints)
      { label: 'Resp', unit: 'uV', sampleRate: 2, physicalMin: -32768, physicalMax: 32767, digitalMin: -32768, digitalMax: 32767, transducer: '', prefilter: '' },
    ]);
    expect(j.records).toBe(2);
    expect(j.recordDurationSeconds).toBe(1);
    expect(j.durationSeconds).toBe(2);
    expect(j.start).toBe('2026-03-04T10:21:00');
    expect(j.events).toEqual([
      { onset: 0.5, duration: 0.25, label: 'Blink' },
      { onset: 1.75, duration: 0, label: 'Tür zu' },
    ]);
  });

  it('prints the reference EDF+ example as checks/edf_layout.py describes it', async () => {
    const path = fileURLToPath(new URL('../fixtures/formats/edf_example.edf', import.meta.url));
    const { code, io } = await inspect(path);
    expect(code).toBe(0);
    expect(JSON.parse(io.out)).toEqual({
      format: 'EDF+C',
      channels: [{ label: 'EEG Fz', unit: 'uV', sampleRate: 4, physicalMin: -3200, physicalMax: 3200, digitalMin: -32768, digitalMax: 32767, transducer: 'AgAgCl electrode', prefilter: 'HP:0.1Hz LP:70Hz' }],
      records: 2,
      recordDurationSeconds: 1,
      durationSeconds: 2,
      start: '2024-01-01T10:30:00',
      events: [{ onset: 0.5, duration: 0.2, label: 'Blink' }, { onset: 1.25, duration: 0, label: 'Stim A' }],
    });
  });

  it('prints an EDF+D file with its record onsets (gaps known)', async () => {
    const { code, io } = await inspect(files.discontinuous);
    expect(code).toBe(0);
    const j = JSON.parse(io.out);
    expect(j.format).toBe('EDF+D');
    expect(j.records).toBe(3);
    expect(j.durationSeconds).toBe(3.5);
    expect(j.recordOnsets).toEqual([0, 0.5, 3]);
    expect(j.events).toEqual([{ onset: 3.25, duration: 0, label: 'after' }]);
  });

  it('prints a BDF file (24-bit) with the BioSemi ranges', async () => {
    const { code, io } = await inspect(files.bdf);
    expect(code).toBe(0);
    const j = JSON.parse(io.out);
    expect(j.format).toBe('BDF');
    expect(j.channels[0]).toMatchObject({ label: 'A1', sampleRate: 8, physicalMin: -262144, physicalMax: 262143, digitalMin: -8388608, digitalMax: 8388607 });
    expect(j.events).toEqual([]);
  });

  it('exits 2 with "error:" naming the file and the fault for a truncated file, a missing file and a folder', async () => {
    const t = await inspect(files.truncated);
    expect(t.code).toBe(2);
    // 4 signals → 1280-byte header; record = (4+4+2+20)·2 = 60 bytes; 120 − 30 bytes of records remain
    expect(t.io.err).toBe(`error: ${files.truncated}: header says 2 data records of 60 bytes but the file holds 1 and 30 bytes\n`);
    const missing = await inspect(join(files.dir, 'nope.edf'));
    expect(missing.code).toBe(2);
    expect(missing.io.err).toBe(`error: ${join(files.dir, 'nope.edf')}: no such file\n`);
    const folder = await inspect(files.dir);
    expect(folder.code).toBe(2);
    expect(folder.io.err).toMatch(/^error: .*: is a directory/);
    const none = memoryIo();
    expect(await main(['inspect'], none)).toBe(2);
    expect(none.err).toMatch(/^error: winnow inspect: give exactly one recording/);
  });
});
