import { describe, expect, it } from 'vitest';
import { bytesByteSource } from '../../src/core/formats/byte-source.ts';
import { writeEdf } from '../../src/core/formats/edf-writer.ts';
import { loadRecording } from '../../src/core/formats/recording-loader.ts';
import { decomposeInputOf, evidenceInputOf, segmentBoundaries } from '../../src/core/recording-input.ts';
import type { Decomposition } from '../../src/core/decomposition.ts';

const fs = 10;
const channel = (label: string, n: number) => ({ label, unit: 'uV', sampleRate: fs, data: Float32Array.from({ length: n }, (_, i) => Math.sin(i) * 10) });

async function load(bytes: Uint8Array, name = 'recording.edf') {
  const r = await loadRecording([bytesByteSource(bytes, name)]);
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

describe('segmentBoundaries (one rule for the workbench and winnow decompose)', () => {
  it('EDF+D: a segment starts at every gap between record times [Kemp & Olivan 2003, EDF+D record onsets]', async () => {
    // Three 1 s records at 0, 2 and 5 s, 10 Hz: samples 0–9 (t 0–0.9 s), 10–19 (t 2–2.9 s), 20–29 (t 5–5.9 s).
    // By hand the segments start at samples 10 and 20.
    const rec = await load(
      writeEdf({ format: 'EDF+D', start: '2026-03-04T10:21:00', recordDurationSeconds: 1, recordOnsets: Float64Array.of(0, 2, 5), channels: [channel('Fz', 30), channel('Cz', 30)], annotations: [] }),
    );
    expect(segmentBoundaries(rec.signals, rec.events)).toEqual([10, 20]);
    expect(decomposeInputOf(rec).boundaries).toEqual([10, 20]);
    // The workbench's former rule (round(onset · rate) of the gap events) read recorded time, gaps included,
    // as a sample index and missed both starts.
    const former = rec.events.filter((e) => e.source === 'boundary').map((e) => Math.round(e.onset * fs)).filter((i) => i > 0 && i < 30);
    expect(former).not.toEqual([10, 20]);
  });

  it('EDF+C: a "boundary" annotation (any case) starts a segment at round(onset · rate); common practice', async () => {
    const rec = await load(
      writeEdf({
        format: 'EDF+C', start: '2026-03-04T10:21:00', recordDurationSeconds: 1, channels: [channel('Fz', 40)],
        annotations: [{ onset: 1.5, duration: 0, label: 'boundary' }, { onset: 2.5, duration: 0, label: 'stimulus' }, { onset: 3.04, duration: 0, label: 'Boundary' }],
      }),
    );
    expect(segmentBoundaries(rec.signals, rec.events)).toEqual([15, 30]);
  });
});

describe('decomposeInputOf / evidenceInputOf', () => {
  it('hands types and status from channels.tsv, positions, events with their columns and the sidecar mains frequency on', async () => {
    const edf = writeEdf({
      format: 'EDF+C', start: '2026-03-04T10:21:00', recordDurationSeconds: 1, channels: [channel('Fz', 40), channel('Cz', 40), channel('VEOG', 40)],
      annotations: [{ onset: 1, duration: 0, label: 'note' }],
    });
    const text = (s: string, name: string) => bytesByteSource(new TextEncoder().encode(s), name);
    const r = await loadRecording([
      bytesByteSource(edf, 'sub-01_eeg.edf'),
      text('name\ttype\tunits\tstatus\nFz\tEEG\tuV\tgood\nCz\tEEG\tuV\tbad\nVEOG\tVEOG\tuV\tgood\n', 'sub-01_channels.tsv'),
      text('onset\tduration\ttrial_type\tcondition\n2\t0\tcue\trare\n', 'sub-01_events.tsv'),
      text('{"PowerLineFrequency":60}', 'sub-01_eeg.json'),
    ]);
    if (!r.ok) throw new Error(r.error.message);
    const rec = r.value;
    const d = decomposeInputOf(rec);
    expect(d.types).toEqual(['EEG', 'EEG', 'VEOG']);
    expect(d.status).toEqual(['good', 'bad', 'good']);
    expect(d.data).toBe(rec.signals.data);
    const dec = { channels: ['Fz'], nChannels: 1, nComponents: 1 } as unknown as Decomposition;
    const { input, mains } = evidenceInputOf(rec, dec, { permutations: 99 });
    expect(mains).toMatchObject({ hz: 60, origin: 'sidecar' });
    expect(input.lineHz).toBe(60);
    expect(input.positionsUnit).toBe(rec.positions);
    expect(input.events).toEqual([
      { onset: 1, duration: 0, label: 'note' },
      { onset: 2, duration: 0, label: 'cue', columns: { condition: 'rare' } },
    ]);
    expect(input.permutations).toBe(99);
    expect(evidenceInputOf(rec, dec, { lineHz: 50 }).mains.origin).toBe('option');
  });
});
