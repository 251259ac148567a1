import { describe, expect, it } from 'vitest';
import {
  decompositionExtrasOf,
  parseDecompositionJson,
  parseMatrixTsv,
  serializeDecomposition,
} from '../../../src/core/formats/decomposition-file.ts';
import { sha256Hex } from '../../../src/core/formats/sha256.ts';
import type { Decomposition } from '../../../src/core/decomposition.ts';
import { base, s } from './decomposition-fixture.ts';

describe('decompositionExtrasOf (the run details workbench and CLI both write)', () => {
  it('writes rank reason, variance shares, warnings and seed beside the contract fields; readers ignore them', () => {
    const result = { rankReason: 'full rank (3 channels)', varianceShare: Float64Array.of(0.6, 0.3), warnings: ['not converged'], densitySigns: Int8Array.of(1, 1) };
    const text = serializeDecomposition(base, decompositionExtrasOf(result, 7));
    const o = JSON.parse(text);
    expect(o).toMatchObject({ rankReason: 'full rank (3 channels)', varianceShare: [0.6, 0.3], warnings: ['not converged'], seed: 7 });
    const back = parseDecompositionJson(text, 'd.json');
    expect(back.ok && Array.from(back.value.unmixing)).toEqual(Array.from(base.unmixing));
  });
});

describe('serializeDecomposition / parseDecompositionJson', () => {
  it('round-trips every field bit for bit', () => {
    const text = serializeDecomposition(base);
    const back = parseDecompositionJson(text, 'd.json');
    expect(back.ok).toBe(true);
    if (!back.ok) return;
    expect(back.warnings).toEqual([]);
    const d = back.value;
    expect(Array.from(d.mixing)).toEqual(Array.from(base.mixing));
    expect(Array.from(d.unmixing)).toEqual(Array.from(base.unmixing));
    expect(Array.from(d.channelMeans!)).toEqual(Array.from(base.channelMeans!));
    expect({ ...d, mixing: 0, unmixing: 0, channelMeans: 0 }).toEqual({ ...base, mixing: 0, unmixing: 0, channelMeans: 0 });
  });
  it('writes the contract fields: format, channels, mixing rows = channels, unmixing rows = components', () => {
    const o = JSON.parse(serializeDecomposition(base));
    expect(o.format).toBe('winnow-decomposition/1');
    expect(o.mixing).toHaveLength(3);
    expect(o.mixing[0]).toHaveLength(2);
    expect(o.unmixing).toHaveLength(2);
    expect(o.unmixing[0]).toHaveLength(3);
    for (const key of ['channels', 'method', 'rank', 'iterations', 'converged', 'preprocessing', 'recordingSha256']) expect(o).toHaveProperty(key);
  });
  it('computes a missing unmixing matrix as the pseudo-inverse of the mixing matrix', () => {
    const o = JSON.parse(serializeDecomposition(base));
    delete o.unmixing;
    const r = parseDecompositionJson(JSON.stringify(o), 'd.json');
    expect(r.ok).toBe(true);
    if (r.ok) for (let i = 0; i < 6; i++) expect(r.value.unmixing[i]).toBeCloseTo(base.unmixing[i], 12);
  });
  const bad: [string, (o: Record<string, unknown>) => unknown, RegExp][] = [
    ['a mixing row of the wrong length', (o) => ((o.mixing as number[][])[1] = [1]), /"mixing" row 2 has 1 values, expected 2/],
    ['too few mixing rows for the channels', (o) => (o.mixing as number[][]).pop(), /"mixing" has 2 rows, expected 3/],
    ['a non-finite value', (o) => ((o.unmixing as unknown[][])[0][2] = null), /"unmixing" row 1, column 3 is null/],
    ['unmixing rows that disagree with mixing columns', (o) => (o.unmixing as unknown[]).pop(), /"unmixing" has 1 rows but "mixing" has 2 columns/],
    ['no matrices', (o) => (delete o.mixing, delete o.unmixing), /neither "mixing" nor "unmixing"/],
    ['a foreign format', (o) => (o.format = 'other/2'), /"format" is "other\/2"/],
    ['a duplicated channel', (o) => ((o.channels as string[])[2] = 'Fz'), /channel "Fz" is listed twice/],
  ];
  for (const [what, edit, msg] of bad) {
    it(`refuses ${what} with a message naming the file and the fault`, () => {
      const o = JSON.parse(serializeDecomposition(base));
      edit(o);
      const r = parseDecompositionJson(JSON.stringify(o), 'sub-01_ica.json');
      expect(r.ok).toBe(false);
      if (!r.ok) {
        expect(r.error.message).toMatch(/^sub-01_ica\.json: /);
        expect(r.error.message).toMatch(msg);
      }
    });
  }
  it('refuses text that is not JSON', () => {
    const r = parseDecompositionJson('{"channels": [', 'x.json');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.code).toBe('bad-value');
  });
});

describe('parseMatrixTsv', () => {
  it('reads an unmixing TSV whose header names the channels and derives the mixing matrix by pseudo-inverse', () => {
    const text = `component\tFz\tCz\tPz\nIC1\t${s}\t${s}\t0\nIC2\t0\t0\t1\n`;
    const r = parseMatrixTsv(text, 'w.tsv', 'unmixing');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.channels).toEqual(['Fz', 'Cz', 'Pz']);
    expect(r.value.nComponents).toBe(2);
    for (let i = 0; i < 6; i++) expect(r.value.mixing[i]).toBeCloseTo(base.mixing[i], 12);
    expect(r.value.method).toBe('imported');
  });
  it('reads a mixing CSV (one scalp map per row) into channels × components', () => {
    const r = parseMatrixTsv(`Fz,Cz,Pz\r\n${s},0,${s}\r\n0,1,0\r\n`, 'a.csv', 'mixing');
    expect(r.ok).toBe(true);
    if (r.ok) expect(Array.from(r.value.mixing)).toEqual([s, 0, 0, 1, s, 0]);
  });
  it('refuses a header of numbers, ragged rows and non-numeric cells with the line number', () => {
    const a = parseMatrixTsv('1\t2\n3\t4\n', 'm.tsv', 'unmixing');
    expect(!a.ok && a.error.message).toMatch(/must name the channels/);
    const b = parseMatrixTsv('Fz\tCz\n1\t2\n3\n', 'm.tsv', 'unmixing');
    expect(!b.ok && b.error.line).toBe(3);
    const c = parseMatrixTsv('Fz\tCz\n1\tNaN\n', 'm.tsv', 'unmixing');
    expect(!c.ok && c.error.message).toMatch(/line 2, channel "Cz": "NaN" is not a finite number/);
  });
});

describe('sha256Hex', () => {
  it('gives the FIPS 180-2 test vector for "abc"', async () => {
    expect(await sha256Hex(new TextEncoder().encode('abc'))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
});
