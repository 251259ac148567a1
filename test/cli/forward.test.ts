import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/winnow.ts';
import { memoryIo } from '../../src/cli/cli-support.ts';

const dir = mkdtempSync(join(tmpdir(), 'winnow-forward-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const fixture = JSON.parse(readFileSync(new URL('../fixtures/headmodel/electrodes_1020.json', import.meta.url), 'utf8'));
const names = fixture.ten_twenty_order as string[];
/** electrodes.tsv (BIDS columns name x y z, mm) of the 21 idealised 10-20 positions on a head of radius r. */
function electrodesTsv(list: string[], r = 90): string {
  return ['name\tx\ty\tz', ...list.map((n) => [n, ...(fixture.positions_unit_sphere[n] as number[]).map((v) => (v * r).toFixed(9))].join('\t'))].join('\n') + '\n';
}
const file = (name: string, text: string) => {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
};
const positions = file('electrodes.tsv', electrodesTsv(names));

async function forward(...args: string[]) {
  const io = memoryIo();
  const code = await main(['forward', ...args], io);
  return { code, out: io.out, err: io.err, rows: io.out.trimEnd().split('\n').map((l) => l.split('\t')) };
}

describe('winnow forward (issue 3 contract)', () => {
  it('prints name and potential (µV, infinite reference) for every electrode: a centred radial dipole gives 3q cosθ/(4πσR²)', async () => {
    const r = await forward('--positions', positions, '--dipole', '0,0,0,0,0,10', '--model', 'sphere');
    expect(r.code).toBe(0);
    expect(r.rows[0]).toEqual(['name', 'potential']);
    expect(r.rows.slice(1).map((row) => row[0])).toEqual(names);
    // closed form, docs/methods.md §8.2 / §8.4: 0.8931253821 µV at Cz for 10 nA·m, R = 90 mm, σ = 0.33 S/m
    const cz = Number(r.rows.find((row) => row[0] === 'Cz')![1]);
    expect(cz).toBeCloseTo(0.8931253821094, 9);
    const c3 = Number(r.rows.find((row) => row[0] === 'C3')![1]);
    expect(c3).toBeCloseTo(0.8931253821094 * Math.cos((36 * Math.PI) / 180), 9);
  });

  it('uses the three-shell model by default and matches the physical example of sphere_forward.json', async () => {
    // D4: r0 = (27, 18, 54) mm, q = 10 nA·m along (.5, −.3, .8)/|·|: Cz 0.7928598596 µV, T8 0.4486553029 µV
    const q = [0.5, -0.3, 0.8];
    const len = Math.hypot(...q);
    const r = await forward('--positions', positions, '--dipole', ['27', '18', '54', ...q.map((v) => String((10 * v) / len))].join(','));
    expect(r.code).toBe(0);
    const get = (n: string) => Number(r.rows.find((row) => row[0] === n)![1]);
    expect(Math.abs(get('Cz') - 0.7928598596344128) / 0.79286).toBeLessThan(1e-6);
    expect(Math.abs(get('T8') - 0.4486553028772122) / 0.44866).toBeLessThan(1e-6);
  });

  it('scales electrodes given at another radius onto the model sphere, and --radius sets the model size', async () => {
    const other = file('electrodes-100.tsv', electrodesTsv(names, 100));
    const a = await forward('--positions', other, '--dipole', '0,0,0,0,0,10', '--model', 'sphere', '--radius', '100');
    const cz = Number(a.rows.find((row) => row[0] === 'Cz')![1]);
    expect(cz).toBeCloseTo((3 * 10e-9) / (4 * Math.PI * 0.33 * 0.1 * 0.1) * 1e6, 9);
    const b = await forward('--positions', other, '--dipole', '0,0,0,0,0,10', '--model', 'sphere', '--radius', 'fit');
    expect(Number(b.rows.find((row) => row[0] === 'Cz')![1])).toBeCloseTo(cz, 6);
  });

  it('exits 2 with an error line for a dipole outside the sphere or outside the brain shell', async () => {
    const out = await forward('--positions', positions, '--dipole', '0,0,95,0,0,1');
    expect(out.code).toBe(2);
    expect(out.err).toMatch(/^error: .*outside the 90 mm sphere/m);
    const shell = await forward('--positions', positions, '--dipole', '0,0,85,0,0,1');
    expect(shell.code).toBe(2);
    expect(shell.err).toMatch(/^error: .*brain shell/m);
    expect(shell.out).toBe('');
  });

  it('exits 2 for fewer than 8 electrodes, NaN coordinates, a bad --dipole and an unknown model', async () => {
    const few = file('few.tsv', electrodesTsv(names.slice(0, 7)));
    expect((await forward('--positions', few, '--dipole', '0,0,0,0,0,1')).err).toMatch(/7 electrodes; at least 8/);
    const nan = file('nan.tsv', electrodesTsv(names).replace(/^Cz\t[^\t]+/m, 'Cz\tn/a'));
    const r = await forward('--positions', nan, '--dipole', '0,0,0,0,0,1');
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/"Cz".*finite x/);
    const bad = await forward('--positions', positions, '--dipole', '0,0,NaN,0,0,1');
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--dipole needs 6 finite numbers/);
    const model = await forward('--positions', positions, '--dipole', '0,0,0,0,0,1', '--model', 'cube');
    expect(model.code).toBe(2);
    expect(model.err).toMatch(/--model must be/);
  });

  it('exits 2 when the positions file is missing or lacks the BIDS columns', async () => {
    expect((await forward('--positions', join(dir, 'nope.tsv'), '--dipole', '0,0,0,0,0,1')).code).toBe(2);
    const cols = file('cols.tsv', 'label\tx\ty\tz\nCz\t0\t0\t90\n');
    const r = await forward('--positions', cols, '--dipole', '0,0,0,0,0,1');
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^error: .*"name"/m);
  });
});
