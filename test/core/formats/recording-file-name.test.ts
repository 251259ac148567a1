import { describe, expect, it } from 'vitest';
import { isRecordingFileName, recordingStem } from '../../../src/core/formats/recording-file-name.ts';
import { bytesByteSource } from '../../../src/core/formats/byte-source.ts';
import { writeEdf } from '../../../src/core/formats/edf-writer.ts';
import { loadRecording } from '../../../src/core/formats/recording-loader.ts';

describe('isRecordingFileName (.edf, .bdf; .rec read as EDF; any case)', () => {
  it('accepts the three extensions in any case, with or without a folder, and nothing else', () => {
    for (const n of ['a.edf', 'A.EDF', 'sub-01/eeg/sub-01_eeg.bdf', 'old.rec', 'OLD.Rec', 'C:\\data\\x.Bdf']) expect(isRecordingFileName(n)).toBe(true);
    for (const n of ['a.edf.json', 'edf', '.edf', 'a.tsv', 'a.edfx', 'record', 'a_rec']) expect(isRecordingFileName(n)).toBe(false);
  });

  it('gives the stem without the extension', () => {
    expect(recordingStem('recording.EDF')).toBe('recording');
    expect(recordingStem('notes.txt')).toBe('notes.txt');
  });

  it('lets the loader read a .rec file as EDF (the reader decides from the header bytes)', async () => {
    const bytes = writeEdf({ format: 'EDF+C', start: '2026-01-02T03:04:05', recordDurationSeconds: 1, channels: [{ label: 'Fz', unit: 'uV', sampleRate: 8, data: new Float32Array(16) }], annotations: [] });
    const r = await loadRecording([bytesByteSource(bytes, 'old.REC')]);
    expect(r.ok && r.value.format).toBe('EDF+C');
  });
});
