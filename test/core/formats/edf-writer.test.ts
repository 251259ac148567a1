import { describe, expect, it } from 'vitest';
import { bytesByteSource } from '../../../src/core/formats/byte-source.ts';
import { iterateEdfSignals, readEdfInfo } from '../../../src/core/formats/edf.ts';
import { formatEdfNumber, writeEdf, writeEdfChunks, type EdfWriteInput } from '../../../src/core/formats/edf-writer.ts';

/** Deterministic pseudo-noise: 32-bit LCG (Numerical Recipes constants), as checks/README.md uses. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296) * 2 - 1;
}

async function readBack(bytes: Uint8Array, name = 'out.edf') {
  const src = bytesByteSource(bytes, name);
  const info = await readEdfInfo(src);
  if (!info.ok) throw new Error(info.error.message);
  const perChannel = new Map<string, number[]>();
  for (const ch of info.value.channels) {
    const vals: number[] = [];
    for await (const c of iterateEdfSignals(src, info.value, { channels: [ch.label] })) {
      if (!c.ok) throw new Error(c.error.message);
      vals.push(...c.value.data);
    }
    perChannel.set(ch.label, vals);
  }
  return { info: info.value, warnings: info.warnings, perChannel };
}

const ascii = (b: Uint8Array, off: number, len: number) => String.fromCharCode(...b.subarray(off, off + len));

function baseInput(format: EdfWriteInput['format']): EdfWriteInput {
  const next = lcg(42);
  const fz = new Float32Array(256 * 3).map(() => 80 * next());
  const cz = new Float32Array(256 * 3).map(() => 120 * next());
  return {
    format,
    start: '2026-03-04T10:21:00',
    recordDurationSeconds: 1,
    channels: [
      { label: 'Fz', unit: 'uV', sampleRate: 256, data: fz, transducer: 'simulated', prefilter: 'HP:0.5Hz' },
      { label: 'Cz', unit: 'uV', sampleRate: 256, data: cz },
    ],
    annotations: [
      { onset: 0.5, duration: 0.25, label: 'blink' },
      { onset: 2.75, duration: 0, label: 'Reiz ü – 刺激' },
    ],
  };
}

describe('writeEdf → readEdfInfo/readEdfSignals round trip', () => {
  it('round-trips an EDF+C file: header, samples within half a digital step, UTF-8 annotations', async () => {
    const input = baseInput('EDF+C');
    const bytes = writeEdf(input);
    const { info, perChannel } = await readBack(bytes);
    expect(info.format).toBe('EDF+C');
    expect(info.header.start).toBe('2026-03-04T10:21:00');
    expect(info.header.records).toBe(3);
    expect(info.channels.map((c) => [c.label, c.sampleRate, c.unit])).toEqual([['Fz', 256, 'uV'], ['Cz', 256, 'uV']]);
    expect(info.channels[0]).toMatchObject({ transducer: 'simulated', prefilter: 'HP:0.5Hz', digitalMin: -32768, digitalMax: 32767 });
    expect(info.events.map((e) => [e.onset, e.duration, e.label])).toEqual([[0.5, 0.25, 'blink'], [2.75, 0, 'Reiz ü – 刺激']]);
    for (const ch of input.channels) {
      const c = info.channels.find((x) => x.label === ch.label)!;
      // default range = symmetric max-abs, so every sample is inside it
      expect(c.physicalMax).toBe(-c.physicalMin);
      const halfStep = (c.physicalMax - c.physicalMin) / (c.digitalMax - c.digitalMin) / 2;
      const got = perChannel.get(ch.label)!;
      expect(got).toHaveLength(ch.data.length);
      let worst = 0;
      for (let i = 0; i < got.length; i++) worst = Math.max(worst, Math.abs(got[i] - ch.data[i]));
      expect(worst).toBeLessThanOrEqual(halfStep * (1 + 1e-9));
    }
  });

  it('writes the EDF+ anonymous identification unless identity is kept (EDF+ §2.1.3.3–2.1.3.4)', () => {
    const anon = writeEdf({ ...baseInput('EDF+C'), patientId: 'MCH-0234567 F 02-MAY-1951 Haagse_Harry' });
    expect(ascii(anon, 8, 80).trimEnd()).toBe('X X X X');
    expect(ascii(anon, 88, 80).trimEnd()).toBe('Startdate 04-MAR-2026 X X X');
    expect(ascii(anon, 168, 16)).toBe('04.03.2610.21.00');
    expect(ascii(anon, 192, 5)).toBe('EDF+C');
    const kept = writeEdf({ ...baseInput('EDF+C'), patientId: 'P01 X X X', recordingId: 'Startdate 04-MAR-2026 R1 X sim', keepIdentity: true });
    expect(ascii(kept, 8, 80).trimEnd()).toBe('P01 X X X');
    expect(ascii(kept, 88, 80).trimEnd()).toBe('Startdate 04-MAR-2026 R1 X sim');
  });

  it('writes a re-read file to identical bytes (header and records are a fixed point)', async () => {
    const bytes = writeEdf(baseInput('EDF+C'));
    const { info, perChannel } = await readBack(bytes);
    const again = writeEdf({
      format: 'EDF+C',
      start: info.header.start,
      recordDurationSeconds: info.header.recordDurationSeconds,
      channels: info.channels.map((c) => ({
        label: c.label, unit: c.headerUnit, sampleRate: c.sampleRate, physicalMin: c.physicalMin, physicalMax: c.physicalMax,
        digitalMin: c.digitalMin, digitalMax: c.digitalMax, transducer: c.transducer, prefilter: c.prefilter,
        data: Float32Array.from(perChannel.get(c.label)!),
      })),
      annotations: info.events.map((e) => ({ onset: e.onset, duration: e.duration, label: e.label })),
    });
    expect(again).toEqual(bytes);
  });

  it('round-trips an EDF+D file: record onsets, gaps as boundary events, sample times', async () => {
    const input = { ...baseInput('EDF+D'), recordOnsets: new Float64Array([0, 1, 10]) };
    input.annotations = [...input.annotations, { onset: 10.5, duration: 0, label: 'after gap' }];
    const { info } = await readBack(writeEdf(input));
    expect(info.format).toBe('EDF+D');
    expect(Array.from(info.header.recordOnsets)).toEqual([0, 1, 10]);
    expect(info.durationSeconds).toBe(11);
    expect(info.events.filter((e) => e.source === 'boundary')).toEqual([{ onset: 10, duration: 8, label: 'boundary', source: 'boundary' }]);
    expect(info.events.filter((e) => e.source === 'annotation').map((e) => e.label)).toEqual(['blink', 'Reiz ü – 刺激', 'after gap']);
    const src = bytesByteSource(writeEdf(input), 'd.edf');
    const times: number[] = [];
    for await (const c of iterateEdfSignals(src, info, { channels: ['Fz'], startS: 1.997, durationS: 8.011 })) if (c.ok) times.push(...c.value.sampleTimes);
    expect(times[0]).toBe(10); // nothing stored between 2 s and 10 s
    expect(times[times.length - 1]).toBe(10 + 2 / 256);
  });

  it('round-trips a BDF+C file with 24-bit resolution', async () => {
    const input = baseInput('BDF+C');
    const bytes = writeEdf(input);
    expect(Array.from(bytes.subarray(0, 8))).toEqual([0xff, 0x42, 0x49, 0x4f, 0x53, 0x45, 0x4d, 0x49]); // FF "BIOSEMI"
    const { info, perChannel } = await readBack(bytes, 'out.bdf');
    expect(info.format).toBe('BDF+C');
    expect(info.channels[0]).toMatchObject({ digitalMin: -8388608, digitalMax: 8388607 });
    const c = info.channels[0];
    const halfStep = (c.physicalMax - c.physicalMin) / (c.digitalMax - c.digitalMin) / 2;
    const got = perChannel.get('Fz')!;
    for (let i = 0; i < got.length; i++) expect(Math.abs(got[i] - input.channels[0].data[i])).toBeLessThanOrEqual(halfStep * 1.000001);
    expect(info.events).toHaveLength(2);
  });

  it('round-trips a multi-rate file (256 Hz EEG, 64 Hz and 0.5 s records of a 2 Hz channel)', async () => {
    const next = lcg(7);
    const input: EdfWriteInput = {
      format: 'EDF+C',
      start: '1999-12-31T23:59:59',
      recordDurationSeconds: 0.5,
      channels: [
        { label: 'EEG Oz', unit: 'uV', sampleRate: 256, data: new Float32Array(512).map(() => 50 * next()) },
        { label: 'Resp', unit: 'mV', sampleRate: 64, data: new Float32Array(128).map(() => next()) },
        { label: 'Temp', unit: 'degC', sampleRate: 2, physicalMin: 30, physicalMax: 40, data: new Float32Array([36.5, 36.6, 36.7, 36.8]) },
      ],
      annotations: [],
    };
    const { info, perChannel } = await readBack(writeEdf(input));
    expect(info.header.start).toBe('1999-12-31T23:59:59'); // 2-digit year 99 → 1999 (clipping at 1985)
    expect(info.channels.map((c) => [c.label, c.sampleRate, c.unit])).toEqual([['EEG Oz', 256, 'uV'], ['Resp', 64, 'uV'], ['Temp', 2, 'degC']]);
    expect(info.header.records).toBe(4);
    const temp = perChannel.get('Temp')!;
    temp.forEach((v, i) => expect(v).toBeCloseTo(input.channels[2].data[i], 3));
    const resp = perChannel.get('Resp')!; // written in mV, read in µV
    resp.forEach((v, i) => expect(v / 1000).toBeCloseTo(input.channels[1].data[i], 4));
  });

  it('spreads many annotations over the records with enough annotation bytes for the fullest record', async () => {
    const input = baseInput('EDF+C');
    input.annotations = Array.from({ length: 200 }, (_, k) => ({ onset: 2 + k / 200, duration: 0.001, label: `event number ${k} ✓` }));
    const { info } = await readBack(writeEdf(input));
    expect(info.events).toHaveLength(200);
    expect(info.events[199]).toMatchObject({ onset: 2.995, duration: 0.001, label: 'event number 199 ✓' });
  });

  it('streams the same bytes in chunks as it writes in one piece', () => {
    const input = baseInput('BDF+C');
    const parts = [...writeEdfChunks(input)];
    expect(parts.length).toBeGreaterThanOrEqual(2);
    const joined = new Uint8Array(parts.reduce((s, p) => s + p.length, 0));
    let o = 0;
    for (const p of parts) joined.set(p, (o += p.length) - p.length);
    expect(joined).toEqual(writeEdf(input));
  });

  it('formats header numbers into 8 characters, rounding ranges outward', () => {
    expect(formatEdfNumber(3200)).toBe('3200');
    expect(formatEdfNumber(123.456789, 8, 'up')).toBe('123.4568');
    expect(formatEdfNumber(-123.456789, 8, 'down')).toBe('-123.457');
    expect(formatEdfNumber(1 / 3, 8, 'up')).toBe('0.333334');
    expect(formatEdfNumber(1e-9, 8, 'up')).toBe('0.000001');
    expect(() => formatEdfNumber(1e12)).toThrow(RangeError);
  });

  it('refuses a rate that gives a fractional number of samples per record (RangeError naming the channel)', () => {
    const input = baseInput('EDF+C');
    input.channels[0].sampleRate = 250.5;
    expect(() => writeEdf(input)).toThrow(/channel "Fz": sampleRate 250.5 Hz/);
  });
});

describe('annotation signal label (BioSemi BDF+: "BDF Annotations"; Kemp & Olivan 2003: "EDF Annotations")', () => {
  it('labels the BDF+ annotation signal "BDF Annotations" and EDF+ "EDF Annotations"', () => {
    const label = (b: Uint8Array, ns: number) => new TextDecoder().decode(b.subarray(256 + 16 * (ns - 1), 256 + 16 * ns)).trim();
    const bdf = writeEdf(baseInput('BDF+C'));
    const nsB = Number(new TextDecoder().decode(bdf.subarray(252, 256)));
    expect(label(bdf, nsB)).toBe('BDF Annotations');
    const edf = writeEdf(baseInput('EDF+C'));
    const nsE = Number(new TextDecoder().decode(edf.subarray(252, 256)));
    expect(label(edf, nsE)).toBe('EDF Annotations');
  });
});

describe('digital minimum/maximum must be whole numbers in range (Kemp et al. 1992, Clin. Neurophysiol. 82:391; BioSemi BDF 24-bit)', () => {
  for (const bad of ['3.5', '1e-300', '-40000']) {
    it(`refuses digital minimum "${bad}" in EDF with the file, signal and field named`, async () => {
      const bytes = writeEdf(baseInput('EDF+C'));
      const ns = Number(new TextDecoder().decode(bytes.subarray(252, 256)));
      bytes.set(new TextEncoder().encode(bad.padEnd(8, ' ')), 256 + ns * 120);
      const r = await readEdfInfo(bytesByteSource(bytes, 'bad.edf'));
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.error.message).toMatch(/bad\.edf.*signal 1.*digital minimum/);
    });
  }
});
