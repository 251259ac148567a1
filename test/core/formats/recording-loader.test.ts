import { describe, expect, it } from 'vitest';
import { bytesByteSource, type ByteSource } from '../../../src/core/formats/byte-source.ts';
import { writeEdf } from '../../../src/core/formats/edf-writer.ts';
import { bidsNameParts, loadRecording } from '../../../src/core/formats/recording-loader.ts';
import { standardPositions } from '../../../src/core/headmodel/montage-1020.ts';
import { mainsFrequency } from '../../../src/core/formats/power-line.ts';
import { simulateSession } from '../../../src/core/simulate/simulate.ts';
import { eegJson, sessionEdf } from '../../../src/core/simulate/session-files.ts';
import { hz } from '../../../src/core/units.ts';

const text = (s: string, name: string): ByteSource => bytesByteSource(new TextEncoder().encode(s), name);

function recording(name: string, labels = ['Fp1', 'Cz', 'VEOG'], extraRate?: { label: string; rate: number }): ByteSource {
  const channels = labels.map((label, i) => ({ label, unit: 'uV', sampleRate: 128, data: new Float32Array(256).map((_, k) => (i + 1) * Math.sin(k / 5)) }));
  if (extraRate) channels.push({ label: extraRate.label, unit: 'uV', sampleRate: extraRate.rate, data: new Float32Array(2 * extraRate.rate) });
  return bytesByteSource(
    writeEdf({ format: 'EDF+C', start: '2026-01-02T03:04:05', recordDurationSeconds: 1, channels, annotations: [{ onset: 1.5, duration: 0, label: 'stimulus' }, { onset: 0.25, duration: 0, label: 'note' }] }),
    name,
  );
}

const channelsTsv = 'name\ttype\tunits\tstatus\nFp1\tEEG\tuV\tgood\nCz\tEEG\tuV\tbad\nVEOG\tVEOG\tuV\tgood\n';

describe('bidsNameParts', () => {
  it('splits BIDS entities, suffix and extension', () => {
    expect(bidsNameParts('sub-01/eeg/sub-01_ses-2_task-rest_run-1_eeg.edf')).toEqual({
      entities: { sub: '01', ses: '2', task: 'rest', run: '1' }, suffix: 'eeg', extension: '.edf',
    });
    expect(bidsNameParts('channels.tsv')).toEqual({ entities: {}, suffix: 'channels', extension: '.tsv' });
  });
});

