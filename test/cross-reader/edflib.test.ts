/**
 * Cross-reader tests (issue 14): every EDF/BDF Winnow writes is re-read by an independent, general-purpose
 * EDF library — EDFlib (Debian package libedf-dev, installed by .ci/run), through test/cross-reader/
 * edflib-harness.c, which this test compiles with gcc into a temporary folder — and compared header field by
 * field and sample by sample; and files written by that library are read by Winnow exactly.
 *
 * Out (Winnow writes, EDFlib reads): `winnow simulate` (EDF+C), `winnow clean` of an EDF, an EDF+, a BDF and a
 * BDF+ input (EDF in → EDF+ out, BDF in → BDF+ out), and the browser export's writer in core
 * (cleanedEdfInput + writeEdfChunks, the calls workers/recording.worker.ts makes) for EDF+ and BDF+.
 * In (EDFlib writes, Winnow reads): plain EDF, EDF+, plain BDF, BDF+, with extreme digital values, two
 * sampling rates, annotations and a sub-second start time. EDFlib 1.23 writes only EDF+/BDF+; the plain files
 * are its EDF+/BDF+ files with the annotation signal taken out by the harness, and EDFlib reads them back.
 *
 * Sources of the expected values: the EDF specification [Kemp et al. 1992] for the header fields and the
 * physical = physMin + (digital − digMin)·(physMax − physMin)/(digMax − digMin) scaling; EDF+ [Kemp & Olivan
 * 2003] for annotations and the sub-second start; BioSemi for BDF. "Within one digital step": the writer
 * rounds to the nearest digital value (half a step), and two readers may evaluate the scaling in a different
 * order (EDFlib: bitvalue·(digital + offset)), so a physical value may differ by rounding, never by a step.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { bytesByteSource } from '../../src/core/formats/byte-source.ts';
import { iterateEdfSignals, readEdfInfo, readEdfSignals, voltageScaleToMicrovolts } from '../../src/core/formats/edf.ts';
import { writeEdfChunks } from '../../src/core/formats/edf-writer.ts';
import { cleanedEdfInput } from '../../src/core/review/clean.ts';
import { buildDecisionsFile, formatDecisionsJson } from '../../src/core/review/decisions-file.ts';
import type { RecordingInfo, SignalBlock } from '../../src/core/recording.ts';
import { compileHarness, libRead as libReadWith, type LibFile } from './edflib-harness.ts';

const repo = fileURLToPath(new URL('../../', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'winnow-edflib-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const harness = compileHarness(dir);
if (!harness.exe) console.warn(`cross-reader tests skipped: ${harness.reason}`);
const libRead = (path: string): LibFile => libReadWith(harness.exe!, path);

const FILETYPE = { EDF: 0, 'EDF+C': 1, BDF: 2, 'BDF+C': 3 } as const;

interface WinnowView {
  info: RecordingInfo;
  /** label → float64 physical values (normalised units) */
  values: Map<string, Float64Array>;
}

async function winnowRead(path: string): Promise<WinnowView> {
  const bytes = new Uint8Array(readFileSync(path));
  const res = await readEdfInfo(bytesByteSource(bytes, path));
  if (!res.ok) throw new Error(res.error.message);
  const info = res.value;
  const values = new Map<string, Float64Array>();
  for (const rate of new Set(info.channels.map((c) => c.sampleRate))) {
    const labels = info.channels.filter((c) => c.sampleRate === rate).map((c) => c.label);
    const parts: Float64Array[][] = labels.map(() => []);
    for await (const chunk of iterateEdfSignals(bytesByteSource(bytes, path), info, { channels: labels })) {
      if (!chunk.ok) throw new Error(chunk.error.message);
      const n = chunk.value.nSamples;
      labels.forEach((_, k) => parts[k].push(chunk.value.data.slice(k * n, (k + 1) * n)));
    }
    labels.forEach((l, k) => {
      const total = parts[k].reduce((s, p) => s + p.length, 0);
      const out = new Float64Array(total);
      let o = 0;
      for (const p of parts[k]) (out.set(p, o), (o += p.length));
      values.set(l, out);
    });
  }
  return { info, values };
}

