import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { bytesByteSource } from '../../../src/core/formats/byte-source.ts';
import { iterateEdfSignals, readEdfInfo, readEdfSignals, voltageScaleToMicrovolts } from '../../../src/core/formats/edf.ts';
import type { RecordingInfo } from '../../../src/core/recording.ts';
import { annotationSignal, le16, le24, specFile, talBytes, type SpecSignal } from './edf-spec-bytes.ts';

const fixture = (name: string) => new Uint8Array(readFileSync(fileURLToPath(new URL(`../../fixtures/formats/${name}`, import.meta.url))));
const layout = JSON.parse(new TextDecoder().decode(fixture('edf_layout.json')));

async function info(bytes: Uint8Array, name = 'recording.edf'): Promise<RecordingInfo> {
  const r = await readEdfInfo(bytesByteSource(bytes, name));
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

async function failure(bytes: Uint8Array, name = 'recording.edf') {
  const r = await readEdfInfo(bytesByteSource(bytes, name));
  if (r.ok) throw new Error('expected a parse error');
  return r.error;
}

/** All float64 samples of the given channels (through the streaming path, which keeps float64). */
async function samples64(bytes: Uint8Array, channels?: string[], startS?: number, durationS?: number) {
  const src = bytesByteSource(bytes, 'recording.edf');
  const inf = await info(bytes);
  const vals: number[][] = [];
  const times: number[] = [];
  for await (const c of iterateEdfSignals(src, inf, { channels, startS, durationS })) {
    if (!c.ok) throw new Error(c.error.message);
    const n = c.value.nSamples;
    c.value.labels.forEach((_, k) => (vals[k] ??= []).push(...c.value.data.subarray(k * n, (k + 1) * n)));
    times.push(...c.value.sampleTimes);
  }
  return { vals, times };
}

const eeg = (label: string, spr: number, extra: Partial<SpecSignal> = {}): SpecSignal => ({
  label, transducer: 'AgAgCl cup', unit: 'uV', pmin: '-3200', pmax: '3200', dmin: '-32768', dmax: '32767',
  prefilter: 'HP:0.1Hz', spr: String(spr), ...extra,
});

describe('readEdfInfo on the reference files (checks/edf_layout.py, docs/methods.md §11)', () => {
  it('reads the EDF+C example header, channel and TAL events exactly as edf_layout.json lists them', async () => {
    const i = await info(fixture('edf_example.edf'), 'edf_example.edf');
    expect(i.format).toBe('EDF+C');
    expect(i.header.headerBytes).toBe(layout.edf.header_bytes);
    expect(i.header.records).toBe(2);
    expect(i.header.recordDurationSeconds).toBe(1);
    expect(i.header.start).toBe('2024-01-01T10:30:00');
    expect(i.durationSeconds).toBe(2);
    expect(i.channels).toHaveLength(1); // the annotation signal is not a channel
    const s = layout.edf.signals[0];
    expect(i.channels[0]).toMatchObject({
      label: s.label, unit: 'uV', headerUnit: s.physical_dimension, sampleRate: 4, transducer: s.transducer,
      prefilter: s.prefiltering, physicalMin: -3200, physicalMax: 3200, digitalMin: -32768, digitalMax: 32767,
      type: 'EEG', status: 'good',
    });
    // docs/methods.md §11: TALs (0, –, [""]), (0.5, 0.2, ["Blink"]), (1, –, [""]), (1.25, –, ["Stim A"])
    expect(i.events).toEqual([
      { onset: 0.5, duration: 0.2, label: 'Blink', source: 'annotation' },
      { onset: 1.25, duration: 0, label: 'Stim A', source: 'annotation' },
    ]);
    expect(Array.from(i.header.recordOnsets)).toEqual([0, 1]);
  });

  it('decodes the EDF+ example samples to the physical values of edf_layout.json (float64 exact, float32 block rounded)', async () => {
    const bytes = fixture('edf_example.edf');
    const expected = [...layout.edf.records[0]['EEG Fz'].physical, ...layout.edf.records[1]['EEG Fz'].physical];
    const { vals, times } = await samples64(bytes);
    expect(vals[0]).toEqual(expected);
    expect(times).toEqual([0, 0.25, 0.5, 0.75, 1, 1.25, 1.5, 1.75]);
    const inf = await info(bytes);
    const block = await readEdfSignals(bytesByteSource(bytes, 'x.edf'), inf);
    expect(block.ok && Array.from(block.value.data)).toEqual(expected.map(Math.fround));
  });

  it('decodes the same values from bytes at an odd memory offset (unaligned path) as from aligned bytes', async () => {
    const bytes = fixture('edf_example.edf');
    const odd = new Uint8Array(bytes.length + 1);
    odd.set(bytes, 1);
    const a = await samples64(bytes);
    const b = await samples64(odd.subarray(1));
    expect(b.vals).toEqual(a.vals);
  });

  it('gives the docs/methods.md §11 scaling check values for −3200…3200 µV over −32768…32767', async () => {
    // docs/methods.md §11: 0 → +0.0488288701 (not 0); 1 → 0.1464866102; 12345 → 1205.6336309; −32768 → −3200; 32767 → 3200
    const digital = [0, 1, 12345, -32768, 32767];
    const bytes = specFile({ records: '1', duration: '1', signals: [eeg('Fz', 5)], data: new Uint8Array(le16(digital)) });
    const { vals } = await samples64(bytes);
    const want = [0.0488288701, 0.1464866102, 1205.6336309, -3200, 3200];
    vals[0].forEach((v, k) => expect(v).toBeCloseTo(want[k], 7));
  });

  it('reads the BDF example: 24-bit extremes and the BioSemi scaling of edf_layout.json', async () => {
    const bytes = fixture('bdf_example.bdf');
    const i = await info(bytes, 'bdf_example.bdf');
    expect(i.format).toBe('BDF');
    expect(i.channels[0]).toMatchObject({ label: 'A1', sampleRate: 8, digitalMin: -8388608, digitalMax: 8388607 });
    const { vals } = await samples64(bytes);
    expect(vals[0]).toEqual(layout.bdf.physical_uV);
    // docs/methods.md §11: BDF digital 0 → −0.4843750289 µV, gain 524287/16777215
    expect(vals[0][0]).toBeCloseTo(-0.4843750289, 9);
  });
});

describe('readEdfInfo on files written byte by byte from the specification', () => {
  it('decodes 24-bit little-endian extremes (BioSemi BDF: −1 = ff ff ff, 8388607 = ff ff 7f, −8388608 = 00 00 80)', async () => {
    const digital = [-1, 8388607, -8388608, 0x123456, -0x123456];
    // identity scaling so physical = digital
    const sig: SpecSignal = { label: 'A1', unit: 'uV', pmin: '-8388608', pmax: '8388607', dmin: '-8388608', dmax: '8388607', spr: '5' };
    const data = new Uint8Array(le24(digital));
    expect(Array.from(data.subarray(0, 9))).toEqual([0xff, 0xff, 0xff, 0xff, 0xff, 0x7f, 0x00, 0x00, 0x80]);
    const bytes = specFile({ bdf: true, reserved: '24BIT', records: '1', duration: '1', signals: [sig], data });
    const { vals } = await samples64(bytes);
    expect(vals[0]).toEqual(digital);
  });

  it('reads a multi-rate EDF+C file: per-signal rates, annotations, and one rate per read', async () => {
    // 2 records of 0.5 s; Fz, Cz at 16 Hz (8 per record), ECG at 4 Hz (2 per record), annotations 30 bytes
    const ann = annotationSignal(15);
    const rec = (r: number) => [
      ...le16([0, 1, 2, 3, 4, 5, 6, 7].map((k) => 100 * r + k)),
      ...le16([0, 1, 2, 3, 4, 5, 6, 7].map((k) => -100 * r - k)),
      ...le16([1000 + r, 2000 + r]),
      ...talBytes(r === 0 ? '+0\x14\x14\x00+0.25\x15\x31\x14Eyes closed\x14\x00' : '+0.5\x14\x14\x00', 30),
    ];
    const bytes = specFile({
      reserved: 'EDF+C', records: '2', duration: '0.5',
      signals: [eeg('EEG Fz', 8), eeg('EEG Cz', 8), eeg('ECG', 2, { unit: 'mV', pmin: '-32.768', pmax: '32.767' }), ann],
      data: new Uint8Array([...rec(0), ...rec(1)]),
    });
    const i = await info(bytes);
    expect(i.format).toBe('EDF+C');
    expect(i.channels.map((c) => [c.label, c.sampleRate])).toEqual([['EEG Fz', 16], ['EEG Cz', 16], ['ECG', 4]]);
    expect(i.channels[2]).toMatchObject({ unit: 'uV', headerUnit: 'mV', physicalMin: -32768, physicalMax: 32767 });
    expect(i.events).toEqual([{ onset: 0.25, duration: 1, label: 'Eyes closed', source: 'annotation' }]);
    expect(i.durationSeconds).toBe(1);
    const ecg = await samples64(bytes, ['ECG']);
    // mV → µV: gain (32.767 + 32.768)/65535 = 0.001 mV = 1 µV per step, so physical µV = digital (to rounding)
    ecg.vals[0].forEach((v, k) => expect(v).toBeCloseTo([1000, 2000, 1001, 2001][k], 6));
    expect(ecg.times).toEqual([0, 0.25, 0.5, 0.75]);
    const bad = await readEdfSignals(bytesByteSource(bytes, 'recording.edf'), i, { channels: ['EEG Fz', 'ECG'] });
    expect(bad.ok).toBe(false);
    if (!bad.ok) {
      expect(bad.error.code).toBe('bad-value');
      expect(bad.error.message).toMatch(/^recording\.edf: .*16 Hz: EEG Fz.*4 Hz: ECG/);
    }
    const all = await readEdfSignals(bytesByteSource(bytes, 'recording.edf'), i);
    expect(all.ok).toBe(false); // no selection = every channel, and the rates differ
  });

  it('selects samples by --start/--duration in seconds (first sample at t ≥ start, last at t < start + duration)', async () => {
    const bytes = specFile({
      reserved: 'EDF+C', records: '2', duration: '1',
      signals: [eeg('Fz', 4, { pmin: '-32768', pmax: '32767' }), annotationSignal(8)],
      data: new Uint8Array([...le16([0, 1, 2, 3]), ...talBytes('+0\x14\x14\x00', 16), ...le16([4, 5, 6, 7]), ...talBytes('+1\x14\x14\x00', 16)]),
    });
    const s = await samples64(bytes, ['fz'], 0.5, 1); // case-insensitive channel name
    expect(s.times).toEqual([0.5, 0.75, 1, 1.25]);
    expect(s.vals[0]).toEqual([2, 3, 4, 5]);
    const block = await readEdfSignals(bytesByteSource(bytes, 'recording.edf'), await info(bytes), { startS: 0.5, durationS: 1 });
    expect(block.ok && Array.from(block.value.sampleTimes ?? [])).toEqual([0.5, 0.75, 1, 1.25]); // window: times given
    const whole = await readEdfSignals(bytesByteSource(bytes, 'recording.edf'), await info(bytes));
    expect(whole.ok && whole.value.sampleTimes).toBeUndefined(); // from the first sample: t = j / fs
    const past = await samples64(bytes, undefined, 5);
    expect(past.times).toEqual([]);
    const unknown = await readEdfSignals(bytesByteSource(bytes, 'recording.edf'), await info(bytes), { channels: ['Oz'] });
    expect(!unknown.ok && unknown.error.code).toBe('unknown-channel');
  });

  it('keeps EDF+D record onsets from the time-keeping TALs and exposes each gap as a boundary event', async () => {
    // EDF+ §2.2.4: record starts of a discontinuous file come from the time-keeping TALs only.
    const recs = [
      [...le16([0, 1]), ...talBytes('+0\x14\x14\x00', 20)],
      [...le16([2, 3]), ...talBytes('+1\x14\x14\x00+1.5\x14Stim\x14\x00', 20)],
      [...le16([4, 5]), ...talBytes('+4.5\x14\x14\x00', 20)],
    ];
    const bytes = specFile({
      reserved: 'EDF+D', records: '3', duration: '1',
      signals: [eeg('Fz', 2, { pmin: '-32768', pmax: '32767' }), annotationSignal(10)],
      data: new Uint8Array(recs.flat()),
    });
    const i = await info(bytes);
    expect(i.format).toBe('EDF+D');
    expect(Array.from(i.header.recordOnsets)).toEqual([0, 1, 4.5]);
    expect(i.durationSeconds).toBe(5.5);
    expect(i.events).toEqual([
      { onset: 1.5, duration: 0, label: 'Stim', source: 'annotation' },
      { onset: 4.5, duration: 2.5, label: 'boundary', source: 'boundary' },
    ]);
    const block = await readEdfSignals(bytesByteSource(bytes, 'recording.edf'), i);
    expect(block.ok).toBe(true);
    if (block.ok) {
      expect(Array.from(block.value.sampleTimes ?? [])).toEqual([0, 0.5, 1, 1.5, 4.5, 5]);
      expect(Array.from(block.value.data)).toEqual([0, 1, 2, 3, 4, 5]);
    }
    const window = await samples64(bytes, undefined, 1.2, 3.5); // 1.2 ≤ t < 4.7
    expect(window.times).toEqual([1.5, 4.5]);
  });

  it('counts the records from the file size when the header says −1 and warns', async () => {
    const bytes = specFile({ records: '-1', duration: '1', signals: [eeg('Fz', 2)], data: new Uint8Array(le16([1, 2, 3, 4, 5, 6])) });
    const r = await readEdfInfo(bytesByteSource(bytes, 'live.edf'));
    expect(r.ok && r.value.header.records).toBe(3);
    expect(r.ok && r.value.format).toBe('EDF');
    expect(r.ok && r.warnings[0]).toMatch(/^live\.edf: .*−1 data records.*counted 3/);
  });

  it('normalises uV, µV (U+00B5, Latin-1 or UTF-8), μV (U+03BC), mV and V to uV', async () => {
    // Unit bytes patched in after building: byte 0xB5 (Latin-1 µ), C2 B5 (UTF-8 µ), CE BC (UTF-8 μ)
    const units: number[][] = [[0x75, 0x56], [0xb5, 0x56], [0xc2, 0xb5, 0x56], [0xce, 0xbc, 0x56], [0x6d, 0x56], [0x56]];
    const ns = units.length;
    const sigs = units.map((_, j) => eeg(`S${j}`, 1, { pmin: '-1', pmax: '1', dmin: '-1', dmax: '1', unit: '' }));
    const bytes = specFile({ records: '1', duration: '1', signals: sigs, data: new Uint8Array(le16(new Array(ns).fill(1))) });
    units.forEach((u, j) => bytes.set(u, 256 + 96 * ns + 8 * j));
    const i = await info(bytes);
    expect(i.channels.map((c) => c.unit)).toEqual(new Array(ns).fill('uV'));
    expect(i.channels.map((c) => c.headerUnit)).toEqual(['uV', 'µV', 'µV', 'μV', 'mV', 'V']);
    expect(i.channels.map((c) => c.physicalMax)).toEqual([1, 1, 1, 1, 1000, 1e6]);
    const block = await readEdfSignals(bytesByteSource(bytes, 'r.edf'), i);
    expect(block.ok && Array.from(block.value.data)).toEqual([1, 1, 1, 1, 1000, 1e6]);
    expect(voltageScaleToMicrovolts('degC')).toBeNull();
  });

  it('reads a BDF+C file with a "BDF Annotations" signal as BDF+C with its events', async () => {
    const sig: SpecSignal = { label: 'A1', unit: 'uV', pmin: '-262144', pmax: '262143', dmin: '-8388608', dmax: '8388607', spr: '2' };
    const annSig = { ...annotationSignal(6), label: 'BDF Annotations', dmin: '-8388608', dmax: '8388607' };
    const bytes = specFile({
      bdf: true, reserved: 'BDF+C', records: '1', duration: '1', signals: [sig, annSig],
      data: new Uint8Array([...le24([8388607, -8388608]), ...talBytes('+0\x14\x14\x00+0.5\x14Ü\x14\x00', 18)]),
    });
    const i = await info(bytes, 'x.bdf');
    expect(i.format).toBe('BDF+C');
    expect(i.events).toEqual([{ onset: 0.5, duration: 0, label: 'Ü', source: 'annotation' }]);
    const { vals } = await samples64(bytes);
    expect(vals[0]).toEqual([262143, -262144]);
  });
});

describe('reading in slices', () => {
  it('never asks the ByteSource for more than one 8 MB batch of records, and scans annotations without reading samples (9 MB file)', async () => {
    // 150 records × 2 signals (30 000 samples + 16-sample annotation signal) × 2 bytes ≈ 9 MB
    const recBytes = 2 * 30000 + 32;
    const data = new Uint8Array(150 * recBytes);
    for (let r = 0; r < 150; r++) data.set(talBytes(`+${r}\x14\x14\x00`, 32), r * recBytes + 60000);
    const bytes = specFile({ reserved: 'EDF+C', records: '150', duration: '1', signals: [eeg('Fz', 30000), annotationSignal(16)], data });
    const reads: number[] = [];
    const inner = bytesByteSource(bytes, 'big.edf');
    const spy = { name: inner.name, size: inner.size, read: (o: number, n: number) => (reads.push(n), inner.read(o, n)) };
    const i = await readEdfInfo(spy);
    expect(i.ok).toBe(true);
    // the annotation scan reads only each record's 32 annotation bytes (plus the 768-byte header)
    const infoReads = reads.splice(0);
    expect(infoReads.reduce((a, b) => a + b, 0)).toBeLessThanOrEqual(768 + 150 * 32);
    const block = i.ok ? await readEdfSignals(spy, i.value) : null;
    expect(block?.ok && block.value.nSamples).toBe(150 * 30000);
    expect(Math.max(...reads)).toBeLessThanOrEqual(8 * 1024 * 1024);
    expect(reads.filter((n) => n > 100_000).length).toBe(2); // 139 + 11 records
  });
});

describe('readEdfInfo on an annotation-only EDF+ file', () => {
  it('accepts record duration 0 when the only signal is "EDF Annotations" (EDF+ §2.2.4) and lists no channels', async () => {
    const bytes = specFile({
      reserved: 'EDF+C', records: '1', duration: '0', signals: [annotationSignal(16)],
      data: new Uint8Array(talBytes('+0\x14\x14\x00+12.5\x15\x33\x14Sleep stage W\x14\x00', 32)),
    });
    const i = await info(bytes);
    expect(i.channels).toEqual([]);
    expect(i.events).toEqual([{ onset: 12.5, duration: 3, label: 'Sleep stage W', source: 'annotation' }]);
  });
});

describe('readEdfInfo on bad input (one typed error each; every message starts with the file name)', () => {
  const good = () => specFile({ records: '1', duration: '1', signals: [eeg('Fz', 2)], data: new Uint8Array(le16([1, 2])) });

  it('reports a truncated data record with the records and bytes the file really holds', async () => {
    // 12 records of 1024 samples × 2 bytes = 2048 bytes; the file holds 11 whole records and 600 bytes
    const bytes = specFile({ records: '12', duration: '1', signals: [eeg('Fz', 1024)], data: new Uint8Array(11 * 2048 + 600) });
    const e = await failure(bytes);
    expect(e.code).toBe('truncated-record');
    expect(e.message).toBe('recording.edf: header says 12 data records of 2048 bytes but the file holds 11 and 600 bytes');
    expect(e.byteOffset).toBe(512 + 11 * 2048);
  });

  it('reports a header byte count that is not 256·(ns+1)', async () => {
    const e = await failure(specFile({ headerBytes: '1024', records: '1', duration: '1', signals: [eeg('Fz', 2)], data: new Uint8Array(4) }));
    expect(e.code).toBe('header-size-mismatch');
    expect(e.message).toMatch(/^recording\.edf: header says it is 1024 bytes but 1 signals need .* = 512 bytes/);
  });

  it('names the field and the signal of a non-numeric header value', async () => {
    const e = await failure(specFile({ records: '1', duration: '1', signals: [eeg('Fz', 2), eeg('Cz', 2, { pmin: 'abc' })], data: new Uint8Array(8) }));
    expect(e.code).toBe('bad-number');
    expect(e.message).toBe('recording.edf: signal 2 ("Cz") physical minimum is "abc", not a number');
    expect(e.byteOffset).toBe(256 + 104 * 2 + 8);
    const e2 = await failure(specFile({ records: 'ten', duration: '1', signals: [eeg('Fz', 2)] }));
    expect(e2.message).toMatch(/^recording\.edf: header field "number of data records" is "ten"/);
  });

  it('refuses physical minimum = physical maximum', async () => {
    const e = await failure(specFile({ records: '1', duration: '1', signals: [eeg('Fz', 2, { pmin: '100', pmax: '100' })], data: new Uint8Array(4) }));
    expect(e.code).toBe('bad-scaling');
    expect(e.message).toMatch(/^recording\.edf: signal 1 \("Fz"\) physical minimum equals physical maximum/);
  });

  it('refuses digital minimum ≥ digital maximum', async () => {
    const e = await failure(specFile({ records: '1', duration: '1', signals: [eeg('Fz', 2, { dmin: '100', dmax: '100' })], data: new Uint8Array(4) }));
    expect(e.code).toBe('bad-scaling');
    expect(e.message).toBe('recording.edf: signal 1 ("Fz") digital minimum 100 is not below digital maximum 100');
  });

  it('refuses a file with zero signals', async () => {
    const e = await failure(specFile({ records: '0', duration: '1', signals: [] }));
    expect(e.code).toBe('no-signals');
    expect(e.message).toMatch(/^recording\.edf: header says the file has 0 signals/);
  });

  it('refuses a file shorter than the 256-byte header, and one shorter than its signal header', async () => {
    const e = await failure(good().subarray(0, 200));
    expect(e.code).toBe('too-short');
    expect(e.message).toBe('recording.edf: file is 200 bytes, shorter than the 256-byte EDF/BDF main header');
    const e2 = await failure(good().subarray(0, 400));
    expect(e2.code).toBe('too-short');
    expect(e2.message).toBe('recording.edf: file is 400 bytes, shorter than its 512-byte header (1 signals)');
    const e3 = await failure(new Uint8Array(0));
    expect(e3.code).toBe('too-short');
  });

  it('refuses a version field that is neither EDF nor BDF', async () => {
    const b = good();
    b.set([0x50, 0x4b, 0x03, 0x04], 0); // a zip file's magic
    const e = await failure(b);
    expect(e.code).toBe('bad-version');
    expect(e.message).toMatch(/^recording\.edf: version field is "PK\?\?/);
  });

  it('names the data record and byte offset of a malformed TAL', async () => {
    const bytes = specFile({
      reserved: 'EDF+C', records: '2', duration: '1',
      signals: [eeg('Fz', 1), annotationSignal(8)],
      data: new Uint8Array([...le16([0]), ...talBytes('+0\x14\x14\x00', 16), ...le16([0]), ...talBytes('+1\x14\x14\x00+x\x14oops\x14\x00', 16)]),
    });
    const e = await failure(bytes);
    expect(e.code).toBe('bad-tal');
    // record 1 starts at 768 + 18; its annotation bytes at + 2; the bad TAL's "x" is 6 bytes further in
    expect(e.byteOffset).toBe(768 + 18 + 2 + 6);
    expect(e.message).toBe(`recording.edf: malformed annotation (TAL) in data record 1 at byte ${768 + 18 + 8}: onset needs digits after the sign, found "x"`);
  });

  it('refuses an EDF+ record whose annotation signal does not start with a time-keeping TAL', async () => {
    const bytes = specFile({
      reserved: 'EDF+C', records: '1', duration: '1', signals: [eeg('Fz', 1), annotationSignal(8)],
      data: new Uint8Array([...le16([0]), ...talBytes('+0\x14Stim\x14\x00', 16)]),
    });
    const e = await failure(bytes);
    expect(e.code).toBe('bad-tal');
    expect(e.message).toMatch(/^recording\.edf: data record 0 does not start with a time-keeping TAL/);
  });

  it('refuses EDF+D records that overlap in time', async () => {
    const bytes = specFile({
      reserved: 'EDF+D', records: '2', duration: '1', signals: [eeg('Fz', 1), annotationSignal(8)],
      data: new Uint8Array([...le16([0]), ...talBytes('+0\x14\x14\x00', 16), ...le16([0]), ...talBytes('+0.5\x14\x14\x00', 16)]),
    });
    const e = await failure(bytes);
    expect(e.code).toBe('bad-tal');
    expect(e.message).toMatch(/^recording\.edf: data record 1 starts at 0\.5 s, before the end of record 0/);
  });
});
