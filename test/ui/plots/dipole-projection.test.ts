import { describe, expect, it } from 'vitest';
import { drawingRadiusMm, projectDipole } from '../../../src/ui/plots/dipole-projection.ts';

// RAS head frame (METHODS global conventions): +x right, +y anterior (nasion), +z up.
describe('projectDipole', () => {
  const p: [number, number, number] = [0, 45, 0];
  it('shows an anterior dipole at the top of the view from above (nose up)', () => {
    const v = projectDipole('top', p, [1, 0, 0], 90);
    expect(v.at[0]).toBeCloseTo(0, 12);
    expect(v.at[1]).toBeCloseTo(-0.5, 12);
  });
  it('shows it on the right of the view from the right side and at the centre of the view from behind', () => {
    expect(projectDipole('side', p, [1, 0, 0], 90).at[0]).toBeCloseTo(0.5, 12);
    const back = projectDipole('back', p, [1, 0, 0], 90).at;
    expect(back[0]).toBeCloseTo(0, 12);
    expect(back[1]).toBeCloseTo(0, 12);
  });
  it('draws an upward moment pointing up in the side view and shortens it in the view from above', () => {
    const side = projectDipole('side', p, [0, 0, 2], 90, 0.3);
    expect(side.tip[1] - side.at[1]).toBeCloseTo(-0.3, 12);
    expect(projectDipole('top', p, [0, 0, 2], 90).inPlane).toBeCloseTo(0, 12);
  });
  it('draws no arrow for a zero moment', () => {
    const v = projectDipole('top', p, [0, 0, 0], 90);
    expect(v.tip).toEqual(v.at);
  });
});

describe('drawingRadiusMm', () => {
  it('uses the 90 mm default head radius unless the dipole lies further out', () => {
    expect(drawingRadiusMm([0, 0, 50])).toBe(90);
    expect(drawingRadiusMm([0, 0, 100])).toBeCloseTo(110, 9);
  });
});
