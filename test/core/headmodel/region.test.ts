import { describe, expect, it } from 'vitest';
import { approximateRegion } from '../../../src/core/headmodel/region.ts';

// Directions of idealised 10-20 electrodes (docs/methods.md §10), scaled to 65 mm (superficial) or 30 mm (deep).
const dir = {
  Fz: [0, 0.587785, 0.809017],
  C3: [-0.587785, 0, 0.809017],
  P4: [0.459031, -0.57996, 0.673006],
  Pz: [0, -0.587785, 0.809017],
  Oz: [0, -0.951057, 0.309017],
  T8: [0.951057, 0, 0.309017],
  F3: [-0.459031, 0.57996, 0.673006],
};
const at = (d: number[], r: number) => d.map((v) => v * r);

describe('approximateRegion', () => {
  it('labels positions under the 10-20 landmarks by hemisphere and lobe (our coarse rules, region.ts)', () => {
    expect(approximateRegion(at(dir.Fz, 65))).toMatchObject({ hemisphere: 'midline', lobe: 'frontal', depth: 'superficial' });
    expect(approximateRegion(at(dir.C3, 65))).toMatchObject({ hemisphere: 'left', lobe: 'central' });
    expect(approximateRegion(at(dir.P4, 65))).toMatchObject({ hemisphere: 'right', lobe: 'parietal' });
    expect(approximateRegion(at(dir.Pz, 65))).toMatchObject({ hemisphere: 'midline', lobe: 'parietal' });
    expect(approximateRegion(at(dir.Oz, 65))).toMatchObject({ lobe: 'occipital' });
    expect(approximateRegion(at(dir.T8, 65))).toMatchObject({ hemisphere: 'right', lobe: 'temporal' });
    expect(approximateRegion(at(dir.F3, 65))).toMatchObject({ hemisphere: 'left', lobe: 'frontal' });
  });

  it('calls positions near the centre deep and always carries the caution that it is a model estimate', () => {
    const r = approximateRegion(at(dir.F3, 30));
    expect(r.depth).toBe('deep');
    expect(r.label).toBe('left frontal, deep');
    expect(r.caution).toMatch(/not an anatomical location/);
    expect(r.caution).toMatch(/estimate/);
  });

  it('scales with the head radius and handles a NaN position without throwing', () => {
    expect(approximateRegion(at(dir.Fz, 40), 60).depth).toBe('superficial');
    expect(approximateRegion([NaN, 0, 0]).label).toBe('unknown position');
  });
});
