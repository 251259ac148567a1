import { beforeAll, describe, expect, it } from 'vitest';
import { parseChannelsTsv, parseElectrodesTsv, parseEventsTsv } from '../../../src/core/formats/bids.ts';
import { bytesByteSource } from '../../../src/core/formats/byte-source.ts';
import { readEdfInfo, readEdfSignals } from '../../../src/core/formats/edf.ts';
import { simulateSession } from '../../../src/core/simulate/simulate.ts';
import {
  channelsTsv,
  coordsystemJson,
  eegJson,
  electrodesTsv,
  eventsTsv,
  formatSeconds,
  eventsJson,
  sessionEdf,
  sessionSidecars,
  sessionTruthFiles,
} from '../../../src/core/simulate/session-files.ts';
import type { SimulatedSession } from '../../../src/core/simulate/truth.ts';
import { hz } from '../../../src/core/units.ts';

let s: SimulatedSession;
beforeAll(() => {
  s = simulateSession({ seed: 3, channels: 32, minutes: 0.5, rate: hz(250) });
});

async function readBack(bytes: Uint8Array, name: string) {
  const src = bytesByteSource(bytes, name);
  const info = await readEdfInfo(src);
  if (!info.ok) throw new Error(info.error.message);
  const sig = await readEdfSignals(src, info.value);
  if (!sig.ok) throw new Error(sig.error.message);
  return { info: info.value, signals: sig.value };
}

