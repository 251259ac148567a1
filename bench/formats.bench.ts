/**
 * Recording-layer speed: EDF+ write, header + annotation scan, and decoding all samples, on a simulated
 * 32-channel, 5-minute, 256 Hz recording (~4.9 MB). Reference: a bare Int16 → Float32 scaling loop over the
 * same samples in the same process (the floor any decoder has to pay). The last row is the way every
 * consumer reads a recording: the recording loader (header, sidecars, main-rate samples, positions).
 */
import { medianMs, type BenchRow } from './bench-types.ts';
import { bytesByteSource } from '../src/core/formats/byte-source.ts';
import { readEdfInfo, readEdfSignals } from '../src/core/formats/edf.ts';
import { writeEdf } from '../src/core/formats/edf-writer.ts';
import { loadRecording } from '../src/core/formats/recording-loader.ts';

export async function bench(): Promise<BenchRow[]> {
  const nCh = 32;
  const fs = 256;
  const seconds = 300;
  const n = fs * seconds;
  let s = 12345;
  const channels = Array.from({ length: nCh }, (_, c) => ({
    label: `E${c + 1}`,
    unit: 'uV',
    sampleRate: fs,
    data: new Float32Array(n).map(() => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32 - 0.5) * 200),
  }));
  const annotations = Array.from({ length: 300 }, (_, k) => ({ onset: k + 0.5, duration: 0, label: `stim ${k}` }));
  const input = { format: 'EDF+C' as const, start: '2026-01-01T00:00:00', recordDurationSeconds: 1, channels, annotations };
  let bytes: Uint8Array = new Uint8Array(0);
  const writeMs = await medianMs(() => void (bytes = writeEdf(input)), 3);
  const src = bytesByteSource(bytes, 'bench.edf');
  const infoRes = await readEdfInfo(src);
  if (!infoRes.ok) throw new Error(infoRes.error.message);
  const info = infoRes.value;
  const infoMs = await medianMs(() => readEdfInfo(src), 3);
  const readMs = await medianMs(() => readEdfSignals(src, info), 3);
  const loadMs = await medianMs(() => loadRecording([src]), 3);
  const raw = new Int16Array(nCh * n);
  const out = new Float32Array(nCh * n);
  const refMs = await medianMs(() => {
    for (let i = 0; i < raw.length; i++) out[i] = 0.1 * raw[i] + 0.05;
  }, 3);
  const mb = (bytes.length / 1e6).toFixed(1);
  return [
    { area: 'formats', case: `writeEdf 32 ch × 5 min × 256 Hz (${mb} MB)`, oursMs: writeMs, referenceMs: null, reference: 'no reference writer here' },
    { area: 'formats', case: 'readEdfInfo (header + 300 TAL records scan)', oursMs: infoMs, referenceMs: null, reference: 'no reference reader here' },
    { area: 'formats', case: 'readEdfSignals all 32 channels', oursMs: readMs, referenceMs: refMs, reference: 'bare Int16→Float32 scaling loop, same sample count' },
    { area: 'formats', case: 'loadRecording (what the workbench and CLI run)', oursMs: loadMs, referenceMs: readMs + infoMs, reference: 'readEdfInfo + readEdfSignals above' },
  ];
}
