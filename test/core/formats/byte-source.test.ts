import { describe, expect, it } from 'vitest';
import { blobByteSource, byteSourceBaseName, bytesByteSource } from '../../../src/core/formats/byte-source.ts';

describe('ByteSource', () => {
  it('reads slices of a Blob and clamps reads past the end (short read, never a throw)', async () => {
    const blob = new Blob([new Uint8Array([1, 2, 3, 4, 5])]);
    const s = blobByteSource(blob, 'x.edf');
    expect(s.size).toBe(5);
    expect(s.name).toBe('x.edf');
    expect(Array.from(await s.read(1, 3))).toEqual([2, 3, 4]);
    expect(Array.from(await s.read(3, 10))).toEqual([4, 5]);
    expect((await s.read(9, 2)).length).toBe(0);
  });

  it('reads views of in-memory bytes with the same clamping', async () => {
    const s = bytesByteSource(new Uint8Array([9, 8, 7]), 'y.bdf');
    expect(Array.from(await s.read(2, 5))).toEqual([7]);
    expect(Array.from(await s.read(-4, 2))).toEqual([9, 8]);
  });

  it('names files by their base name', () => {
    expect(byteSourceBaseName('data/sub-01/eeg/sub-01_eeg.edf')).toBe('sub-01_eeg.edf');
    expect(byteSourceBaseName('C:\\x\\r.bdf')).toBe('r.bdf');
  });
});