describe('loadRecording', () => {
  it('pairs sidecars by BIDS entities, applies channel types/status, electrode positions and merges events', async () => {
    const files = [
      recording('sub-01_task-rest_eeg.edf'),
      text(channelsTsv, 'sub-01_task-rest_channels.tsv'),
      text('name\ttype\tunits\nA\tEEG\tuV\n', 'sub-02_task-rest_channels.tsv'), // another participant: ignored
      text('name\tx\ty\tz\nFp1\t-0.03\t0.09\t0\nCz\t0\t0\t0.1\n', 'sub-01_electrodes.tsv'),
      text('{"EEGCoordinateSystem":"Other","EEGCoordinateUnits":"m","EEGCoordinateSystemDescription":"sim"}', 'sub-01_coordsystem.json'),
      text('onset\tduration\ttrial_type\tresponse_time\n1.5\t0\tstimulus\t0.3\n2\t0.5\tresponse\tn/a\n', 'sub-01_task-rest_events.tsv'),
    ];
    const r = await loadRecording(files);
    if (!r.ok) throw new Error(r.error.message);
    const rec = r.value;
    expect(rec.channels.map((c) => [c.label, c.type, c.status])).toEqual([['Fp1', 'EEG', 'good'], ['Cz', 'EEG', 'bad'], ['VEOG', 'VEOG', 'good']]);
    expect(rec.signals.labels).toEqual(['Fp1', 'Cz', 'VEOG']);
    expect(rec.signals.sampleRate).toBe(128);
    expect(rec.signals.nSamples).toBe(256);
    // events.tsv wins over the duplicate annotation "stimulus" at 1.5 s (it carries response_time)
    expect(rec.events.map((e) => [e.onset, e.label, e.source, e.responseTime])).toEqual([
      [0.25, 'note', 'annotation', undefined],
      [1.5, 'stimulus', 'events-tsv', 0.3],
      [2, 'response', 'events-tsv', undefined],
    ]);
    // fewer than 4 electrodes fix no sphere (sphere-fit.ts): directions about the origin; Cz straight up, Fp1 normalised
    const pos = Array.from(rec.positions!);
    expect(pos.slice(3, 6)).toEqual([0, 0, 1]);
    expect(Math.hypot(pos[0], pos[1], pos[2])).toBeCloseTo(1, 12);
    expect(pos.slice(6, 9).every(Number.isNaN)).toBe(true); // VEOG is not EEG: no position, no warning
    expect(rec.warnings.some((w) => w.includes('no electrode position'))).toBe(false);
  });

  it('uses plain channels.tsv/events.tsv beside recording.edf and the built-in 10-20 positions without electrodes.tsv', async () => {
    const r = await loadRecording([recording('recording.edf', ['FP1', 'T3', 'EEG X1']), text('onset\tduration\n0.5\t0\n', 'events.tsv')]);
    if (!r.ok) throw new Error(r.error.message);
    const P = standardPositions();
    expect(Array.from(r.value.positions!.subarray(0, 6))).toEqual([...P.get('Fp1')!, ...P.get('T7')!]);
    expect(r.value.warnings).toContain('recording.edf: no electrode position for EEG X1 (not a 10-20/10-10 name)');
    expect(r.value.events.filter((e) => e.source === 'events-tsv')).toHaveLength(1);
  });

  it('reads only the main-rate channels and names the others in a warning', async () => {
    const seen: number[] = [];
    const r = await loadRecording([recording('recording.edf', ['Fz', 'Cz'], { label: 'ECG', rate: 64 })], { onProgress: (f) => seen.push(f) });
    expect(seen.length).toBeGreaterThan(1);
    expect(seen.every((f, i) => f >= 0 && f <= 1 && (i === 0 || f >= seen[i - 1]))).toBe(true);
    expect(seen[seen.length - 1]).toBe(1);
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.channels.map((c) => c.label)).toEqual(['Fz', 'Cz', 'ECG']);
    expect(r.value.signals.labels).toEqual(['Fz', 'Cz']);
    expect(r.value.warnings).toContain('recording.edf: ECG (64 Hz) not loaded; the main rate is 128 Hz');
  });

  it('refuses a channels.tsv whose row count differs from the recording', async () => {
    const r = await loadRecording([recording('recording.edf'), text('name\ttype\tunits\nFp1\tEEG\tuV\n', 'channels.tsv')]);
    expect(!r.ok && r.error).toMatchObject({ code: 'row-count-mismatch', message: 'channels.tsv: 1 channel rows but recording.edf has 3 signal channels' });
  });

  it('refuses a channels.tsv that names channels the recording does not have', async () => {
    const r = await loadRecording([recording('recording.edf'), text(channelsTsv.replace('VEOG\tVEOG', 'HEOG\tHEOG'), 'channels.tsv')]);
    expect(!r.ok && r.error.code).toBe('unknown-channel');
    expect(!r.ok && r.error.message).toMatch(/^channels\.tsv: no row for channel "VEOG" of recording\.edf/);
  });

  it('refuses a channels.tsv with a missing column, naming the sidecar', async () => {
    const r = await loadRecording([recording('recording.edf'), text('name\ttype\nFp1\tEEG\n', 'channels.tsv')]);
    expect(!r.ok && r.error).toMatchObject({ code: 'missing-column', file: 'channels.tsv' });
  });

  it('asks which recording to load when there are several, loads the one named, and prefers recording.edf over neural.edf', async () => {
    const files = [recording('sub-01_run-1_eeg.edf'), recording('sub-01_run-2_eeg.edf', ['Oz'])];
    const r = await loadRecording(files);
    expect(!r.ok && r.error.message).toMatch(/2 recordings given .*choose one/);
    const two = await loadRecording(files, { recording: 'sub-01_run-2_eeg.edf' });
    expect(two.ok && two.value.signals.labels).toEqual(['Oz']);
    const sim = await loadRecording([recording('neural.edf', ['Oz']), recording('recording.edf', ['Fz'])]);
    expect(sim.ok && sim.value.signals.labels).toEqual(['Fz']); // the simulator's sensor data, not neural.edf
    expect(sim.ok && sim.warnings).toContain('recording.edf: loaded; neural.edf ignored (one recording at a time)');
    const none = await loadRecording([text('x', 'notes.txt')]);
    expect(!none.ok && none.error.message).toBe('notes.txt: no .edf or .bdf recording among the files');
  });
});

