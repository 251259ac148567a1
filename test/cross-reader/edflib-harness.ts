/**
 * EDFlib harness plumbing shared by test/cross-reader/edflib.test.ts and e2e/offline.spec.ts: compiles
 * test/cross-reader/edflib-harness.c with the system C compiler against Debian's libedf-dev, and runs it.
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const harnessSource = fileURLToPath(new URL('./edflib-harness.c', import.meta.url));

/** Compiles the harness; null (and the reason) when EDFlib or a C compiler is missing. */
export function compileHarness(dir: string): { exe: string | null; reason: string } {
  if (!existsSync('/usr/include/edflib.h'))
    return { exe: null, reason: 'EDFlib is not installed (/usr/include/edflib.h missing): apt-get install libedf-dev (.ci/run does)' };
  const exe = join(dir, 'edflib-harness');
  for (const cc of ['gcc', 'cc', 'g++']) {
    const r = spawnSync(cc, ['-O1', '-o', exe, harnessSource, '-ledf'], { encoding: 'utf8' });
    if (r.status === 0) return { exe, reason: '' };
    if (r.error === undefined) return { exe: null, reason: `${cc} could not build the harness against EDFlib:\n${r.stderr}` };
  }
  return { exe: null, reason: 'no C compiler (gcc/cc/g++) to build the EDFlib harness' };
}

export interface LibSignal {
  label: string;
  physdimension: string;
  prefilter: string;
  transducer: string;
  physMin: number;
  physMax: number;
  digMin: number;
  digMax: number;
  smpInDatarecord: number;
  smpInFile: number;
  digital: number[];
  physical: number[];
}
export interface LibFile {
  edflibVersion: number;
  filetype: number;
  edfsignals: number;
  fileDuration: number;
  startDate: [number, number, number];
  startTime: [number, number, number];
  startSubsecond: number;
  datarecordDuration: number;
  datarecordsInFile: number;
  annotationsInFile: number;
  signals: LibSignal[];
  annotations: { onset: number; duration: number; durationText: string; text: string }[];
}

/** EDFlib's view of a file (times in units of 100 ns, EDFLIB_TIME_DIMENSION). Fails the test if it refuses it. */
export function libRead(exe: string, path: string): LibFile {
  const r = spawnSync(exe, ['read', path], { encoding: 'utf8', maxBuffer: 1 << 30 });
  if (r.status !== 0) throw new Error(`EDFlib refused ${path}: ${r.stderr}`);
  return JSON.parse(r.stdout) as LibFile;
}

