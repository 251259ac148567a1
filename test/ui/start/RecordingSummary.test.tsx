/** Static rendering (react-dom/server) of the recording summary's mains line (BIDS PowerLineFrequency). */
import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { RecordingSummary } from '../../../src/ui/start/RecordingSummary.tsx';
import { bytesByteSource } from '../../../src/core/formats/byte-source.ts';
import { loadRecording } from '../../../src/core/formats/recording-loader.ts';
import { writeEdf } from '../../../src/core/formats/edf-writer.ts';

async function load(sidecar: string | null) {
  const edf = writeEdf({ format: 'EDF+C', start: '2026-01-02T03:04:05', recordDurationSeconds: 1, channels: [{ label: 'Cz', unit: 'uV', sampleRate: 128, data: new Float32Array(256) }], annotations: [] });
  const files = [bytesByteSource(edf, 'sub-01_task-x_eeg.edf')];
  if (sidecar !== null) files.push(bytesByteSource(new TextEncoder().encode(sidecar), 'sub-01_task-x_eeg.json'));
  const r = await loadRecording(files);
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

describe('RecordingSummary: mains frequency', () => {
  it('names the sidecar it came from, or says 50 Hz was assumed', async () => {
    expect(renderToStaticMarkup(<RecordingSummary recording={await load('{"PowerLineFrequency":60}')} />)).toContain(
      '<dd data-testid="recording-mains">mains 60 Hz (from sub-01_task-x_eeg.json)</dd>',
    );
    expect(renderToStaticMarkup(<RecordingSummary recording={await load(null)} />)).toContain('mains 50 Hz (assumed; no PowerLineFrequency)');
  });
});
