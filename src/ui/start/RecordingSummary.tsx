/**
 * What was read from a recording: format, duration, rates, electrode positions, mains, reference, the
 * sidecars paired with it, every channel and the events (plain text).
 */
import { useMemo } from 'react';
import type { LoadedRecording } from '../../core/recording.ts';
import { LockColumnChoice, MainsChoice, MainsText } from './EvidenceChoices.tsx';
import { BatchEvidenceNote } from '../study/BatchEvidenceNote.tsx';

/** Event labels with their counts, most frequent first. */
export function eventCounts(recording: Pick<LoadedRecording, 'events'>): { label: string; count: number; firstOnset: number }[] {
  const m = new Map<string, { count: number; firstOnset: number }>();
  for (const e of recording.events) {
    const hit = m.get(e.label);
    if (hit) hit.count++;
    else m.set(e.label, { count: 1, firstOnset: e.onset });
  }
  return [...m.entries()].map(([label, v]) => ({ label, ...v })).sort((a, b) => b.count - a.count || a.label.localeCompare(b.label));
}

/** Whether electrode positions were found for the EEG channels read, and where from. */
export function positionsText(recording: Pick<LoadedRecording, 'signals' | 'channels' | 'positions' | 'sidecars'>): string {
  const types = new Map(recording.channels.map((c) => [c.label, c.type] as const));
  const eeg = recording.signals.labels.map((l, j) => ({ l, j })).filter((x) => (types.get(x.l) ?? 'EEG') === 'EEG');
  const p = recording.positions;
  const found = p ? eeg.filter((x) => Number.isFinite(p[3 * x.j])).length : 0;
  if (eeg.length === 0) return 'no EEG channels';
  const file = recording.sidecars?.find((s) => s.kind === 'electrodes')?.file;
  if (found === 0) return `none found for the ${eeg.length} EEG channels (no maps or dipoles)`;
  const from = file ? `from ${file}` : 'idealised 10-20/10-10 positions by channel name (no electrodes.tsv)';
  return `${found} of ${eeg.length} EEG channels, ${from}`;
}

/** The reference as channels.tsv and *_eeg.json state it, naming each source; "not stated" otherwise. */
export function referenceText(recording: Pick<LoadedRecording, 'reference' | 'sidecars'>): string {
  const r = recording.reference;
  const file = (kind: string) => recording.sidecars?.find((s) => s.kind === kind)?.file ?? kind;
  const parts: string[] = [];
  if (r?.channels) parts.push(`${r.channels} (${file('channels')})`);
  if (r?.eegJson && r.eegJson !== r.channels) parts.push(`${r.eegJson} (${file('eeg')})`);
  else if (r?.eegJson && parts.length) parts[0] = `${r.channels} (${file('channels')}, ${file('eeg')})`;
  return parts.length ? parts.join('; ') : 'not stated (no reference in channels.tsv or EEGReference in *_eeg.json)';
}

const SIDECAR_KIND: Record<string, string> = {
  channels: 'channels',
  events: 'events',
  electrodes: 'electrode positions',
  coordsystem: 'coordinate system',
  eeg: 'recording description',
};

/** The sidecars read with the recording: "sub-01_channels.tsv (channels), …", or "none". */
export function sidecarsText(recording: Pick<LoadedRecording, 'sidecars'>): string {
  const s = recording.sidecars ?? [];
  return s.length ? s.map((x) => `${x.file} (${SIDECAR_KIND[x.kind] ?? x.kind})`).join(', ') : 'none (the recording alone)';
}

export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return 'unknown';
  const m = Math.floor(seconds / 60);
  const s = seconds - 60 * m;
  return m > 0 ? `${m} min ${s.toFixed(0)} s` : `${s.toFixed(1)} s`;
}

export function RecordingSummary({ recording }: { recording: LoadedRecording }) {
  const events = useMemo(() => eventCounts(recording), [recording]);
  const rates = useMemo(() => [...new Set(recording.channels.map((c) => c.sampleRate))].sort((a, b) => b - a), [recording]);
  return (
    <section className="recording-summary" aria-label="Recording" data-testid="recording-summary">
      <h2>{recording.fileName}</h2>
      <dl className="facts">
        <dt>Format</dt><dd data-testid="recording-format">{recording.format}</dd>
        <dt>Duration</dt><dd data-testid="recording-duration">{formatDuration(recording.durationSeconds)} ({recording.durationSeconds.toFixed(2)} s)</dd>
        <dt>Sample rates</dt><dd data-testid="recording-rates">{rates.map((r) => `${r} Hz`).join(', ')}</dd>
        <dt>Channels</dt><dd>{recording.channels.length} ({recording.signals.labels.length} at {recording.signals.sampleRate} Hz read for review)</dd>
        <dt>Start</dt><dd>{recording.header.start}</dd>
        <dt>Electrode positions</dt><dd data-testid="recording-positions">{positionsText(recording)}</dd>
        <dt>Mains</dt><dd data-testid="recording-mains"><MainsText recording={recording} /></dd>
        <dt>Mains for evidence</dt><dd><MainsChoice recording={recording} /></dd>
        <dt>Reference</dt><dd data-testid="recording-reference">{referenceText(recording)}</dd>
        <dt>Sidecars paired</dt><dd data-testid="recording-sidecars">{sidecarsText(recording)}</dd>
        <BatchEvidenceNote />
      </dl>
      {recording.warnings.length > 0 && (
        <ul className="warnings" aria-label="Warnings">
          {recording.warnings.map((w, i) => <li key={i}>⚠ {w}</li>)}
        </ul>
      )}
      <div className="summary-tables">
        <table className="channel-list" data-testid="channel-list">
          <caption>Channels</caption>
          <thead>
            <tr><th scope="col">#</th><th scope="col">Label</th><th scope="col">Type</th><th scope="col">Unit</th><th scope="col">Rate (Hz)</th><th scope="col">Status</th></tr>
          </thead>
          <tbody>
            {recording.channels.map((c, i) => (
              <tr key={`${i}-${c.label}`}>
                <td>{i + 1}</td><td>{c.label}</td><td>{c.type}</td><td>{c.unit}</td><td>{c.sampleRate}</td><td>{c.status}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <table className="event-list" data-testid="event-list">
          <caption>Events ({recording.events.length})</caption>
          <thead>
            <tr><th scope="col">Label</th><th scope="col">Count</th><th scope="col">First onset (s)</th></tr>
          </thead>
          <tbody>
            {events.length === 0 ? (
              <tr><td colSpan={3}>No events.</td></tr>
            ) : (
              events.map((e) => (
                <tr key={e.label}><td>{e.label}</td><td>{e.count}</td><td>{e.firstOnset.toFixed(3)}</td></tr>
              ))
            )}
          </tbody>
        </table>
      </div>
      <LockColumnChoice recording={recording} />
    </section>
  );
}
