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

describe('RecordingSummary: positions, reference and sidecars', () => {
  it('says where positions came from, the reference the sidecars state and which sidecars were paired', async () => {
    const edf = writeEdf({ format: 'EDF+C', start: '2026-01-02T03:04:05', recordDurationSeconds: 1, channels: ['Cz', 'Pz', 'X1'].map((label) => ({ label, unit: 'uV', sampleRate: 128, data: new Float32Array(128) })), annotations: [] });
    const text = (s: string, name: string) => bytesByteSource(new TextEncoder().encode(s), name);
    const r = await loadRecording([
      bytesByteSource(edf, 'sub-01_task-x_eeg.edf'),
      text('name\ttype\tunits\treference\nCz\tEEG\tuV\tlinked mastoids\nPz\tEEG\tuV\tlinked mastoids\nX1\tEEG\tuV\tlinked mastoids\n', 'sub-01_task-x_channels.tsv'),
      text('{"PowerLineFrequency":50,"EEGReference":"linked mastoids"}', 'sub-01_task-x_eeg.json'),
    ]);
    if (!r.ok) throw new Error(r.error.message);
    const html = renderToStaticMarkup(<RecordingSummary recording={r.value} />);
    // X1 is not a 10-20/10-10 name (common practice: the international 10-20 system names), so 2 of 3.
    expect(html).toContain('<dd data-testid="recording-positions">2 of 3 EEG channels, idealised 10-20/10-10 positions by channel name (no electrodes.tsv)</dd>');
    expect(html).toContain('<dd data-testid="recording-reference">linked mastoids (sub-01_task-x_channels.tsv, sub-01_task-x_eeg.json)</dd>');
    expect(html).toContain('<dd data-testid="recording-sidecars">sub-01_task-x_channels.tsv (channels), sub-01_task-x_eeg.json (recording description)</dd>');
  });
  it('says so when nothing states the reference', async () => {
    const html = renderToStaticMarkup(<RecordingSummary recording={await load(null)} />);
    expect(html).toContain('not stated');
    expect(html).toContain('none (the recording alone)');
  });
});
