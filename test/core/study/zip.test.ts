/**
 * The ZIP writer against the format's own check value and an independent reader: Python's standard
 * zipfile module (Python 3.11, general-purpose reference library) opens the archive, tests every CRC and
 * returns the bytes we stored.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { crc32, zipStore } from '../../../src/core/study/zip.ts';

describe('zip (PKWARE APPNOTE, stored entries)', () => {
  it('CRC-32 check value: CRC32("123456789") = 0xCBF43926 (Williams 1993; IEEE 802.3 polynomial)', () => {
    expect(crc32(new TextEncoder().encode('123456789'))).toBe(0xcbf43926);
    expect(crc32(new Uint8Array(0))).toBe(0);
  });

  it('an independent reader (Python zipfile) lists, tests and extracts every entry exactly', async () => {
    const binary = new Uint8Array(70_000).map((_, i) => (i * 7919) & 0xff);
    const zip = zipStore(
      [
        { path: 'derivatives/winnow/dataset_description.json', data: '{"Name": "x"}\n' },
        { path: 'derivatives/winnow/sub-01/eeg/sub-01_task-a_desc-winnow_decisions.tsv', data: 'index\tverdict\n1\tkeep\n' },
        { path: 'ünïcode/名前.txt', data: 'utf-8 names\n' },
        { path: 'bin/data.bin', data: binary },
      ],
      new Date(Date.UTC(2026, 11, 2, 10, 30, 4)),
    );
    const dir = await mkdtemp(join(tmpdir(), 'winnow-zip-'));
    try {
      const file = join(dir, 'study.zip');
      await writeFile(file, zip);
      const py = [
        'import zipfile, sys, json, hashlib',
        'z = zipfile.ZipFile(sys.argv[1])',
        'bad = z.testzip()',
        'print(json.dumps({"bad": bad, "names": z.namelist(), "sizes": [i.file_size for i in z.infolist()],',
        ' "date": list(z.infolist()[0].date_time), "tsv": z.read(z.namelist()[1]).decode(),',
        ' "bin": hashlib.sha256(z.read("bin/data.bin")).hexdigest()}))',
      ].join('\n');
      const r = spawnSync('python3', ['-c', py, file], { encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(0);
      const out = JSON.parse(r.stdout);
      expect(out.bad).toBeNull();
      expect(out.names).toEqual([
        'derivatives/winnow/dataset_description.json',
        'derivatives/winnow/sub-01/eeg/sub-01_task-a_desc-winnow_decisions.tsv',
        'ünïcode/名前.txt',
        'bin/data.bin',
      ]);
      expect(out.sizes[3]).toBe(70_000);
      expect(out.date).toEqual([2026, 12, 2, 10, 30, 4]);
      expect(out.tsv).toBe('index\tverdict\n1\tkeep\n');
      const { createHash } = await import('node:crypto');
      expect(out.bin).toBe(createHash('sha256').update(binary).digest('hex'));
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
  });

  it('refuses paths that would escape the folder', () => {
    expect(() => zipStore([{ path: '../x', data: '' }])).toThrow(/bad entry path/);
    expect(() => zipStore([{ path: '/abs', data: '' }])).toThrow(/bad entry path/);
  });
});