/** Header fields: the library's and Winnow's readings of one file agree field by field [Kemp et al. 1992 §2]. */
function expectSameHeader(lib: LibFile, w: WinnowView): void {
  const { info } = w;
  expect(lib.filetype).toBe(FILETYPE[info.format as keyof typeof FILETYPE]);
  expect(lib.edfsignals).toBe(info.channels.length); // annotation signals are not data signals in either reader
  expect(lib.datarecordsInFile).toBe(info.header.records);
  expect(lib.datarecordDuration).toBe(Math.round(info.header.recordDurationSeconds * 1e7));
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2})(?:\.(\d+))?$/.exec(info.header.start)!;
  expect(lib.startDate).toEqual([+m[1], +m[2], +m[3]]);
  expect(lib.startTime).toEqual([+m[4], +m[5], +m[6]]);
  expect(lib.startSubsecond).toBe(m[7] ? Math.round(Number(`0.${m[7]}`) * 1e7) : 0);
  lib.signals.forEach((s, j) => {
    const c = info.channels[j];
    expect(s.label.trim()).toBe(c.label);
    expect(s.physdimension.trim()).toBe(c.headerUnit);
    expect(s.prefilter.trim()).toBe(c.prefilter);
    expect(s.transducer.trim()).toBe(c.transducer);
    const uf = voltageScaleToMicrovolts(c.headerUnit) ?? 1;
    expect(s.physMin * uf).toBeCloseTo(c.physicalMin, 9);
    expect(s.physMax * uf).toBeCloseTo(c.physicalMax, 9);
    expect(s.digMin).toBe(c.digitalMin);
    expect(s.digMax).toBe(c.digitalMax);
    expect(s.smpInDatarecord).toBe(c.samplesPerRecord);
    expect(s.smpInFile).toBe(c.samplesPerRecord * info.header.records);
  });
  // annotations: EDFlib counts onsets from the first sample too (it subtracts the sub-second start)
  const events = info.events.filter((e) => e.source === 'annotation');
  expect(lib.annotations.map((a) => a.text)).toEqual(events.map((e) => e.label));
  lib.annotations.forEach((a, k) => {
    expect(Math.abs(a.onset / 1e7 - events[k].onset)).toBeLessThan(1e-7);
    expect(a.duration < 0 ? 0 : a.duration / 1e7).toBeCloseTo(events[k].duration, 7);
  });
}

/**
 * Samples: the same digital value in both readers, and physical values within one digital step (EDF scaling,
 * Kemp et al. 1992). Returns the largest difference in steps.
 */
function expectSameSamples(lib: LibFile, w: WinnowView): number {
  let worst = 0;
  lib.signals.forEach((s, j) => {
    const c = w.info.channels[j];
    const uf = voltageScaleToMicrovolts(c.headerUnit) ?? 1;
    const v = w.values.get(c.label)!;
    expect(v.length).toBe(s.smpInFile);
    const step = (s.physMax - s.physMin) / (s.digMax - s.digMin);
    for (let k = 0; k < v.length; k++) {
      const phys = v[k] / uf;
      const digital = Math.round((phys - s.physMin) / step + s.digMin);
      if (digital !== s.digital[k]) expect(`${c.label}[${k}] digital ${digital}`).toBe(`${c.label}[${k}] digital ${s.digital[k]}`);
      const d = Math.abs(phys - s.physical[k]) / step;
      if (d > worst) worst = d;
    }
  });
  expect(worst).toBeLessThan(1);
  return worst;
}

/** Compares the library's physical samples with the values Winnow was asked to write: within one step. */
function expectWritten(lib: LibFile, channels: { label: string; data: ArrayLike<number> }[]): number {
  let worst = 0;
  channels.forEach((c, j) => {
    const s = lib.signals[j];
    expect(s.label.trim()).toBe(c.label);
    const step = (s.physMax - s.physMin) / (s.digMax - s.digMin);
    for (let k = 0; k < c.data.length; k++) {
      const d = Math.abs(s.physical[k] - c.data[k]) / step;
      if (d > worst) worst = d;
    }
  });
  expect(worst).toBeLessThanOrEqual(1);
  return worst;
}

function winnow(args: string[]): string {
  const r = spawnSync(process.execPath, [join(repo, 'bin/winnow.mjs'), ...args], { encoding: 'utf8', cwd: repo, maxBuffer: 1 << 28 });
  if (r.status !== 0) throw new Error(`winnow ${args[0]} failed (${r.status}): ${r.stderr}`);
  return r.stdout;
}

const sha = (b: Uint8Array | string) => createHash('sha256').update(b).digest('hex');

/** Deterministic pseudo-random numbers in [0, 1) (Park–Miller minimal standard generator). */
function lcg(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 48271) % 2147483647) / 2147483647;
}

interface LibSpecSignal {
  label: string;
  smp: number;
  physmin: number;
  physmax: number;
  digmin: number;
  digmax: number;
  unit: string;
  prefilter?: string;
  transducer?: string;
}

/**
 * A file written by EDFlib: `records` records of 1 s; signal values are digital, generated to span the whole
 * digital range (both extremes included) from mixed sources so that an ICA finds components.
 */
