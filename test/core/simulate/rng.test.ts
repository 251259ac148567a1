import { describe, expect, it } from 'vitest';
import { createRng, fnv1a32, streamRng, streamSeed } from '../../../src/core/simulate/rng.ts';
import reference from '../../fixtures/simulate/rng_reference.json';

// Reference values: test/fixtures/simulate/rng_reference.py, an independent Python port of the published
// C reference code (xoshiro128** by Blackman & Vigna; ziggurat by Marsaglia & Tsang 2000).
describe('simulator random numbers', () => {
  it('hashes stream names with FNV-1a as the published test vector says (fnv1a32("foobar") = 0xbf9cf968)', () => {
    // FNV test vector from the FNV authors' test suite (value from memory, reproduced by the Python port).
    expect(fnv1a32('foobar')).toBe(0xbf9cf968);
    for (const [name, h] of Object.entries(reference.fnv1a32)) expect(fnv1a32(name)).toBe(h);
  });

  it('produces the same xoshiro128** outputs as the Python port of the reference C code', () => {
    const r = createRng(12345);
    expect(Array.from({ length: 8 }, () => r.nextUint32())).toEqual(reference.xoshiro_seed_12345_first_8);
    expect(streamSeed(1, 'sensor-noise')).toBe(reference.stream_seed_1_sensor_noise);
  });

  it('produces the same ziggurat normals as the Python port, including the slow-path (wedge) draws', () => {
    const r = createRng(7);
    const ours = Array.from({ length: 2000 }, () => r.normal());
    ours.forEach((v, i) => expect(v).toBeCloseTo(reference.normals_seed_7_first_2000[i], 12));
  });

  it('draws standard normals: mean 0, variance 1, 95 % inside ±1.96 and kurtosis 3 (normal distribution facts)', () => {
    const r = streamRng(3, 'test');
    const n = 200_000;
    const x = new Float64Array(n);
    r.fillNormal(x);
    let m = 0;
    for (const v of x) m += v;
    m /= n;
    let v2 = 0;
    let v4 = 0;
    let inside = 0;
    for (const v of x) {
      v2 += (v - m) ** 2;
      v4 += (v - m) ** 4;
      if (Math.abs(v) < 1.959964) inside++;
    }
    v2 /= n;
    v4 /= n;
    // Tolerances ≈ 5 standard errors for n = 200 000.
    expect(Math.abs(m)).toBeLessThan(0.012);
    expect(Math.abs(v2 - 1)).toBeLessThan(0.016);
    expect(Math.abs(inside / n - 0.95)).toBeLessThan(0.0025);
    expect(Math.abs(v4 / (v2 * v2) - 3)).toBeLessThan(0.06);
  });

  it('gives each named stream its own reproducible sequence', () => {
    const a = streamRng(1, 'blinks');
    const b = streamRng(1, 'blinks');
    const c = streamRng(1, 'steps');
    const d = streamRng(2, 'blinks');
    const xa = Array.from({ length: 5 }, () => a.uniform());
    expect(Array.from({ length: 5 }, () => b.uniform())).toEqual(xa);
    expect(Array.from({ length: 5 }, () => c.uniform())).not.toEqual(xa);
    expect(Array.from({ length: 5 }, () => d.uniform())).not.toEqual(xa);
    for (const u of xa) expect(u >= 0 && u < 1).toBe(true);
  });
});
