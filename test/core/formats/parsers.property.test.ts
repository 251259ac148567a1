/**
 * Property-based tests (fast-check, fixed seeds): random and mutated headers, records, TALs and TSVs fed to
 * every parser. The only outcomes allowed are success or a typed ParseResult error whose message starts with
 * the file name — never a thrown exception (issue 2, "Bad input").
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { bytesByteSource } from '../../../src/core/formats/byte-source.ts';
import { iterateEdfSignals, readEdfInfo, readEdfSignals } from '../../../src/core/formats/edf.ts';
import { writeEdf } from '../../../src/core/formats/edf-writer.ts';
import { parseTals } from '../../../src/core/formats/tal.ts';
import { parseChannelsTsv, parseElectrodesTsv, parseEventsTsv, parseTsv } from '../../../src/core/formats/bids.ts';
import { loadRecording } from '../../../src/core/formats/recording-loader.ts';
import type { ParseResult } from '../../../src/core/formats/parse-result.ts';

const CODES = new Set([
  'too-short', 'bad-version', 'bad-number', 'header-size-mismatch', 'no-signals', 'bad-scaling', 'truncated-record',
  'record-size-mismatch', 'bad-tal', 'bad-tsv', 'missing-column', 'row-count-mismatch', 'bad-value', 'bad-shape',
  'unknown-channel', 'unsupported', 'io',
]);

function expectTyped<T>(r: ParseResult<T>, fileName: string): void {
  if (!r.ok) {
    expect(CODES.has(r.error.code)).toBe(true);
    expect(r.error.message.startsWith(`${fileName}: `)).toBe(true);
  }
}

const base = (format: 'EDF+C' | 'BDF+D') =>
  writeEdf({
    format,
    start: '2026-01-01T00:00:00',
    recordDurationSeconds: 0.5,
    recordOnsets: new Float64Array([0, 0.5, 2]),
    channels: [
      { label: 'Fz', unit: 'uV', sampleRate: 8, data: new Float32Array(12).map((_, i) => i - 6) },
      { label: 'ECG', unit: 'mV', sampleRate: 4, data: new Float32Array(6).fill(0.5) },
    ],
    annotations: [{ onset: 0.25, duration: 0.1, label: 'ä' }, { onset: 2.1, duration: 0, label: 'x' }],
  });

async function readAll(bytes: Uint8Array): Promise<void> {
  const src = bytesByteSource(bytes, 'fuzz.edf');
  const info = await readEdfInfo(src);
  expectTyped(info, 'fuzz.edf');
  if (!info.ok) return;
  for (const ch of info.value.channels) {
    const block = await readEdfSignals(src, info.value, { channels: [ch.label], startS: 0.3 });
    expectTyped(block, 'fuzz.edf');
    for await (const c of iterateEdfSignals(src, info.value, { channels: [ch.label] })) expectTyped(c, 'fuzz.edf');
  }
  expectTyped(await readEdfSignals(src, info.value), 'fuzz.edf');
}

describe('EDF/BDF parsers never throw', () => {
  it('on completely random bytes', async () => {
    await fc.assert(fc.asyncProperty(fc.uint8Array({ maxLength: 2000 }), readAll), { seed: 20261202, numRuns: 200 });
  });

  it('on random bytes behind a valid EDF version field and printable numeric-looking header text', async () => {
    const digitText = fc.stringMatching(/^[-+0-9. eE]{0,8}$/);
    await fc.assert(
      fc.asyncProperty(fc.array(digitText, { minLength: 4, maxLength: 4 }), fc.uint8Array({ maxLength: 1500 }), async ([hb, rec, dur, ns], tail) => {
        const head = new Uint8Array(256).fill(0x20);
        head[0] = 0x30;
        const put = (off: number, w: number, t: string) => [...t.slice(0, w)].forEach((ch, i) => (head[off + i] = ch.charCodeAt(0)));
        put(184, 8, hb);
        put(236, 8, rec);
        put(244, 8, dur);
        put(252, 4, ns);
        const b = new Uint8Array(256 + tail.length);
        b.set(head);
        b.set(tail, 256);
        await readAll(b);
      }),
      { seed: 424242, numRuns: 300 },
    );
  });

  it('on valid files with random bytes overwritten (header and records) and random truncation', async () => {
    const files = [base('EDF+C'), base('BDF+D')];
    const printable = fc.integer({ min: 0x20, max: 0x7e });
    await fc.assert(
      fc.asyncProperty(
        fc.integer({ min: 0, max: 1 }),
        fc.array(fc.tuple(fc.nat(), fc.oneof(fc.integer({ min: 0, max: 255 }), printable, fc.constantFrom(0x14, 0x15, 0x00, 0x2b, 0x2d, 0x2e))), { maxLength: 12 }),
        fc.option(fc.nat(), { nil: undefined }),
        async (which, edits, cut) => {
          const b = files[which].slice();
          for (const [pos, v] of edits) b[pos % b.length] = v;
          await readAll(cut === undefined ? b : b.subarray(0, cut % (b.length + 1)));
        },
      ),
      { seed: 7, numRuns: 300 },
    );
  });

  it('on valid headers whose numeric fields are replaced by random short texts', async () => {
    const file = base('EDF+C');
    const ns = 3;
    // numeric fields: header bytes 184, records 236, duration 244, ns 252; per signal pmin..dmax, spr
    const fields: [number, number][] = [[184, 8], [236, 8], [244, 8], [252, 4]];
    for (const b of [104, 112, 120, 128, 216]) for (let j = 0; j < ns; j++) fields.push([256 + b * ns + 8 * j, 8]);
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 0, max: fields.length - 1 }), fc.string({ maxLength: 8 }), async (f, text) => {
        const b = file.slice();
        const [off, width] = fields[f];
        for (let i = 0; i < width; i++) b[off + i] = i < text.length ? text.charCodeAt(i) & 0xff : 0x20;
        await readAll(b);
      }),
      { seed: 99, numRuns: 300 },
    );
  });
});

describe('TAL parser never throws', () => {
  it('on random bytes biased towards the TAL grammar', () => {
    const byte = fc.oneof(fc.constantFrom(0x14, 0x15, 0x00, 0x2b, 0x2d, 0x2e, 0x30, 0x31, 0x39), fc.integer({ min: 0, max: 255 }));
    fc.assert(
      fc.property(fc.array(byte, { maxLength: 80 }), (arr) => {
        const r = parseTals(new Uint8Array(arr), 0, 'fuzz.edf');
        expectTyped(r, 'fuzz.edf');
        if (r.ok) for (const t of r.value) expect(Number.isFinite(t.onset)).toBe(true);
      }),
      { seed: 1, numRuns: 1000 },
    );
  });
});

describe('BIDS parsers never throw', () => {
  const cell = fc.oneof(fc.constantFrom('n/a', '1.5', '-2', 'EEG', 'bad', 'good', '', '"', '"a\tb"', '1e3', 'x'), fc.string({ maxLength: 6 }));
  const line = fc.array(cell, { minLength: 0, maxLength: 6 }).map((cs) => cs.join('\t'));
  const header = fc.subarray(['name', 'type', 'units', 'status', 'x', 'y', 'z', 'onset', 'duration', 'trial_type', 'response_time', 'value']).map((cs) => cs.join('\t'));
  it('on random TSV text with BIDS-like columns', () => {
    fc.assert(
      fc.property(header, fc.array(line, { maxLength: 6 }), fc.constantFrom('\n', '\r\n'), fc.option(fc.string({ maxLength: 30 }), { nil: undefined }), (h, rows, nl, json) => {
        const text = [h, ...rows].join(nl);
        expectTyped(parseTsv(text, 'f.tsv'), 'f.tsv');
        expectTyped(parseChannelsTsv(text, 'f.tsv'), 'f.tsv');
        expectTyped(parseElectrodesTsv(text, 'f.tsv', json), 'f.tsv');
        expectTyped(parseElectrodesTsv(text, 'f.tsv', '{"EEGCoordinateUnits":"cm"}'), 'f.tsv');
        expectTyped(parseEventsTsv(text, 'f.tsv'), 'f.tsv');
      }),
      { seed: 5, numRuns: 500 },
    );
  });

  it('in the loader, with a random channels.tsv beside a valid recording', async () => {
    const rec = base('EDF+C');
    await fc.assert(
      fc.asyncProperty(fc.array(line, { maxLength: 4 }), async (rows) => {
        const files = [bytesByteSource(rec, 'recording.edf'), bytesByteSource(new TextEncoder().encode(['name\ttype\tunits', ...rows].join('\n')), 'channels.tsv')];
        const r = await loadRecording(files);
        if (!r.ok) expect(CODES.has(r.error.code)).toBe(true);
      }),
      { seed: 11, numRuns: 100 },
    );
  });
});

describe('writer → reader round trip (random inputs)', () => {
  it('recovers channel layout, annotations and samples within half a digital step', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom('EDF+C' as const, 'BDF+C' as const),
        fc.array(fc.tuple(fc.integer({ min: 1, max: 4 }), fc.integer({ min: 1, max: 1000 })), { minLength: 1, maxLength: 3 }),
        fc.integer({ min: 1, max: 3 }),
        fc.array(fc.tuple(fc.integer({ min: 0, max: 299 }), fc.string({ maxLength: 12 })), { maxLength: 5 }),
        async (format, chans, records, anns) => {
          const channels = chans.map(([spr, amp], c) => ({
            label: `C${c}`, unit: 'uV', sampleRate: spr,
            data: new Float32Array(spr * records).map((_, i) => Math.fround(amp * Math.sin(i + c))),
          }));
          const annotations = anns.map(([t, label]) => ({ onset: (t / 100) % records, duration: 0, label: label.replace(/[\u0000-\u001f\u007f]/g, ' ') }));
          const bytes = writeEdf({ format, start: '2026-01-01T00:00:00', recordDurationSeconds: 1, channels, annotations });
          const src = bytesByteSource(bytes, 'rt.edf');
          const info = await readEdfInfo(src);
          if (!info.ok) throw new Error(info.error.message);
          expect(info.value.channels.map((c) => c.sampleRate)).toEqual(chans.map(([s]) => s));
          expect(info.value.events.map((e) => e.label).sort()).toEqual(annotations.map((a) => a.label).sort());
          for (const [c, ch] of info.value.channels.entries()) {
            const half = (ch.physicalMax - ch.physicalMin) / (ch.digitalMax - ch.digitalMin) / 2;
            for await (const chunk of iterateEdfSignals(src, info.value, { channels: [ch.label] })) {
              if (!chunk.ok) throw new Error(chunk.error.message);
              chunk.value.data.forEach((v, i) => expect(Math.abs(v - channels[c].data[i])).toBeLessThanOrEqual(half * 1.000001));
            }
          }
        },
      ),
      { seed: 3, numRuns: 60 },
    );
  });
});