function libWrite(name: string, filetype: 0 | 1 | 2 | 3, signals: LibSpecSignal[], records: number, opts: { subsecond?: number; annotations?: [number, number, string][] } = {}) {
  const rnd = lcg(7 + filetype);
  const digital: number[][] = signals.map(() => []);
  const n0 = signals[0].smp * records;
  const sources = [0, 1, 2].map((q) => Array.from({ length: n0 }, (_, t) => (q === 0 ? Math.sin(2 * Math.PI * 3 * t / signals[0].smp) : q === 1 ? Math.sign(Math.sin(2 * Math.PI * 0.7 * t / signals[0].smp)) : 2 * rnd() - 1)));
  signals.forEach((s, j) => {
    const n = s.smp * records;
    const mid = (s.digmax + s.digmin) / 2;
    const half = (s.digmax - s.digmin) / 2;
    for (let t = 0; t < n; t++) {
      const tt = Math.floor((t * n0) / n);
      const x = (0.5 * sources[0][tt] * Math.cos(j) + 0.3 * sources[1][tt] * Math.sin(j + 1) + 0.2 * sources[2][tt]) * (j % 2 ? 1 : -1);
      digital[j].push(Math.max(s.digmin, Math.min(s.digmax, Math.round(mid + half * x))) + 0); // + 0: no −0
    }
    digital[j][1] = s.digmin; // the format's extremes are kept [Kemp et al. 1992; BioSemi]
    digital[j][2] = s.digmax;
  });
  let spec = `filetype ${filetype === 0 || filetype === 2 ? filetype + 1 : filetype}\nsignals ${signals.length}\nrecords ${records}\nduration10us 100000\nstart 2026 3 2 9 15 30\n`;
  if (opts.subsecond) spec += `subsecond ${opts.subsecond}\n`;
  if (filetype === 1 || filetype === 3) spec += 'patientname Anon_Participant\nrecordingadditional cross-reader test\n';
  for (const s of signals) {
    spec += `signal\nlabel ${s.label}\nsmp ${s.smp}\nphysmin ${s.physmin}\nphysmax ${s.physmax}\ndigmin ${s.digmin}\ndigmax ${s.digmax}\nunit ${s.unit}\n`;
    if (s.prefilter) spec += `prefilter ${s.prefilter}\n`;
    if (s.transducer) spec += `transducer ${s.transducer}\n`;
  }
  for (const [on, dur, text] of opts.annotations ?? []) spec += `annotation ${on} ${dur} ${text}\n`;
  spec += 'data\n';
  for (let r = 0; r < records; r++) for (let j = 0; j < signals.length; j++) spec += digital[j].slice(r * signals[j].smp, (r + 1) * signals[j].smp).join(' ') + '\n';
  const specPath = join(dir, `${name}.spec`);
  const out = join(dir, name);
  writeFileSync(specPath, spec);
  const plain = filetype === 0 || filetype === 2;
  const r = spawnSync(harness.exe!, ['write', specPath, plain ? `${out}.plus` : out], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`EDFlib could not write ${name}: ${r.stderr}`);
  if (plain) {
    // EDFlib writes only EDF+/BDF+; the plain file is its EDF+ file without the annotation signal (harness)
    const p = spawnSync(harness.exe!, ['plain', `${out}.plus`, out], { encoding: 'utf8' });
    if (p.status !== 0) throw new Error(`harness could not derive plain ${name}: ${p.stderr}`);
  }
  return { path: out, digital };
}

const eegSignals = (bdf: boolean): LibSpecSignal[] => {
  const [dmin, dmax] = bdf ? [-8388608, 8388607] : [-32768, 32767];
  return [
    { label: 'Fz', smp: 128, physmin: -3276.8, physmax: 3276.7, digmin: dmin, digmax: dmax, unit: 'uV', prefilter: 'HP:0.1Hz LP:70Hz', transducer: 'AgAgCl cup' },
    { label: 'Cz', smp: 128, physmin: -500, physmax: 500, digmin: dmin + 8, digmax: dmax - 8, unit: 'uV', prefilter: 'HP:0.1Hz LP:70Hz', transducer: 'AgAgCl cup' },
    { label: 'Pz', smp: 128, physmin: -1.5, physmax: 2.5, digmin: dmin, digmax: dmax, unit: 'mV' },
    { label: 'Oz', smp: 128, physmin: -200, physmax: 200, digmin: -2048, digmax: 2047, unit: 'uV' },
    { label: 'Resp', smp: 16, physmin: -10, physmax: 10, digmin: dmin, digmax: dmax, unit: 'mV' },
  ];
};

