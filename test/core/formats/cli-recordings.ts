/**
 * Recordings for the CLI contract tests, written to a temporary folder: a multi-rate EDF+C built byte by byte
 * from the specification (test/core/formats/edf-spec-bytes.ts), an EDF+D from our writer, and the reference
 * BDF example (test/fixtures/formats/bdf_example.bdf, from checks/edf_layout.py).
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { writeEdf } from '../../../src/core/formats/edf-writer.ts';
import { annotationSignal, le16, specFile, talBytes } from './edf-spec-bytes.ts';

export interface CliRecordings {
  dir: string;
  multiRate: string;
  discontinuous: string;
  bdf: string;
  truncated: string;
}

export function writeCliRecordings(): CliRecordings {
  const dir = mkdtempSync(join(tmpdir(), 'winnow-cli-'));
  // Multi-rate EDF+C: 2 records of 1 s; "EEG Fz" and "EEG Cz" 4 Hz (identity scaling), "Resp" 2 Hz in mV.
  const eeg = (label: string) => ({ label, transducer: 'AgAgCl', unit: 'uV', pmin: '-32768', pmax: '32767', dmin: '-32768', dmax: '32767', prefilter: 'HP:0.1Hz', spr: '4' });
  const resp = { label: 'Resp', unit: 'mV', pmin: '-32.768', pmax: '32.767', dmin: '-32768', dmax: '32767', spr: '2' };
  const rec = (r: number, tal: string) => [...le16([10 * r, 10 * r + 1, 10 * r + 2, 10 * r + 3]), ...le16([-r, -r, -r, -r]), ...le16([1000, -1000]), ...talBytes(tal, 40)];
  const multiRate = join(dir, 'multi-rate.edf');
  writeFileSync(
    multiRate,
    specFile({
      reserved: 'EDF+C', records: '2', duration: '1', date: '04.03.26', time: '10.21.00',
      signals: [eeg('EEG Fz'), eeg('EEG Cz'), resp, annotationSignal(20)],
      data: new Uint8Array([...rec(0, '+0\x14\x14\x00+0.5\x150.25\x14Blink\x14\x00'), ...rec(1, '+1\x14\x14\x00+1.75\x14Tür zu\x14\x00')]),
    }),
  );
  const discontinuous = join(dir, 'gaps.edf');
  writeFileSync(
    discontinuous,
    writeEdf({
      format: 'EDF+D', start: '2026-03-04T10:21:00', recordDurationSeconds: 0.5, recordOnsets: new Float64Array([0, 0.5, 3]),
      channels: [{ label: 'Oz', unit: 'uV', sampleRate: 4, physicalMin: -32768, physicalMax: 32767, data: new Float32Array([0, 1, 2, 3, 4, 5]) }],
      annotations: [{ onset: 3.25, duration: 0, label: 'after' }],
    }),
  );
  const bdf = join(dir, 'example.bdf');
  writeFileSync(bdf, readFileSync(fileURLToPath(new URL('../../fixtures/formats/bdf_example.bdf', import.meta.url))));
  const truncated = join(dir, 'recording.edf');
  const full = readFileSync(multiRate);
  writeFileSync(truncated, full.subarray(0, full.length - 30));
  return { dir, multiRate, discontinuous, bdf, truncated };
}
