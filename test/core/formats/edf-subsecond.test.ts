/**
 * Sub-second start of an EDF+ file (issue 14 item 7). EDF+ specification [Kemp & Olivan 2003 §2.2.4]: the
 * header's start time holds whole seconds; the onset of the first (time-keeping) TAL of the first data record
 * gives the fraction ("+0.214"), and every TAL onset counts from the header's start time. So the first sample
 * is at header start + first onset, and an annotation at "+1.464" lies 1.25 s after the first sample.
 * The files are built byte by byte from the specification (edf-spec-bytes.ts), not by our writer.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { bytesByteSource } from '../../../src/core/formats/byte-source.ts';
import { readEdfInfo, readEdfSignals } from '../../../src/core/formats/edf.ts';
import { addSecondsToStart } from '../../../src/core/formats/edf-annotations.ts';
import { writeEdf } from '../../../src/core/formats/edf-writer.ts';
import { main } from '../../../src/cli/winnow.ts';
import { memoryIo } from '../../../src/cli/cli-support.ts';
import { annotationSignal, le16, specFile, talBytes } from './edf-spec-bytes.ts';

const dir = mkdtempSync(join(tmpdir(), 'winnow-subsecond-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

// 2 records of 1 s, "Fz" at 4 Hz with identity scaling (physical = digital); the digital value of sample j is
// 100·j, so a sample's value tells its index. Header start 09.15.30; first TAL "+0.214" → first sample at
// 09:15:30.214. Record 1 is stamped "+1.214". "Blink" at "+1.464" is 1.25 s after the first sample (sample 5).
function subsecondFile(time = '09.15.30', first = '+0.214', second = '+1.214', blink = '+1.464'): Uint8Array {
  const fz = { label: 'Fz', unit: 'uV', pmin: '-32768', pmax: '32767', dmin: '-32768', dmax: '32767', spr: '4' };
  return specFile({
    reserved: 'EDF+C', records: '2', duration: '1', time,
    signals: [fz, annotationSignal(16)],
    data: new Uint8Array([
      ...le16([0, 100, 200, 300]), ...talBytes(`${first}\x14\x14\x00${blink}\x150.1\x14Blink\x14\x00`, 32),
      ...le16([400, 500, 600, 700]), ...talBytes(`${second}\x14\x14\x00`, 32),
    ]),
  });
}

describe('EDF+ sub-second start [Kemp & Olivan 2003 §2.2.4]', () => {
  it('reports the start with its fraction and counts event and record times from the first sample', async () => {
    const r = await readEdfInfo(bytesByteSource(subsecondFile(), 'frac.edf'));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.warnings).toEqual([]); // a sub-second first onset is the normal EDF+ form, not a fault
    expect(r.value.header.start).toBe('2026-03-02T09:15:30.214');
    expect(Array.from(r.value.header.recordOnsets)).toEqual([0, 1]);
    expect(r.value.events).toEqual([{ onset: 1.25, duration: 0.1, label: 'Blink', source: 'annotation' }]);
    // events and samples aligned: the sample at the event's time (1.25 s · 4 Hz = index 5) holds 500
    const s = await readEdfSignals(bytesByteSource(subsecondFile(), 'frac.edf'), r.value);
    expect(s.ok).toBe(true);
    if (!s.ok) return;
    expect(s.value.data[Math.round(r.value.events[0].onset * s.value.sampleRate)]).toBe(500);
  });

  it('carries the fraction across midnight and the year end (calendar arithmetic)', () => {
    expect(addSecondsToStart('1999-12-31T23:59:59', 0.5)).toBe('1999-12-31T23:59:59.5');
    expect(addSecondsToStart('1999-12-31T23:59:59', 1.25)).toBe('2000-01-01T00:00:00.25');
    expect(addSecondsToStart('2024-02-28T23:59:59', 1)).toBe('2024-02-29T00:00:00'); // 2024 is a leap year
    expect(addSecondsToStart('2026-03-02T09:15:30', 0)).toBe('2026-03-02T09:15:30');
  });

  it('a first onset of a second or more is reported with a warning, the start still the first sample', async () => {
    const r = await readEdfInfo(bytesByteSource(subsecondFile('09.15.30', '+2.5', '+3.5', '+3.75'), 'late.edf'));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.header.start).toBe('2026-03-02T09:15:32.5');
    expect(r.value.events[0].onset).toBe(1.25);
    expect(r.warnings.join('\n')).toMatch(/^late\.edf: first data record starts at \+2\.5 s/);
  });

  it('`winnow inspect` prints the fractional start and the aligned event onset', async () => {
    const path = join(dir, 'frac.edf');
    writeFileSync(path, subsecondFile());
    const io = memoryIo();
    expect(await main(['inspect', path], io)).toBe(0);
    const j = JSON.parse(io.out);
    expect(j.start).toBe('2026-03-02T09:15:30.214');
    expect(j.events).toEqual([{ onset: 1.25, duration: 0.1, label: 'Blink' }]);
  });

  it('our writer keeps the fraction: header whole second, first time-keeping TAL "+0.214", annotations shifted', async () => {
    const data = new Float32Array([0, 100, 200, 300, 400, 500, 600, 700]);
    const bytes = writeEdf({
      format: 'EDF+C', start: '2026-03-02T09:15:30.214', recordDurationSeconds: 1,
      channels: [{ label: 'Fz', unit: 'uV', sampleRate: 4, physicalMin: -32768, physicalMax: 32767, data }],
      annotations: [{ onset: 1.25, duration: 0, label: 'Blink' }],
    });
    const text = new TextDecoder('latin1').decode(bytes);
    expect(text.slice(176, 184)).toBe('09.15.30');
    const rec0 = 256 * 3;
    expect(text.slice(rec0 + 8, rec0 + 16)).toBe('+0.214\x14\x14');
    expect(text).toContain('+1.464\x14Blink\x14');
    const r = await readEdfInfo(bytesByteSource(bytes, 'ours.edf'));
    expect(r.ok && r.value.header.start).toBe('2026-03-02T09:15:30.214');
    expect(r.ok && r.value.events.map((e) => e.onset)).toEqual([1.25]);
  });
});