const CASES = [
  { name: 'lib-plain.edf', filetype: 0, bdf: false, format: 'EDF' },
  { name: 'lib-plus.edf', filetype: 1, bdf: false, format: 'EDF+C' },
  { name: 'lib-plain.bdf', filetype: 2, bdf: true, format: 'BDF' },
  { name: 'lib-plus.bdf', filetype: 3, bdf: true, format: 'BDF+C' },
] as const;

// EDFlib's writer takes onsets in units of 100 µs: 1.25 s, 2.5 s (0.1 s long), 3.0001 s
const ANNOTATIONS: [number, number, string][] = [[12500, -1, 'Stim A'], [25000, 1000, 'Blink'], [30001, -1, 'Tür zu']];

describe.skipIf(!harness.exe)(`cross-reader: EDFlib (libedf-dev) re-reads what Winnow writes, Winnow reads what EDFlib writes`, () => {
  it('the harness runs against the installed EDFlib (version stated)', () => {
    const r = spawnSync(harness.exe!, ['version'], { encoding: 'utf8' });
    expect(r.status).toBe(0);
    expect(Number(r.stdout)).toBeGreaterThanOrEqual(100); // 123 = EDFlib 1.23 (Debian libedf-dev 1.23-1) when written
  });

  describe('in: files written by EDFlib are read by Winnow exactly', () => {
    for (const c of CASES) {
      it(`${c.format}: header, rates, start, annotations and every digital value`, async () => {
        const plus = c.filetype === 1 || c.filetype === 3;
        const f = libWrite(c.name, c.filetype, eegSignals(c.bdf), 8, plus ? { subsecond: 2140000, annotations: ANNOTATIONS } : {});
        const lib = libRead(f.path);
        expect(lib.filetype).toBe(c.filetype); // EDFlib itself takes the file as EDF, EDF+, BDF or BDF+
        const w = await winnowRead(f.path);
        expect(w.info.format).toBe(c.format);
        expect(w.info.header.start).toBe(plus ? '2026-03-02T09:15:30.214' : '2026-03-02T09:15:30');
        expect(w.info.channels.map((ch) => [ch.label, ch.sampleRate])).toEqual([['Fz', 128], ['Cz', 128], ['Pz', 128], ['Oz', 128], ['Resp', 16]]);
        if (plus)
          expect(w.info.events.map((e) => [e.onset, e.duration, e.label])).toEqual([[1.25, 0, 'Stim A'], [2.5, 0.1, 'Blink'], [3.0001, 0, 'Tür zu']]);
        else expect(w.info.events).toEqual([]);
        expectSameHeader(lib, w);
        // exact: Winnow's physical value maps back to the very digital value EDFlib wrote
        lib.signals.forEach((s, j) => expect(s.digital).toEqual(f.digital[j]));
        expectSameSamples(lib, w);
        // and the physical values agree with EDFlib's to rounding (a millionth of a step; the two evaluation orders differ in the last bits)
        lib.signals.forEach((s, j) => {
          const v = w.values.get(s.label.trim())!;
          const uf = voltageScaleToMicrovolts(s.physdimension.trim()) ?? 1;
          const step = (s.physMax - s.physMin) / (s.digMax - s.digMin);
          for (let k = 0; k < v.length; k++) if (Math.abs(v[k] / uf - s.physical[k]) > 1e-6 * step) expect(v[k] / uf).toBe(s.physical[k]);
        });
      });
    }
  });

  describe('out: EDFlib re-reads every file Winnow writes', () => {
    it('winnow simulate: recording.edf and neural.edf (EDF+C), header field by field, sample by sample', async () => {
      const out = join(dir, 'sim');
      winnow(['simulate', '--out', out, '--minutes', '0.1', '--seed', '3']);
      for (const name of ['recording.edf', 'neural.edf']) {
        const lib = libRead(join(out, name));
        const w = await winnowRead(join(out, name));
        expect(lib.filetype).toBe(1);
        expect(lib.edfsignals).toBe(32);
        expect(lib.annotationsInFile).toBeGreaterThan(0);
        expectSameHeader(lib, w);
        expectSameSamples(lib, w);
      }
    });

    for (const c of CASES) {
      it(`winnow clean of ${c.format} (${c.bdf ? 'BDF in, BDF+ out' : 'EDF in, EDF+ out'}): EDFlib reads the cleaned file`, async () => {
        const plus = c.filetype === 1 || c.filetype === 3;
        const input = libWrite(`clean-in-${c.name}`, c.filetype, eegSignals(c.bdf), 8, plus ? { annotations: ANNOTATIONS } : {});
        const dec = join(dir, `clean-${c.name}.decomposition.json`);
        winnow(['decompose', input.path, '--out', dec]);
        const decText = readFileSync(dec, 'utf8');
        const nComponents = (JSON.parse(decText) as { mixing: unknown[][] }).mixing[0].length;
        const decisions = buildDecisionsFile({
          aim: 'erp', reviewer: 'cross-reader', createdAt: '2026-12-02T00:00:00Z', software: 'winnow test',
          recordingSha256: sha(readFileSync(input.path)), decompositionSha256: sha(decText), nComponents,
          decisions: { 1: { verdict: 'remove', reason: 'blink', note: '' } },
        });
        const decisionsPath = join(dir, `clean-${c.name}.decisions.json`);
        writeFileSync(decisionsPath, formatDecisionsJson(decisions));
        const cleaned = join(dir, `cleaned-${c.name}`);
        winnow(['clean', input.path, dec, decisionsPath, '--out', cleaned]);
        const lib = libRead(cleaned);
        const w = await winnowRead(cleaned);
        expect(w.info.format).toBe(c.bdf ? 'BDF+C' : 'EDF+C');
        expect(lib.filetype).toBe(c.bdf ? 3 : 1);
        expect(lib.signals.map((s) => s.label.trim())).toEqual(['Fz', 'Cz', 'Pz', 'Oz', 'Resp']); // no bogus annotation channel
        expect(lib.annotations.map((a) => a.text)).toEqual(plus ? ['Stim A', 'Blink', 'Tür zu'] : []);
        expectSameHeader(lib, w);
        expectSameSamples(lib, w);
        // the channel at the other rate is not cleaned: EDFlib reads back the digital values it wrote
        expect(lib.signals[4].digital).toEqual(input.digital[4]);
      });
    }

    for (const family of ['EDF', 'BDF'] as const) {
      it(`the browser export's writer (cleanedEdfInput + writeEdfChunks) for ${family}+: EDFlib reads what it was given`, async () => {
        const input = libWrite(`export-in-${family}`, family === 'BDF' ? 3 : 1, eegSignals(family === 'BDF'), 4, { subsecond: 5000000, annotations: ANNOTATIONS.slice(0, 2) });
        const bytes = new Uint8Array(readFileSync(input.path));
        const infoRes = await readEdfInfo(bytesByteSource(bytes, 'in'));
        if (!infoRes.ok) throw new Error(infoRes.error.message);
        const info = infoRes.value;
        const blocks: SignalBlock[] = [];
        for (const labels of [['Fz', 'Cz', 'Pz', 'Oz'], ['Resp']]) {
          const r = await readEdfSignals(bytesByteSource(bytes, 'in'), info, { channels: labels });
          if (!r.ok) throw new Error(r.error.message);
          blocks.push(r.value);
        }
        // stand-in for the cleaned samples: Fz and Cz changed (so their ranges are refitted), Pz/Oz kept
        const main = blocks[0];
        const n = main.nSamples;
        const cleanedData = Float32Array.from(main.data, (v, i) => (i < 2 * n ? 0.5 * v + 3 * Math.sin(i / 7) : v));
        const cleanedBlocks = [{ ...main, data: cleanedData }, blocks[1]];
        const writeInput = cleanedEdfInput(info, cleanedBlocks, new Set(['fz', 'cz']), family, false);
        const out = join(dir, `export.${family.toLowerCase()}`);
        writeFileSync(out, Buffer.concat([...writeEdfChunks(writeInput)]));
        const lib = libRead(out);
        const w = await winnowRead(out);
        expect(lib.filetype).toBe(family === 'BDF' ? 3 : 1);
        expect(lib.startSubsecond).toBe(5000000); // the 0.5 s start fraction survives the export
        expectSameHeader(lib, w);
        expectSameSamples(lib, w);
        // values EDFlib reads are the values the export was given, to within one digital step; mV channels
        // are written in µV (Winnow's normalised unit), so compare in µV
        const worst = expectWritten(
          { ...lib, signals: lib.signals.map((s) => ({ ...s, physical: s.physical.map((v) => v * (voltageScaleToMicrovolts(s.physdimension.trim()) ?? 1)), physMin: s.physMin * (voltageScaleToMicrovolts(s.physdimension.trim()) ?? 1), physMax: s.physMax * (voltageScaleToMicrovolts(s.physdimension.trim()) ?? 1) })) },
          writeInput.channels.map((ch) => ({ label: ch.label, data: ch.data })),
        );
        expect(worst).toBeLessThanOrEqual(0.5 + 1e-6); // nearest rounding: half a step at most
      });
    }
  });
});
