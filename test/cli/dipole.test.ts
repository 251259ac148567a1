import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/winnow.ts';
import { memoryIo } from '../../src/cli/cli-support.ts';

const dir = mkdtempSync(join(tmpdir(), 'winnow-dipole-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const reference = JSON.parse(readFileSync(new URL('../fixtures/headmodel/dipole_fit.json', import.meta.url), 'utf8'));
const unit = JSON.parse(readFileSync(new URL('../fixtures/headmodel/electrodes_1020.json', import.meta.url), 'utf8')).positions_unit_sphere;
const names = reference.electrodes as string[];
const file = (name: string, text: string) => {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
};
const positions = file(
  'electrodes.tsv',
  ['name\tx\ty\tz', ...names.map((n) => [n, ...(unit[n] as number[]).map((v) => (v * 90).toFixed(12))].join('\t'))].join('\n') + '\n',
);
const mapTsv = (rows: [string, number | string][]) => ['name\tvalue', ...rows.map(([n, v]) => `${n}\t${v}`)].join('\n') + '\n';

async function run(command: string, ...args: string[]) {
  const io = memoryIo();
  const code = await main([command, ...args], io);
  return { code, out: io.out, err: io.err };
}

describe('winnow dipole (issue 3 contract)', () => {
  it('recovers the dipole that winnow forward simulated (round trip through the CLI, three-shell default)', async () => {
    const fwd = await run('forward', '--positions', positions, '--dipole', '-30,25,45,4,-2,7');
    expect(fwd.code).toBe(0);
    const map = file('map.tsv', fwd.out.replace(/^name\tpotential/, 'name\tvalue'));
    const r = await run('dipole', '--positions', positions, '--map', map);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.out);
    expect(Math.hypot(json.position[0] + 30, json.position[1] - 25, json.position[2] - 45)).toBeLessThan(0.01);
    expect(Math.hypot(json.moment[0] - 4, json.moment[1] + 2, json.moment[2] - 7)).toBeLessThan(0.01);
    expect(json.residualVariance).toBeLessThan(1e-8);
    expect(json.region.caution).toMatch(/not an anatomical location/);
  });

  it('matches the scipy least-squares fit of dipole_fit.json for the noisy map (positions scale with R = 90 mm)', async () => {
    const values = (reference.data_noise_free_avgref as number[]).map((v, i) => v + reference.noise_added[i]);
    const map = file('noisy.tsv', mapTsv(names.map((n, i) => [n, values[i]])));
    const r = await run('dipole', '--positions', positions, '--map', map);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.out);
    const ref = (reference.cases.noisy_3shell.scipy_lm.p as number[]).map((v) => v * 90);
    expect(Math.hypot(json.position[0] - ref[0], json.position[1] - ref[1], json.position[2] - ref[2])).toBeLessThan(1e-4);
    expect(json.residualVariance).toBeCloseTo(reference.cases.noisy_3shell.scipy_lm.RV, 8);
  });

  it('exits 2 for a map naming an unknown electrode', async () => {
    const map = file('unknown.tsv', mapTsv([...names.slice(0, 10).map((n): [string, number] => [n, 1]), ['Xy9', 2]]));
    const r = await run('dipole', '--positions', positions, '--map', map);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^error: .*"Xy9" is not in/m);
    expect(r.out).toBe('');
  });

  it('exits 2 for fewer than 8 values, a NaN value, and a flat map', async () => {
    const few = await run('dipole', '--positions', positions, '--map', file('few.tsv', mapTsv(names.slice(0, 7).map((n, i) => [n, i]))));
    expect(few.code).toBe(2);
    expect(few.err).toMatch(/7 electrode values; at least 8/);
    const nan = await run('dipole', '--positions', positions, '--map', file('nan.tsv', mapTsv(names.slice(0, 12).map((n, i) => [n, i === 3 ? 'NaN' : i]))));
    expect(nan.code).toBe(2);
    expect(nan.err).toMatch(/not a finite number/);
    const flat = await run('dipole', '--positions', positions, '--map', file('flat.tsv', mapTsv(names.slice(0, 12).map((n) => [n, 4]))));
    expect(flat.code).toBe(2);
    expect(flat.err).toMatch(/flat/);
  });

  it('exits 2 without --map, and for a map without a value column', async () => {
    expect((await run('dipole', '--positions', positions)).code).toBe(2);
    const r = await run('dipole', '--positions', positions, '--map', file('cols.tsv', 'name\tamp\nCz\t1\n'));
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/"value"/);
  });
});