describe('simulated session files', () => {
  it('writes an EDF+C whose samples read back within half a digital step (EDF scaling, docs/methods.md §11)', async () => {
    const { info, signals } = await readBack(sessionEdf(s, 'data'), 'recording.edf');
    expect(info.format).toBe('EDF+C');
    expect(signals.labels).toEqual(s.labels);
    expect(signals.sampleRate).toBe(250);
    expect(signals.nSamples).toBe(s.nSamples);
    const n = s.nSamples;
    for (let c = 0; c < s.labels.length; c++) {
      const ch = info.channels[c];
      const step = (ch.physicalMax - ch.physicalMin) / (ch.digitalMax - ch.digitalMin);
      let worst = 0;
      for (let t = 0; t < n; t++) worst = Math.max(worst, Math.abs(signals.data[c * n + t] - s.data[c * n + t]));
      // Half a step of quantisation plus float32 rounding of the decoded value (2^-24 relative, a few times).
      expect(worst).toBeLessThanOrEqual(0.5 * step + 4 * 2 ** -24 * ch.physicalMax);
    }
  });

  it('writes the neural-only back-projection with the same layout', async () => {
    const { info, signals } = await readBack(sessionEdf(s, 'neural'), 'neural.edf');
    expect(signals.labels).toEqual(s.labels);
    expect(signals.nSamples).toBe(s.nSamples);
    const c = s.labels.indexOf('Oz');
    const step = (info.channels[c].physicalMax - info.channels[c].physicalMin) / 65535;
    const tol = 0.5 * step + 4 * 2 ** -24 * info.channels[c].physicalMax;
    for (let t = 0; t < 500; t++) expect(Math.abs(signals.data[c * s.nSamples + t] - s.neuralOnly[c * s.nSamples + t])).toBeLessThanOrEqual(tol);
  });

  it('writes the same events in the EDF+ annotations as in events.tsv', async () => {
    const { info } = await readBack(sessionEdf(s, 'data'), 'recording.edf');
    const fromEdf = info.events.filter((e) => e.label !== '').map((e) => [e.onset, e.label] as const);
    const tsv = parseEventsTsv(eventsTsv(s), 'events.tsv');
    if (!tsv.ok) throw new Error(tsv.error.message);
    const fromTsv = tsv.value.map((e) => [e.onset, e.label] as const);
    expect(fromEdf.length).toBe(s.events.length);
    expect(fromTsv.length).toBe(s.events.length);
    fromEdf.forEach(([onset, label], i) => {
      expect(label).toBe(fromTsv[i][1]);
      expect(Math.abs(onset - fromTsv[i][0])).toBeLessThan(1e-9);
      expect(Math.abs(onset - s.events[i].onset)).toBeLessThan(1e-9);
    });
  });

  it('writes channels.tsv and electrodes.tsv that the BIDS readers accept, in data order and mm', () => {
    const ch = parseChannelsTsv(channelsTsv(s), 'channels.tsv');
    if (!ch.ok) throw new Error(ch.error.message);
    expect(ch.value.map((r) => r.name)).toEqual(s.labels);
    expect(ch.value.every((r) => r.type === 'EEG')).toBe(true);
    const el = parseElectrodesTsv(electrodesTsv(s), 'electrodes.tsv', coordsystemJson(s));
    if (!el.ok) throw new Error(el.error.message);
    expect(el.warnings).toEqual([]);
    expect(el.value.units).toBe('mm');
    expect(el.value.names).toEqual(s.labels);
    el.value.positionsMm.forEach((v, i) => expect(Math.abs(v - s.electrodesMm[i])).toBeLessThan(1e-4));
    const coords = JSON.parse(coordsystemJson(s));
    expect(coords.EEGCoordinateUnits).toBe('mm');
    expect(coords.EEGCoordinateSystem).toBe('Other');
    expect(typeof coords.EEGCoordinateSystemDescription).toBe('string');
  });

  it('writes *_eeg.json with the fields BIDS requires (TaskName, EEGReference, SamplingFrequency, PowerLineFrequency, SoftwareFilters)', () => {
    const j = JSON.parse(eegJson(s));
    for (const key of ['TaskName', 'EEGReference', 'SamplingFrequency', 'PowerLineFrequency', 'SoftwareFilters']) expect(j).toHaveProperty(key);
    expect(j.PowerLineFrequency).toBe(50);
    expect(j.SamplingFrequency).toBe(250);
  });

  it('writes truth files from which data = mixing · activations + noise is recomputed exactly', () => {
    const files = sessionTruthFiles(s, { activations: 'activations.f32', sensorNoise: 'sensor-noise.f32' });
    const truth = JSON.parse(files.truthJson);
    expect(truth.format).toBe('winnow-simulation-truth');
    expect(truth.channels).toEqual(s.labels);
    const bytes = files.activations.slice(); // own, aligned copy
    const acts = new Float32Array(bytes.buffer, 0, bytes.length / 4);
    const noise = new Float32Array(files.sensorNoise.slice().buffer);
    const n = truth.nSamples;
    let mismatches = 0;
    for (const c of [0, 13, 31]) {
      for (let t = 0; t < n; t++) {
        let acc = 0;
        truth.sources.forEach((src: { map: number[]; activation: { byteOffset: number } }) => {
          acc += src.map[c] * acts[src.activation.byteOffset / 4 + t];
        });
        if (Math.fround(acc + noise[c * n + t]) !== s.data[c * n + t]) mismatches++;
      }
    }
    expect(mismatches).toBe(0);
  });

  it('formats seconds without exponent or trailing zeros', () => {
    expect(formatSeconds(2)).toBe('2');
    expect(formatSeconds(2.5)).toBe('2.5');
    expect(formatSeconds(1 / 256)).toBe('0.00390625');
    expect(formatSeconds(1e-10)).toBe('0');
  });
});

describe('sessionSidecars', () => {
  it('lists the six BIDS sidecars with their writers\' text; only electrodes and coordsystem lack the task entity', () => {
    // BIDS specification v1.11, EEG: *_electrodes.tsv and *_coordsystem.json take no task entity.
    const list = sessionSidecars(s);
    expect(list.map((f) => [f.suffix, f.taskEntity])).toEqual([
      ['channels.tsv', true],
      ['electrodes.tsv', false],
      ['coordsystem.json', false],
      ['events.tsv', true],
      ['events.json', true],
      ['eeg.json', true],
    ]);
    expect(list.map((f) => f.text)).toEqual([channelsTsv(s), electrodesTsv(s), coordsystemJson(s), eventsTsv(s), eventsJson(), eegJson(s)]);
  });
});