describe('loadRecording: mains frequency from *_eeg.json (BIDS v1.11 EEG: PowerLineFrequency, Hz)', () => {
  it('reads 60 Hz from the simulator\'s sidecar of a 60 Hz session, paired by entities', async () => {
    const session = simulateSession({ seed: 3, channels: 32, minutes: 0.05, rate: hz(250), lineHz: 60 });
    const files = [
      bytesByteSource(sessionEdf(session, 'data'), 'sub-01_task-x_eeg.edf'),
      text(eegJson(session), 'sub-01_task-x_eeg.json'),
      text('{"PowerLineFrequency":50}', 'sub-02_task-x_eeg.json'), // another participant: ignored
    ];
    const r = await loadRecording(files);
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.powerLine).toEqual({ hz: 60, sidecar: 'sub-01_task-x_eeg.json' });
    expect(mainsFrequency(r.value.powerLine)).toMatchObject({ hz: 60, origin: 'sidecar', text: 'mains 60 Hz (from sub-01_task-x_eeg.json)' });
    expect(mainsFrequency(r.value.powerLine, 50)).toMatchObject({ hz: 50, origin: 'option' });
  });

  it('pairs plain eeg.json beside recording.edf; without a usable value mains is 50 Hz, assumed, with a warning', async () => {
    const plain = await loadRecording([recording('recording.edf'), text('{"PowerLineFrequency":50}', 'eeg.json')]);
    expect(plain.ok && plain.value.powerLine).toEqual({ hz: 50, sidecar: 'eeg.json' });
    const none = await loadRecording([recording('recording.edf')]);
    expect(none.ok && none.value.powerLine).toEqual({ hz: null, sidecar: null });
    expect(none.ok && mainsFrequency(none.value.powerLine).text).toBe('mains 50 Hz (assumed; no PowerLineFrequency)');
    const na = await loadRecording([recording('sub-01_eeg.edf'), text('{"PowerLineFrequency":"n/a"}', 'sub-01_eeg.json')]);
    expect(na.ok && mainsFrequency(na.value.powerLine)).toMatchObject({ hz: 50, origin: 'assumed' });
    const odd = await loadRecording([recording('sub-01_eeg.edf'), text('{"PowerLineFrequency":400}', 'sub-01_eeg.json')]);
    expect(odd.ok && odd.value.powerLine?.hz).toBeNull();
    expect(odd.ok && odd.warnings).toContain('sub-01_eeg.json: PowerLineFrequency 400 Hz is neither 50 nor 60; not used');
    const broken = await loadRecording([recording('sub-01_eeg.edf'), text('{', 'sub-01_eeg.json')]);
    expect(broken.ok).toBe(true); // a broken sidecar does not stop the load
    expect(broken.ok && broken.warnings.some((w) => /^sub-01_eeg\.json: not valid JSON .*; mains frequency not read$/.test(w))).toBe(true);
  });
});

describe('loadRecording: which sidecars were paired, and the reference they state (BIDS v1.11 EEG)', () => {
  it('lists every sidecar read and reads channels.tsv `reference` and *_eeg.json EEGReference', async () => {
    const r = await loadRecording([
      recording('sub-01_task-rest_eeg.edf'),
      text('name\ttype\tunits\treference\nFp1\tEEG\tuV\tCz\nCz\tEEG\tuV\tCz\nVEOG\tVEOG\tuV\tn/a\n', 'sub-01_task-rest_channels.tsv'),
      text('onset\tduration\ttrial_type\n1.5\t0\tstimulus\n', 'sub-01_task-rest_events.tsv'),
      text('{"PowerLineFrequency":50,"EEGReference":"Cz"}', 'sub-01_task-rest_eeg.json'),
    ]);
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.sidecars).toEqual([
      { kind: 'channels', file: 'sub-01_task-rest_channels.tsv' },
      { kind: 'events', file: 'sub-01_task-rest_events.tsv' },
      { kind: 'eeg', file: 'sub-01_task-rest_eeg.json' },
    ]);
    expect(r.value.reference).toEqual({ channels: 'Cz', eegJson: 'Cz' });
  });
  it('states no reference and no sidecars for a bare recording', async () => {
    const r = await loadRecording([recording('recording.edf')]);
    if (!r.ok) throw new Error(r.error.message);
    expect(r.value.sidecars).toEqual([]);
    expect(r.value.reference).toEqual({ channels: null, eegJson: null });
  });
});
